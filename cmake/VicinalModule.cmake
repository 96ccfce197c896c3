# vicinal_module(NAME DEPS <targets...>)
#
# Declares the library vicinal_NAME from every *.cc in the calling folder
# except *_test.cc, and, when tests are on, the test program NAME_tests from
# the *_test.cc files beside them (tests live next to the code they test).
function(vicinal_module name)
  cmake_parse_arguments(M "" "" "DEPS;TEST_DEPS" ${ARGN})
  file(GLOB sources CONFIGURE_DEPENDS ${CMAKE_CURRENT_SOURCE_DIR}/*.cc)
  list(FILTER sources EXCLUDE REGEX "_test\\.cc$")
  add_library(vicinal_${name} STATIC ${sources})
  target_include_directories(vicinal_${name} PUBLIC ${PROJECT_SOURCE_DIR}/src)
  target_link_libraries(vicinal_${name} PUBLIC ${M_DEPS})
  set_property(GLOBAL APPEND PROPERTY VICINAL_MODULES vicinal_${name})

  file(GLOB tests CONFIGURE_DEPENDS ${CMAKE_CURRENT_SOURCE_DIR}/*_test.cc)
  if(VICINAL_BUILD_TESTS AND tests)
    add_executable(${name}_tests ${tests})
    target_link_libraries(${name}_tests PRIVATE vicinal_${name} ${M_TEST_DEPS}
                          GTest::gtest GTest::gtest_main GTest::gmock)
    gtest_discover_tests(${name}_tests DISCOVERY_TIMEOUT 60
                         PROPERTIES LABELS "unit;${name}")
  endif()
endfunction()
