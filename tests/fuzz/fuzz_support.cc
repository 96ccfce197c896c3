#include "fuzz_support.h"

#include <unistd.h>

#include <cstdio>
#include <cstdlib>
#include <filesystem>
#include <fstream>

namespace vicinal::fuzz {

std::string scratch_file(std::string_view contents, const std::string& extension) {
  // One folder per process: parallel fuzz jobs and ctest runs never share files.
  static const std::filesystem::path folder = [] {
    auto dir = std::filesystem::temp_directory_path() / ("vicinal-fuzz-" + std::to_string(::getpid()));
    std::filesystem::create_directories(dir);
    std::atexit([] {
      std::error_code ignored;
      std::filesystem::remove_all(std::filesystem::temp_directory_path() /
                                      ("vicinal-fuzz-" + std::to_string(::getpid())),
                                  ignored);
    });
    return dir;
  }();
  const auto path = (folder / ("input" + extension)).string();
  std::ofstream out(path, std::ios::binary | std::ios::trunc);
  out.write(contents.data(), static_cast<std::streamsize>(contents.size()));
  out.close();
  if (!out) broken_promise("cannot write the scratch file");
  return path;
}

void broken_promise(const char* what) {
  std::fprintf(stderr, "fuzz target: %s\n", what);
  std::fflush(stderr);
  std::abort();
}

}  // namespace vicinal::fuzz
