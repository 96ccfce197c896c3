// vicinal karplus curve     J against the dihedral for one or more sets, as a table, JSON or plot
#include <fmt/format.h>

#include <algorithm>
#include <set>

#include "cli/command.h"
#include "cli/karplus_options.h"
#include "core/error.h"
#include "karplus/karplus.h"
#include "report/table.h"

namespace vicinal::cli {

namespace {

struct Options {
  std::vector<std::string> sets;
  std::string step = "5";
  std::vector<std::string> substituents;
  PlotTargets plot;
};

struct Curve {
  const karplus::ParameterSet* set;
  std::vector<karplus::Substituent> substituents;  // empty unless a Haasnoot set
  std::vector<double> j_hz;
  karplus::JRange range;
};

void run_curve(const Options& o, const Globals& g) {
  const double step = parse_option_number(o.step, "--step", "5");
  if (step <= 0 || step > 90)
    throw Error(fmt::format("step {:g} deg is outside (0, 90]", step), Location::field_in("", "--step"));
  o.plot.check();
  const auto subs = parse_substituents(o.substituents);

  std::vector<double> angles;
  for (int i = 0;; ++i) {
    const double t = -180.0 + i * step;
    if (t > 180.0 + 1e-9) break;
    angles.push_back(std::min(t, 180.0));
  }

  std::vector<Curve> curves;
  bool any_haasnoot = false;
  for (const auto& id : o.sets) {
    const auto& set = karplus::SetCatalog::shipped().find(id);
    Curve c{&set, set.is_haasnoot() ? subs : std::vector<karplus::Substituent>{}, {}, {}};
    any_haasnoot |= set.is_haasnoot();
    note_substituent_use(g, set, c.substituents.size());
    c.j_hz.resize(angles.size());
    karplus::j_hz(set, angles, c.j_hz, c.substituents);
    c.range = karplus::j_range(set, c.substituents);
    curves.push_back(std::move(c));
  }
  if (!subs.empty() && !any_haasnoot)
    throw Error("--substituent applies to Haasnoot sets only, and none was chosen",
                Location::field_in("", "--substituent"), "list them with: vicinal karplus sets --coupling \"3J(H,H)\"");

  std::set<std::string> angle_names;
  for (const auto& c : curves) angle_names.insert(c.set->angle_name);
  if (angle_names.size() > 1)
    g.note(fmt::format("note: these sets are measured on different dihedrals ({}); their curves share an axis only "
                       "as a picture.",
                       fmt::join(angle_names, ", ")));

  if (g.json) {
    // "curves" holds every set; "set" and "points" repeat the first for single-set callers.
    const auto points = [&](const Curve& c) {
      Json list = Json::array();
      for (std::size_t i = 0; i < angles.size(); ++i) list.push_back({{"dihedral_deg", angles[i]}, {"j_hz", c.j_hz[i]}});
      return list;
    };
    Json doc = {{"set", curves.front().set->id}, {"step_deg", step}, {"points", points(curves.front())}};
    doc["curves"] = Json::array();
    for (const auto& c : curves)
      doc["curves"].push_back({{"set", c.set->id},
                               {"coupling", c.set->coupling},
                               {"angle_name", c.set->angle_name},
                               {"offset_deg", c.set->offset_deg},
                               {"form", karplus::form_name(c.set->form)},
                               {"citation", c.set->citation},
                               {"substituents", substituents_json(c.substituents)},
                               {"min_hz", c.range.min_hz},
                               {"min_at_deg", c.range.min_at_deg},
                               {"max_hz", c.range.max_hz},
                               {"max_at_deg", c.range.max_at_deg},
                               {"points", points(c)}});
    g.print_json(doc);
  } else {
    std::vector<std::string> header{"dihedral deg"};
    for (const auto& c : curves) header.push_back(c.set->id + " J Hz");
    report::TextTable t(header);
    for (std::size_t i = 0; i < angles.size(); ++i) {
      std::vector<std::string> row{fmt::format("{:.1f}", angles[i])};
      for (const auto& c : curves) row.push_back(fmt::format("{:.2f}", c.j_hz[i]));
      t.add_row(row);
    }
    std::string text = t.render();
    for (const auto& c : curves)
      text += fmt::format("{}: {} on {} (offset {:+g} deg); J {:.2f} to {:.2f} Hz. {}\n", c.set->id, c.set->coupling,
                          c.set->angle_name, c.set->offset_deg, c.range.min_hz, c.range.max_hz, c.set->citation);
    g.print(text);
  }

  if (o.plot.any()) {
    report::Figure fig;
    fig.title = curves.size() == 1 ? curves.front().set->title : "Karplus curves";
    dihedral_axis(fig, fmt::format("{}", fmt::join(angle_names, " / ")));
    fig.y_label = "J / Hz";
    std::vector<std::string> sources;
    for (const auto& c : curves) {
      report::Series s;
      s.label = fmt::format("{} {} ({})", c.set->coupling, c.set->short_citation, c.set->id);
      s.x = angles;
      s.y = c.j_hz;
      fig.series.push_back(std::move(s));
      sources.push_back(c.set->citation);
    }
    fig.footnote = "Sources: " + fmt::format("{}", fmt::join(sources, "; "));
    o.plot.save(fig, g);
  }
}

void setup(CLI::App& root, Globals& g) {
  auto& karplus = command_group(root, "karplus", "Karplus relations: parameter sets, curves, dihedrals from J");
  auto opts = std::make_shared<Options>();
  auto* cmd = karplus.add_subcommand("curve", "J against the dihedral angle for one or more parameter sets");
  cmd->add_option("--set", opts->sets, "Parameter set id (repeat to overlay several)")->required();
  cmd->add_option("--step", opts->step, "Angle step in degrees, (0, 90]")->capture_default_str();
  cmd->add_option("--substituent", opts->substituents,
                  "Haasnoot sets: one substituent as DCHI:SIGN (repeat, up to 4), e.g. 1.26:+1");
  opts->plot.add_options(*cmd);
  cmd->footer(
      "Examples:\n"
      "  vicinal karplus curve --set hn-ha-hu-bax-1997 --step 10\n"
      "  vicinal karplus curve --set hn-ha-pardi-1984 --set hn-ha-vogeli-2007 --svg hnha.svg\n"
      "  vicinal karplus curve --set hh-haasnoot-1980-general --substituent 1.26:+1 --substituent 0.4:-1\n"
      "  vicinal --json karplus curve --set hh-karplus-1963\n"
      "The dihedral is the set's own (phi for protein backbone sets, measured on\n"
      "C'(i-1)-N-CA-C'); J is evaluated at dihedral + the set's offset.\n"
      "--json: {\"set\", \"points\": [{\"dihedral_deg\", \"j_hz\"}], \"curves\": [one entry per --set]};\n"
      "\"set\"/\"points\" repeat the first curve.");
  cmd->callback([opts, &g] { run_curve(*opts, g); });
}

const bool registered = register_command(21, setup);

}  // namespace

}  // namespace vicinal::cli
