// Library health: SQLite's own integrity and foreign-key checks plus checks of
// our rules that constraints alone cannot hold (rows that lost their parent in
// a file edited by other tools, values outside physical ranges, atoms that are
// not in the compound, missing identity data).
#pragma once

#include <string>
#include <vector>

#include "library/sqlite.h"

namespace vicinal::library {

struct CheckFinding {
  std::string check;    // which check found it
  std::string detail;   // what, with row ids
};

struct CheckReport {
  int schema_version = 0;
  std::vector<std::string> checks_run;
  std::vector<CheckFinding> findings;  // empty = healthy
  bool ok() const { return findings.empty(); }
};

CheckReport check_library(Database& db);

}  // namespace vicinal::library
