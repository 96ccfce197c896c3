// A calibrated parameter set as a file of the same shape as
// db/karplus/*.json, so that every command can use it by id once it lies in
// $VICINAL_KARPLUS_DIR. The set-file format has no provenance key: the input,
// date, number of points and fit statistics go into `notes` and `table`.
#pragma once

#include <array>
#include <filesystem>
#include <string>
#include <vector>

#include "core/json_file.h"
#include "karplus/karplus.h"

namespace vicinal::calibrate {

struct NewSet {
  std::string id, title;
  std::array<std::string, 2> nuclei = {"1H", "1H"};
  std::string coupling = "3J(H,H)";
  std::string pattern_smarts = "[#1:1][#6:2][#6:3][#1:4]";
  std::string angle_name = "H-C-C-H";
  double offset_deg = 0;
  karplus::Form form = karplus::Form::ThreeTerm;
  std::vector<std::string> names;
  std::vector<double> coefficients;
  double rms_hz = 0;
  std::string table;  // what the numbers are: "calibrated with vicinal from <input>"
  std::string notes;  // provenance: input, date, points, loss, statistics, intervals
};

// Fields of `like` (nuclei, coupling, pattern, angle name, offset) as the template.
NewSet new_set_like(const karplus::ParameterSet& like);

Json set_json(const NewSet& set);

// Writes atomically, after checking that the catalogue reads the file back
// (so a set that every command would reject is never left behind).
void write_set(const NewSet& set, const std::filesystem::path& path);

// Where a new set goes without --out: $VICINAL_KARPLUS_DIR/<id>.json.
// vicinal::Error when the variable is not set.
std::filesystem::path default_set_path(const std::string& id);

// "2026-12-01T21:59:00Z"
std::string utc_now();

}  // namespace vicinal::calibrate
