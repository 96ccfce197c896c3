// Spectrum of the observed isotope of a spin system.
//
// Nuclei of the observed isotope are treated exactly: H = sum nu_i Iz_i +
// sum J_ij I_i.I_j (Hz) in the product basis, split into blocks of equal total
// Fz and diagonalised block by block; lines are the F- transitions with
// intensity |<f|F-|i>|^2. Each group of magnetically equivalent nuclei enters
// as composite spins (its total-spin components, each with its multiplicity),
// so `count` shrinks the basis and the mutual coupling inside a group, which is
// constant within each component, drops out by construction.
// Other isotopes are weakly coupled: each combination of their m values shifts
// the observed frequencies by sum J m, weighted by how many states share it.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "spin/spin_system.h"

namespace vicinal::spin {

struct Line {
  double hz = 0;         // from 0 ppm, at the observed isotope's frequency
  double ppm = 0;
  double intensity = 0;  // all lines sum to the number of observed nuclei
};

struct SimulationOptions {
  std::vector<std::string> decouple;       // isotopes whose couplings are removed
  double merge_tolerance_hz = 1e-3;        // lines closer than this become one
  double min_relative_intensity = 1e-6;    // weaker lines (vs the strongest) are dropped
  std::size_t max_block_states = 2000;     // larger Fz blocks are refused (time and memory)
  int threads = 0;                         // blocks diagonalised in parallel; 0 = all cores
};

struct Simulation {
  std::vector<Line> lines;             // ascending in hz
  double observe_mhz = 0;
  std::size_t largest_block = 0;       // states in the largest Fz block diagonalised
  std::size_t heteronuclear_states = 1;  // distinct heteronuclear m combinations used
};

Simulation simulate(const SpinSystem& system, const SimulationOptions& options = {});

// Sorts lines and merges those within `tolerance_hz` (intensity-weighted position).
std::vector<Line> merge_lines(std::vector<Line> lines, double tolerance_hz);

}  // namespace vicinal::spin
