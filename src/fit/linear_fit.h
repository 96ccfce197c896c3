// The exact linear population fit: chi^2(w) = sum_r ((J_obs_r - sum_i w_i J_ri) / s_r)^2
// minimised over w_i >= 0, sum w_i = 1 (global optimum; the problem is convex).
#pragma once

#include <Eigen/Dense>
#include <vector>

#include "fit/min_norm_point.h"
#include "fit/population_problem.h"

namespace vicinal::fit {

struct LinearFit {
  Eigen::VectorXd weights;        // one per conformer, >= 0, sum 1
  Eigen::VectorXd predicted_hz;   // sum_i w_i J_ri
  Eigen::VectorXd residual_hz;    // J_obs - predicted
  Eigen::VectorXd z;              // residual / s
  double chi2 = 0;
  // KKT on the simplex: with g = grad chi^2 and mu = min_j g_j, every g_j >= mu
  // and g_j = mu wherever w_j > 0. Both violations are reported (chi^2 units).
  double kkt_stationarity = 0;     // max over the support of g_j - mu
  double kkt_gap = 0;              // Wolfe gap |x|^2 - min_j c_j.x
  // True when the optimal weights are unique: the columns that can carry
  // weight at the optimum (c_j.x = |x|^2) are affinely independent.
  bool weights_unique = false;
  int iterations = 0;
  HullPoint hull;                 // the solver state (warm starts)
};

// `warm` (optional): a previous fit of a similar problem to start from.
LinearFit fit_linear(const PopulationProblem& problem, const LinearFit* warm = nullptr);

// The same from precomputed centred columns C (see PopulationProblem) and s.
LinearFit fit_linear_centred(const Eigen::MatrixXd& centred, const Eigen::VectorXd& j_obs_hz,
                             const Eigen::VectorXd& total_sigma_hz, const HullPoint* warm = nullptr);

// chi^2 of given weights (not necessarily optimal).
double chi2_of(const PopulationProblem& problem, const Eigen::VectorXd& weights);

}  // namespace vicinal::fit
