// Calibration pairs from the coupling library: every 3-bond coupling a library
// query finds, with the dihedral along its stored 4-atom path measured on the
// compound's stored 3D structure (the molfile whose numbering the couplings use).
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "calibrate/calibration_points.h"
#include "library/query.h"

namespace vicinal::calibrate {

struct LibraryPoint {
  std::string compound, nuclei;  // nuclei as written in the library ("H-3,H-4")
  std::vector<int> path;         // 1-based atoms of the stored path
  bool sigma_defaulted = false;  // sigma_hz is the stated default, not a stored value
};

struct LibraryPoints {
  std::vector<CalibrationPoint> points;
  std::vector<LibraryPoint> origins;  // one per point, same order
  std::vector<std::string> skipped;   // couplings left out, and why
};

// `query.bonds` is forced to 3. Couplings without sigma take default_sigma_hz,
// or are refused (vicinal::Error) when it is not given. Stereo-unassigned
// couplings are skipped (which alternative atom is meant is not known).
// vicinal::Error when nothing matches or a matched compound has no 3D
// coordinates (every z = 0). `library_path` names the file in messages.
LibraryPoints points_from_library(library::Database& db, library::FindQuery query,
                                  std::optional<double> default_sigma_hz, const std::string& library_path);

}  // namespace vicinal::calibrate
