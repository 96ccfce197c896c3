// vicinal library find     search couplings by compound, substructure, nuclei, J, conditions
#include <fmt/format.h>

#include "cli/command.h"
#include "cli/library_common.h"
#include "library/query.h"
#include "report/table.h"

namespace vicinal::cli {

namespace {

struct Options {
  library::FindQuery query;
  std::optional<double> j_min, j_max;
  std::optional<int> bonds;
  std::size_t limit = 200;
};

std::string optional_text(const std::optional<double>& v, const char* unit = "") {
  return v ? fmt::format("{}{}", *v, unit) : "-";
}

Json conditions_json(const library::Conditions& k) {
  Json j = {{"set", k.name},         {"solvent", k.solvent},   {"instrument", k.instrument},
            {"method", k.method},    {"measured_by", k.measured_by}, {"measured_on", k.measured_on},
            {"source", k.source}};
  j["temperature_k"] = k.temperature_k ? Json(*k.temperature_k) : Json();
  j["field_mhz"] = k.field_mhz ? Json(*k.field_mhz) : Json();
  j["ph"] = k.ph ? Json(*k.ph) : Json();
  return j;
}

void run_find(Options& o, const Globals& g) {
  o.query.j_min_hz = o.j_min;
  o.query.j_max_hz = o.j_max;
  o.query.bonds = o.bonds;
  o.query.limit = o.limit;
  auto lib = open_library(g);
  const auto result = library::find_couplings(lib->db(), o.query);
  const std::size_t shown = result.couplings.size();
  if (g.json) {
    Json doc = {{"matches", result.total}, {"shown", shown}, {"couplings", Json::array()}};
    if (!o.query.smarts.empty()) {
      doc["compounds_matching_smarts"] = result.compounds_matched_smarts;
      doc["compounds_skipped_by_fingerprint"] = result.compounds_screened_out;
    }
    for (std::size_t i = 0; i < shown; ++i) {
      const auto& f = result.couplings[i];
      const auto& c = f.coupling;
      Json j = {{"compound", f.compound}, {"compound_id", f.compound_id}, {"inchikey", f.inchikey},
                {"nuclei", c.nucleus_a + "," + c.nucleus_b}, {"isotopes", {c.isotope_a, c.isotope_b}},
                {"bonds", c.bond_count}, {"j_hz", c.j_hz}, {"sign_known", c.sign_known},
                {"assignment", c.stereo_unassigned ? "stereo-unassigned" : "assigned"},
                {"conditions", conditions_json(f.conditions)}, {"note", c.note}, {"origin", c.origin},
                {"conflict", f.in_conflict}};
      j["sigma_hz"] = c.sigma_hz ? Json(*c.sigma_hz) : Json();
      doc["couplings"].push_back(std::move(j));
    }
    g.print_json(doc);
    return;
  }
  if (result.couplings.empty()) {
    g.print("no couplings match");
    return;
  }
  report::TextTable t({"id", "compound", "nuclei", "nJ", "J/Hz", "sigma/Hz", "solvent", "T/K", "source"});
  for (std::size_t i = 0; i < shown; ++i) {
    const auto& f = result.couplings[i];
    const auto& c = f.coupling;
    t.add_row({std::to_string(f.compound_id), f.compound, c.nucleus_a + "," + c.nucleus_b,
               fmt::format("{}J({},{})", c.bond_count, c.isotope_a, c.isotope_b),
               fmt::format("{}{}", c.j_hz, f.in_conflict ? " !" : ""), optional_text(c.sigma_hz),
               f.conditions.solvent.empty() ? "-" : f.conditions.solvent, optional_text(f.conditions.temperature_k),
               f.conditions.source.empty() ? "-" : f.conditions.source});
  }
  std::string text = t.render();
  text += fmt::format("{} coupling{} match", result.total, result.total == 1 ? "" : "s");
  if (shown < result.total) text += fmt::format(" ({} shown; raise --limit for more)", shown);
  text += "\n";
  if (std::any_of(result.couplings.begin(), result.couplings.end(), [](const auto& f) { return f.in_conflict; }))
    text += "! another value for the same coupling and conditions is stored too (see library show)\n";
  g.print(text);
}

void setup(CLI::App& root, Globals& g) {
  auto o = std::make_shared<Options>();
  auto* cmd = library_group(root).add_subcommand("find", "Search the library's couplings");
  cmd->add_option("--name", o->query.name, "Part of the compound name (any case)");
  cmd->add_option("--inchikey", o->query.inchikey, "InChIKey, or its first 14 characters (any stereo)");
  cmd->add_option("--smarts", o->query.smarts, "Substructure the compound must contain (SMARTS)");
  cmd->add_option("--nuclei", o->query.nuclei, "Coupled nuclei: elements or isotopes, e.g. H,H or 1H,13C");
  cmd->add_option("--j-min", o->j_min, "Smallest J in Hz");
  cmd->add_option("--j-max", o->j_max, "Largest J in Hz");
  cmd->add_option("--bonds", o->bonds, "Bonds between the nuclei (3 for vicinal couplings)")->check(CLI::Range(1, 12));
  cmd->add_option("--solvent", o->query.solvent, "Solvent as recorded (any case)");
  cmd->add_option("--source", o->query.source, "Part of the source or DOI");
  cmd->add_flag("--no-prescreen", [o](std::int64_t) { o->query.fingerprint_screen = false; },
                "Match the SMARTS against every compound (to check that the pre-screen loses nothing)");
  cmd->add_option("--limit", o->limit, "Show at most this many couplings")
      ->check(CLI::Range(0, 100000000))
      ->capture_default_str();
  cmd->footer("Example: vicinal library find --smarts 'C1CCOC1' --nuclei H,H --bonds 3 --j-min 8\n"
              "All given criteria must hold. Substructure searches first skip compounds whose\n"
              "stored path fingerprint cannot contain the query, then match the SMARTS.");
  cmd->callback([o, &g] { run_find(*o, g); });
}

const bool registered = register_command(13, setup);

}  // namespace

}  // namespace vicinal::cli
