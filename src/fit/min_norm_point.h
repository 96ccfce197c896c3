// The point of smallest Euclidean norm in the convex hull of the columns of a
// matrix, by Wolfe's finite active-set algorithm (P. Wolfe, "Finding the
// nearest point in a polytope", Math. Programming 11, 128-149, 1976).
//
// Why this algorithm: with sum w = 1 the population fit
//   min |A w - b|^2, w >= 0, sum w = 1
// equals min |(A - b 1^T) w|^2 over the simplex, i.e. the nearest point to the
// origin in the hull of the columns of C = A - b 1^T. Wolfe's method keeps a
// "corral" of affinely independent columns, so it is exact (no penalty weight
// for the equality) and stays well posed when conformers outnumber couplings
// and the Hessian C^T C is singular. Each corral has at most rows + 1 columns.
#pragma once

#include <Eigen/Dense>
#include <span>
#include <vector>

namespace vicinal::fit {

struct HullPoint {
  std::vector<int> support;   // column indices with positive weight
  std::vector<double> weight; // their weights, summing to 1
  Eigen::VectorXd point;      // sum of weight * column
  double squared_norm = 0;    // |point|^2
  // Optimality gap |x|^2 - min_j c_j.x (>= 0; 0 at the optimum, where every
  // column satisfies c_j.x >= |x|^2: the KKT conditions on the simplex).
  double gap = 0;
  int iterations = 0;

  Eigen::VectorXd dense_weights(int columns) const;
};

// `warm_support`/`warm_weight`: a previous solution to start from (e.g. for a
// slightly perturbed matrix); ignored when unusable. Throws std::logic_error
// only on an internal failure (iteration limit), never on user data.
HullPoint min_norm_point(const Eigen::MatrixXd& columns, std::span<const int> warm_support = {},
                         std::span<const double> warm_weight = {});

}  // namespace vicinal::fit
