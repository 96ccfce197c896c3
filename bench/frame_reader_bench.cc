// The fast frame reader on a generated multi-model PDB (carbon atoms on a
// jittered grid), by frame count. The file is written once to the temporary
// folder and removed at exit.
#include <benchmark/benchmark.h>

#include <cstdio>
#include <filesystem>
#include <fstream>
#include <random>
#include <string>
#include <vector>

#include "structure/frame_reader.h"

namespace {

constexpr int kAtoms = 4000;

std::string write_trajectory(int frames) {
  const auto path = std::filesystem::temp_directory_path() /
                    ("vicinal-bench-" + std::to_string(frames) + ".pdb");
  std::ofstream out(path);
  std::mt19937_64 rng(3);
  std::normal_distribution<double> jitter(0.0, 0.1);
  char line[96];
  for (int f = 0; f < frames; ++f) {
    std::snprintf(line, sizeof line, "MODEL     %4d\n", f + 1);
    out << line;
    for (int a = 0; a < kAtoms; ++a) {
      const double x = (a % 16) * 1.5 + jitter(rng), y = (a / 16 % 16) * 1.5 + jitter(rng),
                   z = (a / 256) * 1.5 + jitter(rng);
      std::snprintf(line, sizeof line, "ATOM  %5d  CA  ALA A%4d    %8.3f%8.3f%8.3f  1.00  0.00           C\n",
                    a + 1, a / 10 + 1, x, y, z);
      out << line;
    }
    out << "ENDMDL\n";
  }
  return path.string();
}

void stream_pdb(benchmark::State& state) {
  const int frames = static_cast<int>(state.range(0));
  const std::string path = write_trajectory(frames);
  const std::vector<int> atomic_numbers(kAtoms, 6);
  double sink = 0;
  for (auto _ : state) {
    vicinal::structure::stream_frames(path, atomic_numbers,
                                      [&](std::size_t, std::span<const double> xyz) { sink += xyz[0]; });
  }
  benchmark::DoNotOptimize(sink);
  state.SetItemsProcessed(state.iterations() * frames);
  state.SetBytesProcessed(state.iterations() * static_cast<std::int64_t>(std::filesystem::file_size(path)));
  std::filesystem::remove(path);
}

}  // namespace

BENCHMARK(stream_pdb)->Arg(10)->Arg(50)->Arg(200)->Unit(benchmark::kMillisecond);
BENCHMARK_MAIN();
