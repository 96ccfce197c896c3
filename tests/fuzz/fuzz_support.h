// Shared helpers of the fuzz targets. Each target defines
// LLVMFuzzerTestOneInput: libFuzzer drives it in the fuzz build, and
// replay_main.cc drives it over the saved corpus and regression files in the
// normal test suite. vicinal::Error is the expected answer to bad input; any
// other exception escapes and aborts, which both drivers report as a failure.
#pragma once

#include <cstddef>
#include <cstdint>
#include <string>
#include <string_view>

#include "core/error.h"

namespace vicinal::fuzz {

inline std::string_view as_text(const std::uint8_t* data, std::size_t size) {
  return {reinterpret_cast<const char*>(data), size};
}

// Runs one parser call; only vicinal::Error is caught.
template <class F>
void expect_only_vicinal_errors(F&& call) {
  try {
    call();
  } catch (const vicinal::Error&) {
  }
}

// Parsers that take a path get the input in a per-process scratch file whose
// extension selects the format (e.g. ".xyz"); returns the path.
std::string scratch_file(std::string_view contents, const std::string& extension);

// A check of our own inside a target (a parser result that breaks its
// promise): prints the message and aborts, so both drivers report it.
[[noreturn]] void broken_promise(const char* what);

}  // namespace vicinal::fuzz
