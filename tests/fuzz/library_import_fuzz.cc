// Fuzz target: library import. The input is a library exchange file, JSON
// when its first non-blank character is '{', CSV otherwise; it is read as
// `library import` reads it (on the first bad row, and with bad rows
// skipped), and what was read is stored in a fresh in-memory library.
#include "core/progress.h"
#include "fuzz_support.h"
#include "library/formats.h"
#include "library/store.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace vicinal;
  const std::string_view text = fuzz::as_text(data, size);
  const auto first = text.find_first_not_of(" \t\r\n");
  const bool json = first != std::string_view::npos && text[first] == '{';
  const std::string path = fuzz::scratch_file(text, json ? ".json" : ".csv");
  for (const bool skip_bad : {false, true}) {
    fuzz::expect_only_vicinal_errors([&] {
      library::ImportOptions options;
      options.skip_bad = skip_bad;
      const auto result = library::read_exchange_file(path, options);
      if (!skip_bad && !result.rejects.empty()) fuzz::broken_promise("rejects without skip_bad");
      if (result.entries.empty()) return;
      auto lib = library::Library::create(":memory:");
      NoProgress quiet;
      lib->store(result.entries, quiet);
      if (lib->read_entries().empty()) fuzz::broken_promise("stored entries do not read back");
    });
  }
  return 0;
}
