#include "fit/nonlinear_models.h"

#include <ceres/ceres.h>
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <memory>
#include <numbers>

#include "core/error.h"
#include "fit/ceres_options.h"
#include "fit/linear_fit.h"

namespace vicinal::fit {

int StateGeometry::torsions() const {
  return torsion.empty() ? 0 : *std::max_element(torsion.begin(), torsion.end()) + 1;
}

void gauss_hermite(int points, std::vector<double>& nodes, std::vector<double>& weights) {
  // Jacobi matrix of the Hermite recurrence: off-diagonal sqrt(k/2).
  Eigen::MatrixXd t = Eigen::MatrixXd::Zero(points, points);
  for (int k = 1; k < points; ++k) t(k, k - 1) = t(k - 1, k) = std::sqrt(k / 2.0);
  Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> eig(t);
  nodes.assign(points, 0);
  weights.assign(points, 0);
  for (int k = 0; k < points; ++k) {
    nodes[k] = eig.eigenvalues()(k);
    const double v = eig.eigenvectors()(0, k);
    weights[k] = std::sqrt(std::numbers::pi) * v * v;
  }
}

namespace {

// Residual of one coupling under the rotamer-angle model:
// (J_obs - sum_k u_k^2 J(ideal_k + deviation_{torsion,k})) / s.
struct RotamerAngleResidual {
  int row, states, torsion;
  bool shared;
  const StateGeometry* geometry;
  const CouplingCurve* curve;
  double j_obs_hz, s_hz;

  bool operator()(double const* const* p, double* residual) const {
    const double* u = p[0];
    double predicted = 0;
    for (int k = 0; k < states; ++k) {
      const double deviation = shared ? p[1][torsion] : p[1][torsion * states + k];
      predicted += u[k] * u[k] * (*curve)(row, geometry->dihedral_deg(row, k) + deviation);
    }
    residual[0] = (j_obs_hz - predicted) / s_hz;
    return true;
  }
};

// Residual of one coupling under the distribution model: each state's J is
// averaged over a Gaussian spread of its torsion (Gauss-Hermite quadrature).
struct DistributionResidual {
  int row, states;
  bool shared_width;
  const StateGeometry* geometry;
  const CouplingCurve* curve;
  const std::vector<double>* nodes;
  const std::vector<double>* node_weights;
  double j_obs_hz, s_hz;

  bool operator()(double const* const* p, double* residual) const {
    const double* u = p[0];
    double predicted = 0;
    for (int k = 0; k < states; ++k) {
      const double width = p[1][shared_width ? 0 : k];
      double mean = 0;
      for (std::size_t q = 0; q < nodes->size(); ++q)
        mean += (*node_weights)[q] *
                (*curve)(row, geometry->dihedral_deg(row, k) + std::sqrt(2.0) * width * (*nodes)[q]);
      predicted += u[k] * u[k] * mean / std::sqrt(std::numbers::pi);
    }
    residual[0] = (j_obs_hz - predicted) / s_hz;
    return true;
  }
};

void check_inputs(const PopulationProblem& data, const StateGeometry& g, int parameters, const char* model) {
  const int m = data.couplings(), k = static_cast<int>(g.dihedral_deg.cols());
  if (m == 0) throw Error("no measured couplings to fit");
  if (k < 2) throw Error(fmt::format("the {} model needs at least two states", model));
  if (g.dihedral_deg.rows() != m || static_cast<int>(g.torsion.size()) != m)
    throw std::logic_error("StateGeometry does not match the couplings");
  if (m < parameters)
    throw Error(fmt::format("the {} model has {} free parameters but only {} couplings were measured", model,
                            parameters, m),
                {}, "measure more couplings, or use the linear model");
  PopulationProblem probe = data;
  probe.j_hz = Eigen::MatrixXd::Zero(m, 1);
  probe.validate();
}

// Start from the exact linear fit at the ideal angles; populations floored so
// that no state starts at u = 0, where the gradient with respect to it vanishes.
std::vector<double> start_u(const PopulationProblem& data, const StateGeometry& g, const CouplingCurve& curve) {
  PopulationProblem p = data;
  p.j_hz.resize(data.couplings(), g.dihedral_deg.cols());
  for (int r = 0; r < p.j_hz.rows(); ++r)
    for (int k = 0; k < p.j_hz.cols(); ++k) p.j_hz(r, k) = curve(r, g.dihedral_deg(r, k));
  p.conformer_names.clear();
  const LinearFit f = fit_linear(p);
  std::vector<double> u(g.dihedral_deg.cols());
  double norm = 0;
  for (std::size_t k = 0; k < u.size(); ++k) {
    u[k] = std::sqrt(std::max(f.weights(k), 0.02));
    norm += u[k] * u[k];
  }
  for (double& x : u) x /= std::sqrt(norm);
  return u;
}

void solve(ceres::Problem& problem, NonlinearFit& fit, const char* model) {
  const ceres::Solver::Options options = tight_solver_options();
  ceres::Solver::Summary summary;
  ceres::Solve(options, &problem, &summary);
  fit.iterations = static_cast<int>(summary.iterations.size());
  fit.solver_report = summary.BriefReport();
  if (summary.termination_type != ceres::CONVERGENCE)
    throw Error(fmt::format("the {} fit did not converge: {}", model, summary.message), {},
                "try the linear model, or check that the couplings and states belong together");
  fit.chi2 = 2 * summary.final_cost;
}

}  // namespace

NonlinearFit fit_rotamer_angles(const PopulationProblem& data, const StateGeometry& g, const CouplingCurve& curve,
                                const RotamerAngleOptions& options) {
  const int m = data.couplings(), k = static_cast<int>(g.dihedral_deg.cols()), t = g.torsions();
  NonlinearFit fit;
  const int deviations = options.shared_deviation ? t : t * k;
  fit.parameters = (k - 1) + deviations;
  check_inputs(data, g, fit.parameters, "rotamer-angle");
  const Eigen::VectorXd s = data.total_sigma_hz();
  std::vector<double> u = start_u(data, g, curve);
  std::vector<double> deviation(deviations, 0.0);

  ceres::Problem problem;
  for (int r = 0; r < m; ++r) {
    auto* cost = new ceres::DynamicNumericDiffCostFunction<RotamerAngleResidual, ceres::CENTRAL>(
        new RotamerAngleResidual{r, k, g.torsion[r], options.shared_deviation, &g, &curve, data.j_obs_hz(r), s(r)});
    cost->AddParameterBlock(k);
    cost->AddParameterBlock(deviations);
    cost->SetNumResiduals(1);
    problem.AddResidualBlock(cost, nullptr, u.data(), deviation.data());
  }
  problem.SetManifold(u.data(), new ceres::SphereManifold<ceres::DYNAMIC>(k));
  for (int j = 0; j < deviations; ++j) {
    problem.SetParameterLowerBound(deviation.data(), j, -options.max_deviation_deg);
    problem.SetParameterUpperBound(deviation.data(), j, options.max_deviation_deg);
  }
  solve(problem, fit, "rotamer-angle");

  fit.weights.resize(k);
  for (int j = 0; j < k; ++j) fit.weights(j) = u[j] * u[j];
  fit.weights /= fit.weights.sum();
  fit.deviation_deg.resize(t, k);
  for (int b = 0; b < t; ++b)
    for (int j = 0; j < k; ++j) fit.deviation_deg(b, j) = deviation[options.shared_deviation ? b : b * k + j];
  fit.predicted_hz.resize(m);
  for (int r = 0; r < m; ++r) {
    double p = 0;
    for (int j = 0; j < k; ++j) p += fit.weights(j) * curve(r, g.dihedral_deg(r, j) + fit.deviation_deg(g.torsion[r], j));
    fit.predicted_hz(r) = p;
  }
  fit.z = (data.j_obs_hz - fit.predicted_hz).cwiseQuotient(s);
  return fit;
}

NonlinearFit fit_dihedral_distributions(const PopulationProblem& data, const StateGeometry& g,
                                        const CouplingCurve& curve, const DistributionOptions& options) {
  const int m = data.couplings(), k = static_cast<int>(g.dihedral_deg.cols());
  const int widths = options.shared_width ? 1 : k;
  NonlinearFit fit;
  fit.parameters = (k - 1) + widths;
  check_inputs(data, g, fit.parameters, "dihedral-distribution");
  const Eigen::VectorXd s = data.total_sigma_hz();
  std::vector<double> nodes, node_weights;
  gauss_hermite(options.quadrature_points, nodes, node_weights);
  std::vector<double> u = start_u(data, g, curve);
  std::vector<double> width(widths, options.start_width_deg);

  ceres::Problem problem;
  for (int r = 0; r < m; ++r) {
    auto* cost = new ceres::DynamicNumericDiffCostFunction<DistributionResidual, ceres::CENTRAL>(
        new DistributionResidual{r, k, options.shared_width, &g, &curve, &nodes, &node_weights, data.j_obs_hz(r), s(r)});
    cost->AddParameterBlock(k);
    cost->AddParameterBlock(widths);
    cost->SetNumResiduals(1);
    problem.AddResidualBlock(cost, nullptr, u.data(), width.data());
  }
  problem.SetManifold(u.data(), new ceres::SphereManifold<ceres::DYNAMIC>(k));
  for (int j = 0; j < widths; ++j) {
    problem.SetParameterLowerBound(width.data(), j, options.min_width_deg);
    problem.SetParameterUpperBound(width.data(), j, options.max_width_deg);
  }
  solve(problem, fit, "dihedral-distribution");

  fit.weights.resize(k);
  for (int j = 0; j < k; ++j) fit.weights(j) = u[j] * u[j];
  fit.weights /= fit.weights.sum();
  fit.width_deg.resize(k);
  for (int j = 0; j < k; ++j) fit.width_deg(j) = width[options.shared_width ? 0 : j];
  fit.predicted_hz.resize(m);
  for (int r = 0; r < m; ++r) {
    std::vector<double*> blocks{u.data(), width.data()};
    DistributionResidual residual{r, k, options.shared_width, &g, &curve, &nodes, &node_weights, data.j_obs_hz(r), s(r)};
    double z = 0;
    residual(blocks.data(), &z);
    fit.predicted_hz(r) = data.j_obs_hz(r) - z * s(r);
  }
  fit.z = (data.j_obs_hz - fit.predicted_hz).cwiseQuotient(s);
  return fit;
}

}  // namespace vicinal::fit
