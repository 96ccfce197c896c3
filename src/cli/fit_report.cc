#include "cli/fit_report.h"

#include <fmt/format.h>

#include <filesystem>

#include "report/plot.h"
#include "report/table.h"

namespace vicinal::cli {

namespace {

std::string fixed(double v, int digits) { return fmt::format("{:.{}f}", v, digits); }

}  // namespace

void add_analysis_options(CLI::App& c, AnalysisOptions& o) {
  c.add_option("--draws", o.draws, "Monte Carlo draws for population uncertainties (0 = none)")
      ->capture_default_str()
      ->check(CLI::Range(0, 1000000));
  c.add_option("--seed", o.seed, "Seed of the Monte Carlo draws (same seed, same numbers)")->capture_default_str();
  c.add_option("--confidence", o.confidence,
               "Confidence of the population ranges (chi-square, 1 degree of freedom)")
      ->capture_default_str()
      ->check(CLI::Range(0.5, 0.9999));
}

LinearAnalysis analyse_linear(const fit::PopulationProblem& problem, const AnalysisOptions& o, const Globals& g) {
  LinearAnalysis a;
  a.problem = problem;
  fit::fill_default_names(a.problem);
  a.options = o;
  a.fit = fit::fit_linear(a.problem);
  a.conditioning = fit::conditioning(a.problem);
  a.delta_chi2 = fit::range_delta_chi2(o.confidence);
  a.ranges = fit::population_ranges(a.problem, a.fit, {o.confidence});
  if (o.draws > 0) {
    auto progress = g.progress();
    fit::MonteCarloOptions mc{o.draws, o.seed, g.thread_count(), progress.get()};
    a.monte_carlo = fit::monte_carlo(a.problem, a.fit, mc);
  }
  a.goodness = fit::assess_fit(a.problem, a.fit);
  return a;
}

Json analysis_json(const LinearAnalysis& a) {
  const auto& p = a.problem;
  Json doc;
  doc["model"] = "linear";
  doc["populations"] = Json::array();
  for (int i = 0; i < p.conformers(); ++i) {
    Json row = {{"conformer", p.conformer_names[i]},
                {"weight", a.fit.weights(i)},
                {"range", {a.ranges[i].min, a.ranges[i].max}}};
    if (a.monte_carlo) {
      const auto& s = a.monte_carlo->populations[i];
      row["sd"] = s.sd;
      row["mean"] = s.mean;
      row["ci95"] = {s.low95, s.high95};
    } else {
      row["sd"] = nullptr;
      row["ci95"] = nullptr;
    }
    // Small ensembles (rotamers): each conformer's predicted couplings, in coupling order.
    if (p.conformers() <= 20) row["j_hz"] = std::vector<double>(p.j_hz.col(i).data(), p.j_hz.col(i).data() + p.couplings());
    doc["populations"].push_back(row);
  }
  doc["chi2"] = a.fit.chi2;
  doc["dof"] = a.goodness.dof;
  doc["reduced_chi2"] = a.goodness.dof > 0 ? Json(a.goodness.reduced_chi2) : Json(nullptr);
  doc["p_value"] = a.goodness.dof > 0 ? Json(a.goodness.p_value) : Json(nullptr);
  doc["rmsd_hz"] = a.goodness.rmsd_hz;
  doc["acceptable"] = a.goodness.acceptable;
  doc["verdict"] = a.goodness.verdict;
  doc["residuals"] = Json::array();
  const Eigen::VectorXd s = p.total_sigma_hz();
  for (int r = 0; r < p.couplings(); ++r)
    doc["residuals"].push_back({{"coupling", p.coupling_names[r]},
                                {"j_obs_hz", p.j_obs_hz(r)},
                                {"j_calc_hz", a.fit.predicted_hz(r)},
                                {"residual_hz", a.fit.residual_hz(r)},
                                {"sigma_total_hz", s(r)},
                                {"z", a.fit.z(r)}});
  doc["weights_unique"] = a.fit.weights_unique;
  doc["identifiability"] = {{"rank", a.conditioning.rank},
                            {"condition_number", a.conditioning.condition_number},
                            {"singular_values", a.conditioning.singular_values},
                            {"confidence", a.options.confidence},
                            {"delta_chi2", a.delta_chi2}};
  doc["kkt"] = {{"gap", a.fit.kkt_gap}, {"stationarity", a.fit.kkt_stationarity}};
  if (a.monte_carlo)
    doc["monte_carlo"] = {{"draws", a.monte_carlo->draws},
                          {"seed", a.options.seed},
                          {"chi2_mean", a.monte_carlo->chi2.mean}};
  return doc;
}

std::string analysis_text(const LinearAnalysis& a) {
  const auto& p = a.problem;
  report::TextTable pops({"conformer", "weight", "sd (MC)", "95% MC interval",
                          fmt::format("range at chi2 + {:.2f}", a.delta_chi2)});
  for (int i = 0; i < p.conformers(); ++i) {
    std::string sd = "-", ci = "-";
    if (a.monte_carlo) {
      const auto& s = a.monte_carlo->populations[i];
      sd = fixed(s.sd, 3);
      ci = fmt::format("{:.3f} - {:.3f}", s.low95, s.high95);
    }
    pops.add_row({p.conformer_names[i], fixed(a.fit.weights(i), 3), sd, ci,
                  fmt::format("{:.3f} - {:.3f}", a.ranges[i].min, a.ranges[i].max)});
  }
  report::TextTable res({"coupling", "J obs / Hz", "J calc / Hz", "obs - calc", "s / Hz", "z"});
  const Eigen::VectorXd s = p.total_sigma_hz();
  for (int r = 0; r < p.couplings(); ++r)
    res.add_row({p.coupling_names[r], fixed(p.j_obs_hz(r), 2), fixed(a.fit.predicted_hz(r), 2),
                 fixed(a.fit.residual_hz(r), 2), fixed(s(r), 2), fixed(a.fit.z(r), 2)});
  std::string text = pops.render() + "\n" + res.render();
  text += fmt::format("\nchi2 = {:.4g}", a.fit.chi2);
  if (a.goodness.dof > 0)
    text += fmt::format(" with {} degrees of freedom (reduced {:.3g}, p = {:.3g})", a.goodness.dof,
                        a.goodness.reduced_chi2, a.goodness.p_value);
  text += fmt::format("; RMSD {:.2f} Hz\n", a.goodness.rmsd_hz);
  text += fmt::format("J matrix (scaled by s): rank {} of {} conformers, condition number {:.3g}{}\n",
                      a.conditioning.rank, a.conditioning.conformers, a.conditioning.condition_number,
                      a.fit.weights_unique ? "; the best populations are unique"
                                           : "; the best populations are not unique: read the ranges");
  text += fmt::format("Ranges: every population compatible with chi2 <= chi2_min + {:.2f} ({:g}% confidence, 1 "
                      "degree of freedom).\n",
                      a.delta_chi2, 100 * a.options.confidence);
  if (a.monte_carlo)
    text += fmt::format("Monte Carlo: {} draws (seed {}), measured J perturbed by sigma and predicted J by the "
                        "Karplus set's RMS error.\n",
                        a.monte_carlo->draws, a.options.seed);
  text += a.goodness.verdict + "\n";
  return text;
}

Json nonlinear_json(const fit::NonlinearFit& f, const fit::PopulationProblem& p, const std::string& model) {
  Json doc = {{"model", model}, {"chi2", f.chi2}, {"parameters", f.parameters}, {"populations", Json::array()},
              {"residuals", Json::array()}, {"solver", f.solver_report}};
  for (int k = 0; k < f.weights.size(); ++k) {
    Json row = {{"conformer", p.conformer_names[k]}, {"weight", f.weights(k)}};
    if (f.deviation_deg.size()) {
      std::vector<double> d(f.deviation_deg.rows());
      for (int t = 0; t < f.deviation_deg.rows(); ++t) d[t] = f.deviation_deg(t, k);
      row["deviation_deg"] = d;
    }
    if (f.width_deg.size()) row["width_deg"] = f.width_deg(k);
    doc["populations"].push_back(row);
  }
  double sum2 = 0;
  for (int r = 0; r < p.couplings(); ++r) {
    const double res = p.j_obs_hz(r) - f.predicted_hz(r);
    sum2 += res * res;
    doc["residuals"].push_back({{"coupling", p.coupling_names[r]}, {"j_obs_hz", p.j_obs_hz(r)},
                                {"j_calc_hz", f.predicted_hz(r)}, {"residual_hz", res}, {"z", f.z(r)}});
  }
  doc["rmsd_hz"] = std::sqrt(sum2 / p.couplings());
  return doc;
}

std::string nonlinear_text(const fit::NonlinearFit& f, const fit::PopulationProblem& p, const std::string& model) {
  const bool angles = f.deviation_deg.size() > 0;
  report::TextTable t({"conformer", "weight", angles ? "deviation / deg" : "width / deg"});
  for (int k = 0; k < f.weights.size(); ++k) {
    std::string extra;
    if (angles)
      for (int b = 0; b < f.deviation_deg.rows(); ++b) extra += (b ? ", " : "") + fmt::format("{:+.1f}", f.deviation_deg(b, k));
    else
      extra = fixed(f.width_deg(k), 1);
    t.add_row({p.conformer_names[k], fixed(f.weights(k), 3), extra});
  }
  report::TextTable res({"coupling", "J obs / Hz", "J calc / Hz", "z"});
  for (int r = 0; r < p.couplings(); ++r)
    res.add_row({p.coupling_names[r], fixed(p.j_obs_hz(r), 2), fixed(f.predicted_hz(r), 2), fixed(f.z(r), 2)});
  return t.render() + "\n" + res.render() +
         fmt::format("\n{} model: chi2 = {:.4g} with {} free parameters for {} couplings; Ceres: {}\n", model, f.chi2,
                     f.parameters, p.couplings(), f.solver_report);
}

Json assignments_json(const fit::AssignmentComparison& c) {
  Json list = Json::array();
  for (const auto& s : c.scores)
    list.push_back({{"assignment", s.label}, {"chi2", s.fit.chi2}, {"delta_chi2", s.delta_chi2},
                    {"likelihood_ratio", s.likelihood_ratio}, {"probability", s.probability}});
  return {{"options", list}, {"best", c.scores[c.best].label}, {"verdict", c.verdict}};
}

std::string assignments_text(const fit::AssignmentComparison& c) {
  report::TextTable t({"assignment", "chi2", "delta chi2", "likelihood ratio", "probability"});
  for (const auto& s : c.scores)
    t.add_row({s.label, fmt::format("{:.4g}", s.fit.chi2), fmt::format("{:.3g}", s.delta_chi2),
               fmt::format("{:.3g}", s.likelihood_ratio), fixed(s.probability, 3)});
  return "Stereo-unassigned nuclei, every assignment fitted:\n" + t.render() + c.verdict + "\n\n";
}

void save_fit_figures(const LinearAnalysis& a, const std::string& path) {
  const auto& p = a.problem;
  report::Figure bars;
  bars.title = "Fitted populations";
  bars.x_label = "conformer";
  bars.y_label = "population";
  bars.y_range = {{0.0, 1.0}};
  report::Series s;
  s.label = "exact fit";
  s.style = report::Series::Style::Bars;
  for (int i = 0; i < p.conformers(); ++i) {
    s.x.push_back(i + 1);
    s.y.push_back(a.fit.weights(i));
    bars.x_ticks.push_back(i + 1);
    bars.x_tick_labels.push_back(p.conformer_names[i]);
    if (a.monte_carlo) {
      s.error_low.push_back(a.monte_carlo->populations[i].low95);
      s.error_high.push_back(a.monte_carlo->populations[i].high95);
    }
  }
  bars.series.push_back(s);
  bars.footnote = a.monte_carlo ? fmt::format("Error bars: 95% Monte Carlo interval ({} draws, seed {}).",
                                              a.monte_carlo->draws, a.options.seed)
                                : "No Monte Carlo draws: no error bars.";

  report::Figure obs;
  obs.title = "Observed vs predicted couplings";
  obs.x_label = "J observed / Hz";
  obs.y_label = "J predicted / Hz";
  report::Series pts;
  pts.label = "couplings";
  pts.style = report::Series::Style::Points;
  const Eigen::VectorXd sig = p.total_sigma_hz();
  double lo = 0, hi = 1;
  for (int r = 0; r < p.couplings(); ++r) {
    pts.x.push_back(p.j_obs_hz(r));
    pts.y.push_back(a.fit.predicted_hz(r));
    pts.error_low.push_back(a.fit.predicted_hz(r) - sig(r));
    pts.error_high.push_back(a.fit.predicted_hz(r) + sig(r));
    lo = std::min({lo, p.j_obs_hz(r), a.fit.predicted_hz(r) - sig(r)});
    hi = std::max({hi, p.j_obs_hz(r), a.fit.predicted_hz(r) + sig(r)});
  }
  report::Series diagonal{"observed = predicted", {lo, hi}, {lo, hi}, report::Series::Style::Line};
  diagonal.dashed = true;
  obs.series = {diagonal, pts};
  obs.footnote = "Error bars: s = sqrt(sigma^2 + Karplus RMS^2).";

  std::filesystem::path second(path);
  second.replace_filename(second.stem().string() + "-couplings" + second.extension().string());
  report::save_figure(bars, path);
  report::save_figure(obs, second);
}

}  // namespace vicinal::cli
