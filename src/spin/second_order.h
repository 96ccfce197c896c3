// When is a multiplet not first order, and what are its couplings then?
// A coupling J to a partner whose shift differs by delta-nu (Hz) leaves the
// first-order pattern intact only while delta-nu / J is large; below about 10
// line positions and intensities drift (roof effect, extra lines). Given the
// partners' shifts, the small spin system (the observed nucleus and one group
// of equivalent partners per coupling) is simulated exactly and its shifts and
// couplings are fitted to the peaks with Ceres.
#pragma once

#include <vector>

#include "spin/first_order.h"
#include "spin/simulate.h"
#include "spin/spin_system.h"

namespace vicinal::spin {

// delta-nu / J below this is called second order (common practice).
inline constexpr double kFirstOrderRatio = 10.0;

struct MultipletModel {
  double field_mhz = 0;                  // 1H frequency; the model is homonuclear 1H
  double center_hz = 0;                  // shift of the observed nucleus
  std::vector<CouplingGroup> groups;     // one per partner group
  std::vector<double> partner_hz;        // shift of each partner group
};

// The model as a spin system: "X" observed (one nucleus), partners "P1".."Pk"
// (count = partners of the group); partner-partner couplings are unknown and set to 0.
SpinSystem model_system(const MultipletModel& model);

// Observed peaks against the simulated model: RMS distance of each peak from
// the nearest simulated line of the observed multiplet.
double model_residual_hz(const MultipletModel& model, const PeakList& peaks);

struct SecondOrderFit {
  MultipletModel model;
  double residual_hz = 0;
  double intensity_error = -1;  // RMS relative misfit of matched lines; -1 without intensities
  bool converged = false;
  int iterations = 0;
};

// Fits the centre and the couplings (and the partner shifts when
// `fit_partner_shifts`) starting from `start`. Intensities, when given, enter
// the fit scaled so that `intensity_tolerance` weighs like `tolerance_hz`.
SecondOrderFit fit_second_order(const MultipletModel& start, const PeakList& peaks, bool fit_partner_shifts,
                                double tolerance_hz, double intensity_tolerance);

}  // namespace vicinal::spin
