// One whole analysis, from measured couplings to the analysis document that
// `vicinal report` renders: the measurements go into a fresh library and are
// read back from it, every candidate's conformers are loaded (or generated
// when the file is missing), couplings are back-calculated, populations
// fitted, candidates ranked, a multiplet analysed, and every coupling turned
// into its allowed dihedral angles. `vicinal demo` runs it on the shipped
// scenario (examples/demo/scenario.json); the scenario file format:
//   title, couplings (library CSV, relative to the scenario), compound (its
//   name in that CSV), candidates [{name, smiles, conformers (relative to the
//   data folder)}], optional multiplet {proton, peaks (CSV of position_ppm or
//   position_hz, optional intensity)}, optional key_dihedral [4 labels],
//   optional side_chain {ring_atom, branch_atom, side_atom, end_atom,
//   other_ring_atom} (gg/gt/tg as for hexopyranose C-6 rotamers), optional
//   depict_labels [labels drawn on the structure].
#pragma once

#include <filesystem>
#include <string>

#include "cli/command.h"

namespace vicinal::cli {

struct ScenarioRun {
  std::filesystem::path scenario;  // scenario.json
  std::filesystem::path out_dir;   // library, regenerated conformers
  int draws = 1000;                // Monte Carlo draws for population intervals
};

// The analysis document (report/analysis_report.h). Progress goes to stderr
// through `g`; vicinal::Error for bad scenario files or data.
Json run_scenario_analysis(const ScenarioRun& run, const Globals& g);

}  // namespace vicinal::cli
