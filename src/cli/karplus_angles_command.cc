// vicinal karplus angles    the dihedral intervals consistent with a measured J
#include <fmt/format.h>

#include "cli/command.h"
#include "cli/karplus_options.h"
#include "core/error.h"
#include "karplus/karplus.h"
#include "report/table.h"

namespace vicinal::cli {

namespace {

struct Options {
  std::string set;
  std::string j, sigma = "0", k = "2";
  std::vector<std::string> substituents;
  PlotTargets plot;
};

std::string angle_list(const std::vector<double>& angles) {
  std::vector<std::string> parts;
  for (double a : angles) parts.push_back(fmt::format("{:.1f}", a));
  return parts.empty() ? "none" : fmt::format("{}", fmt::join(parts, ", "));
}

void run_angles(const Options& o, const Globals& g) {
  const double j = parse_option_number(o.j, "--j", "7.4");
  const double sigma = parse_option_number(o.sigma, "--sigma", "0.3");
  const double k = parse_option_number(o.k, "--k", "2");
  if (sigma < 0)
    throw Error(fmt::format("uncertainty {:g} Hz is negative", sigma), Location::field_in("", "--sigma"),
                "give the standard uncertainty of J, >= 0");
  if (k <= 0) throw Error(fmt::format("k = {:g} must be > 0", k), Location::field_in("", "--k"), "2 is usual");
  o.plot.check();
  const auto subs = parse_substituents(o.substituents);
  const auto& set = karplus::SetCatalog::shipped().find(o.set);
  note_substituent_use(g, set, subs.size());
  const auto sol = karplus::allowed_dihedrals(set, j, sigma, k, subs);

  if (g.json) {
    Json intervals = Json::array();
    for (const auto& iv : sol.intervals)
      intervals.push_back({{"from_deg", iv.from_deg},
                           {"to_deg", iv.to_deg},
                           {"best_deg", iv.best_deg},
                           {"wraps", iv.wraps},
                           {"j_at_best_hz", karplus::j_hz(set, iv.best_deg, subs)}});
    g.print_json({{"set", set.id},
                  {"angle_name", set.angle_name},
                  {"j_hz", j},
                  {"sigma_hz", sigma},
                  {"k", k},
                  {"rms_hz", set.rms_hz},
                  {"tolerance_hz", sol.tolerance_hz},
                  {"substituents", substituents_json(subs)},
                  {"intervals", intervals},
                  {"exact_deg", sol.exact_deg},
                  {"range", {{"min_hz", sol.range.min_hz},
                             {"min_at_deg", sol.range.min_at_deg},
                             {"max_hz", sol.range.max_hz},
                             {"max_at_deg", sol.range.max_at_deg}}},
                  {"citation", set.citation}});
  } else {
    report::TextTable t({"from deg", "to deg", "best deg", "J at best Hz", ""});
    for (const auto& iv : sol.intervals)
      t.add_row({fmt::format("{:.1f}", iv.from_deg), fmt::format("{:.1f}", iv.to_deg), fmt::format("{:.1f}", iv.best_deg),
                 fmt::format("{:.2f}", karplus::j_hz(set, iv.best_deg, subs)), iv.wraps ? "continues across +-180" : ""});
    g.print(fmt::format("{} = {:g} Hz with sigma {:g} Hz, set rms {:g} Hz, k = {:g}: |J(curve) - J| <= {:.2f} Hz\n"
                        "{} dihedral intervals in [-180, 180] (set {}, {}):\n{}"
                        "exact solutions {}: {}\n"
                        "the curve spans {:.2f} to {:.2f} Hz. {}\n",
                        set.coupling, j, sigma, set.rms_hz, k, sol.tolerance_hz, set.angle_name, set.id,
                        set.short_citation, t.render(), set.angle_name, angle_list(sol.exact_deg),
                        sol.range.min_hz, sol.range.max_hz, set.citation));
  }

  if (o.plot.any()) {
    report::Figure fig;
    fig.title = fmt::format("{} = {:g} Hz: allowed {} ({})", set.coupling, j, set.angle_name, set.id);
    dihedral_axis(fig, set.angle_name);
    fig.y_label = "J / Hz";
    report::Series curve;
    curve.label = fmt::format("{} {}", set.coupling, set.short_citation);
    for (double t = -180; t <= 180.0 + 1e-9; t += 1.0) curve.x.push_back(t);
    curve.y.resize(curve.x.size());
    karplus::j_hz(set, curve.x, curve.y, subs);
    fig.series.push_back(std::move(curve));
    if (!sol.exact_deg.empty()) {
      report::Series roots;
      roots.label = "J(curve) = J";
      roots.style = report::Series::Style::Points;
      roots.color = 1;
      roots.x = sol.exact_deg;
      roots.y.assign(roots.x.size(), j);
      fig.series.push_back(std::move(roots));
    }
    fig.bands.push_back({false, j - sol.tolerance_hz, j + sol.tolerance_hz,
                         fmt::format("J +- {:.2f} Hz", sol.tolerance_hz), 0});
    // One colour for every allowed interval: they are one answer, not a series.
    bool first = true;
    for (const auto& iv : sol.intervals) {
      fig.bands.push_back({true, iv.from_deg, iv.to_deg, first ? "allowed dihedrals" : "", 2});
      first = false;
    }
    fig.footnote = "Source: " + set.citation;
    o.plot.save(fig, g);
  }
}

void setup(CLI::App& root, Globals& g) {
  auto& karplus = command_group(root, "karplus", "Karplus relations: parameter sets, curves, dihedrals from J");
  auto opts = std::make_shared<Options>();
  auto* cmd = karplus.add_subcommand("angles", "Dihedral angles consistent with a measured coupling");
  cmd->add_option("--set", opts->set, "Parameter set id (see: vicinal karplus sets)")->required();
  cmd->add_option("--j", opts->j, "Measured coupling in Hz")->required();
  cmd->add_option("--sigma", opts->sigma, "Standard uncertainty of the coupling in Hz")->capture_default_str();
  cmd->add_option("--k", opts->k, "Coverage factor: the band is k * sqrt(sigma^2 + rms^2)")->capture_default_str();
  cmd->add_option("--substituent", opts->substituents,
                  "Haasnoot sets: one substituent as DCHI:SIGN (repeat, up to 4), e.g. 1.26:+1");
  opts->plot.add_options(*cmd);
  cmd->footer(
      "Examples:\n"
      "  vicinal karplus angles --set hn-ha-hu-bax-1997 --j 7.4 --sigma 0.3\n"
      "  vicinal karplus angles --set hn-ha-vogeli-2007 --j 9.1 --sigma 0.2 --k 1 --svg phi.svg\n"
      "  vicinal karplus angles --set hh-haasnoot-1980-general --j 3.2 --substituent 1.26:+1 --substituent 0.4:-1\n"
      "Every interval where |J(curve) - J| <= k * sqrt(sigma^2 + rms^2), rms being the\n"
      "set's own stated deviation, with the best angle in each and every exact solution\n"
      "(up to four for cos^2 curves). An interval through +-180 is printed as two pieces\n"
      "marked 'continues across +-180'. A J the curve cannot reach is an error naming\n"
      "the nearest attainable J.");
  cmd->callback([opts, &g] { run_angles(*opts, g); });
}

const bool registered = register_command(22, setup);

}  // namespace

}  // namespace vicinal::cli
