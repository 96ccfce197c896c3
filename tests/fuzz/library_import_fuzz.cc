// Fuzz target: library import. The input is a library exchange file, JSON
// when its first non-blank character is '{', CSV otherwise; it is read as
// `library import` reads it (on the first bad row, and with bad rows
// skipped), and what was read is stored in a fresh in-memory library.
#include "core/progress.h"
#include "exchange_file_support.h"
#include "library/store.h"

extern "C" int LLVMFuzzerTestOneInput(const std::uint8_t* data, std::size_t size) {
  using namespace vicinal;
  const std::string_view text = fuzz::as_text(data, size);
  const auto first = text.find_first_not_of(" \t\r\n");
  const bool json = first != std::string_view::npos && text[first] == '{';
  const std::string path = fuzz::scratch_file(text, json ? ".json" : ".csv");
  fuzz::read_exchange_both_ways(path, [](const library::ImportResult& result) {
    if (result.entries.empty()) return;
    auto lib = library::Library::create(":memory:");
    NoProgress quiet;
    lib->store(result.entries, quiet);
    if (lib->read_entries().empty()) fuzz::broken_promise("stored entries do not read back");
  });
  return 0;
}
