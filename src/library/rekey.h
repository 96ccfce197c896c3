// Recomputing coupling identity keys from the stored structures, for
// libraries written before schema version 3 (see schema/003_coupling_keys.sql):
// the keys of those versions could depend on atom numbering for molecules
// with many automorphisms, and name pairs with two marker elements.
#pragma once

#include <string>
#include <vector>

#include "core/progress.h"
#include "library/records.h"
#include "library/sqlite.h"

namespace vicinal::library {

// The first schema version whose keys this program computes the same way.
constexpr int kCurrentKeysVersion = 3;

// Rewrites the identity of every stored coupling whose key is computed
// differently now. Runs inside the caller's write transaction. Returns the
// number of couplings whose key changed. vicinal::Error, naming the library
// and the compound, when a stored structure no longer reads. `progress`
// counts compounds.
int rekey_stored_couplings(Database& db, Progress& progress);

// The same for entries read from the older library file `library` (before
// merging them).
void rekey_entries(std::vector<Entry>& entries, const std::string& library);

}  // namespace vicinal::library
