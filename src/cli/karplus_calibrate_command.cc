// vicinal karplus calibrate   fit Karplus coefficients to (J, dihedral) pairs,
//                             or self-consistently to several coupling types per site
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <sstream>

#include "calibrate/calibration_points.h"
#include "calibrate/karplus_calibration.h"
#include "calibrate/library_points.h"
#include "calibrate/self_consistent.h"
#include "calibrate/set_file.h"
#include "cli/command.h"
#include "cli/library_common.h"
#include "cli/result_report_output.h"
#include "core/error.h"
#include "report/calibration_section.h"
#include "report/self_consistent_section.h"
#include "report/table.h"

namespace vicinal::cli {

namespace {

using namespace vicinal::calibrate;

struct Options {
  std::string points, sites, form = "three-term", like, loss = "squared", compare, id, out, title, report;
  int order = 2, bootstrap_samples = 200;
  double offset_deg = NAN, loss_scale = 2.0;
  std::uint64_t seed = 1;
  bool from_library = false;
  library::FindQuery query;
  double default_sigma_hz = NAN;
};

std::string num(double v, const char* f = "{:.3f}") { return std::isfinite(v) ? fmt::format(fmt::runtime(f), v) : "-"; }
Json finite_or_null(double v) { return std::isfinite(v) ? Json(v) : Json(nullptr); }

std::vector<std::string> split_commas(const std::string& text) {
  std::vector<std::string> out;
  std::stringstream in(text);
  std::string item;
  while (std::getline(in, item, ','))
    if (!item.empty()) out.push_back(item);
  return out;
}

// The library filters as one readable phrase for the provenance.
std::string describe_query(const library::FindQuery& q) {
  std::string text = "bonds 3";
  if (!q.nuclei.empty()) text += ", nuclei " + q.nuclei;
  if (!q.smarts.empty()) text += ", smarts " + q.smarts;
  if (!q.name.empty()) text += ", name " + q.name;
  return text;
}

// The pairs and a description of where they came from: the CSV, or the
// library (path and query), with a note per coupling left out.
struct Input {
  std::vector<CalibrationPoint> points;
  std::string description;
  Json library_points = nullptr;
};

Input read_input(const Options& o, const Globals& g) {
  if (!o.from_library) return {read_calibration_points(o.points), o.points};
  if (std::isfinite(o.default_sigma_hz) && !(o.default_sigma_hz > 0))
    throw Error("the default sigma must be positive", Location::field_in("", "--default-sigma-hz"));
  auto lib = open_library(g);
  const auto sigma = std::isfinite(o.default_sigma_hz) ? std::optional<double>(o.default_sigma_hz) : std::nullopt;
  LibraryPoints found = points_from_library(lib->db(), o.query, sigma, lib->path());
  for (const auto& why : found.skipped) g.note("skipped " + why);
  Input in{std::move(found.points), fmt::format("library {} (query: {})", lib->path(), describe_query(o.query)),
           Json::array()};
  for (std::size_t i = 0; i < in.points.size(); ++i) {
    const auto& at = found.origins[i];
    in.library_points.push_back({{"compound", at.compound}, {"nuclei", at.nuclei}, {"path", at.path},
                                 {"j_hz", in.points[i].j_hz}, {"sigma_hz", in.points[i].sigma_hz},
                                 {"sigma_defaulted", at.sigma_defaulted}, {"dihedral_deg", in.points[i].dihedral_deg}});
  }
  return in;
}

// Published sets to judge on the same data: those named, or every shipped set
// for the same nuclei and angle that needs no substituents.
std::vector<const karplus::ParameterSet*> sets_to_compare(const Options& o, const NewSet& shape) {
  const auto& catalog = karplus::SetCatalog::shipped();
  std::vector<const karplus::ParameterSet*> out;
  if (!o.compare.empty()) {
    for (const auto& id : split_commas(o.compare)) out.push_back(&catalog.find(id));
    return out;
  }
  for (const auto& s : catalog.all())
    if (s.nuclei == shape.nuclei && s.angle_name == shape.angle_name && s.form != karplus::Form::Haasnoot)
      out.push_back(&s);
  return out;
}

// --report: the points with their fitted values and the curves of the fit and
// of every compared set on a 2 degree grid go into the document beside the
// --json result, so that the page can be rebuilt from it alone.
void save_calibration_report(const Options& o, Json doc, const NewSet& shape, const CalibrationOptions& copt,
                             const Calibration& fit, const std::vector<CalibrationPoint>& points,
                             const std::vector<const karplus::ParameterSet*>& compared, const Globals& g) {
  doc["coupling"] = shape.coupling;
  doc["angle_name"] = shape.angle_name;
  doc["data"] = Json::array();
  for (const auto& p : points)
    doc["data"].push_back({{"j_hz", p.j_hz}, {"sigma_hz", p.sigma_hz}, {"dihedral_deg", p.dihedral_deg},
                           {"fitted_hz", model_j_hz(copt, fit.coefficients, p.dihedral_deg)}});
  std::vector<double> grid;
  for (double d = -180; d <= 180 + 1e-9; d += 2) grid.push_back(d);
  const auto curve = [&](const std::string& label, bool fitted, const std::function<double(double)>& j) {
    std::vector<double> values;
    for (double d : grid) values.push_back(j(d));
    return Json{{"label", label}, {"fitted", fitted}, {"dihedral_deg", grid}, {"j_hz", values}};
  };
  doc["curves"] = Json::array({curve(o.id.empty() ? "this calibration" : o.id, true,
                                     [&](double d) { return model_j_hz(copt, fit.coefficients, d); })});
  for (const auto* set : compared)
    doc["curves"].push_back(curve(set->id, false, [set](double d) { return karplus::j_hz(*set, d); }));
  save_result_report(doc, report::kCalibrationFormat,
                     fmt::format("Karplus calibration of {} on {} points", shape.coupling, fit.stats.n), o.report, g);
}

void calibrate_points(const Options& o, const Globals& g) {
  CalibrationOptions copt;
  copt.form = karplus::parse_form(o.form);
  copt.fourier_order = o.order;
  copt.loss = parse_loss(o.loss);
  copt.loss_scale = o.loss_scale;
  NewSet shape = o.like.empty() ? NewSet{} : new_set_like(karplus::SetCatalog::shipped().find(o.like));
  if (std::isfinite(o.offset_deg)) shape.offset_deg = o.offset_deg;
  copt.offset_deg = shape.offset_deg;
  if (!(o.loss_scale > 0)) throw Error("the loss scale must be positive", Location::field_in("", "--loss-scale"));

  const Input in = read_input(o, g);
  const auto& points = in.points;
  const Calibration fit = vicinal::calibrate::calibrate(points, copt);
  auto progress = g.progress();
  progress->start("bootstrap", 1);
  const BootstrapIntervals boot = bootstrap(points, copt, o.bootstrap_samples, o.seed);
  progress->finish();

  Json doc = {{"input", in.description}, {"form", karplus::form_name(copt.form)}, {"offset_deg", copt.offset_deg},
              {"loss", loss_name(copt.loss)}, {"loss_scale_sigma", copt.loss_scale}, {"n", fit.stats.n},
              {"coefficients", Json::array()},
              {"statistics", {{"chi2", fit.stats.chi2}, {"rmsd_hz", fit.stats.rmsd_hz},
                              {"reduced_chi2", finite_or_null(fit.stats.reduced_chi2)}, {"aic", fit.stats.aic},
                              {"bic", fit.stats.bic}, {"k", fit.stats.k}}},
              {"bootstrap", {{"samples", boot.samples}, {"seed", boot.seed}}}, {"comparison", Json::array()}};
  report::TextTable tc({"coefficient", "value / Hz", "sd (covariance)", "95 % bootstrap interval"});
  for (std::size_t i = 0; i < fit.names.size(); ++i) {
    doc["coefficients"].push_back({{"name", fit.names[i]}, {"value", fit.coefficients[i]}, {"sd", finite_or_null(fit.sd[i])},
                                   {"bootstrap_low", boot.low[i]}, {"bootstrap_high", boot.high[i]},
                                   {"bootstrap_sd", finite_or_null(boot.sd[i])}});
    tc.add_row({fit.names[i], num(fit.coefficients[i]), num(fit.sd[i]),
                fmt::format("[{:.3f}, {:.3f}]", boot.low[i], boot.high[i])});
  }
  const auto compared = sets_to_compare(o, shape);
  report::TextTable tj({"set", "k", "RMSD / Hz", "reduced chi^2", "AIC", "BIC"});
  tj.add_row({"this calibration", fmt::format("{}", fit.stats.k), num(fit.stats.rmsd_hz), num(fit.stats.reduced_chi2),
              num(fit.stats.aic, "{:.1f}"), num(fit.stats.bic, "{:.1f}")});
  for (const auto* set : compared) {
    const FitStatistics s = judge_set(*set, points);
    doc["comparison"].push_back({{"set", set->id}, {"rmsd_hz", s.rmsd_hz}, {"reduced_chi2", finite_or_null(s.chi2 / s.n)},
                                 {"aic", s.aic}, {"bic", s.bic}, {"k", 0}, {"citation", set->citation}});
    tj.add_row({set->id, "0", num(s.rmsd_hz), num(s.chi2 / s.n), num(s.aic, "{:.1f}"), num(s.bic, "{:.1f}")});
  }

  if (!in.library_points.is_null()) doc["points"] = in.library_points;
  std::string written;
  if (!o.id.empty()) {
    NewSet set = shape;
    set.id = o.id;
    set.title = o.title.empty() ? fmt::format("{} calibrated on {} points", shape.coupling, fit.stats.n) : o.title;
    set.form = copt.form;
    set.names = fit.names;
    set.coefficients = fit.coefficients;
    set.rms_hz = fit.stats.rmsd_hz;
    set.table = fmt::format("calibrated with vicinal karplus calibrate from {}", in.description);
    std::string intervals;
    for (std::size_t i = 0; i < fit.names.size(); ++i)
      intervals += fmt::format("{} [{:.3f}, {:.3f}]; ", fit.names[i], boot.low[i], boot.high[i]);
    set.notes = fmt::format(
        "Provenance: input {}; written {}; {} points; form {}, offset {} deg; loss {} (scale {} sigma); "
        "chi2 {:.3f}, reduced chi2 {}, RMSD {:.3f} Hz, AIC {:.2f}, BIC {:.2f}; 95 % bootstrap intervals ({} resamples, "
        "seed {}): {}command: {}",
        in.description, utc_now(), fit.stats.n, karplus::form_name(copt.form), copt.offset_deg, loss_name(copt.loss),
        copt.loss_scale, fit.stats.chi2, num(fit.stats.reduced_chi2), fit.stats.rmsd_hz, fit.stats.aic, fit.stats.bic,
        boot.samples, boot.seed, intervals, g.command_line);
    const auto path = o.out.empty() ? default_set_path(o.id) : std::filesystem::path(o.out);
    write_set(set, path);
    written = path.string();
    doc["written"] = written;
    g.note(fmt::format("new set '{}' written to {}", o.id, written));
  }
  if (!o.report.empty()) save_calibration_report(o, doc, shape, copt, fit, points, compared, g);
  if (g.json) return g.print_json(doc);
  std::string text = fmt::format("Calibration of the {} form (offset {} deg) on {} points from {}, {} loss\n\n",
                                 karplus::form_name(copt.form), copt.offset_deg, fit.stats.n, in.description, loss_name(copt.loss));
  text += tc.render();
  text += fmt::format("Bootstrap: {} resamples of the points, seed {}.\n\n", boot.samples, boot.seed);
  text += "On the same data (published sets are not fitted here, so k = 0 and reduced chi^2 = chi^2 / n):\n";
  text += tj.render();
  if (written.empty()) text += "Not saved: give --id (and --out or $VICINAL_KARPLUS_DIR) to write the set.\n";
  g.print(text);
}

// --report with --sites: per type the fitted and the starting curve on a 2
// degree grid and the measured couplings at their sites' fitted angles.
void save_self_consistent_report(const Options& o, Json doc, const std::vector<SiteCoupling>& rows,
                                 const SelfConsistentFit& fit, const Globals& g) {
  std::vector<double> grid;
  for (double d = -180; d <= 180 + 1e-9; d += 2) grid.push_back(d);
  doc["angle_name"] = fit.types.front().angle_name;
  doc["curves"] = Json::array();
  for (std::size_t t = 0; t < fit.types.size(); ++t) {
    const auto& type = fit.types[t];
    CalibrationOptions shape;
    shape.offset_deg = type.offset_deg;
    std::vector<double> fitted, start;
    for (double d : grid) {
      fitted.push_back(model_j_hz(shape, fit.coefficients[t], d));
      start.push_back(karplus::j_hz(type, d));
    }
    Json points = Json::array();
    for (const auto& r : rows) {
      if (r.type != type.id) continue;
      const auto site = std::find(fit.sites.begin(), fit.sites.end(), r.site) - fit.sites.begin();
      points.push_back({{"site", r.site}, {"angle_deg", fit.angle_deg[static_cast<std::size_t>(site)]},
                        {"j_hz", r.j_hz}, {"sigma_hz", r.sigma_hz}});
    }
    doc["curves"].push_back({{"type", type.id}, {"coupling", type.coupling}, {"dihedral_deg", grid},
                             {"fitted_hz", fitted}, {"start_hz", start}, {"points", points}});
  }
  save_result_report(doc, report::kSelfConsistentFormat,
                     fmt::format("Self-consistent Karplus calibration of {} types on {} sites", fit.types.size(),
                                 fit.sites.size()),
                     o.report, g);
}

void calibrate_sites(const Options& o, const Globals& g) {
  const auto rows = read_site_couplings(o.sites);
  const SelfConsistentFit fit =
      fit_self_consistent(rows, karplus::SetCatalog::shipped(), parse_loss(o.loss), o.loss_scale);
  Json doc = {{"input", o.sites}, {"n", fit.n}, {"k", fit.k}, {"chi2", fit.chi2}, {"types", Json::array()},
              {"sites", Json::array()}};
  report::TextTable tt({"type", "n", "A", "B", "C", "start A, B, C", "RMSD / Hz"});
  for (std::size_t t = 0; t < fit.types.size(); ++t) {
    const auto& c = fit.coefficients[t];
    const auto& s = fit.types[t].coefficients;
    doc["types"].push_back({{"type", fit.types[t].id}, {"n", fit.type_n[t]}, {"coefficients", c},
                            {"start_coefficients", s}, {"rmsd_hz", fit.type_rmsd_hz[t]}});
    tt.add_row({fit.types[t].id, fmt::format("{}", fit.type_n[t]), num(c[0], "{:.2f}"), num(c[1], "{:.2f}"),
                num(c[2], "{:.2f}"), fmt::format("{:.2f}, {:.2f}, {:.2f}", s[0], s[1], s[2]), num(fit.type_rmsd_hz[t])});
  }
  report::TextTable ts({"site", fit.types.front().angle_name + " / deg", "start / deg"});
  for (std::size_t s = 0; s < fit.sites.size(); ++s) {
    doc["sites"].push_back({{"site", fit.sites[s]}, {"angle_deg", fit.angle_deg[s]}, {"start_deg", fit.start_angle_deg[s]}});
    ts.add_row({fit.sites[s], num(fit.angle_deg[s], "{:.1f}"), num(fit.start_angle_deg[s], "{:.1f}")});
  }
  if (!o.id.empty()) {
    doc["written"] = Json::array();
    for (std::size_t t = 0; t < fit.types.size(); ++t) {
      NewSet set = new_set_like(fit.types[t]);
      set.id = o.id + "-" + fit.types[t].id;
      set.title = fmt::format("{} self-consistent calibration", fit.types[t].coupling);
      set.names = {"A", "B", "C"};
      set.coefficients = fit.coefficients[t];
      set.rms_hz = fit.type_rmsd_hz[t];
      set.table = fmt::format("self-consistent calibration with vicinal from {}", o.sites);
      set.notes = fmt::format(
          "Provenance: input {}; written {}; self-consistent fit (Schmidt et al., J. Biomol. NMR 14, 1, 1999) of {} "
          "types and {} site angles to {} couplings; this type {} couplings, RMSD {:.3f} Hz; started from set {}; "
          "total chi2 {:.3f}; loss {}; command: {}",
          o.sites, utc_now(), fit.types.size(), fit.sites.size(), fit.n, fit.type_n[t], fit.type_rmsd_hz[t],
          fit.types[t].id, fit.chi2, o.loss, g.command_line);
      const auto path = o.out.empty() ? default_set_path(set.id) : std::filesystem::path(o.out) / (set.id + ".json");
      write_set(set, path);
      doc["written"].push_back(path.string());
      g.note(fmt::format("new set '{}' written to {}", set.id, path.string()));
    }
  }
  if (!o.report.empty()) save_self_consistent_report(o, doc, rows, fit, g);
  if (g.json) return g.print_json(doc);
  g.print(fmt::format("Self-consistent calibration: {} couplings, {} types, {} sites ({} parameters), chi^2 = {:.3f}\n\n{}\n{}",
                      fit.n, fit.types.size(), fit.sites.size(), fit.k, fit.chi2, tt.render(), ts.render()));
}

void setup(CLI::App& root, Globals& g) {
  auto& group = command_group(root, "karplus", "Karplus relations: parameter sets, curves, angles, calibration");
  auto o = std::make_shared<Options>();
  auto* c = group.add_subcommand("calibrate", "Fit Karplus coefficients to your own (J, dihedral) data");
  auto* points = c->add_option("--points", o->points, "CSV with columns j_hz, sigma_hz, dihedral_deg");
  auto* sites = c->add_option("--sites", o->sites,
                              "CSV with columns site, type (a three-term set id), j_hz, sigma_hz[, start_deg]: "
                              "self-consistent fit of coefficients and one angle per site");
  auto* from_library = c->add_flag("--from-library", o->from_library,
                                   "Take every 3-bond coupling the filters find in the library (--library), with the "
                                   "dihedral along its stored path measured on the compound's stored 3D structure; "
                                   "stereo-unassigned couplings are skipped with a note");
  points->excludes(sites);
  from_library->excludes(points)->excludes(sites);
  c->add_option("--nuclei", o->query.nuclei, "With --from-library: coupled nuclei, e.g. H,H or 1H,13C")->needs(from_library);
  c->add_option("--smarts", o->query.smarts, "With --from-library: substructure the compound must contain")
      ->needs(from_library);
  c->add_option("--name", o->query.name, "With --from-library: part of the compound name (any case)")->needs(from_library);
  c->add_option("--default-sigma-hz", o->default_sigma_hz,
                "With --from-library: sigma for couplings stored without one (no default: without this option "
                "such couplings are refused)")
      ->needs(from_library);
  c->add_option("--form", o->form, "three-term or fourier")->capture_default_str();
  c->add_option("--order", o->order, "Order of the Fourier series")->capture_default_str();
  c->add_option("--like", o->like, "Copy nuclei, coupling, atom pattern and offset from this set");
  c->add_option("--offset-deg", o->offset_deg, "Angle offset (default: that of --like, else 0)");
  c->add_option("--loss", o->loss, "squared, huber or cauchy (robust to outliers)")->capture_default_str();
  c->add_option("--loss-scale", o->loss_scale, "Where the robust loss starts, in units of sigma")->capture_default_str();
  c->add_option("--bootstrap", o->bootstrap_samples, "Bootstrap resamples")->capture_default_str()
      ->check(CLI::Range(10, 100000));
  c->add_option("--seed", o->seed, "Seed of the bootstrap")->capture_default_str();
  c->add_option("--compare", o->compare, "Comma list of set ids to judge on the same data "
                                         "(default: every set for the same nuclei and angle)");
  c->add_option("--id", o->id, "Save the result as a set with this id (self-consistent: prefix of one set per type)");
  c->add_option("--title", o->title, "Title of the saved set");
  c->add_option("--report", o->report,
                "Folder for the HTML report (report.html, figures/, tables/) and calibration.json (with --sites: "
                "self-consistent.json), from which `vicinal report` rebuilds it");
  c->add_option("--out", o->out, "File (or, with --sites, folder) to write (default: $VICINAL_KARPLUS_DIR)");
  c->footer(
      "Example: vicinal karplus calibrate --points my-pairs.csv --like hh-karplus-1963 --id hh-my-lab --out hh-my-lab.json\n"
      "Put saved sets in $VICINAL_KARPLUS_DIR and every command finds them by id.\n"
      "Pairs must cover the angle range: coefficients from a narrow range are extrapolations.\n"
      "From the library: vicinal karplus calibrate --from-library --nuclei H,H --smarts '[H]C-C[H]' --default-sigma-hz 0.5\n"
      "--report DIR adds an HTML page: coefficients with bootstrap intervals, the published sets on the same\n"
      "data, and the points with the fitted and published curves.");
  c->callback([o, points, sites, &g] {
    if (points->count() == 0 && sites->count() == 0 && !o->from_library)
      throw Error("nothing to calibrate on", Location::field_in("", "--points"),
                  "give --points FILE, --sites FILE or --from-library");
    if (!o->sites.empty()) calibrate_sites(*o, g);
    else calibrate_points(*o, g);
  });
}

const bool registered = register_command(21, setup);

}  // namespace

}  // namespace vicinal::cli
