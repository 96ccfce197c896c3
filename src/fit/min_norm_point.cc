#include "fit/min_norm_point.h"

#include <algorithm>
#include <stdexcept>

namespace vicinal::fit {

namespace {

// Relative tolerances against the largest squared column norm.
constexpr double kGapTolerance = 1e-13;
constexpr double kWeightFloor = 1e-14;

// Coefficients alpha (sum 1) of the point of least norm in the affine hull of
// the corral's columns: alpha is proportional to (ee^T + P^T P)^{-1} e, i.e.
// the least-squares solution of [e^T; P] a = e_1 (Wolfe 1976, section 4).
// Returns false when the columns are affinely dependent.
bool affine_minimizer(const Eigen::MatrixXd& c, const std::vector<int>& s, Eigen::VectorXd& alpha) {
  const int k = static_cast<int>(s.size());
  Eigen::MatrixXd b(c.rows() + 1, k);
  for (int j = 0; j < k; ++j) {
    b(0, j) = 1.0;
    b.col(j).tail(c.rows()) = c.col(s[j]);
  }
  Eigen::VectorXd rhs = Eigen::VectorXd::Zero(c.rows() + 1);
  rhs(0) = 1.0;
  Eigen::ColPivHouseholderQR<Eigen::MatrixXd> qr(b);
  qr.setThreshold(1e-12);
  if (qr.rank() < k) return false;
  Eigen::VectorXd a = qr.solve(rhs);
  const double sum = a.sum();
  if (!(std::abs(sum) > 0)) return false;
  alpha = a / sum;
  return true;
}

}  // namespace

Eigen::VectorXd HullPoint::dense_weights(int columns) const {
  Eigen::VectorXd w = Eigen::VectorXd::Zero(columns);
  for (std::size_t j = 0; j < support.size(); ++j) w(support[j]) = weight[j];
  return w;
}

HullPoint min_norm_point(const Eigen::MatrixXd& c, std::span<const int> warm_support,
                         std::span<const double> warm_weight) {
  const int n = static_cast<int>(c.cols());
  if (n == 0) throw std::logic_error("min_norm_point: no columns");
  const Eigen::VectorXd norms = c.colwise().squaredNorm();
  const double scale = std::max(norms.maxCoeff(), 1e-300);

  std::vector<int> s;
  std::vector<double> lam;
  if (!warm_support.empty() && warm_support.size() == warm_weight.size() &&
      warm_support.size() <= static_cast<std::size_t>(c.rows() + 1)) {
    double total = 0;
    for (std::size_t j = 0; j < warm_support.size(); ++j) {
      if (warm_support[j] < 0 || warm_support[j] >= n || warm_weight[j] <= 0) { s.clear(); break; }
      s.push_back(warm_support[j]);
      lam.push_back(warm_weight[j]);
      total += warm_weight[j];
    }
    for (double& l : lam) l /= total;
    // An affinely dependent warm support is caught by the first minor cycle
    // below, which then falls back to the cold start.
  }
  if (s.empty()) {
    int j0;
    norms.minCoeff(&j0);
    s = {j0};
    lam = {1.0};
  }

  auto point_of = [&] {
    Eigen::VectorXd x = Eigen::VectorXd::Zero(c.rows());
    for (std::size_t j = 0; j < s.size(); ++j) x += lam[j] * c.col(s[j]);
    return x;
  };

  // Minor cycle: move from the current point towards the affine minimiser of
  // the corral, dropping columns whose weight reaches zero, until the affine
  // minimiser lies inside the corral's hull.
  auto minor_cycle = [&]() -> bool {
    for (int guard = 0; guard < 4 * c.rows() + 8; ++guard) {
      Eigen::VectorXd alpha;
      if (!affine_minimizer(c, s, alpha)) return false;
      if (alpha.minCoeff() > kWeightFloor) {
        for (std::size_t j = 0; j < s.size(); ++j) lam[j] = alpha(j);
        return true;
      }
      double theta = 1.0;
      for (std::size_t j = 0; j < s.size(); ++j)
        if (alpha(j) <= kWeightFloor && lam[j] - alpha(j) > 0) theta = std::min(theta, lam[j] / (lam[j] - alpha(j)));
      std::vector<int> keep_s;
      std::vector<double> keep_l;
      double total = 0;
      for (std::size_t j = 0; j < s.size(); ++j) {
        const double l = (1 - theta) * lam[j] + theta * alpha(j);
        if (l > kWeightFloor) {
          keep_s.push_back(s[j]);
          keep_l.push_back(l);
          total += l;
        }
      }
      if (keep_s.empty()) return false;
      for (double& l : keep_l) l /= total;
      s = std::move(keep_s);
      lam = std::move(keep_l);
      if (s.size() == 1) return true;
    }
    return false;
  };

  HullPoint result;
  if (s.size() > 1 && !minor_cycle()) {
    int j0;
    norms.minCoeff(&j0);
    s = {j0};
    lam = {1.0};
  }
  const int limit = 100 * (n + static_cast<int>(c.rows())) + 1000;
  Eigen::VectorXd x = point_of();
  for (;;) {
    if (++result.iterations > limit) throw std::logic_error("min_norm_point: iteration limit reached");
    const Eigen::VectorXd dots = c.transpose() * x;
    int j;
    const double best = dots.minCoeff(&j);
    result.gap = x.squaredNorm() - best;
    if (result.gap <= kGapTolerance * scale) break;
    if (std::find(s.begin(), s.end(), j) != s.end()) break;  // no further progress possible numerically
    const auto saved_s = s;
    const auto saved_l = lam;
    s.push_back(j);
    lam.push_back(0.0);
    if (!minor_cycle()) {  // column affinely dependent within rounding: the current point is optimal
      s = saved_s;
      lam = saved_l;
      break;
    }
    const Eigen::VectorXd next = point_of();
    if (next.squaredNorm() >= x.squaredNorm()) {  // no decrease: rounding level reached
      s = saved_s;
      lam = saved_l;
      break;
    }
    x = next;
  }
  result.support = s;
  result.weight = lam;
  result.point = point_of();
  result.squared_norm = result.point.squaredNorm();
  const Eigen::VectorXd dots = c.transpose() * result.point;
  result.gap = std::max(0.0, result.squared_norm - dots.minCoeff());
  return result;
}

}  // namespace vicinal::fit
