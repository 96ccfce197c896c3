// Shared by the fuzz targets that read library exchange files (CSV, JSON, SDF).
#pragma once

#include <string>

#include "fuzz_support.h"
#include "library/formats.h"

namespace vicinal::fuzz {

// Reads `path` as `library import` does, first stopping at the first bad row,
// then with bad rows skipped, and holds the reader to its promise that only the
// second way returns rejects. `then` gets what each read returned.
template <class F>
void read_exchange_both_ways(const std::string& path, F&& then) {
  for (const bool skip_bad : {false, true}) {
    expect_only_vicinal_errors([&] {
      library::ImportOptions options;
      options.skip_bad = skip_bad;
      const auto result = library::read_exchange_file(path, options);
      if (!skip_bad && !result.rejects.empty()) broken_promise("rejects without skip_bad");
      then(result);
    });
  }
}

}  // namespace vicinal::fuzz
