#include "fit/monte_carlo.h"

#include <gtest/gtest.h>

namespace vicinal::fit {
namespace {

PopulationProblem two_states(double sigma_hz, double rms_hz) {
  PopulationProblem p;
  p.j_hz.resize(1, 2);
  p.j_hz << 0.0, 10.0;
  p.j_obs_hz = Eigen::VectorXd::Constant(1, 4.0);
  p.sigma_hz = Eigen::VectorXd::Constant(1, sigma_hz);
  p.rms_hz = Eigen::VectorXd::Constant(1, rms_hz);
  fill_default_names(p);
  return p;
}

TEST(MonteCarlo, SpreadMatchesErrorPropagation) {
  // w2 = J_obs / 10 while inside (0, 1): sd(w2) = sigma / 10 = 0.05.
  const PopulationProblem p = two_states(0.5, 0.0);
  const LinearFit f = fit_linear(p);
  MonteCarloOptions o;
  o.draws = 4000;
  o.seed = 42;
  const auto mc = monte_carlo(p, f, o);
  EXPECT_NEAR(mc.populations[1].mean, 0.4, 0.005);
  EXPECT_NEAR(mc.populations[1].sd, 0.05, 0.005);
  EXPECT_NEAR(mc.populations[1].low95, 0.4 - 1.96 * 0.05, 0.01);
  EXPECT_NEAR(mc.populations[1].high95, 0.4 + 1.96 * 0.05, 0.01);
}

TEST(MonteCarlo, CurveErrorWidensTheSpread) {
  // With rms on both predicted J values the spread grows (delta method:
  // w2 = (J_obs - J1) / (J2 - J1), sd^2 ~ (s_obs^2 + (1-w)^2 rms^2 + w^2 rms^2) / 100).
  const PopulationProblem p = two_states(0.5, 0.5);
  MonteCarloOptions o;
  o.draws = 4000;
  const auto mc = monte_carlo(p, fit_linear(p), o);
  const double expected = std::sqrt(0.25 + 0.36 * 0.25 + 0.16 * 0.25) / 10;
  EXPECT_NEAR(mc.populations[1].sd, expected, 0.1 * expected);
}

TEST(MonteCarlo, ReproducibleWithASeedAndIndependentOfThreads) {
  PopulationProblem p;
  p.j_hz = Eigen::MatrixXd::Random(5, 20).array() * 5 + 6;
  p.j_obs_hz = p.j_hz.col(3) * 0.5 + p.j_hz.col(7) * 0.5;
  p.sigma_hz = Eigen::VectorXd::Constant(5, 0.4);
  p.rms_hz = Eigen::VectorXd::Constant(5, 0.6);
  fill_default_names(p);
  const LinearFit f = fit_linear(p);
  MonteCarloOptions o;
  o.draws = 300;
  o.seed = 7;
  const auto a = monte_carlo(p, f, o);
  o.threads = 2;
  const auto b = monte_carlo(p, f, o);
  o.seed = 8;
  const auto c = monte_carlo(p, f, o);
  bool differs = false;
  for (int i = 0; i < 20; ++i) {
    EXPECT_EQ(a.populations[i].mean, b.populations[i].mean);
    EXPECT_EQ(a.populations[i].high95, b.populations[i].high95);
    differs |= a.populations[i].mean != c.populations[i].mean;
  }
  EXPECT_TRUE(differs);
}

}  // namespace
}  // namespace vicinal::fit
