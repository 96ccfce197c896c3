// vicinal pucker rings     the ring types and their H-H relations
// vicinal pucker predict   torsions, H-H dihedrals and couplings for one (P, nu_max)
// vicinal pucker fit       two-state North/South pseudorotation fit to measured ring couplings
#include <fmt/format.h>

#include <cmath>
#include <sstream>

#include "cli/command.h"
#include "cli/result_report_output.h"
#include "core/error.h"
#include "karplus/karplus.h"
#include "pucker/pseudorotation.h"
#include "pucker/ring_couplings_csv.h"
#include "pucker/ring_model.h"
#include "pucker/two_state_fit.h"
#include "report/heatmap.h"
#include "report/pucker_section.h"
#include "report/table.h"

namespace vicinal::cli {

namespace {

using namespace vicinal::pucker;

std::string number_or_dash(double v, const char* format = "{:.2f}") {
  return std::isfinite(v) ? fmt::format(fmt::runtime(format), v) : "-";
}

Json finite_or_null(double v) { return std::isfinite(v) ? Json(v) : Json(nullptr); }

// ---------------------------------------------------------------- rings
void list_rings(const Globals& g) {
  Json doc = Json::array();
  std::string text;
  for (const auto& id : RingModel::shipped_ids()) {
    const RingModel ring = RingModel::load(id);
    Json r = {{"id", ring.id}, {"title", ring.title}, {"ring_atoms", ring.ring_atoms},
              {"karplus_set", ring.karplus_set}, {"relations_source", ring.relations_source},
              {"couplings", Json::array()}};
    report::TextTable t({"coupling", "torsion", "phi(H,H) = a nu + b", "substituents", "set"});
    for (const auto& c : ring.couplings) {
      r["couplings"].push_back({{"name", c.name}, {"nu", c.nu}, {"a", c.a}, {"b", c.b}, {"source", c.source}});
      t.add_row({c.name, fmt::format("nu{}", c.nu), fmt::format("{:.2f} nu{} {:+.1f}", c.a, c.nu, c.b),
                 fmt::format("{}", c.substituents.size()), c.karplus_set.empty() ? ring.karplus_set : c.karplus_set});
    }
    doc.push_back(r);
    text += fmt::format("{}: {}\nring atoms {}\n{}Relations: {}\n\n", ring.id, ring.title,
                        fmt::join(ring.ring_atoms, " "), t.render(), ring.relations_source);
  }
  if (g.json) g.print_json(doc);
  else g.print(text);
}

// ---------------------------------------------------------------- predict
struct PredictOptions {
  std::string ring = "deoxyribose", set;
  double phase_deg = 162, amplitude_deg = 36;
};

void predict(const PredictOptions& o, const Globals& g) {
  const RingModel ring = RingModel::load(o.ring);
  const RingCouplings model(ring, karplus::SetCatalog::shipped(), o.set);
  const auto nu = endocyclic_torsions_deg(o.phase_deg, o.amplitude_deg);
  const std::string form = ring.envelope(o.phase_deg);
  Json doc = {{"ring", ring.id}, {"phase_deg", wrap_phase_deg(o.phase_deg)}, {"amplitude_deg", o.amplitude_deg},
              {"nearest_envelope", form}, {"torsions_deg", nu}, {"couplings", Json::array()}};
  report::TextTable tn({"torsion", "atoms", "deg"});
  for (int j = 0; j < 5; ++j)
    tn.add_row({fmt::format("nu{}", j),
                fmt::format("{}-{}-{}-{}", ring.ring_atoms[(j + 4) % 5], ring.ring_atoms[j], ring.ring_atoms[(j + 1) % 5],
                            ring.ring_atoms[(j + 2) % 5]),
                fmt::format("{:.1f}", nu[j])});
  report::TextTable tc({"coupling", "phi(H,H) deg", "J Hz", "set"});
  for (std::size_t i = 0; i < ring.couplings.size(); ++i) {
    const double phi = hh_dihedral_deg(ring.couplings[i], o.phase_deg, o.amplitude_deg);
    const double j = model.j_hz(i, o.phase_deg, o.amplitude_deg);
    doc["couplings"].push_back({{"name", ring.couplings[i].name}, {"dihedral_deg", phi}, {"j_hz", j},
                                {"set", model.set(i).id}});
    tc.add_row({ring.couplings[i].name, fmt::format("{:.1f}", phi), fmt::format("{:.2f}", j), model.set(i).id});
  }
  if (g.json) return g.print_json(doc);
  g.print(fmt::format("{} at P = {:.1f} deg, nu_max = {:.1f} deg (nearest envelope {})\n\n{}\n{}", ring.title,
                      wrap_phase_deg(o.phase_deg), o.amplitude_deg, form, tn.render(), tc.render()));
}

// ---------------------------------------------------------------- fit
struct FitCommandOptions {
  std::string ring = "deoxyribose", couplings, set, fix = "amplitudes", map, report;
  bool tie = false;
  double pn = 9, ps = 162, amplitude = 36, fraction = 0.5;
  double amplitude_n = NAN, amplitude_s = NAN;
  int monte_carlo = 0;
  std::uint64_t seed = 1;
  double map_step = 6;
};

void apply_fix_list(const std::string& list, TwoStateOptions& o) {
  o.fixed.fill(false);
  std::stringstream in(list);
  std::string item;
  while (std::getline(in, item, ',')) {
    if (item == "none") continue;
    if (item == "pn") o.fixed[kPhaseN] = true;
    else if (item == "ps") o.fixed[kPhaseS] = true;
    else if (item == "amplitude-n") o.fixed[kAmplitudeN] = true;
    else if (item == "amplitude-s") o.fixed[kAmplitudeS] = true;
    else if (item == "amplitudes") o.fixed[kAmplitudeN] = o.fixed[kAmplitudeS] = true;
    else if (item == "fraction") o.fixed[kFractionS] = true;
    else
      throw Error(fmt::format("cannot fix '{}'", item), Location::field_in("", "--fix"),
                  "choose from pn, ps, amplitude-n, amplitude-s, amplitudes, fraction, none");
  }
}

std::string status_of(const TwoStateFit& fit, int p) {
  if (fit.fixed[p]) return "fixed";
  if (fit.tied_amplitudes && p == kAmplitudeS) return "tied to nu_max_N";
  return fit.at_bound[p] ? "free, at its bound" : "free";
}

Chi2Map compute_map(const FitCommandOptions& o, const RingCouplings& model,
                    const std::vector<MeasuredRingCoupling>& measured, const TwoStateOptions& options,
                    const TwoStateFit& fit, const Globals& g) {
  auto progress = g.progress();
  progress->start("chi^2 map", 1);
  Chi2Map map = chi2_map(model, measured, options, fit, o.map_step);
  progress->finish();
  return map;
}

// What the map's footnote says about the parameters not on its axes.
std::string map_note(const FitCommandOptions& o, const TwoStateFit& fit) {
  std::string others;
  for (int p : {kAmplitudeN, kAmplitudeS, kFractionS})
    others += fmt::format("{} {}; ", parameter_name(p),
                          fit.fixed[p]                                    ? "fixed"
                          : fit.tied_amplitudes && p == kAmplitudeS ? "tied to nu_max_N"
                                                                          : "refitted at each point");
  return fmt::format("{}grid step {:g} deg. Couplings from {}.", others, o.map_step, o.couplings);
}

// The couplings of the model over the whole cycle (North amplitude below
// P = 90, South above), for the report's figure.
Json cycle_curves(const RingCouplings& model, const std::vector<MeasuredRingCoupling>& measured, const TwoStateFit& fit) {
  Json phases = Json::array();
  for (double p = -90; p <= 270 + 1e-9; p += 3) phases.push_back(p);
  Json curves = Json::array();
  for (const auto& m : measured) {
    Json j = Json::array();
    for (const auto& p : phases) {
      const double phase = p.get<double>();
      j.push_back(model.j_hz(m.coupling, phase, phase < 90 ? fit.value[kAmplitudeN] : fit.value[kAmplitudeS]));
    }
    curves.push_back({{"name", model.ring().couplings[m.coupling].name}, {"j_hz", j}});
  }
  return {{"phase_deg", phases}, {"couplings", curves}};
}

void fit(const FitCommandOptions& o, const Globals& g) {
  const RingModel ring = RingModel::load(o.ring);
  const RingCouplings model(ring, karplus::SetCatalog::shipped(), o.set);
  const auto measured = read_ring_couplings(o.couplings, ring);
  TwoStateOptions options;
  apply_fix_list(o.fix, options);
  options.tie_amplitudes = o.tie;
  options.start = {o.pn, std::isfinite(o.amplitude_n) ? o.amplitude_n : o.amplitude, o.ps,
                   std::isfinite(o.amplitude_s) ? o.amplitude_s : o.amplitude, o.fraction};
  for (int p = 0; p < kParameterCount; ++p) {
    const auto b = parameter_bounds(p);
    if (options.fixed[p] && (options.start[p] < b[0] || options.start[p] > b[1]))
      throw Error(fmt::format("{} = {:g} lies outside [{:g}, {:g}]", parameter_name(p), options.start[p], b[0], b[1]),
                  Location::field_in("", "--fix"), "give a value inside the range or let it be fitted");
  }
  if (o.map_step <= 0 || o.map_step > 45)
    throw Error("the map step must lie in (0, 45] degrees", Location::field_in("", "--map-step-deg"));
  const TwoStateFit result = fit_two_state(model, measured, options);
  std::array<double, kParameterCount> sd = result.sd;
  std::string sd_source = result.covariance_ok ? "Ceres covariance at the minimum" : "unavailable";
  if (o.monte_carlo > 0) {
    auto progress = g.progress();
    progress->start("Monte Carlo", 1);
    sd = monte_carlo_sd(model, measured, options, result, o.monte_carlo, o.seed);
    progress->finish();
    sd_source = fmt::format("Monte Carlo, {} samples, seed {}", o.monte_carlo, o.seed);
  }
  const int dof = result.n - result.free_parameters;
  std::vector<std::string> fixed_names;
  for (int p = 0; p < kParameterCount; ++p)
    if (result.fixed[p]) fixed_names.push_back(fmt::format("{} = {:g}", parameter_name(p), result.value[p]));
  if (result.tied_amplitudes) fixed_names.push_back("nu_max_S = nu_max_N (tied)");

  Json doc = {{"ring", ring.id}, {"couplings_file", o.couplings}, {"chi2", result.chi2}, {"n", result.n},
              {"free_parameters", result.free_parameters}, {"degrees_of_freedom", dof},
              {"reduced_chi2", dof > 0 ? Json(result.chi2 / dof) : Json(nullptr)}, {"uncertainty_from", sd_source},
              {"constraints", fixed_names}, {"parameters", Json::object()}, {"couplings", Json::array()}};
  report::TextTable tp({"parameter", "value", "sd", "status"});
  for (int p = 0; p < kParameterCount; ++p) {
    const bool angle = p != kFractionS;
    doc["parameters"][parameter_name(p)] = {{"value", result.value[p]}, {"sd", finite_or_null(sd[p])},
                                            {"status", status_of(result, p)}};
    tp.add_row({parameter_name(p) + (angle ? " / deg" : ""), number_or_dash(result.value[p], angle ? "{:.1f}" : "{:.3f}"),
                number_or_dash(sd[p], angle ? "{:.1f}" : "{:.3f}"), status_of(result, p)});
  }
  doc["parameters"]["P_N"]["nearest_envelope"] = ring.envelope(result.value[kPhaseN]);
  doc["parameters"]["P_S"]["nearest_envelope"] = ring.envelope(result.value[kPhaseS]);
  report::TextTable tc({"coupling", "J obs", "sigma", "J North", "J South", "J calc", "obs - calc"});
  for (std::size_t i = 0; i < measured.size(); ++i) {
    const auto& m = measured[i];
    doc["couplings"].push_back({{"name", ring.couplings[m.coupling].name}, {"j_hz", m.j_hz}, {"sigma_hz", m.sigma_hz},
                                {"j_north_hz", result.j_north_hz[i]}, {"j_south_hz", result.j_south_hz[i]},
                                {"j_calc_hz", result.j_calc_hz[i]}, {"set", model.set(m.coupling).id}});
    tc.add_row({ring.couplings[m.coupling].name, fmt::format("{:.2f}", m.j_hz), fmt::format("{:.2f}", m.sigma_hz),
                fmt::format("{:.2f}", result.j_north_hz[i]), fmt::format("{:.2f}", result.j_south_hz[i]),
                fmt::format("{:.2f}", result.j_calc_hz[i]), fmt::format("{:+.2f}", m.j_hz - result.j_calc_hz[i])});
  }
  if (!o.map.empty() || !o.report.empty()) {
    // The map file and the report draw the same figure from the report's document.
    const Chi2Map map = compute_map(o, model, measured, options, result, g);
    Json report_doc = doc;
    report_doc["ring_title"] = ring.title;
    report_doc["relations_source"] = ring.relations_source;
    report_doc["map"] = {{"phase_n_deg", map.phase_n_deg}, {"phase_s_deg", map.phase_s_deg}, {"chi2", map.chi2},
                         {"note", map_note(o, result)}};
    report_doc["cycle"] = cycle_curves(model, measured, result);
    if (!o.map.empty()) {
      report::save_heatmap(report::pucker_chi2_heatmap(report_doc), o.map);
      g.note(fmt::format("chi^2 map written to {}", o.map));
    }
    if (!o.report.empty())
      save_result_report(report_doc, report::kPuckerFitFormat,
                         fmt::format("Ring puckering of the {} ring from {}", ring.id, o.couplings), o.report, g);
  }
  if (dof == 0) g.note("as many free parameters as couplings: the fit is exact by construction, chi^2 tests nothing");
  for (int p = 0; p < kParameterCount; ++p)
    if (result.at_bound[p])
      g.note(fmt::format("{} stopped at the edge of its range; its uncertainty is not meaningful", parameter_name(p)));
  if (g.json) return g.print_json(doc);

  std::string text = fmt::format("Two-state pseudorotation fit, {} ({} couplings from {})\n", ring.title, result.n,
                                 o.couplings);
  text += fmt::format("Constraints: {}\n\n", fixed_names.empty() ? "none" : fmt::format("{}", fmt::join(fixed_names, ", ")));
  text += tp.render();
  text += fmt::format("North: {}   South: {}   (nearest envelopes)\n", ring.envelope(result.value[kPhaseN]),
                      ring.envelope(result.value[kPhaseS]));
  text += fmt::format("Uncertainties: {}.\n\n", sd_source);
  text += tc.render();
  text += fmt::format("chi^2 = {:.3f} with {} degrees of freedom{}\n", result.chi2, dof,
                      dof > 0 ? fmt::format(" (reduced chi^2 {:.3f})", result.chi2 / dof) : std::string());
  text += fmt::format("Relations phi(H,H) = a nu + b: {}\n", ring.relations_source);
  g.print(text);
}

void setup(CLI::App& root, Globals& g) {
  auto& pucker = command_group(root, "pucker", "Five-membered ring puckering from ring couplings (pseudorotation)");
  pucker.footer("Phase P and amplitude nu_max describe the ring (Altona and Sundaralingam 1972);\n"
                "H-H couplings follow through phi(H,H) = a nu + b and the generalized Karplus equation.");

  auto* rings = pucker.add_subcommand("rings", "List the ring types, their couplings and H-H relations");
  rings->footer("Example: vicinal pucker rings\nRing files live in db/pucker/; each names its sources.");
  rings->callback([&g] { list_rings(g); });

  auto po = std::make_shared<PredictOptions>();
  auto* pr = pucker.add_subcommand("predict", "Torsions and couplings of one ring conformation");
  pr->add_option("--ring", po->ring, "Ring type (see 'pucker rings') or a ring file")->capture_default_str();
  pr->add_option("--phase-deg", po->phase_deg, "Phase angle P")->capture_default_str();
  pr->add_option("--amplitude-deg", po->amplitude_deg, "Puckering amplitude nu_max")->capture_default_str()
      ->check(CLI::Range(0.0, 80.0));
  pr->add_option("--set", po->set, "Karplus set for every coupling (default: the ones the ring file names)");
  pr->footer("Example: vicinal pucker predict --ring deoxyribose --phase-deg 18 --amplitude-deg 38\n"
             "P = 18 is C3'-endo (North), P = 162 C2'-endo (South).");
  pr->callback([po, &g] { predict(*po, g); });

  auto fo = std::make_shared<FitCommandOptions>();
  auto* f = pucker.add_subcommand("fit", "Fit a North/South two-state model to measured ring couplings");
  f->add_option("--ring", fo->ring, "Ring type (see 'pucker rings') or a ring file")->capture_default_str();
  f->add_option("--couplings", fo->couplings, "CSV with columns coupling, j_hz, sigma_hz")->required();
  f->add_option("--fix", fo->fix,
                "Parameters held at their given value: comma list of pn, ps, amplitude-n, amplitude-s, "
                "amplitudes, fraction, or none")->capture_default_str();
  f->add_flag("--tie-amplitudes", fo->tie, "One amplitude for both states");
  f->add_option("--pn-deg", fo->pn, "P_N: start, or value when fixed")->capture_default_str();
  f->add_option("--ps-deg", fo->ps, "P_S: start, or value when fixed")->capture_default_str();
  f->add_option("--amplitude-deg", fo->amplitude, "nu_max of both states: start, or value when fixed")
      ->capture_default_str();
  f->add_option("--amplitude-n-deg", fo->amplitude_n, "nu_max of North only");
  f->add_option("--amplitude-s-deg", fo->amplitude_s, "nu_max of South only");
  f->add_option("--fraction-s", fo->fraction, "x_S: start, or value when fixed")->capture_default_str()
      ->check(CLI::Range(0.0, 1.0));
  f->add_option("--set", fo->set, "Karplus set for every coupling (default: the ones the ring file names)");
  f->add_option("--monte-carlo", fo->monte_carlo, "Uncertainties from N refits of noisy copies instead of the covariance")
      ->check(CLI::Range(2, 100000));
  f->add_option("--seed", fo->seed, "Seed of the Monte Carlo noise")->capture_default_str();
  f->add_option("--map", fo->map, "Write chi^2 over (P_N, P_S) as a heat map (.svg, .pdf or .png)");
  f->add_option("--map-step-deg", fo->map_step, "Grid step of the map")->capture_default_str();
  f->add_option("--report", fo->report,
                "Folder for the HTML report (report.html, figures/, tables/) and pucker.json, from which "
                "`vicinal report` rebuilds it");
  f->footer("Example: vicinal pucker fit --ring deoxyribose --couplings examples/pucker/deoxy-nucleoside.csv --map chi2.svg\n"
            "The CSV has a header row: coupling,j_hz,sigma_hz (names as 'pucker rings' lists them).\n"
            "By default both amplitudes are fixed at 36 deg and P_N, P_S, x_S are fitted; with three\n"
            "couplings (ribose) also fix P_N or P_S. The fit is a model: check the chi^2 map.\n"
            "--report DIR writes an HTML page with the parameters, the chi^2 map and the couplings around the cycle.");
  f->callback([fo, &g] { fit(*fo, g); });
}

const bool registered = register_command(60, setup);

}  // namespace

}  // namespace vicinal::cli
