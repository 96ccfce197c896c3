#include "spin/second_order.h"

#include <gtest/gtest.h>

namespace vicinal::spin {
namespace {

// Peaks of X in a simulated X + partners system (first-order window around X).
PeakList observed_peaks(const MultipletModel& truth, double half_width_hz) {
  PeakList peaks;
  for (const auto& l : merge_lines(simulate(model_system(truth)).lines, 0.05))
    if (std::abs(l.hz - truth.center_hz) < half_width_hz && l.intensity > 0.02) {
      peaks.hz.push_back(l.hz);
      peaks.intensity.push_back(l.intensity);
    }
  return peaks;
}

// X coupled to P1 (J 8, dnu/J = 3.75) and P2 (J 3, far away): the first-order
// reading is distorted; the fit with the partner shifts recovers the truth.
TEST(SecondOrder, FitRecoversShiftAndCouplingsOfStronglyCoupledMultiplet) {
  MultipletModel truth;
  truth.field_mhz = 400;
  truth.center_hz = 1000;
  truth.groups = {{8.0, 1}, {3.0, 1}};
  truth.partner_hz = {1030, 2000};
  const auto peaks = observed_peaks(truth, 12);
  ASSERT_EQ(peaks.hz.size(), 4u);

  const auto first = analyse_first_order(peaks).trees.front();
  ASSERT_EQ(first.multiplicity(), "dd");
  MultipletModel start = truth;
  start.center_hz = first.center_hz;
  start.groups = first.groups;
  // The first-order model placed at the real partner shifts misses the peaks.
  EXPECT_GT(std::abs(first.center_hz - 1000), 0.1);

  const auto fit = fit_second_order(start, peaks, false, 0.3, 0.3);
  EXPECT_TRUE(fit.converged);
  EXPECT_NEAR(fit.model.center_hz, 1000, 0.01);
  EXPECT_NEAR(fit.model.groups[0].j_hz, 8.0, 0.01);
  EXPECT_NEAR(fit.model.groups[1].j_hz, 3.0, 0.01);
  EXPECT_LT(fit.residual_hz, 0.01);
}

TEST(SecondOrder, FirstOrderTreeSimulatedFarAwayReproducesPeaks) {
  MultipletModel m;
  m.field_mhz = 600;
  m.center_hz = 2400;
  m.groups = {{10.0, 1}, {6.0, 2}};
  m.partner_hz = {2400 + 1e4, 2400 - 2e4};
  const auto peaks = observed_peaks(m, 20);
  EXPECT_LT(model_residual_hz(m, peaks), 0.02);
  m.partner_hz = {1.0};
  EXPECT_THROW(model_system(m), Error);
}

}  // namespace
}  // namespace vicinal::spin
