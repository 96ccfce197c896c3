#include "fit/linear_fit.h"

#include <algorithm>

namespace vicinal::fit {

LinearFit fit_linear_centred(const Eigen::MatrixXd& c, const Eigen::VectorXd& j_obs_hz,
                             const Eigen::VectorXd& s, const HullPoint* warm) {
  LinearFit fit;
  fit.hull = warm ? min_norm_point(c, warm->support, warm->weight) : min_norm_point(c);
  const int n = static_cast<int>(c.cols());
  fit.weights = fit.hull.dense_weights(n);
  const Eigen::VectorXd& x = fit.hull.point;   // = (predicted - observed) / s
  fit.chi2 = fit.hull.squared_norm;
  fit.z = -x;
  fit.residual_hz = fit.z.cwiseProduct(s);
  fit.predicted_hz = j_obs_hz - fit.residual_hz;
  fit.iterations = fit.hull.iterations;
  fit.kkt_gap = fit.hull.gap;

  const Eigen::VectorXd g = 2.0 * (c.transpose() * x);  // gradient of |Cw|^2
  const double mu = g.minCoeff();
  for (int j : fit.hull.support) fit.kkt_stationarity = std::max(fit.kkt_stationarity, g(j) - mu);

  // Candidate columns of any optimum: c_j.x within rounding of |x|^2.
  const double scale = std::max(1.0, c.colwise().squaredNorm().maxCoeff());
  std::vector<int> face;
  for (int j = 0; j < n; ++j)
    if (g(j) - mu <= 1e-9 * scale) face.push_back(j);
  if (static_cast<int>(face.size()) <= c.rows() + 1) {
    Eigen::MatrixXd b(c.rows() + 1, static_cast<int>(face.size()));
    for (std::size_t k = 0; k < face.size(); ++k) {
      b(0, k) = 1.0;
      b.col(k).tail(c.rows()) = c.col(face[k]);
    }
    Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr(b);
    qr.setThreshold(1e-10);
    fit.weights_unique = qr.rank() == static_cast<int>(face.size());
  }
  return fit;
}

LinearFit fit_linear(const PopulationProblem& problem, const LinearFit* warm) {
  problem.validate();
  return fit_linear_centred(problem.centred_columns(), problem.j_obs_hz, problem.total_sigma_hz(),
                            warm ? &warm->hull : nullptr);
}

double chi2_of(const PopulationProblem& problem, const Eigen::VectorXd& weights) {
  const Eigen::VectorXd r = (problem.j_obs_hz - problem.j_hz * weights).cwiseQuotient(problem.total_sigma_hz());
  return r.squaredNorm();
}

}  // namespace vicinal::fit
