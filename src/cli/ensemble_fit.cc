#include "cli/ensemble_fit.h"

#include <fmt/format.h>

#include "fit/assignments.h"
#include "fit/nonlinear_models.h"

namespace vicinal::cli {

void add_ensemble_fit_options(CLI::App& c, EnsembleFitOptions& o) {
  c.add_option("--set", o.set, "Karplus set id, or auto")->capture_default_str();
  c.add_option("--model", o.model,
               "linear (exact populations of the given conformers), rotamer-angles (populations and torsion "
               "deviations, Ceres) or distribution (populations and Gaussian torsion widths, Ceres)")
      ->capture_default_str()
      ->check(CLI::IsMember({"linear", "rotamer-angles", "distribution"}));
  c.add_option("--max-deviation-deg", o.max_deviation_deg, "Bound on torsion deviations (rotamer-angles)")
      ->capture_default_str()
      ->check(CLI::Range(0.0, 90.0));
  c.add_flag("--per-state", o.per_state,
             "One deviation/width per conformer instead of one shared (needs more couplings)");
  add_analysis_options(c, o.analysis);
  c.add_option("--svg", o.svg, "Population bar chart (.svg/.pdf/.png); observed vs predicted goes to NAME-couplings");
}

void report_linear(const LinearAnalysis& a, const EnsembleFitOptions& o, const Globals& g, const Json& extra,
                   const std::string& preface) {
  if (!o.svg.empty()) save_fit_figures(a, o.svg);
  if (g.json) {
    Json doc = analysis_json(a);
    for (auto it = extra.begin(); it != extra.end(); ++it) doc[it.key()] = it.value();
    g.print_json(doc);
  } else {
    g.print(preface + analysis_text(a));
  }
  if (!o.svg.empty()) g.note("wrote " + o.svg + " and its -couplings companion");
}

void fit_ensemble_and_report(const LoadedEnsemble& in, const MeasuredCouplings& measured, const EnsembleFitOptions& o,
                             const Globals& g, Json extra) {
  const auto assignments = enumerate_assignments(measured.list);
  std::vector<EnsembleProblem> problems;
  for (const auto& a : assignments) problems.push_back(problem_from_ensemble(in, measured, a, o.set, g.thread_count()));
  int chosen = 0;
  std::string preface;
  if (assignments.size() > 1) {
    std::vector<fit::AssignmentOption> options;
    for (std::size_t k = 0; k < assignments.size(); ++k) options.push_back({assignments[k].label, problems[k].problem});
    const auto comparison = fit::compare_assignments(options);
    chosen = comparison.best;
    extra["assignments"] = assignments_json(comparison);
    preface = assignments_text(comparison);
  }
  const EnsembleProblem& ep = problems[chosen];
  if (o.model == "linear") {
    AnalysisOptions analysis = o.analysis;
    analysis.threads = g.thread_count();
    report_linear(analyse_linear(ep.problem, analysis, g), o, g, extra, preface);
    return;
  }
  const auto geometry = state_geometry(ep);
  const auto curve = coupling_curve(ep);
  fit::NonlinearFit f;
  if (o.model == "rotamer-angles") {
    fit::RotamerAngleOptions ro;
    ro.max_deviation_deg = o.max_deviation_deg;
    ro.shared_deviation = !o.per_state;
    f = fit::fit_rotamer_angles(ep.problem, geometry, curve, ro);
  } else {
    fit::DistributionOptions d;
    d.shared_width = !o.per_state;
    f = fit::fit_dihedral_distributions(ep.problem, geometry, curve, d);
  }
  if (g.json) {
    Json doc = nonlinear_json(f, ep.problem, o.model);
    for (auto it = extra.begin(); it != extra.end(); ++it) doc[it.key()] = it.value();
    g.print_json(doc);
  } else {
    g.print(preface + nonlinear_text(f, ep.problem, o.model));
  }
}

}  // namespace vicinal::cli
