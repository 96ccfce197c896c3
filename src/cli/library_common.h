// Shared by the `vicinal library ...` commands: opening the library named by
// --library (telling the user about schema upgrades) and reporting what a
// store (import, merge) did.
#pragma once

#include <memory>
#include <string>

#include "cli/command.h"
#include "library/store.h"

namespace vicinal::cli {

// The library at Globals::library_path(); vicinal::Error if it does not exist
// unless `create` (then it is created, with a note).
std::unique_ptr<library::Library> open_library(const Globals& g, bool create = false);

// Counts and conflicts as a table (or JSON members added to `doc`).
void report_store(const Globals& g, const library::StoreReport& report, Json& doc);

// The CLI group "library" under the root.
CLI::App& library_group(CLI::App& root);

}  // namespace vicinal::cli
