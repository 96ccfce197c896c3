#include "fit/monte_carlo.h"

#include <algorithm>
#include <atomic>
#include <cmath>
#include <random>
#include <thread>

#include "core/error.h"

namespace vicinal::fit {

namespace {

// SplitMix64 step: decorrelates the per-draw seeds derived from (seed, d).
std::uint64_t mix(std::uint64_t z) {
  z += 0x9e3779b97f4a7c15ULL;
  z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
  z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
  return z ^ (z >> 31);
}

PopulationSpread spread(std::vector<double> values) {
  PopulationSpread s;
  const double n = static_cast<double>(values.size());
  for (double v : values) s.mean += v;
  s.mean /= n;
  for (double v : values) s.sd += (v - s.mean) * (v - s.mean);
  s.sd = values.size() > 1 ? std::sqrt(s.sd / (n - 1)) : 0;
  std::sort(values.begin(), values.end());
  // Linear interpolation between order statistics (the common "type 7" rule).
  auto quantile = [&](double p) {
    const double h = (n - 1) * p;
    const auto lo = static_cast<std::size_t>(std::floor(h));
    const auto hi = std::min(lo + 1, values.size() - 1);
    return values[lo] + (h - lo) * (values[hi] - values[lo]);
  };
  s.low95 = quantile(0.025);
  s.high95 = quantile(0.975);
  return s;
}

}  // namespace

MonteCarloResult monte_carlo(const PopulationProblem& problem, const LinearFit& best,
                             const MonteCarloOptions& options) {
  if (options.draws < 2) throw Error("Monte Carlo needs at least 2 draws", Location::field_in("", "--draws"));
  problem.validate();
  const int m = problem.couplings(), n = problem.conformers(), draws = options.draws;
  const Eigen::VectorXd s = problem.total_sigma_hz();
  const Eigen::VectorXd s_inv = s.cwiseInverse();
  Eigen::MatrixXd weights(n, draws);
  std::vector<double> chi2(draws);
  std::atomic<int> next{0}, done{0};
  if (options.progress) options.progress->start("Monte Carlo draws", draws);

  auto worker = [&](bool reports) {  // progress only from the calling thread
    Eigen::VectorXd obs(m);
    Eigen::MatrixXd c(m, n);
    for (int d = next++; d < draws; d = next++) {
      std::mt19937_64 rng(mix(options.seed ^ mix(static_cast<std::uint64_t>(d))));
      std::normal_distribution<double> normal(0.0, 1.0);
      for (int r = 0; r < m; ++r) obs(r) = problem.j_obs_hz(r) + problem.sigma_hz(r) * normal(rng);
      for (int i = 0; i < n; ++i)
        for (int r = 0; r < m; ++r) {
          const double curve = problem.rms_hz(r) > 0 ? problem.rms_hz(r) * normal(rng) : 0.0;
          c(r, i) = (problem.j_hz(r, i) + curve - obs(r)) * s_inv(r);
        }
      const LinearFit f = fit_linear_centred(c, obs, s, &best.hull);
      weights.col(d) = f.weights;
      chi2[d] = f.chi2;
      ++done;
      if (reports && options.progress) options.progress->advance(done);
    }
  };
  const int threads = std::max(1, std::min(options.threads, draws));
  std::vector<std::thread> pool;
  for (int t = 1; t < threads; ++t) pool.emplace_back(worker, false);
  worker(true);
  for (auto& t : pool) t.join();
  if (options.progress) options.progress->finish();

  MonteCarloResult result;
  result.draws = draws;
  for (int i = 0; i < n; ++i)
    result.populations.push_back(spread(std::vector<double>(weights.row(i).begin(), weights.row(i).end())));
  result.chi2 = spread(chi2);
  return result;
}

}  // namespace vicinal::fit
