// The couplings CSV (our format). Header required; columns:
//   nuclei    two atom references separated by a comma: labels ("H-2,H-3"),
//             1-based indices ("12,15") or element+index ("H12,H15"). One side
//             may list alternatives separated by '|' ("13,14|15") for
//             diastereotopic protons whose assignment is unknown.
//   j_hz      measured coupling (optional for prediction, required for fits)
//   sigma_hz  its uncertainty (optional; must be > 0 when given)
//   set       Karplus set id for this coupling (optional; overrides --set)
//   note      free text (optional)
// Any other column is kept as it is (the library importer adds compound columns).
#pragma once

#include <array>
#include <optional>
#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "core/csv.h"

namespace vicinal::predict {

struct CouplingRow {
  long line = 0;                                  // CSV line, for messages
  std::array<std::vector<std::string>, 2> nuclei;  // each side: one reference or alternatives
  std::optional<double> j_hz;
  std::optional<double> sigma_hz;
  std::string set;
  std::string note;
  std::vector<std::pair<std::string, std::string>> extra;  // other columns, header order

  bool has_alternatives() const { return nuclei[0].size() > 1 || nuclei[1].size() > 1; }
  // Every concrete pair the alternatives allow, in order (first side varies slowest).
  std::vector<std::array<std::string, 2>> assignments() const;
  // "H-2,H-3" or "13,14|15" as written.
  std::string nuclei_text() const;
};

struct CouplingList {
  std::string source;
  std::vector<std::string> extra_columns;
  std::vector<CouplingRow> rows;
};

// Parses rows of an already-read CSV table; the library importer reuses it.
class CouplingRowParser {
 public:
  // Checks the header (a `nuclei` column is required; `j_hz` too when
  // `require_j`). Errors name the file.
  CouplingRowParser(const CsvTable& table, bool require_j);
  // Errors name file, line and column (empty references, a side with more than
  // one atom but no '|', non-numeric or negative sigma, ...).
  CouplingRow parse(const CsvRow& row) const;
  const std::vector<std::string>& extra_columns() const { return extra_names_; }

 private:
  const CsvTable& table_;
  bool require_j_;
  std::size_t nuclei_;
  std::optional<std::size_t> j_, sigma_, set_, note_;
  std::vector<std::size_t> extra_;
  std::vector<std::string> extra_names_;
};

CouplingList parse_coupling_list(const CsvTable& table, bool require_j = false);
CouplingList read_coupling_list(const std::string& path, bool require_j = false);

// Splits "a,b" / "a,b|c" into two sides of alternatives; `where` for errors.
std::array<std::vector<std::string>, 2> split_nuclei(std::string_view text, const Location& where);

}  // namespace vicinal::predict
