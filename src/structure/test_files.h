// Scratch files for tests: a fresh folder per test program run, removed at exit.
#pragma once

#include <filesystem>
#include <fstream>
#include <string>
#include <unistd.h>

namespace vicinal::structure::testing {

inline std::filesystem::path scratch_dir() {
  static const std::filesystem::path dir = [] {
    auto d = std::filesystem::temp_directory_path() / ("vicinal-structure-test-" + std::to_string(::getpid()));
    std::filesystem::create_directories(d);
    return d;
  }();
  return dir;
}

inline std::string write_scratch(const std::string& name, const std::string& content) {
  const auto path = scratch_dir() / name;
  std::ofstream(path, std::ios::binary) << content;
  return path.string();
}

}  // namespace vicinal::structure::testing
