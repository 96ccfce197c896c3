// Input of a Karplus calibration: measured couplings with the dihedral each
// was measured at. CSV with a header row and the columns
//   j_hz, sigma_hz, dihedral_deg      (other columns, e.g. a note, are ignored)
// for a direct calibration, or
//   site, type, j_hz, sigma_hz [, start_deg]
// for the self-consistent mode, where `type` names a shipped set whose form,
// offset and coefficients start the fit. Errors name the line and column.
#pragma once

#include <string>
#include <vector>

namespace vicinal::calibrate {

struct CalibrationPoint {
  double j_hz = 0, sigma_hz = 0, dihedral_deg = 0;
  long line = 0;
};

std::vector<CalibrationPoint> read_calibration_points(const std::string& path);
std::vector<CalibrationPoint> parse_calibration_points(const std::string& text, const std::string& source);

struct SiteCoupling {
  std::string site, type;
  double j_hz = 0, sigma_hz = 0;
  double start_deg = 0;
  bool has_start = false;
  long line = 0;
};

std::vector<SiteCoupling> read_site_couplings(const std::string& path);
std::vector<SiteCoupling> parse_site_couplings(const std::string& text, const std::string& source);

}  // namespace vicinal::calibrate
