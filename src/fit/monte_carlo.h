// Monte Carlo uncertainty of the populations: each draw perturbs the measured
// couplings by their sigma and every predicted J by its Karplus set's RMS error
// (independently per conformer and coupling: conformers differ in dihedral, so
// the curve's errors at their angles are treated as uncorrelated), then refits
// exactly, starting from the unperturbed solution's active set.
// Draw d uses its own generator seeded from (seed, d), so results do not depend
// on the number of threads.
#pragma once

#include <Eigen/Dense>
#include <cstdint>
#include <vector>

#include "core/progress.h"
#include "fit/linear_fit.h"
#include "fit/population_problem.h"

namespace vicinal::fit {

struct MonteCarloOptions {
  int draws = 1000;
  std::uint64_t seed = 1;
  int threads = 1;
  Progress* progress = nullptr;
};

struct PopulationSpread {
  double mean = 0, sd = 0, low95 = 0, high95 = 0;  // 2.5 % and 97.5 % quantiles
};

struct MonteCarloResult {
  std::vector<PopulationSpread> populations;  // one per conformer
  PopulationSpread chi2;
  int draws = 0;
};

MonteCarloResult monte_carlo(const PopulationProblem& problem, const LinearFit& best,
                             const MonteCarloOptions& options = {});

}  // namespace vicinal::fit
