// The library's schema: forward-only migrations schema/NNN_name.sql applied in
// order, each in its own transaction, with PRAGMA user_version recording the
// last one applied. An older library is copied beside itself (named with its
// old version) before it is upgraded; a newer one is refused.
#pragma once

#include <filesystem>
#include <functional>
#include <string>
#include <vector>

#include "library/sqlite.h"

namespace vicinal::library {

struct Migration {
  int version = 0;              // NNN of the file name
  std::string name;             // file name
  std::filesystem::path path;
};

// The shipped migrations in version order (versions must be 1, 2, 3, ...).
std::vector<Migration> shipped_migrations();
int current_schema_version();

struct UpgradeReport {
  int from_version = 0;
  int to_version = 0;
  std::string backup_path;  // empty when nothing was upgraded or the library was new
};

// Brings `db` to the current version. A library at version 0 must be empty
// (a new file); anything else at 0 is not ours and is refused. All pending
// migrations run in one transaction, and `complete`, if given, runs inside it
// (to fill what the SQL cannot; it is told the version the file had), so an
// interrupted upgrade leaves the old version or the whole new one.
// The copy of an older library is written under a temporary name and renamed,
// so a copy that exists is always whole.
UpgradeReport upgrade_schema(Database& db, const std::function<void(int from_version)>& complete = {});

// Where the copy made before upgrading a library at `version` goes.
std::string pre_upgrade_backup_path(const std::string& library_path, int version);

}  // namespace vicinal::library
