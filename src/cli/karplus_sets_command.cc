// vicinal karplus sets      list the shipped (and user) Karplus parameter sets
#include <fmt/format.h>

#include "cli/command.h"
#include "karplus/karplus.h"
#include "report/table.h"

namespace vicinal::cli {

namespace {

Json set_json(const karplus::ParameterSet& s) {
  Json coefficients = Json::object();
  for (std::size_t i = 0; i < s.coefficients.size(); ++i) coefficients[s.coefficient_names[i]] = s.coefficients[i];
  Json out = {{"id", s.id},
              {"title", s.title},
              {"nuclei", {s.nuclei[0], s.nuclei[1]}},
              {"coupling", s.coupling},
              {"pattern_smarts", s.pattern_smarts},
              {"angle_name", s.angle_name},
              {"offset_deg", s.offset_deg},
              {"form", karplus::form_name(s.form)},
              {"coefficients", coefficients},
              {"rms_hz", s.rms_hz},
              {"valid_range_deg", {s.valid_from_deg, s.valid_to_deg}},
              {"citation", s.citation},
              {"short_citation", s.short_citation},
              {"table", s.table},
              {"doi", s.doi},
              {"notes", s.notes},
              {"file", s.file}};
  if (s.is_haasnoot()) out["substituent_count"] = s.substituent_count;
  return out;
}

std::string rms_text(double rms_hz) { return rms_hz > 0 ? fmt::format("{:.2f}", rms_hz) : "-"; }

void show_one(const karplus::ParameterSet& s, const Globals& g) {
  std::string text = fmt::format("{}\n  {}\n  coupling {} ({}-{}), angle {} on {}, offset {:+g} deg\n  form {}:", s.id,
                                 s.title, s.coupling, s.nuclei[0], s.nuclei[1], s.angle_name, s.pattern_smarts,
                                 s.offset_deg, karplus::form_name(s.form));
  for (std::size_t i = 0; i < s.coefficients.size(); ++i)
    text += fmt::format(" {}={:g}", s.coefficient_names[i], s.coefficients[i]);
  if (s.is_haasnoot())
    text += s.substituent_count ? fmt::format("\n  fitted for {} substituents", s.substituent_count)
                                : std::string("\n  fitted for all substitution patterns");
  const auto r = karplus::j_range(s);
  text += fmt::format("\n  J from {:.2f} Hz ({:.1f} deg) to {:.2f} Hz ({:.1f} deg){}\n  rms {} Hz\n  {}", r.min_hz,
                      r.min_at_deg, r.max_hz, r.max_at_deg, s.is_haasnoot() ? " without substituents" : "",
                      rms_text(s.rms_hz), s.citation);
  if (!s.table.empty()) text += ", " + s.table;
  if (!s.doi.empty()) text += ", doi:" + s.doi;
  if (!s.notes.empty()) text += "\n  notes: " + s.notes;
  text += "\n  file: " + s.file + "\n";
  g.print(text);
}

struct Options {
  std::string coupling;
  std::string id;
};

void run_sets(const Options& o, const Globals& g) {
  const auto& catalog = karplus::SetCatalog::shipped();
  if (!o.id.empty()) {
    const auto& s = catalog.find(o.id);
    if (g.json)
      g.print_json(set_json(s));
    else
      show_one(s, g);
    return;
  }
  std::vector<const karplus::ParameterSet*> chosen;
  for (const auto& s : catalog.all())
    if (o.coupling.empty() || s.coupling.find(o.coupling) != std::string::npos) chosen.push_back(&s);
  if (g.json) {
    Json doc = {{"sets", Json::array()}};
    for (const auto* s : chosen) doc["sets"].push_back(set_json(*s));
    g.print_json(doc);
    return;
  }
  report::TextTable t({"id", "coupling", "form", "rms Hz", "source"});
  for (const auto* s : chosen)
    t.add_row({s->id, s->coupling, karplus::form_name(s->form), rms_text(s->rms_hz), s->short_citation});
  g.print(t.render() + fmt::format("{} sets; details of one: vicinal karplus sets --set ID\n", chosen.size()));
}

void setup(CLI::App& root, Globals& g) {
  auto& karplus = command_group(root, "karplus", "Karplus relations: parameter sets, curves, dihedrals from J");
  auto opts = std::make_shared<Options>();
  auto* cmd = karplus.add_subcommand("sets", "List the published Karplus parameter sets");
  cmd->add_option("--coupling", opts->coupling, "Only sets for this coupling, e.g. \"3J(HN,HA)\"");
  cmd->add_option("--set", opts->id, "Show one set in full: coefficients, range, citation, notes");
  cmd->footer(
      "Examples:\n"
      "  vicinal karplus sets\n"
      "  vicinal karplus sets --coupling \"3J(HN,HA)\"\n"
      "  vicinal karplus sets --set hn-ha-hu-bax-1997\n"
      "  vicinal --json karplus sets\n"
      "Each set is one file in db/karplus/ with its citation; sets in $VICINAL_KARPLUS_DIR\n"
      "are listed too. rms is the set's own stated deviation ('-' when none is stated).");
  cmd->callback([opts, &g] { run_sets(*opts, g); });
}

const bool registered = register_command(20, setup);

}  // namespace

}  // namespace vicinal::cli
