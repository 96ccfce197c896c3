// Stereo-unassigned nuclei (diastereotopic protons whose labels are not known)
// give several concrete assignments of the measured couplings. Each is fitted
// exactly; the comparison reports each chi^2 and which the data prefer.
// With equal prior odds the relative probability of assignment a is
// exp(-chi2_a / 2) / sum_b exp(-chi2_b / 2) (the likelihood of the best fit
// under Gaussian errors, with the same number of populations for each).
#pragma once

#include <string>
#include <vector>

#include "fit/linear_fit.h"
#include "fit/population_problem.h"

namespace vicinal::fit {

struct AssignmentOption {
  std::string label;            // e.g. "H-6a=13, H-6b=14"
  PopulationProblem problem;
};

struct AssignmentScore {
  std::string label;
  LinearFit fit;
  double delta_chi2 = 0;          // chi2 - best chi2
  double likelihood_ratio = 1;    // best likelihood / this likelihood = exp(delta_chi2 / 2)
  double probability = 0;         // with equal priors
};

struct AssignmentComparison {
  std::vector<AssignmentScore> scores;  // in the order given
  int best = 0;
  std::string verdict;
};

AssignmentComparison compare_assignments(const std::vector<AssignmentOption>& options);

}  // namespace vicinal::fit
