// Nonlinear population models solved with Ceres:
//  - rotamer angles: each state's torsions may deviate from their ideal
//    (staggered) values by a bounded amount, fitted with the populations;
//  - dihedral distributions: each state is a Gaussian spread of its torsions
//    about the ideal value, with a fitted width, instead of a single angle.
// The coupling curve J(row, dihedral) comes in as a callback, so this module
// does not depend on any particular Karplus implementation.
// Populations are w_k = u_k^2 with |u| = 1 (Ceres' sphere manifold): they stay
// non-negative and sum to one without penalty terms.
// A fit that Ceres does not report as converged is a vicinal::Error.
#pragma once

#include <Eigen/Dense>
#include <functional>
#include <string>
#include <vector>

#include "fit/population_problem.h"

namespace vicinal::fit {

// J in Hz of coupling `row` (0-based) at dihedral `dihedral_deg` of its path.
using CouplingCurve = std::function<double(int row, double dihedral_deg)>;

struct StateGeometry {
  Eigen::MatrixXd dihedral_deg;  // couplings x states: ideal dihedral of each coupling's path in each state
  // couplings: the torsion (bond, 0-based) each coupling's path turns with.
  // Paths across one bond rotate together: a deviation applies to all of them.
  std::vector<int> torsion;
  int torsions() const;
};

struct RotamerAngleOptions {
  double max_deviation_deg = 20;  // bound on each deviation from the ideal torsion
  // One deviation per torsion shared by all states (a uniformly skewed
  // staggering), else one per torsion and state. Why shared is the default:
  // a three-term Karplus curve is a combination of 1, cos t, sin t, cos 2t and
  // sin 2t, so however many couplings are measured across one bond they fix at
  // most four numbers per bond; three populations and three free angles (five
  // parameters) cannot all be determined. Per-state deviations need curves
  // with higher harmonics (Fourier sets) or several torsions.
  bool shared_deviation = true;
};

struct DistributionOptions {
  bool shared_width = true;       // one width for every state, else one per state
  double min_width_deg = 1, max_width_deg = 60, start_width_deg = 12;
  int quadrature_points = 24;     // Gauss-Hermite nodes for the average over each distribution
};

struct NonlinearFit {
  Eigen::VectorXd weights;        // one per state
  Eigen::MatrixXd deviation_deg;  // torsions x states (rotamer-angle model; columns equal if shared)
  Eigen::VectorXd width_deg;      // one per state (distribution model; equal if shared)
  Eigen::VectorXd predicted_hz, z;
  double chi2 = 0;
  int parameters = 0;             // free parameters (populations count K - 1)
  int iterations = 0;
  std::string solver_report;      // Ceres' brief report
};

// `data` supplies J_obs, sigma, rms and names; its j_hz is ignored.
NonlinearFit fit_rotamer_angles(const PopulationProblem& data, const StateGeometry& geometry,
                                const CouplingCurve& curve, const RotamerAngleOptions& options = {});

NonlinearFit fit_dihedral_distributions(const PopulationProblem& data, const StateGeometry& geometry,
                                        const CouplingCurve& curve, const DistributionOptions& options = {});

// Nodes x_k and weights v_k with sum_k v_k f(x_k) ~ integral f(x) exp(-x^2) dx
// (Golub-Welsch); E[f(mu + sigma Z)] = sum_k v_k / sqrt(pi) f(mu + sqrt(2) sigma x_k).
void gauss_hermite(int points, std::vector<double>& nodes, std::vector<double>& weights);

}  // namespace vicinal::fit
