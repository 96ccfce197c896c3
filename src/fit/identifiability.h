// How well the couplings determine the populations: rank and condition number
// of the scaled J matrix, and for each population the interval it can span
// while the fit stays statistically acceptable.
//
// Range of population i: { w_i : w in simplex, chi^2(w) <= chi^2_min + delta },
// delta = chi-square quantile with 1 degree of freedom at the stated confidence
// (3.841 at 95%): the profile-likelihood interval of one population.
// It is computed exactly through g(t) = min { chi^2(w) : w in simplex, w_i = t },
// which is convex in t: for t < 1, g(t) is the squared distance from the origin
// to the hull of the columns t c_i + (1 - t) c_j (j != i), one more exact
// nearest-point problem. Its slope follows from the envelope theorem,
// g'(t) = 2 x.(c_i - x) / (1 - t) with x the nearest point, so each end of the
// interval (where g crosses the threshold, on either side of the optimum) is
// found by Newton steps kept inside a shrinking bracket (bisection fallback).
#pragma once

#include <Eigen/Dense>
#include <vector>

#include "fit/linear_fit.h"
#include "fit/population_problem.h"

namespace vicinal::fit {

struct MatrixConditioning {
  int rank = 0;                 // numerical rank of the s-scaled J matrix
  double condition_number = 0;  // largest / smallest non-zero singular value
  std::vector<double> singular_values;
  int conformers = 0, couplings = 0;
};

MatrixConditioning conditioning(const PopulationProblem& problem);

struct PopulationRange {
  double min = 0, max = 1;
};

struct RangeOptions {
  double confidence = 0.95;
  double tolerance = 1e-6;   // on the population
};

// delta chi^2 for one population at `confidence`.
double range_delta_chi2(double confidence);

// Ranges of every population around `best` (the exact fit of `problem`).
std::vector<PopulationRange> population_ranges(const PopulationProblem& problem, const LinearFit& best,
                                               const RangeOptions& options = {});

// g(t) above, for population i (exposed for tests); `slope` receives g'(t)
// for t < 1 (NaN at t = 1).
double profile_chi2(const Eigen::MatrixXd& centred, int i, double t, HullPoint* warm = nullptr,
                    double* slope = nullptr);

}  // namespace vicinal::fit
