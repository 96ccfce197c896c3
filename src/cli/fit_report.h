// The analysis behind `vicinal fit` and `vicinal rotamers` (exact fit,
// identifiability, Monte Carlo, goodness of fit) and its three renderings:
// text tables, JSON and SVG figures.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "cli/command.h"
#include "fit/assignments.h"
#include "fit/goodness.h"
#include "fit/identifiability.h"
#include "fit/linear_fit.h"
#include "fit/monte_carlo.h"
#include "fit/nonlinear_models.h"

namespace vicinal::cli {

struct AnalysisOptions {
  int draws = 1000;
  std::uint64_t seed = 1;
  double confidence = 0.95;
  int threads = 1;
};

struct LinearAnalysis {
  fit::PopulationProblem problem;
  fit::LinearFit fit;
  fit::MatrixConditioning conditioning;
  std::vector<fit::PopulationRange> ranges;
  std::optional<fit::MonteCarloResult> monte_carlo;
  fit::Goodness goodness;
  double delta_chi2 = 0;
  AnalysisOptions options;
};

LinearAnalysis analyse_linear(const fit::PopulationProblem& problem, const AnalysisOptions& options, const Globals& g);

// Adds the CLI options shared by fit and rotamers.
void add_analysis_options(CLI::App& c, AnalysisOptions& o);

Json analysis_json(const LinearAnalysis& a);
std::string analysis_text(const LinearAnalysis& a);

Json nonlinear_json(const fit::NonlinearFit& f, const fit::PopulationProblem& p, const std::string& model);
std::string nonlinear_text(const fit::NonlinearFit& f, const fit::PopulationProblem& p, const std::string& model);

Json assignments_json(const fit::AssignmentComparison& c);
std::string assignments_text(const fit::AssignmentComparison& c);

// Population bars (with Monte Carlo 95 % intervals) to `path`, and observed
// vs predicted couplings to the same name with "-couplings" before the extension.
void save_fit_figures(const LinearAnalysis& a, const std::string& path);

}  // namespace vicinal::cli
