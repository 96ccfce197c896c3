#include "library/entry_builder.h"

#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/elements.h>
#include <openbabel/generic.h>
#include <openbabel/obconversion.h>
#include <openbabel/obiter.h>

#include <algorithm>
#include <cmath>
#include <map>
#include <sstream>

#include "core/nuclei.h"
#include "core/parse.h"
#include "library/fingerprint.h"
#include "structure/coupling_path.h"
#include "structure/molecule_format.h"
#include "structure/molecule_io.h"
#include "structure/openbabel_log.h"
#include "structure/openbabel_read.h"

namespace vicinal::library {

namespace {

// Replaces the program/date line of a mol block so equal molecules give equal text.
std::string fixed_header(std::string block) {
  const auto first = block.find('\n');
  if (first == std::string::npos) return block;
  const auto second = block.find('\n', first + 1);
  if (second == std::string::npos) return block;
  const std::string line = block.substr(first + 1, second - first - 1);
  const std::string dimension = line.size() >= 22 ? line.substr(20, 2) : "3D";
  return block.substr(0, first + 1) + "  vicinal 0000000000" + dimension + block.substr(second);
}

Location with_field(Location where, const std::string& field) {
  where.field = field;
  return where;
}

}  // namespace

std::string molfile_with_labels(const OpenBabel::OBMol& mol, const std::vector<std::pair<std::string, int>>& labels) {
  OpenBabel::OBMol copy(mol);
  copy.SetTitle("");
  copy.DeleteData(OpenBabel::OBGenericDataType::PairData);
  structure::LogCapture quiet;
  OpenBabel::OBConversion conv;
  conv.SetOutFormat("mol");
  std::string block = conv.WriteString(&copy, true);
  // Strip the end marker; the labels field and "$$$$" follow.
  if (auto end = block.rfind("M  END"); end != std::string::npos) block = block.substr(0, end + 6) + "\n";
  block = fixed_header(block);
  if (!labels.empty()) {
    block += fmt::format("> <{}>\n", structure::kSdfLabelField);
    for (const auto& [label, atom] : labels) block += fmt::format("{} {}\n", label, atom);
    block += "\n";
  }
  return block + "$$$$\n";
}

OpenBabel::OBMol molecule_from_molfile(const std::string& text, const std::string& source) {
  structure::LogCapture log;
  OpenBabel::OBConversion conv;
  conv.SetInFormat("sdf");
  OpenBabel::OBMol mol;
  if (!structure::guarded_read([&] { return conv.ReadString(&mol, text); }, source, "molfile") || mol.NumAtoms() == 0 ||
      !log.errors().empty())
    throw Error("the molfile does not parse", {source}, "give the structure as a file or SMILES instead");
  int implicit = 0;
  FOR_ATOMS_OF_MOL(atom, mol) implicit += atom->GetImplicitHCount();
  if (implicit > 0 || mol.GetDimension() != 3)
    throw Error("an inline molfile must be 3D with explicit hydrogens", {source},
                "give the structure as a file (hydrogens and 3D are added) or as SMILES");
  return mol;
}

std::string observed_isotope(const OpenBabel::OBMol& mol, int atom) {
  auto* a = const_cast<OpenBabel::OBMol&>(mol).GetAtom(atom);
  const std::string element = OpenBabel::OBElements::GetSymbol(a->GetAtomicNum());
  if (a->GetIsotope() != 0) return fmt::format("{}{}", a->GetIsotope(), element);
  static std::map<std::string, std::string> chosen;  // element -> isotope, from the shipped table
  if (chosen.empty()) {
    std::map<std::string, const Nucleus*> best;
    for (const auto& n : NuclearTable::shipped().all()) {
      if (n.abundance_percent <= 0) continue;
      auto& b = best[n.element];
      const bool half = std::fabs(n.spin - 0.5) < 1e-9;
      const bool b_half = b && std::fabs(b->spin - 0.5) < 1e-9;
      if (!b || (half && !b_half) || (half == b_half && n.abundance_percent > b->abundance_percent)) b = &n;
    }
    for (const auto& [e, n] : best) chosen[e] = n->isotope;
  }
  auto it = chosen.find(element);
  return it == chosen.end() ? element : it->second;
}

void check_coupling_values(double j_hz, std::optional<double> sigma_hz, const Location& where) {
  if (!std::isfinite(j_hz) || std::fabs(j_hz) > 1000)
    throw Error(fmt::format("J = {} Hz is outside -1000..1000 Hz", j_hz), with_field(where, "j_hz"));
  if (sigma_hz && (!std::isfinite(*sigma_hz) || *sigma_hz < 0))
    throw Error(fmt::format("sigma = {} Hz is negative", *sigma_hz), with_field(where, "sigma_hz"));
}

void check_conditions(const Conditions& c, const Location& where) {
  if (c.temperature_k && !(*c.temperature_k > 0 && *c.temperature_k < 1000))
    throw Error(fmt::format("temperature {} K is outside 0..1000 K", *c.temperature_k),
                with_field(where, "temperature_k"), "give the temperature in kelvin");
  if (c.field_mhz && !(*c.field_mhz > 0))
    throw Error(fmt::format("field {} MHz is not positive", *c.field_mhz), with_field(where, "field_mhz"));
  if (c.ph && !(*c.ph >= 0 && *c.ph <= 14))
    throw Error(fmt::format("pH {} is outside 0..14", *c.ph), with_field(where, "ph"));
}

CompoundBuilder::CompoundBuilder(const std::string& name, const StructureSpec& spec, const Location& where) {
  try {
    switch (spec.kind) {
      case StructureSpec::Kind::Smiles:
        mol_ = structure::molecule_from_smiles(spec.text, true);
        source_ = "SMILES " + spec.text;
        break;
      case StructureSpec::Kind::File:
        mol_ = structure::read_molecule(spec.text);
        source_ = spec.text;
        break;
      case StructureSpec::Kind::Molfile:
        mol_ = molecule_from_molfile(spec.text, where.file);
        source_ = "the inline molfile";
        break;
    }
    // Residue-based labels mean something only for PDB input; Open Babel
    // invents residues for other formats.
    const bool pdb = spec.kind == StructureSpec::Kind::File && structure::molecule_format_of(spec.text).openbabel_id == "pdb";
    if (pdb) {
      can_park_ = false;
      labels_ = structure::AtomLabels::for_molecule(mol_, source_, spec.labels_file);
    } else {
      labels_ = structure::AtomLabels::from_sdf_field(mol_, source_);
      if (!spec.labels_file.empty())
        labels_.merge(structure::AtomLabels::from_csv(spec.labels_file, static_cast<int>(mol_.NumAtoms())));
    }
    identity_ = std::make_unique<CompoundIdentity>(mol_, source_);
  } catch (const Error& e) {
    // A fault in a file the row names (structure, labels) is reported at its
    // own place, with the row that named it in the message.
    const bool other_file = !e.where().file.empty() && e.where().file != where.file;
    throw Error(other_file ? fmt::format("compound '{}' (named at {}): {}", name, where.describe(), e.what_happened())
                           : fmt::format("compound '{}': {}", name, e.what_happened()),
                other_file ? e.where() : where, e.hint());
  }
  record_.name = name;
  record_.smiles = identity_->smiles();
  record_.inchi = identity_->inchi();
  record_.inchikey = identity_->inchikey();
  // Here rather than in the store, so that a pipelined import keeps every
  // Open Babel call on the reading thread.
  record_.fingerprint = compound_fingerprint(record_.smiles);
  record_.labels.assign(labels_.all().begin(), labels_.all().end());
  record_.molfile = molfile_with_labels(mol_, record_.labels);
  for (int i = 1; i <= static_cast<int>(mol_.NumAtoms()); ++i)
    record_.atoms.push_back({i, OpenBabel::OBElements::GetSymbol(mol_.GetAtom(i)->GetAtomicNum()), identity_->rank(i)});
}

CompoundBuilder::CompoundBuilder(Parked parked)
    : mol_(molecule_from_molfile(parked.record.molfile, parked.source)),
      labels_(structure::AtomLabels::from_sdf_field(mol_, parked.source)),
      identity_(std::make_unique<CompoundIdentity>(mol_, parked.source, CompoundIdentity::Names::KeysOnly)),
      record_(std::move(parked.record)),
      source_(std::move(parked.source)) {}

CouplingRecord CompoundBuilder::coupling(const std::array<std::vector<std::string>, 2>& nuclei, double j_hz,
                                         std::optional<double> sigma_hz, const Location& where) {
  check_coupling_values(j_hz, sigma_hz, where);
  CouplingRecord c;
  c.j_hz = j_hz;
  c.sigma_hz = sigma_hz;
  // Built only for a message: this runs for every row of a file.
  const auto at = [&] { return with_field(where, "nuclei"); };
  std::array<std::vector<int>*, 2> atoms{&c.atoms_a, &c.atoms_b};
  std::array<std::string*, 2> texts{&c.nucleus_a, &c.nucleus_b};
  for (int side = 0; side < 2; ++side) {
    if (nuclei[side].empty()) throw Error("a nucleus is missing", at(), "write two nuclei, e.g. H-2,H-3");
    for (const auto& ref : nuclei[side]) {
      int atom = 0;
      try {
        atom = labels_.resolve(ref, &mol_);
      } catch (const Error& e) {
        throw Error(e.what_happened(), at(), e.hint());
      }
      if (std::find(atoms[side]->begin(), atoms[side]->end(), atom) != atoms[side]->end())
        throw Error(fmt::format("'{}' is listed twice as an alternative", ref), at());
      atoms[side]->push_back(atom);
      *texts[side] += (texts[side]->empty() ? "" : "|") + std::string(trim(ref));
    }
  }
  for (int a : c.atoms_a)
    for (int b : c.atoms_b)
      if (a == b) throw Error(fmt::format("atom {} is coupled to itself", a), at());
  auto known = pair_facts_.find({c.atoms_a, c.atoms_b});
  if (known == pair_facts_.end()) {
    auto facts = facts_of(c.atoms_a, c.atoms_b);
    if (!facts) throw Error(fmt::format("{} and {} are not connected by bonds", c.nucleus_a, c.nucleus_b), at());
    known = pair_facts_.emplace(std::make_pair(c.atoms_a, c.atoms_b), std::move(*facts)).first;
  }
  const PairFacts& f = known->second;
  c.path = f.path;
  c.bond_count = f.bond_count;
  c.isotope_a = f.isotope_a;
  c.isotope_b = f.isotope_b;
  c.stereo_unassigned = c.atoms_a.size() > 1 || c.atoms_b.size() > 1;
  c.ranks_a = f.ranks_a;
  c.ranks_b = f.ranks_b;
  c.identity = f.identity;
  c.line = where.line;
  return c;
}

std::optional<CompoundBuilder::PairFacts> CompoundBuilder::facts_of(const std::vector<int>& atoms_a,
                                                                     const std::vector<int>& atoms_b) {
  PairFacts f;
  const int a = atoms_a.front(), b = atoms_b.front();
  f.bond_count = structure::bond_distance(mol_, a, b);
  if (f.bond_count < 1) return std::nullopt;
  const auto paths = structure::paths_of_length(mol_, a, b, f.bond_count);
  f.path = paths.empty() ? std::vector<int>{a, b} : paths.front().atoms;
  f.isotope_a = observed_isotope(mol_, a);
  f.isotope_b = observed_isotope(mol_, b);
  f.ranks_a = identity_->ranks_text(atoms_a);
  f.ranks_b = identity_->ranks_text(atoms_b);
  f.identity = identity_->coupling_key(atoms_a, atoms_b);
  return f;
}

}  // namespace vicinal::library
