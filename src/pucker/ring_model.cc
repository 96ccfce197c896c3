#include "pucker/ring_model.h"

#include <fmt/format.h>

#include <algorithm>
#include <filesystem>

#include "core/data_dir.h"
#include "core/error.h"
#include "core/json_file.h"
#include "pucker/pseudorotation.h"
#include "structure/substituents.h"

namespace vicinal::pucker {

namespace {

std::string optional_string(const Json& o, const std::string& key) {
  return o.contains(key) && o[key].is_string() ? o[key].get<std::string>() : std::string();
}

RingSubstituent read_substituent(const Json& s, const std::string& file, const std::string& at) {
  json_require_keys(s, {"atom", "on", "element", "beta", "orientation"}, file, at);
  RingSubstituent r;
  r.atom = json_string(json_member(s, "atom", file, at), file, at + ".atom");
  r.on = json_string(json_member(s, "on", file, at), file, at + ".on");
  r.element = json_string(json_member(s, "element", file, at), file, at + ".element");
  const Json& beta = json_member(s, "beta", file, at);
  if (!beta.is_array()) throw Error("expected a list of elements", Location::field_in(file, at + ".beta"));
  for (std::size_t i = 0; i < beta.size(); ++i)
    r.beta.push_back(json_string(beta[i], file, fmt::format("{}.beta[{}]", at, i)));
  const double xi = json_number(json_member(s, "orientation", file, at), file, at + ".orientation");
  if (xi != 1 && xi != -1)
    throw Error("orientation must be +1 or -1", Location::field_in(file, at + ".orientation"),
                "see substituent_notes in the file for the rule");
  r.orientation = static_cast<int>(xi);
  return r;
}

}  // namespace

RingModel RingModel::load_file(const std::string& path) {
  const Json doc = read_json_file(path);
  // Ring files are written by hand: a misspelt key must not be silently ignored.
  json_require_keys(doc, {"id", "title", "ring_atoms", "torsion_convention", "endo_exo_swapped", "karplus_set",
                          "relations_source", "substituent_notes", "proton_names", "prochirality", "couplings"},
                    path, "");
  RingModel m;
  m.file = path;
  m.id = json_string(json_member(doc, "id", path, ""), path, "id");
  m.title = json_string(json_member(doc, "title", path, ""), path, "title");
  m.karplus_set = json_string(json_member(doc, "karplus_set", path, ""), path, "karplus_set");
  m.torsion_convention = optional_string(doc, "torsion_convention");
  m.relations_source = json_string(json_member(doc, "relations_source", path, ""), path, "relations_source");
  m.substituent_notes = optional_string(doc, "substituent_notes");
  if (doc.contains("endo_exo_swapped")) {
    if (!doc["endo_exo_swapped"].is_boolean())
      throw Error("endo_exo_swapped must be true or false", Location::field_in(path, "endo_exo_swapped"));
    m.endo_exo_swapped = doc["endo_exo_swapped"].get<bool>();
  }
  const Json& atoms = json_member(doc, "ring_atoms", path, "");
  if (!atoms.is_array() || atoms.size() != 5)
    throw Error("ring_atoms must list the five ring atoms", Location::field_in(path, "ring_atoms"));
  for (int i = 0; i < 5; ++i) m.ring_atoms[i] = json_string(atoms[i], path, fmt::format("ring_atoms[{}]", i));
  const Json& couplings = json_member(doc, "couplings", path, "");
  if (!couplings.is_array() || couplings.empty())
    throw Error("couplings must be a non-empty list", Location::field_in(path, "couplings"));
  for (std::size_t i = 0; i < couplings.size(); ++i) {
    const std::string at = fmt::format("couplings[{}]", i);
    const Json& c = couplings[i];
    json_require_keys(c, {"name", "nu", "a", "b", "source", "karplus_set", "substituents"}, path, at);
    RingCoupling r;
    r.name = json_string(json_member(c, "name", path, at), path, at + ".name");
    const double nu = json_number(json_member(c, "nu", path, at), path, at + ".nu");
    if (nu != static_cast<int>(nu) || nu < 0 || nu > 4)
      throw Error("nu must be the torsion index 0..4", Location::field_in(path, at + ".nu"));
    r.nu = static_cast<int>(nu);
    r.a = json_number(json_member(c, "a", path, at), path, at + ".a");
    r.b = json_number(json_member(c, "b", path, at), path, at + ".b");
    r.source = json_string(json_member(c, "source", path, at), path, at + ".source");
    r.karplus_set = optional_string(c, "karplus_set");
    const Json& subs = json_member(c, "substituents", path, at);
    if (!subs.is_array()) throw Error("expected a list", Location::field_in(path, at + ".substituents"));
    for (std::size_t k = 0; k < subs.size(); ++k)
      r.substituents.push_back(read_substituent(subs[k], path, fmt::format("{}.substituents[{}]", at, k)));
    m.couplings.push_back(std::move(r));
  }
  return m;
}

std::vector<std::string> RingModel::shipped_ids() {
  std::vector<std::string> ids;
  for (const auto& entry : std::filesystem::directory_iterator(data_dir() / "db" / "pucker"))
    if (entry.path().extension() == ".json") ids.push_back(entry.path().stem().string());
  std::sort(ids.begin(), ids.end());
  return ids;
}

RingModel RingModel::load(const std::string& id_or_path) {
  if (id_or_path.find('/') != std::string::npos || id_or_path.ends_with(".json")) return load_file(id_or_path);
  const auto ids = shipped_ids();
  if (std::find(ids.begin(), ids.end(), id_or_path) == ids.end())
    throw Error(fmt::format("unknown ring type '{}'", id_or_path), Location::field_in("", "--ring"),
                fmt::format("shipped ring types: {}; or give the path of a ring file", fmt::join(ids, ", ")));
  return load_file(data_file("db/pucker/" + id_or_path + ".json").string());
}

std::size_t RingModel::index_of(const std::string& name) const {
  for (std::size_t i = 0; i < couplings.size(); ++i)
    if (couplings[i].name == name) return i;
  std::vector<std::string> names;
  for (const auto& c : couplings) names.push_back(c.name);
  throw Error(fmt::format("ring '{}' has no coupling '{}'", id, name), {},
              fmt::format("its couplings are {}", fmt::join(names, ", ")));
}

std::string RingModel::envelope(double phase_deg) const {
  return envelope_name(phase_deg, ring_atoms, endo_exo_swapped);
}

double hh_dihedral_deg(const RingCoupling& coupling, double phase_deg, double amplitude_deg) {
  return coupling.a * endocyclic_torsions_deg(phase_deg, amplitude_deg)[coupling.nu] + coupling.b;
}

RingCouplings::RingCouplings(const RingModel& ring, const karplus::SetCatalog& catalog,
                             const std::string& override_set)
    : ring_(ring) {
  const auto& en = structure::Electronegativity::shipped();
  for (const auto& c : ring.couplings) {
    const std::string& id = !override_set.empty() ? override_set : !c.karplus_set.empty() ? c.karplus_set : ring.karplus_set;
    const karplus::ParameterSet& set = catalog.find(id);
    if (set.nuclei[0] != "1H" || set.nuclei[1] != "1H")
      throw Error(fmt::format("set '{}' is for {}, not for proton-proton couplings", set.id, set.coupling),
                  Location::field_in("", "--set"), "choose an H-C-C-H set, e.g. hh-haasnoot-1980-general");
    const bool haasnoot = set.form == karplus::Form::Haasnoot;
    if (haasnoot && set.coefficients.size() < 7)
      throw Error(fmt::format("set '{}' lacks the beta factor P7", set.id), {set.file});
    const double p7 = haasnoot ? set.coefficients[6] : 0.0;
    sets_.push_back(set);
    std::vector<karplus::Substituent> subs;
    if (haasnoot)
      for (const auto& s : c.substituents) {
        double beta_sum = 0;
        for (const auto& b : s.beta) beta_sum += en.delta_from_hydrogen(b);
        subs.push_back({en.delta_from_hydrogen(s.element) - p7 * beta_sum, s.orientation});
      }
    substituents_.push_back(std::move(subs));
  }
}

double RingCouplings::j_hz(std::size_t coupling, double phase_deg, double amplitude_deg) const {
  return karplus::j_hz(sets_[coupling], hh_dihedral_deg(ring_.couplings[coupling], phase_deg, amplitude_deg),
                       substituents_[coupling]);
}

}  // namespace vicinal::pucker
