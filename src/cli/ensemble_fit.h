// The fit of measured couplings over a loaded ensemble, shared by
// `vicinal fit --ensemble` and `vicinal rotamers`: every assignment of '|'
// alternatives is predicted and compared, then the preferred one is analysed
// with the chosen model and printed (tables or JSON, optional figures).
#pragma once

#include <string>

#include "cli/command.h"
#include "cli/fit_inputs.h"
#include "cli/fit_report.h"

namespace vicinal::cli {

struct EnsembleFitOptions {
  std::string set = predict::kAutoSet;
  std::string model = "linear";  // linear | rotamer-angles | distribution
  double max_deviation_deg = 20;
  bool per_state = false;
  std::string svg;
  AnalysisOptions analysis;
};

// Adds --set, --model, --max-deviation-deg, --per-state, --svg and the analysis options.
void add_ensemble_fit_options(CLI::App& c, EnsembleFitOptions& o);

void fit_ensemble_and_report(const LoadedEnsemble& in, const MeasuredCouplings& measured, const EnsembleFitOptions& o,
                             const Globals& g, Json extra = Json::object());

// Prints a linear analysis (and writes figures) with optional extra JSON keys and text before it.
void report_linear(const LinearAnalysis& a, const EnsembleFitOptions& o, const Globals& g, const Json& extra,
                   const std::string& preface);

}  // namespace vicinal::cli
