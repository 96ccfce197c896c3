#include "fit/identifiability.h"

#include <algorithm>
#include <cmath>
#include <limits>

#include "fit/statistics.h"

namespace vicinal::fit {

MatrixConditioning conditioning(const PopulationProblem& problem) {
  problem.validate();
  const Eigen::MatrixXd a = problem.total_sigma_hz().cwiseInverse().asDiagonal() * problem.j_hz;
  Eigen::JacobiSVD<Eigen::MatrixXd> svd(a);
  MatrixConditioning c;
  c.couplings = problem.couplings();
  c.conformers = problem.conformers();
  const auto& sv = svd.singularValues();
  const double largest = sv.size() ? sv(0) : 0;
  const double threshold = largest * 1e-10 * std::max(a.rows(), a.cols());
  double smallest = largest;
  for (int k = 0; k < sv.size(); ++k) {
    c.singular_values.push_back(sv(k));
    if (sv(k) > threshold) {
      ++c.rank;
      smallest = sv(k);
    }
  }
  c.condition_number = smallest > 0 ? largest / smallest : 0;
  return c;
}

double range_delta_chi2(double confidence) { return chi2_quantile(confidence, 1.0); }

double profile_chi2(const Eigen::MatrixXd& c, int i, double t, HullPoint* warm, double* slope) {
  const int n = static_cast<int>(c.cols());
  if (t >= 1.0 || n == 1) {
    if (slope) *slope = std::numeric_limits<double>::quiet_NaN();
    return c.col(i).squaredNorm();
  }
  Eigen::MatrixXd q(c.rows(), n - 1);
  for (int j = 0, k = 0; j < n; ++j)
    if (j != i) q.col(k++) = t * c.col(i) + (1 - t) * c.col(j);
  HullPoint h = warm && !warm->support.empty() ? min_norm_point(q, warm->support, warm->weight) : min_norm_point(q);
  const double value = h.squared_norm;
  if (slope) *slope = 2 * h.point.dot(c.col(i) - h.point) / (1 - t);
  if (warm) *warm = std::move(h);
  return value;
}

namespace {

// Where the convex profile crosses `threshold` between `inside` (g <= threshold)
// and `outside` (g > threshold), starting from `start` (an outside point, at
// best near the crossing) with `warm` as the solver's first guess: Newton
// steps while they land inside the bracket, bisection otherwise. From an
// outside point of a convex function Newton's steps stay outside and converge
// from one side and the error after a step is of the order of the step
// squared, so the search stops when a step moves less than `tol`, when the
// bracket is below `tol`, or when g meets the threshold to rounding.
double crossing(const Eigen::MatrixXd& c, int i, double inside, double outside, double start, HullPoint warm,
                double threshold, double tol) {
  double t = start, slope = std::numeric_limits<double>::quiet_NaN();
  double g = profile_chi2(c, i, t, &warm, &slope);
  (g <= threshold ? inside : outside) = t;
  for (int step = 0; step < 200 && std::abs(outside - inside) > tol; ++step) {
    if (std::abs(g - threshold) <= 1e-11 * std::max(1.0, threshold)) return t;
    double next = std::isfinite(slope) && slope != 0 ? t - (g - threshold) / slope : NAN;
    if (!(next > std::min(inside, outside) && next < std::max(inside, outside))) next = 0.5 * (inside + outside);
    const bool small_step = std::abs(next - t) < tol;
    t = next;
    g = profile_chi2(c, i, t, &warm, &slope);
    (g <= threshold ? inside : outside) = t;
    if (small_step) return t;
  }
  return inside;
}

// The optimal hull point's support with column i removed (indices as in the
// profile's matrix of n - 1 columns), weights renormalised: the solver's
// first guess near t = 0.
HullPoint without_column(const HullPoint& best, int i) {
  HullPoint warm;
  double total = 0;
  for (std::size_t k = 0; k < best.support.size(); ++k) {
    if (best.support[k] == i) continue;
    warm.support.push_back(best.support[k] < i ? best.support[k] : best.support[k] - 1);
    warm.weight.push_back(best.weight[k]);
    total += best.weight[k];
  }
  for (double& w : warm.weight) w /= total;
  if (warm.support.empty()) warm.weight.clear();
  return warm;
}

}  // namespace

std::vector<PopulationRange> population_ranges(const PopulationProblem& problem, const LinearFit& best,
                                               const RangeOptions& options) {
  const Eigen::MatrixXd c = problem.centred_columns();
  const int n = static_cast<int>(c.cols());
  const double threshold = best.chi2 + range_delta_chi2(options.confidence);
  std::vector<PopulationRange> ranges(n);
  if (n == 1) return ranges;  // one conformer: its population is 1 by definition
  const Eigen::VectorXd& x = best.hull.point;
  for (int i = 0; i < n; ++i) {
    const double t_best = best.weights(i);
    PopulationRange r{t_best, t_best};
    const HullPoint warm = without_column(best.hull, i);
    // A conformer outside the optimal support can vanish at no cost: g(0) = chi2_min.
    const double g0 = t_best > 0 ? profile_chi2(c, i, 0.0) : best.chi2;
    r.min = g0 <= threshold ? 0.0 : crossing(c, i, t_best, 0.0, 0.0, warm, threshold, options.tolerance);
    const double g1 = c.col(i).squaredNorm();
    double start = 1.0;
    if (t_best == 0) {
      // g is convex with g(0) = chi2_min and slope g'(0) = 2 x.(c_i - x) (x the
      // optimal point), so g(t) >= chi2_min + g'(0) t: the threshold is not
      // reached before delta / g'(0), an outside point close to the crossing.
      const double slope0 = 2 * x.dot(c.col(i) - x);
      if (slope0 > 0) start = std::min(1.0, (threshold - best.chi2) / slope0);
    }
    r.max = g1 <= threshold ? 1.0
                            : crossing(c, i, t_best, 1.0, start, start < 1.0 ? warm : HullPoint{}, threshold,
                                       options.tolerance);
    ranges[i] = r;
  }
  return ranges;
}

}  // namespace vicinal::fit
