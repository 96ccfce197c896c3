// The exact population fit and its Monte Carlo, on random problems of the
// sizes met in practice and beyond (conformers x couplings).
#include <benchmark/benchmark.h>

#include <random>

#include "fit/linear_fit.h"
#include "fit/monte_carlo.h"
#include "fit/population_problem.h"

namespace {

using vicinal::fit::PopulationProblem;

// J of each conformer uniform in 0..12 Hz; the measured J are a mixture of
// five conformers plus 2 Hz noise, which puts them outside the hull: chi2 > 0
// and the optimum has a small support.
PopulationProblem random_problem(int conformers, int couplings) {
  std::mt19937_64 rng(4);
  std::uniform_real_distribution<double> j(0.0, 12.0);
  std::normal_distribution<double> noise(0.0, 2.0);
  PopulationProblem p;
  p.j_hz.resize(couplings, conformers);
  for (int c = 0; c < conformers; ++c)
    for (int r = 0; r < couplings; ++r) p.j_hz(r, c) = j(rng);
  p.j_obs_hz = Eigen::VectorXd::Zero(couplings);
  for (int c = 0; c < 5; ++c) p.j_obs_hz += 0.2 * p.j_hz.col((c * 7919) % conformers);
  for (int r = 0; r < couplings; ++r) p.j_obs_hz(r) += noise(rng);
  p.sigma_hz = Eigen::VectorXd::Constant(couplings, 0.3);
  p.rms_hz = Eigen::VectorXd::Constant(couplings, 0.4);
  vicinal::fit::fill_default_names(p);
  return p;
}

// Arguments: conformers, couplings.
void exact_fit(benchmark::State& state) {
  const auto p = random_problem(static_cast<int>(state.range(0)), static_cast<int>(state.range(1)));
  for (auto _ : state) {
    auto fit = vicinal::fit::fit_linear(p);
    benchmark::DoNotOptimize(fit.chi2);
  }
}

// Arguments: conformers, couplings; 200 draws on one thread.
void monte_carlo(benchmark::State& state) {
  const auto p = random_problem(static_cast<int>(state.range(0)), static_cast<int>(state.range(1)));
  const auto best = vicinal::fit::fit_linear(p);
  vicinal::fit::MonteCarloOptions options;
  options.draws = 200;
  for (auto _ : state) {
    auto mc = vicinal::fit::monte_carlo(p, best, options);
    benchmark::DoNotOptimize(mc.chi2.mean);
  }
  state.SetItemsProcessed(state.iterations() * options.draws);
}

}  // namespace

BENCHMARK(exact_fit)->ArgsProduct({{10, 100, 1000, 10000}, {10, 40, 160}})->Unit(benchmark::kMillisecond);
BENCHMARK(monte_carlo)->ArgsProduct({{10, 100, 1000}, {40}})->Unit(benchmark::kMillisecond);
BENCHMARK_MAIN();
