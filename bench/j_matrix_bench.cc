// Dihedrals from coordinates plus the conformer x coupling J matrix, for a
// synthetic ensemble (random coordinates; the four atoms of each coupling are
// consecutive, as in a chain).
#include <benchmark/benchmark.h>

#include <random>
#include <vector>

#include "karplus/karplus.h"
#include "predict/j_matrix.h"

namespace {

using vicinal::predict::CouplingSpec;

constexpr int kAtoms = 400;

std::vector<double> random_frames(std::size_t frames) {
  std::mt19937_64 rng(2);
  std::uniform_real_distribution<double> coord(-20.0, 20.0);
  std::vector<double> xyz(frames * kAtoms * 3);
  for (double& v : xyz) v = coord(rng);
  return xyz;
}

std::vector<CouplingSpec> chain_specs(int couplings) {
  const auto& set = vicinal::karplus::SetCatalog::shipped().find("hn-ha-hu-bax-1997");
  std::vector<CouplingSpec> specs(static_cast<std::size_t>(couplings));
  for (int k = 0; k < couplings; ++k) {
    const int first = 1 + (4 * k) % (kAtoms - 4);
    specs[k].path = {first, first + 1, first + 2, first + 3};
    specs[k].bond_path = specs[k].path;
    specs[k].nuclei = {first, first + 3};
    specs[k].set = &set;
  }
  return specs;
}

// Arguments: frames, couplings.
void j_matrix(benchmark::State& state) {
  const auto frames = static_cast<std::size_t>(state.range(0));
  const auto xyz = random_frames(frames);
  const auto specs = chain_specs(static_cast<int>(state.range(1)));
  for (auto _ : state) {
    auto m = vicinal::predict::compute_j_matrix(specs, xyz, kAtoms, 1);
    benchmark::DoNotOptimize(m.j_hz.data());
  }
  state.SetItemsProcessed(state.iterations() * state.range(0) * state.range(1));
}

}  // namespace

BENCHMARK(j_matrix)->ArgsProduct({{100, 1000, 10000}, {10, 40, 160}})->Unit(benchmark::kMillisecond);
BENCHMARK_MAIN();
