// Goodness of a population fit and a plain-language verdict.
#pragma once

#include <string>
#include <vector>

#include "fit/linear_fit.h"
#include "fit/population_problem.h"

namespace vicinal::fit {

struct CouplingMisfit {
  int coupling = 0;           // 0-based row
  double z = 0;               // residual / s at the best fit
  bool unreachable = false;   // outside [min_i J_ri, max_i J_ri] by more than 2 s: no mixture can reach it
};

struct Goodness {
  double chi2 = 0;
  int dof = 0;                    // couplings - (conformers with weight > 0 - 1); may be <= 0
  double reduced_chi2 = 0;        // chi2 / dof when dof > 0
  double p_value = 1;             // P(chi-square(dof) > chi2) when dof > 0
  double rmsd_hz = 0;             // unweighted root-mean-square residual
  std::vector<CouplingMisfit> misfits;  // couplings off by more than 2 s
  bool acceptable = true;         // no misfit and p >= 0.05
  std::string verdict;            // one or more sentences for people
};

Goodness assess_fit(const PopulationProblem& problem, const LinearFit& fit);

}  // namespace vicinal::fit
