#include "fit/nonlinear_models.h"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

#include "core/error.h"

namespace vicinal::fit {
namespace {

constexpr double kDeg = std::numbers::pi / 180;

// Synthetic three-term curves with different phases, as couplings to
// different partners across one bond would have.
double curve_value(int row, double dihedral_deg) {
  const double phase[] = {0, 120, -120, 60, -60, 180, 30, -30};
  const double t = (dihedral_deg + phase[row % 8]) * kDeg;
  const double a = 7.8 + 0.3 * row, b = -1.0, c = 1.4;
  return a * std::cos(t) * std::cos(t) + b * std::cos(t) + c;
}

PopulationProblem data_for(int m, const Eigen::VectorXd& j_obs) {
  PopulationProblem p;
  p.j_obs_hz = j_obs;
  p.sigma_hz = Eigen::VectorXd::Constant(m, 0.1);
  p.rms_hz = Eigen::VectorXd::Zero(m);
  p.j_hz = Eigen::MatrixXd::Zero(m, 3);
  fill_default_names(p);
  return p;
}

StateGeometry staggered(int m) {
  StateGeometry g;
  g.dihedral_deg.resize(m, 3);
  for (int r = 0; r < m; ++r) g.dihedral_deg.row(r) << 60.0, 180.0, -60.0;
  g.torsion.assign(m, 0);
  return g;
}

TEST(GaussHermite, AveragesCosineExactly) {
  // E[cos(s Z)] = exp(-s^2 / 2) for Z ~ N(0, 1) (characteristic function of
  // the normal distribution; common practice, no source).
  std::vector<double> x, v;
  gauss_hermite(24, x, v);
  for (double s : {0.1, 0.5, 1.0}) {
    double sum = 0;
    for (std::size_t k = 0; k < x.size(); ++k) sum += v[k] * std::cos(s * std::sqrt(2.0) * x[k]);
    EXPECT_NEAR(sum / std::sqrt(std::numbers::pi), std::exp(-s * s / 2), 1e-12);
  }
}

TEST(RotamerAngles, RecoversASharedDeviationAndPopulations) {
  const int m = 6;
  const Eigen::Vector3d w(0.5, 0.3, 0.2);
  const double dev = 7.0;
  const StateGeometry g = staggered(m);
  Eigen::VectorXd obs(m);
  for (int r = 0; r < m; ++r) {
    obs(r) = 0;
    for (int k = 0; k < 3; ++k) obs(r) += w(k) * curve_value(r, g.dihedral_deg(r, k) + dev);
  }
  const NonlinearFit f = fit_rotamer_angles(data_for(m, obs), g, curve_value);
  for (int k = 0; k < 3; ++k) {
    EXPECT_NEAR(f.weights(k), w(k), 1e-5);
    EXPECT_NEAR(f.deviation_deg(0, k), dev, 1e-3);
  }
  EXPECT_LT(f.chi2, 1e-8);
  EXPECT_EQ(f.parameters, 3);
}

// With a third harmonic in the curve (as Fourier-form sets have) per-state
// deviations become identifiable.
double fourier_curve(int row, double dihedral_deg) {
  const double t = (dihedral_deg + 40.0 * row) * kDeg;
  return 5.0 + 2.0 * std::cos(t) + 3.0 * std::cos(2 * t) + 1.5 * std::sin(3 * t) + 0.8 * std::cos(3 * t);
}

TEST(RotamerAngles, RecoversPerStateDeviationsWhenCurvesAllowIt) {
  const int m = 9;
  const Eigen::Vector3d w(0.5, 0.3, 0.2);
  const Eigen::Vector3d dev(8.0, -5.0, 4.0);
  const StateGeometry g = staggered(m);
  Eigen::VectorXd obs(m);
  for (int r = 0; r < m; ++r) {
    obs(r) = 0;
    for (int k = 0; k < 3; ++k) obs(r) += w(k) * fourier_curve(r, g.dihedral_deg(r, k) + dev(k));
  }
  RotamerAngleOptions o;
  o.shared_deviation = false;
  const NonlinearFit f = fit_rotamer_angles(data_for(m, obs), g, fourier_curve, o);
  for (int k = 0; k < 3; ++k) {
    EXPECT_NEAR(f.weights(k), w(k), 1e-4);
    EXPECT_NEAR(f.deviation_deg(0, k), dev(k), 0.01);
  }
  EXPECT_EQ(f.parameters, 5);
}

TEST(RotamerAngles, TooFewCouplingsIsAnError) {
  const StateGeometry g = staggered(2);
  EXPECT_THROW(fit_rotamer_angles(data_for(2, Eigen::Vector2d(5, 6)), g, curve_value), Error);
}

TEST(Distributions, RecoversWidthAndPopulations) {
  const int m = 6;
  const Eigen::Vector3d w(0.6, 0.25, 0.15);
  const double width = 15.0;
  const StateGeometry g = staggered(m);
  // Synthetic data by brute-force integration over the Gaussian (not the
  // quadrature the model uses).
  Eigen::VectorXd obs = Eigen::VectorXd::Zero(m);
  for (int r = 0; r < m; ++r)
    for (int k = 0; k < 3; ++k) {
      double sum = 0, norm = 0;
      for (double x = -8 * width; x <= 8 * width; x += 0.01) {
        const double p = std::exp(-x * x / (2 * width * width));
        sum += p * curve_value(r, g.dihedral_deg(r, k) + x);
        norm += p;
      }
      obs(r) += w(k) * sum / norm;
    }
  const NonlinearFit f = fit_dihedral_distributions(data_for(m, obs), g, curve_value);
  EXPECT_NEAR(f.width_deg(0), width, 0.05);
  for (int k = 0; k < 3; ++k) EXPECT_NEAR(f.weights(k), w(k), 1e-3);
  EXPECT_EQ(f.parameters, 3);
}

}  // namespace
}  // namespace vicinal::fit
