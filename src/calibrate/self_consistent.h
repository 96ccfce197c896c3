// Self-consistent calibration in the manner of Schmidt, Blümel, Löhr and
// Rüterjans (J. Biomol. NMR 14, 1, 1999): several coupling types measured at
// the same sites share one unknown dihedral per site, so the coefficients of
// every type and the angles of every site are fitted together. Each type is
// a shipped three-term set (its offset is kept, its coefficients start the
// fit). Site angles start from the given start_deg or the best angle on a 2
// degree grid under the current coefficients; joint Ceres fits alternate with
// fresh grid searches for three rounds so that no site stays on a wrong branch.
#pragma once

#include <string>
#include <vector>

#include "calibrate/calibration_points.h"
#include "calibrate/karplus_calibration.h"
#include "karplus/karplus.h"

namespace vicinal::calibrate {

struct SelfConsistentFit {
  std::vector<karplus::ParameterSet> types;     // the starting sets
  std::vector<std::vector<double>> coefficients;  // fitted {A, B, C} per type
  std::vector<int> type_n;
  std::vector<double> type_rmsd_hz;
  std::vector<std::string> sites;
  std::vector<double> angle_deg;  // per site, in (-180, 180]
  std::vector<double> start_angle_deg;
  double chi2 = 0;
  int n = 0, k = 0;
};

// vicinal::Error when a type is unknown or not three-term, when the types
// measure different angles, or when the rows cannot determine the parameters.
SelfConsistentFit fit_self_consistent(const std::vector<SiteCoupling>& rows, const karplus::SetCatalog& catalog,
                                      Loss loss, double loss_scale);

}  // namespace vicinal::calibrate
