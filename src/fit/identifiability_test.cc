#include "fit/identifiability.h"

#include <gtest/gtest.h>

#include <cmath>

namespace vicinal::fit {
namespace {

PopulationProblem two_state_one_coupling() {
  PopulationProblem p;
  p.j_hz.resize(1, 2);
  p.j_hz << 0.0, 10.0;
  p.j_obs_hz = Eigen::VectorXd::Constant(1, 5.0);
  p.sigma_hz = Eigen::VectorXd::Constant(1, 1.0);
  p.rms_hz = Eigen::VectorXd::Zero(1);
  fill_default_names(p);
  return p;
}

TEST(Identifiability, RangeMatchesTheClosedForm) {
  // chi2(w2) = (5 - 10 w2)^2: the 95 % range is 0.5 +- sqrt(3.8415)/10.
  const PopulationProblem p = two_state_one_coupling();
  const LinearFit f = fit_linear(p);
  const auto ranges = population_ranges(p, f);
  const double half = std::sqrt(3.841458820694124) / 10;
  EXPECT_NEAR(ranges[1].min, 0.5 - half, 1e-6);
  EXPECT_NEAR(ranges[1].max, 0.5 + half, 1e-6);
  EXPECT_NEAR(ranges[0].min, 0.5 - half, 1e-6);
  EXPECT_NEAR(ranges[0].max, 0.5 + half, 1e-6);
}

TEST(Identifiability, IdenticalRowsSpanEverything) {
  // Two conformers that predict the same couplings: each may take any share.
  PopulationProblem p;
  p.j_hz.resize(3, 3);
  p.j_hz << 2.0, 2.0, 9.0,  //
      8.0, 8.0, 3.0,        //
      4.0, 4.0, 10.0;
  const Eigen::Vector3d w(0.3, 0.3, 0.4);
  p.j_obs_hz = p.j_hz * w;
  p.sigma_hz = Eigen::VectorXd::Constant(3, 0.2);
  p.rms_hz = Eigen::VectorXd::Zero(3);
  fill_default_names(p);
  const LinearFit f = fit_linear(p);
  EXPECT_NEAR(f.weights(0) + f.weights(1), 0.6, 1e-9);
  EXPECT_FALSE(f.weights_unique);
  const auto ranges = population_ranges(p, f);
  EXPECT_DOUBLE_EQ(ranges[0].min, 0.0);
  EXPECT_NEAR(ranges[0].max, ranges[1].max, 1e-6);
  EXPECT_GT(ranges[0].max, 0.6);   // can carry the twins' whole share (and a little more within tolerance)
  EXPECT_LT(ranges[2].max - ranges[2].min, 0.2);  // the third is well determined
  const auto c = conditioning(p);
  EXPECT_EQ(c.rank, 2);
}

TEST(Identifiability, IdenticalRowsInAFlatProblemSpanZeroToOne) {
  // Both conformers predict the measured values exactly: any split fits.
  PopulationProblem p;
  p.j_hz.resize(2, 2);
  p.j_hz << 3.0, 3.0, 7.0, 7.0;
  p.j_obs_hz = Eigen::Vector2d(3.0, 7.0);
  p.sigma_hz = Eigen::VectorXd::Constant(2, 0.5);
  p.rms_hz = Eigen::VectorXd::Zero(2);
  fill_default_names(p);
  const auto ranges = population_ranges(p, fit_linear(p));
  for (const auto& r : ranges) {
    EXPECT_DOUBLE_EQ(r.min, 0.0);
    EXPECT_DOUBLE_EQ(r.max, 1.0);
  }
}

TEST(Identifiability, ProfileIsConvexAndMinimalAtTheFit) {
  PopulationProblem p;
  p.j_hz.resize(3, 4);
  p.j_hz << 1.0, 9.0, 4.0, 11.0,  //
      10.0, 2.0, 5.0, 1.0,        //
      3.0, 3.0, 9.0, 6.0;
  p.j_obs_hz = Eigen::Vector3d(6.0, 5.0, 5.5);
  p.sigma_hz = Eigen::VectorXd::Constant(3, 0.5);
  p.rms_hz = Eigen::VectorXd::Zero(3);
  fill_default_names(p);
  const LinearFit f = fit_linear(p);
  const Eigen::MatrixXd c = p.centred_columns();
  for (int i = 0; i < 4; ++i) {
    double previous_slope = -INFINITY, previous = profile_chi2(c, i, 0.0);
    EXPECT_GE(previous, f.chi2 - 1e-9);
    for (int k = 1; k <= 20; ++k) {
      const double value = profile_chi2(c, i, k / 20.0);
      EXPECT_GE(value, f.chi2 - 1e-9);
      const double slope = value - previous;
      EXPECT_GE(slope, previous_slope - 1e-7);  // convex
      previous_slope = slope;
      previous = value;
    }
    EXPECT_NEAR(profile_chi2(c, i, f.weights(i)), f.chi2, 1e-8);
    // The envelope-theorem slope agrees with a central difference.
    for (double t : {0.1, 0.45, 0.8}) {
      double slope = 0;
      profile_chi2(c, i, t, nullptr, &slope);
      const double h = 1e-6;
      const double numeric = (profile_chi2(c, i, t + h) - profile_chi2(c, i, t - h)) / (2 * h);
      EXPECT_NEAR(slope, numeric, 1e-4 * std::max(1.0, std::abs(numeric))) << "population " << i << " t " << t;
    }
  }
}

}  // namespace
}  // namespace vicinal::fit
