#include "fit/linear_fit.h"

#include <gtest/gtest.h>

#include <random>

#include "core/error.h"

namespace vicinal::fit {
namespace {

PopulationProblem random_problem(int m, int n, unsigned seed, double noise_hz) {
  std::mt19937 rng(seed);
  std::uniform_real_distribution<double> j(0.5, 11.0);
  std::normal_distribution<double> e(0.0, 1.0);
  PopulationProblem p;
  p.j_hz.resize(m, n);
  for (int r = 0; r < m; ++r)
    for (int i = 0; i < n; ++i) p.j_hz(r, i) = j(rng);
  Eigen::VectorXd w = Eigen::VectorXd::Zero(n);
  for (int i = 0; i < std::min(n, 3); ++i) w(i * (n / 3 > 0 ? n / 3 : 1) % n) += (i + 1) / 6.0;
  p.j_obs_hz = p.j_hz * w;
  for (int r = 0; r < m; ++r) p.j_obs_hz(r) += noise_hz * e(rng);
  p.sigma_hz = Eigen::VectorXd::Constant(m, 0.3);
  p.rms_hz = Eigen::VectorXd::Constant(m, 0.4);
  fill_default_names(p);
  return p;
}

// Euclidean projection onto the simplex (Held, Wolfe, Crowder 1974 sorting rule).
Eigen::VectorXd project_simplex(Eigen::VectorXd v) {
  std::vector<double> u(v.data(), v.data() + v.size());
  std::sort(u.rbegin(), u.rend());
  double cumulative = 0, tau = 0;
  for (std::size_t k = 0; k < u.size(); ++k) {
    cumulative += u[k];
    const double t = (cumulative - 1) / (k + 1);
    if (u[k] - t > 0) tau = t;
  }
  return (v.array() - tau).max(0.0).matrix();
}

// An independent, slow reference: accelerated projected gradient (FISTA).
double reference_chi2(const PopulationProblem& p) {
  const Eigen::MatrixXd c = p.centred_columns();
  const Eigen::MatrixXd h = 2 * c.transpose() * c;
  const double step = 1.0 / Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd>(h).eigenvalues().maxCoeff();
  Eigen::VectorXd w = Eigen::VectorXd::Constant(p.conformers(), 1.0 / p.conformers()), y = w;
  double t = 1;
  for (int it = 0; it < 200000; ++it) {
    const Eigen::VectorXd next = project_simplex(y - step * h * y);
    const double t_next = (1 + std::sqrt(1 + 4 * t * t)) / 2;
    y = next + ((t - 1) / t_next) * (next - w);
    w = next;
    t = t_next;
  }
  return (c * w).squaredNorm();
}

TEST(LinearFit, RecoversKnownPopulationsFromExactData) {
  PopulationProblem p = random_problem(6, 3, 7, 0.0);
  const LinearFit f = fit_linear(p);
  EXPECT_NEAR(f.weights(0), 1.0 / 6, 1e-9);
  EXPECT_NEAR(f.weights(1), 2.0 / 6, 1e-9);
  EXPECT_NEAR(f.weights(2), 3.0 / 6, 1e-9);
  EXPECT_NEAR(f.chi2, 0.0, 1e-12);
  EXPECT_TRUE(f.weights_unique);
}

TEST(LinearFit, SatisfiesKktAndMatchesSlowReference) {
  for (unsigned seed : {1u, 2u, 3u}) {
    for (auto [m, n] : {std::pair{4, 12}, std::pair{8, 5}, std::pair{3, 40}}) {
      PopulationProblem p = random_problem(m, n, seed, 1.5);
      const LinearFit f = fit_linear(p);
      EXPECT_NEAR(f.weights.sum(), 1.0, 1e-12);
      EXPECT_GE(f.weights.minCoeff(), 0.0);
      // KKT: gradient equal on the support and not smaller anywhere else.
      const Eigen::MatrixXd c = p.centred_columns();
      const Eigen::VectorXd g = 2 * c.transpose() * (c * f.weights);
      const double mu = g.minCoeff();
      for (int i = 0; i < n; ++i)
        if (f.weights(i) > 1e-10) {
          EXPECT_NEAR(g(i), mu, 1e-8 * std::max(1.0, std::abs(mu)));
        }
      EXPECT_LT(f.kkt_gap, 1e-10);
      EXPECT_LT(f.kkt_stationarity, 1e-8);
      EXPECT_NEAR(f.chi2, chi2_of(p, f.weights), 1e-9);
      const double ref = reference_chi2(p);
      EXPECT_LE(f.chi2, ref * (1 + 1e-9) + 1e-12) << "seed " << seed << " m " << m << " n " << n;
      EXPECT_NEAR(f.chi2, ref, 1e-6 * std::max(1.0, ref));
    }
  }
}

TEST(LinearFit, WarmStartGivesTheSameOptimum) {
  PopulationProblem p = random_problem(10, 60, 11, 1.0);
  const LinearFit cold = fit_linear(p);
  p.j_obs_hz(0) += 0.3;
  const LinearFit warm = fit_linear(p, &cold);
  const LinearFit fresh = fit_linear(p);
  EXPECT_NEAR(warm.chi2, fresh.chi2, 1e-10 * std::max(1.0, fresh.chi2));
}

TEST(LinearFit, IdenticalConformersAreNotUnique) {
  PopulationProblem p = random_problem(5, 3, 5, 0.0);
  p.j_hz.col(2) = p.j_hz.col(1);
  p.j_obs_hz = p.j_hz * Eigen::Vector3d(0.5, 0.25, 0.25);
  const LinearFit f = fit_linear(p);
  // Only the sum of the twins is determined (the data are built so that they carry weight).
  ASSERT_GT(f.weights(1) + f.weights(2), 1e-6);
  EXPECT_FALSE(f.weights_unique);
}

TEST(LinearFit, SingleConformerHasWeightOne) {
  PopulationProblem p = random_problem(4, 1, 3, 0.5);
  const LinearFit f = fit_linear(p);
  EXPECT_DOUBLE_EQ(f.weights(0), 1.0);
  EXPECT_NEAR(f.chi2, chi2_of(p, f.weights), 1e-12);
}

TEST(LinearFit, ZeroUncertaintyIsAnError) {
  PopulationProblem p = random_problem(4, 3, 3, 0.5);
  p.sigma_hz.setZero();
  p.rms_hz.setZero();
  EXPECT_THROW(fit_linear(p), Error);
}

TEST(LinearFit, EmptyEnsembleIsAnError) {
  PopulationProblem p = random_problem(4, 3, 3, 0.5);
  p.j_hz.resize(4, 0);
  EXPECT_THROW(fit_linear(p), Error);
}

}  // namespace
}  // namespace vicinal::fit
