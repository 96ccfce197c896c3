// vicinal library show COMPOUND     one compound's couplings with labels and conditions
#include <fmt/format.h>

#include <map>

#include "cli/command.h"
#include "cli/library_common.h"
#include "library/derived.h"
#include "library/query.h"
#include "report/table.h"

namespace vicinal::cli {

namespace {

std::string optional_text(const std::optional<double>& v) { return v ? fmt::format("{}", *v) : "-"; }

// "-65.2..-21.0, 21.0..65.2 (set-id)" for each set, or "-".
std::string derived_text(const std::vector<library::DerivedResult>& results) {
  std::string out;
  for (const auto& r : results) {
    std::string intervals;
    for (const auto& iv : r.intervals)
      intervals += fmt::format("{}{:.1f}..{:.1f}", intervals.empty() ? "" : ", ", iv.from_deg, iv.to_deg);
    out += fmt::format("{}{} ({})", out.empty() ? "" : "; ", intervals.empty() ? "none" : intervals, r.karplus_set);
  }
  return out.empty() ? "-" : out;
}

Json derived_json(const std::vector<library::DerivedResult>& results) {
  Json out = Json::array();
  for (const auto& r : results) {
    Json intervals = Json::array();
    for (const auto& iv : r.intervals) intervals.push_back({{"from_deg", iv.from_deg}, {"to_deg", iv.to_deg}});
    out.push_back({{"karplus_set", r.karplus_set}, {"coverage_k", library::kDerivedCoverage},
                   {"intervals", std::move(intervals)}});
  }
  return out;
}

std::string conditions_text(const library::Conditions& k) {
  std::vector<std::string> parts;
  if (!k.name.empty()) parts.push_back("'" + k.name + "'");
  if (!k.solvent.empty()) parts.push_back(k.solvent);
  if (k.temperature_k) parts.push_back(fmt::format("{} K", *k.temperature_k));
  if (k.field_mhz) parts.push_back(fmt::format("{} MHz", *k.field_mhz));
  if (k.ph) parts.push_back(fmt::format("pH {}", *k.ph));
  for (const auto* s : {&k.instrument, &k.method, &k.measured_by, &k.measured_on})
    if (!s->empty()) parts.push_back(*s);
  if (!k.source.empty()) parts.push_back("source: " + k.source);
  std::string out;
  for (const auto& p : parts) out += (out.empty() ? "" : ", ") + p;
  return out.empty() ? "(no conditions recorded)" : out;
}

void run_show(const std::string& what, const Globals& g) {
  auto lib = open_library(g);
  const auto id = library::find_compound(lib->db(), what);
  const auto entries = lib->read_entries({id});
  const auto& e = entries.at(0);
  const auto& c = e.compound;
  if (g.json) {
    Json doc = {{"id", id}, {"name", c.name}, {"inchikey", c.inchikey}, {"inchi", c.inchi}, {"smiles", c.smiles},
                {"notes", c.notes}, {"labels", Json::object()}, {"sets", Json::array()}};
    for (const auto& [label, atom] : c.labels) doc["labels"][label] = atom;
    for (const auto& s : e.sets) {
      const auto& k = s.conditions;
      Json sj = {{"name", k.name}, {"solvent", k.solvent}, {"instrument", k.instrument}, {"method", k.method},
                 {"measured_by", k.measured_by}, {"measured_on", k.measured_on}, {"source", k.source},
                 {"imported_from", s.imported_from}, {"notes", s.notes}, {"couplings", Json::array()}};
      sj["temperature_k"] = k.temperature_k ? Json(*k.temperature_k) : Json();
      sj["field_mhz"] = k.field_mhz ? Json(*k.field_mhz) : Json();
      sj["ph"] = k.ph ? Json(*k.ph) : Json();
      for (const auto& x : s.couplings) {
        Json j = {{"nuclei", x.nucleus_a + "," + x.nucleus_b}, {"atoms", {x.atoms_a, x.atoms_b}}, {"path", x.path},
                  {"bonds", x.bond_count}, {"isotopes", {x.isotope_a, x.isotope_b}}, {"j_hz", x.j_hz},
                  {"sign_known", x.sign_known},
                  {"assignment", x.stereo_unassigned ? "stereo-unassigned" : "assigned"},
                  {"canonical_ranks", {x.ranks_a, x.ranks_b}}, {"identity", x.identity},
                  {"karplus_set", x.karplus_set}, {"note", x.note}, {"origin", x.origin}};
        j["sigma_hz"] = x.sigma_hz ? Json(*x.sigma_hz) : Json();
        j["derived"] = derived_json(library::by_karplus_set(x.derived));
        sj["couplings"].push_back(std::move(j));
      }
      doc["sets"].push_back(std::move(sj));
    }
    g.print_json(doc);
    return;
  }
  std::string text = fmt::format("{}  (id {})\nInChIKey {}\nSMILES   {}\n", c.name, id, c.inchikey, c.smiles);
  for (const auto& n : c.notes) text += "note: " + n + "\n";
  bool any_conflict = false;
  for (const auto& s : e.sets) {
    text += "\n" + conditions_text(s.conditions) + "\n";
    for (const auto& n : s.notes) text += "note: " + n + "\n";
    std::map<std::string, int> seen;
    for (const auto& x : s.couplings) any_conflict |= ++seen[x.identity] > 1;
    report::TextTable t({"nuclei", "atoms", "nJ", "J/Hz", "sigma/Hz", "assignment", "dihedral/deg (set)", "note", "from"});
    for (const auto& x : s.couplings)
      t.add_row({x.nucleus_a + "," + x.nucleus_b,
                 library::join_atoms(x.atoms_a, '|') + "," + library::join_atoms(x.atoms_b, '|'),
                 fmt::format("{}J({},{})", x.bond_count, x.isotope_a, x.isotope_b),
                 fmt::format("{}{}{}", x.sign_known && x.j_hz > 0 ? "+" : "", x.j_hz, seen[x.identity] > 1 ? " !" : ""),
                 optional_text(x.sigma_hz), x.stereo_unassigned ? "stereo-unassigned" : "assigned",
                 derived_text(library::by_karplus_set(x.derived)), x.note, x.origin});
    text += t.render();
  }
  if (e.sets.empty()) text += "\n(no couplings stored)\n";
  if (any_conflict) text += "\n! the same coupling has more than one value under these conditions (kept side by side)\n";
  g.print(text);
}

void setup(CLI::App& root, Globals& g) {
  auto what = std::make_shared<std::string>();
  auto* cmd = library_group(root).add_subcommand("show", "Show one compound's couplings and conditions");
  cmd->add_option("compound", *what, "Compound name, InChIKey or id number")->required();
  cmd->footer("Example: vicinal library show 'methyl glucoside'\n"
              "Couplings are listed per measurement set with the labels they were given, the\n"
              "atoms in the stored structure's numbering, nJ and the isotopes.");
  cmd->callback([what, &g] { run_show(*what, g); });
}

const bool registered = register_command(14, setup);

}  // namespace

}  // namespace vicinal::cli
