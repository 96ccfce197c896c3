// Karplus forward evaluation on arrays of dihedrals (the j_hz span overload).
#include <benchmark/benchmark.h>

#include <random>
#include <vector>

#include "karplus/karplus.h"

namespace {

using vicinal::karplus::SetCatalog;

void karplus_array(benchmark::State& state, const char* set_id) {
  const auto& set = SetCatalog::shipped().find(set_id);
  std::mt19937_64 rng(1);
  std::uniform_real_distribution<double> angle(-180.0, 180.0);
  std::vector<double> dihedral_deg(static_cast<std::size_t>(state.range(0)));
  for (double& d : dihedral_deg) d = angle(rng);
  std::vector<double> out(dihedral_deg.size());
  for (auto _ : state) {
    vicinal::karplus::j_hz(set, dihedral_deg, out);
    benchmark::DoNotOptimize(out.data());
  }
  state.SetItemsProcessed(state.iterations() * state.range(0));
}

}  // namespace

BENCHMARK_CAPTURE(karplus_array, three_term, "hn-ha-hu-bax-1997")->RangeMultiplier(10)->Range(1000, 1000000);
BENCHMARK_CAPTURE(karplus_array, haasnoot, "hh-haasnoot-1980-general")->RangeMultiplier(10)->Range(1000, 1000000);
BENCHMARK_MAIN();
