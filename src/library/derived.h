// Results derived from stored couplings and kept beside them: for a 3J
// coupling, the dihedral intervals a Karplus set allows (karplus/karplus.h,
// allowed_dihedrals at k = 2, the same band as `karplus angles`), stored in
// derived_results with the set's id. Deriving again with the same set
// replaces that coupling's rows for the set; results from other sets stay.
#pragma once

#include <cstdint>
#include <map>
#include <string>
#include <vector>

#include "core/progress.h"
#include "library/records.h"
#include "library/sqlite.h"

namespace vicinal::library {

// Coverage factor of the stored intervals: |J(curve) - J| <= 2 sqrt(sigma^2 + rms^2).
inline constexpr double kDerivedCoverage = 2.0;

struct DerivedInterval {
  double from_deg = 0, to_deg = 0;  // within [-180, 180]; an interval through +-180 is two rows
};

struct DerivedResult {
  std::string karplus_set;
  std::vector<DerivedInterval> intervals;
};

struct DeriveOptions {
  std::int64_t compound_id = 0;      // 0 = every compound
  std::string set_choice = "auto";   // for couplings without a preferred set of their own
};

struct DeriveReport {
  int couplings_derived = 0, rows_written = 0;
  std::map<std::string, int> skipped;  // reason -> count
};

// Computes and stores (one transaction) the intervals of every 3J coupling of
// the chosen compounds. A coupling is skipped, with the reason counted, when it
// is not a 3J coupling, is stereo-unassigned, no set fits its path, or its J
// lies outside what the set's curve can reach.
DeriveReport derive_dihedral_intervals(Database& db, const DeriveOptions& options, Progress& progress);

// A coupling's derived rows (as read_entries gives them, ordered by set and
// interval) grouped by Karplus set.
std::vector<DerivedResult> by_karplus_set(const std::vector<DerivedRecord>& rows);

// Derived rows travelling with entries (CouplingRecord::derived), so that
// export, import and merge keep them.

// vicinal::Error naming `source` and `context`.<key> unless the row is one
// derive could have written: a Karplus set this vicinal knows, ends within
// [-180, 180] with from_deg <= to_deg (a band through +-180 is two rows), and
// created_utc empty or "YYYY-MM-DDTHH:MM:SSZ".
void check_derived(const DerivedRecord& row, const std::string& source, const std::string& context);

// Reads the derived rows of a compound's couplings.
class DerivedRowReader {
 public:
  explicit DerivedRowReader(Database& db);
  // By coupling id; each list ordered by karplus_set, from_deg, to_deg.
  std::map<std::int64_t, std::vector<DerivedRecord>> of_compound(std::int64_t compound_id);

 private:
  Statement read_;
};

// Stores derived rows for couplings inside the caller's write transaction.
// Deriving replaces a coupling's rows for a set as a whole, so a coupling
// keeps the rows it already has for a set and the incoming rows for that set
// are dropped: importing or merging the same results again adds nothing, and
// two derivations are never mixed.
class DerivedRowWriter {
 public:
  explicit DerivedRowWriter(Database& db);
  void add(std::int64_t coupling_id, const std::vector<DerivedRecord>& rows);
  // The same for the coupling stored in set_id that `in` duplicates (same
  // identity, J, sigma and sign), which keeps its id.
  void add_to_duplicate(std::int64_t set_id, const CouplingRecord& in);

 private:
  Statement sets_present_, insert_, find_duplicate_;
};

}  // namespace vicinal::library
