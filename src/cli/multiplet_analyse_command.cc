// vicinal multiplet analyse   coupling constants read from a multiplet's peak list
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <optional>

#include "cli/command.h"
#include "cli/karplus_options.h"
#include "core/csv.h"
#include "core/error.h"
#include "core/parse.h"
#include "report/plot.h"
#include "report/table.h"
#include "cli/multiplet_store.h"
#include "spin/first_order.h"
#include "spin/second_order.h"

namespace vicinal::cli {

namespace {

struct Options {
  std::string peaks_path;
  std::string peaks_list, intensity_list;
  std::optional<double> field_mhz;
  double tolerance_hz = 0.3;
  double intensity_tolerance = 0.3;
  int max_couplings = 7;
  std::vector<double> partner_ppm;
  bool fit_partner_shifts = false;
  PlotTargets plot;
  MultipletStoreOptions store;
};

std::vector<double> parse_list(const std::string& text, const std::string& option) {
  std::vector<double> out;
  std::size_t start = 0;
  for (std::size_t k = 1;; ++k) {
    const auto comma = text.find(',', start);
    const auto item = text.substr(start, comma == std::string::npos ? std::string::npos : comma - start);
    Location at = Location::field_in("", option);
    at.field = fmt::format("{} item {}", option, k);
    out.push_back(parse_double(item, at));
    if (comma == std::string::npos) break;
    start = comma + 1;
  }
  return out;
}

spin::PeakList read_peaks(const Options& o) {
  spin::PeakList peaks;
  if (!o.peaks_path.empty() && !o.peaks_list.empty())
    throw Error("give the peaks either as a file or with --peaks, not both", Location::field_in("", "--peaks"));
  if (!o.peaks_list.empty()) {
    peaks.hz = parse_list(o.peaks_list, "--peaks");
    if (!o.intensity_list.empty()) peaks.intensity = parse_list(o.intensity_list, "--intensities");
    if (!peaks.intensity.empty() && peaks.intensity.size() != peaks.hz.size())
      throw Error(fmt::format("{} intensities for {} peaks", peaks.intensity.size(), peaks.hz.size()),
                  Location::field_in("", "--intensities"));
    return peaks;
  }
  if (o.peaks_path.empty())
    throw Error("no peaks given", {}, "name a CSV file or list positions with --peaks 1201.3,1194.1,...");
  if (!o.intensity_list.empty())
    throw Error("--intensities goes with --peaks; in a file use an 'intensity' column",
                Location::field_in("", "--intensities"));
  const auto table = CsvTable::read_file(o.peaks_path);
  const auto hz_col = table.column("position_hz");
  const auto ppm_col = table.column("position_ppm");
  if (!hz_col && !ppm_col)
    throw Error("needs a column 'position_hz' or 'position_ppm'", {o.peaks_path, 1},
                "header e.g.: position_hz,intensity");
  if (!hz_col && !o.field_mhz)
    throw Error("positions in ppm need the spectrometer frequency", Location::field_in("", "--field-mhz"),
                "add --field-mhz 400 (the 1H frequency)");
  const auto int_col = table.column("intensity");
  if (table.rows().empty())
    throw Error("no peaks in the file", {o.peaks_path}, "give one row per resolved line of the multiplet");
  for (const auto& row : table.rows()) {
    const std::size_t col = hz_col ? *hz_col : *ppm_col;
    const double hz = parse_double(row.fields[col], table.where(row, col)) * (hz_col ? 1.0 : *o.field_mhz);
    // A position beyond 1 MHz from the reference is no NMR line (1000 ppm at
    // 1 GHz): a damaged file or a typo. Common practice, no source.
    if (std::fabs(hz) > 1e6)
      throw Error(fmt::format("the position {:g} Hz is beyond 1 MHz from the reference", hz), table.where(row, col));
    peaks.hz.push_back(hz);
    if (int_col) {
      const double v = parse_double(row.fields[*int_col], table.where(row, *int_col));
      if (!(v > 0)) throw Error(fmt::format("intensity {} is not positive", v), table.where(row, *int_col));
      peaks.intensity.push_back(v);
    }
  }
  return peaks;
}

// Mirror-image peaks differing by more than this (relative) count as a roof
// effect; picked intensities scatter by a few per cent (common practice).
constexpr double kRoofLean = 0.1;

// In a second-order multiplet the lines nearer the partner grow (roof effect):
// mirror-image peaks of the ideal tree have unequal intensities. Returns the
// mean relative difference, positive when the high-frequency side is stronger.
double roof_lean(const spin::PeakList& sorted) {
  if (sorted.intensity.empty()) return 0;
  const std::size_t n = sorted.hz.size();
  double sum = 0;
  for (std::size_t i = 0; i < n / 2; ++i) {
    const double low = sorted.intensity[i], high = sorted.intensity[n - 1 - i];
    sum += (high - low) / (high + low);
  }
  return n >= 2 ? sum / static_cast<double>(n / 2) : 0;
}

Json tree_json(const spin::TreeFit& t, const std::optional<double>& field) {
  Json couplings = Json::array();
  for (const auto& c : t.groups) couplings.push_back({{"j_hz", c.j_hz}, {"partners", c.partners}});
  Json j = {{"notation", t.notation()},
            {"multiplicity", t.multiplicity()},
            {"center_hz", t.center_hz},
            {"couplings_hz", t.couplings_hz()},
            {"couplings", couplings},
            {"residual_hz", t.residual_hz},
            {"max_deviation_hz", t.max_deviation_hz},
            {"intensity_error", t.intensity_error >= 0 ? Json(t.intensity_error) : Json(nullptr)}};
  if (field) j["center_ppm"] = t.center_hz / *field;
  return j;
}

void run_analyse(const Options& o, const Globals& g) {
  if (o.field_mhz && !(*o.field_mhz > 0))
    throw Error("the field must be positive", Location::field_in("", "--field-mhz"));
  if (!o.partner_ppm.empty() && !o.field_mhz)
    throw Error("partner shifts in ppm need the spectrometer frequency", Location::field_in("", "--field-mhz"),
                "add --field-mhz 400 (the 1H frequency)");
  o.plot.check();
  auto peaks = read_peaks(o);
  spin::FirstOrderOptions fo;
  fo.tolerance_hz = o.tolerance_hz;
  fo.intensity_tolerance = o.intensity_tolerance;
  fo.max_couplings = o.max_couplings;
  const auto result = spin::analyse_first_order(peaks, fo);
  const auto& best = result.trees.front();

  // Sorted copy of the peaks (the analysis reports them ascending).
  spin::PeakList sorted;
  {
    std::vector<std::size_t> order(peaks.hz.size());
    for (std::size_t i = 0; i < order.size(); ++i) order[i] = i;
    std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return peaks.hz[a] < peaks.hz[b]; });
    for (std::size_t i : order) {
      sorted.hz.push_back(peaks.hz[i]);
      if (!peaks.intensity.empty()) sorted.intensity.push_back(peaks.intensity[i]);
    }
  }
  const double lean = roof_lean(sorted);
  const bool leans = std::abs(lean) > kRoofLean;

  // The reading checked by the spin code: partners at their shifts when given,
  // else far away (the first-order limit the tree assumes).
  if (!o.partner_ppm.empty() && o.partner_ppm.size() != best.groups.size())
    throw Error(fmt::format("{} partner shifts given, but the best reading ({}) has {} couplings",
                            o.partner_ppm.size(), best.multiplicity(), best.groups.size()),
                Location::field_in("", "--partner"), "give one --partner PPM per coupling, largest J first");
  // Stored before anything is printed, so a refused store leaves no output that looks like success.
  const std::string stored =
      o.store.requested()
          ? store_multiplet(o.store, best, o.field_mhz, o.peaks_path.empty() ? "--peaks" : o.peaks_path, g)
          : "";
  const double field = o.field_mhz.value_or(400.0);
  spin::MultipletModel model;
  model.field_mhz = field;
  model.center_hz = best.center_hz;
  model.groups = best.groups;
  for (std::size_t k = 0; k < best.groups.size(); ++k)
    model.partner_hz.push_back(o.partner_ppm.empty() ? best.center_hz + (k % 2 ? -1.0 : 1.0) * 1e4 * (k + 1)
                                                     : o.partner_ppm[k] * field);
  const double simulated_residual = spin::model_residual_hz(model, sorted);

  Json partners = Json::array();
  bool second_order = false;
  for (std::size_t k = 0; k < o.partner_ppm.size(); ++k) {
    const double ratio = std::abs(model.partner_hz[k] - best.center_hz) / best.groups[k].j_hz;
    second_order |= ratio < spin::kFirstOrderRatio;
    partners.push_back({{"j_hz", best.groups[k].j_hz},
                        {"partner_ppm", o.partner_ppm[k]},
                        {"delta_nu_over_j", ratio},
                        {"second_order", ratio < spin::kFirstOrderRatio}});
  }
  std::optional<spin::SecondOrderFit> fit;
  if (!o.partner_ppm.empty())
    fit = spin::fit_second_order(model, sorted, o.fit_partner_shifts, o.tolerance_hz, o.intensity_tolerance);

  const bool consistent_intensities = peaks.intensity.empty() || best.intensity_error <= o.intensity_tolerance;
  if (g.json) {
    Json doc = tree_json(best, o.field_mhz);
    doc["ambiguous"] = result.ambiguous;
    doc["intensities_consistent"] = consistent_intensities;
    doc["alternatives"] = Json::array();
    for (std::size_t k = 1; k < result.trees.size(); ++k) doc["alternatives"].push_back(tree_json(result.trees[k], o.field_mhz));
    doc["peaks"] = Json::array();
    for (std::size_t i = 0; i < sorted.hz.size(); ++i)
      doc["peaks"].push_back({{"hz", sorted.hz[i]}, {"tree_hz", best.peaks[i].hz}, {"lines", best.peaks[i].lines}});
    doc["simulated_residual_hz"] = simulated_residual;
    doc["roof_lean"] = lean;
    doc["search_truncated"] = result.search_truncated;
    Json check = {{"first_order_ratio", spin::kFirstOrderRatio}, {"partners", partners}};
    check["second_order"] = o.partner_ppm.empty() ? (leans ? Json(true) : Json(nullptr)) : Json(second_order);
    doc["second_order_check"] = check;
    if (fit) {
      Json fitted = {{"center_hz", fit->model.center_hz},
                     {"center_ppm", fit->model.center_hz / field},
                     {"couplings_hz", Json::array()},
                     {"partner_ppm", Json::array()},
                     {"residual_hz", fit->residual_hz},
                     {"converged", fit->converged},
                     {"partner_shifts_fitted", o.fit_partner_shifts}};
      for (std::size_t k = 0; k < fit->model.groups.size(); ++k) {
        fitted["couplings_hz"].push_back(fit->model.groups[k].j_hz);
        fitted["partner_ppm"].push_back(fit->model.partner_hz[k] / field);
      }
      doc["second_order_fit"] = fitted;
    }
    g.print_json(doc);
  } else {
    std::string text = fmt::format("{}, centre {:.2f} Hz", best.notation(), best.center_hz);
    if (o.field_mhz) text += fmt::format(" ({:.4f} ppm)", best.center_hz / *o.field_mhz);
    text += fmt::format("; RMS deviation {:.3f} Hz", best.residual_hz);
    if (best.intensity_error >= 0) text += fmt::format(", intensity misfit {:.0f} %", 100 * best.intensity_error);
    text += "\n";
    report::TextTable t({"peak Hz", "tree Hz", "lines"});
    for (std::size_t i = 0; i < sorted.hz.size(); ++i)
      t.add_row({fmt::format("{:.2f}", sorted.hz[i]), fmt::format("{:.2f}", best.peaks[i].hz),
                 fmt::format("{}", best.peaks[i].lines)});
    text += t.render();
    if (result.trees.size() > 1) {
      text += result.ambiguous ? "Other readings that fit as well (the peaks alone cannot decide):\n"
                               : "Other readings (fit worse):\n";
      for (std::size_t k = 1; k < result.trees.size(); ++k) {
        const auto& a = result.trees[k];
        text += fmt::format("  {}; RMS {:.3f} Hz", a.notation(), a.residual_hz);
        if (a.intensity_error >= 0) text += fmt::format(", intensity misfit {:.0f} %", 100 * a.intensity_error);
        text += "\n";
      }
    }
    if (!consistent_intensities) text += "The intensities do not match any first-order tree well.\n";
    for (const auto& p : partners)
      text += fmt::format("J = {:.1f} Hz to the partner at {:.3f} ppm: delta-nu/J = {:.1f}{}\n", p["j_hz"].get<double>(),
                          p["partner_ppm"].get<double>(), p["delta_nu_over_j"].get<double>(),
                          p["second_order"].get<bool>() ? " (below 10: second order)" : "");
    if (fit) {
      std::string js;
      for (const auto& c : fit->model.groups) js += fmt::format("{}{:.2f}", js.empty() ? "" : ", ", c.j_hz);
      text += fmt::format("Exact fit of the spin system: centre {:.2f} Hz ({:.4f} ppm), J = {} Hz; RMS {:.3f} Hz{}\n",
                          fit->model.center_hz, fit->model.center_hz / field, js, fit->residual_hz,
                          fit->converged ? "" : " (did not converge)");
    }
    g.print(text);
  }
  if (o.partner_ppm.empty())
    g.note(leans ? fmt::format("note: the intensities lean to the {}-frequency side (roof effect): a coupled partner "
                               "is probably close on that side; give --partner PPM per coupling to check",
                               lean > 0 ? "high" : "low")
                 : "note: the first-order reading assumes delta-nu/J >= 10 for every coupling; give --partner PPM "
                   "per coupling to check it");
  if (result.search_truncated) g.note("note: the search stopped at its limit; rarer readings may be missing");
  if (!stored.empty()) g.note(stored);

  if (o.plot.any()) {
    report::Figure fig;
    fig.title = "Multiplet: " + best.notation();
    fig.x_label = "frequency / Hz";
    fig.y_label = sorted.intensity.empty() ? "lines in peak" : "intensity (scaled to lines)";
    fig.reverse_x = true;
    report::Series observed, tree;
    observed.label = "observed peaks";
    tree.label = "first-order tree";
    observed.style = tree.style = report::Series::Style::Sticks;
    double scale = 1;
    if (!sorted.intensity.empty()) {
      double total = 0;
      for (double v : sorted.intensity) total += v;
      scale = std::pow(2.0, best.coupling_count()) / total;
    }
    for (std::size_t i = 0; i < sorted.hz.size(); ++i) {
      observed.x.push_back(sorted.hz[i]);
      observed.y.push_back(sorted.intensity.empty() ? best.peaks[i].lines : sorted.intensity[i] * scale);
      tree.x.push_back(best.peaks[i].hz);
      tree.y.push_back(best.peaks[i].lines);
    }
    tree.dashed = true;
    fig.series = {std::move(observed), std::move(tree)};
    o.plot.save(fig, g);
  }
}

void setup(CLI::App& root, Globals& g) {
  auto& group = command_group(root, "multiplet", "Spin-system spectra and coupling constants read from multiplets");
  auto opts = std::make_shared<Options>();
  auto* cmd = group.add_subcommand("analyse", "Read coupling constants out of a multiplet's peak list");
  cmd->add_option("peaks", opts->peaks_path, "CSV with position_hz (or position_ppm) and optional intensity");
  cmd->add_option("--peaks", opts->peaks_list, "Peak positions in Hz, comma-separated, instead of a file");
  cmd->add_option("--intensities", opts->intensity_list, "Intensities for --peaks, comma-separated, same order");
  cmd->add_option("--field-mhz", opts->field_mhz, "Spectrometer 1H frequency (for ppm input and output)");
  cmd->add_option("--tolerance-hz", opts->tolerance_hz, "How far a peak may lie from its tree line")
      ->capture_default_str();
  cmd->add_option("--intensity-tolerance", opts->intensity_tolerance,
                  "RMS relative intensity misfit still called consistent")
      ->capture_default_str();
  cmd->add_option("--max-couplings", opts->max_couplings, "Most partners in the tree")
      ->capture_default_str()
      ->check(CLI::Range(1, 7));
  cmd->add_option("--partner", opts->partner_ppm,
                  "Shift (ppm) of the partner of each coupling, largest J first (repeat); "
                  "checks delta-nu/J and fits the spin system exactly");
  cmd->add_flag("--fit-partner-shifts", opts->fit_partner_shifts, "Let the exact fit move the partner shifts too");
  opts->plot.add_options(*cmd);
  opts->store.add_options(*cmd);
  cmd->footer(
      "Examples:\n"
      "  vicinal multiplet analyse examples/multiplets/ddd_peaks.csv --field-mhz 400\n"
      "  vicinal multiplet analyse --peaks 1209.5,1197.7,1204.6,1192.8 --intensities 1,1,1,1\n"
      "  vicinal multiplet analyse peaks.csv --field-mhz 400 --partner 3.82 --partner 1.20\n"
      "  vicinal multiplet analyse h3.csv --field-mhz 500 --store 'product 7' --nucleus H-3 \\\n"
      "      --partners 'H-4a|H-4b,H-2,H-4b|H-4a' --solvent CD3OD --temperature-k 298\n"
      "Every coupling and every sum of couplings is a distance from the lowest peak, and\n"
      "all of them add up to the multiplet's width: trees built from those distances are\n"
      "checked line by line (coincident lines allowed), refined by least squares and ranked:\n"
      "consistent intensities first, then the fewest couplings, then the closest fit.\n"
      "Give intensities whenever you can: without them a dd with J1 = 2 J2 and a q look alike.\n"
      "--json: {\"notation\", \"center_hz\", \"couplings_hz\", \"residual_hz\", \"alternatives\", \"ambiguous\",\n"
      "\"peaks\", \"simulated_residual_hz\", \"second_order_check\", \"second_order_fit\" (with --partner)}.");
  cmd->callback([opts, &g] { run_analyse(*opts, g); });
}

const bool registered = register_command(71, setup);

}  // namespace

}  // namespace vicinal::cli
