// Exact simulation of n coupled spin-1/2 nuclei (all 1H, count 1 each), shifts
// 0.15 ppm apart at 400 MHz so the system is strongly coupled, each spin
// coupled to its neighbours within three places.
#include <benchmark/benchmark.h>

#include "core/nuclei.h"
#include "spin/simulate.h"
#include "spin/spin_system.h"

namespace {

using namespace vicinal::spin;

SpinSystem chain(int n) {
  SpinSystem s;
  s.field_mhz = 400;
  s.observe = vicinal::NuclearTable::shipped().find("1H");
  for (int i = 0; i < n; ++i) s.groups.push_back({"S" + std::to_string(i + 1), s.observe, 1.0 + 0.15 * i, 1});
  for (int i = 0; i < n; ++i)
    for (int j = i + 1; j < n && j <= i + 3; ++j)
      s.couplings.push_back({static_cast<std::size_t>(i), static_cast<std::size_t>(j), 7.0 / (j - i) + 0.3 * i});
  return s;
}

void simulate_spins(benchmark::State& state) {
  const auto system = chain(static_cast<int>(state.range(0)));
  SimulationOptions options;
  options.threads = 1;
  options.max_block_states = 1000000;
  for (auto _ : state) {
    auto sim = simulate(system, options);
    benchmark::DoNotOptimize(sim.lines.data());
  }
}

}  // namespace

BENCHMARK(simulate_spins)->DenseRange(4, 12, 2)->Unit(benchmark::kMillisecond);
BENCHMARK_MAIN();
