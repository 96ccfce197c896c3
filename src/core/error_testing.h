// For tests: the one-line message of the vicinal::Error a call throws, or
// "no error", so a test can check both that it failed and what it said.
#pragma once

#include <functional>
#include <string>

#include "core/error.h"

namespace vicinal::testing {

inline std::string error_of(const std::function<void()>& call) {
  try {
    call();
  } catch (const Error& e) {
    return e.one_line();
  }
  return "no error";
}

}  // namespace vicinal::testing
