#include "structure/atom_labels.h"

#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/elements.h>
#include <openbabel/generic.h>
#include <openbabel/residue.h>

#include <cctype>
#include <limits>
#include <set>
#include <sstream>

#include "core/csv.h"
#include "core/parse.h"

namespace vicinal::structure {

std::string atom_name(const OpenBabel::OBMol& mol, int atom) {
  auto& m = const_cast<OpenBabel::OBMol&>(mol);  // Open Babel's accessors are not const
  const OpenBabel::OBAtom* a = m.GetAtom(atom);
  if (!a) return fmt::format("#{}", atom);
  return fmt::format("{}{}", OpenBabel::OBElements::GetSymbol(a->GetAtomicNum()), atom);
}

AtomLabels::AtomLabels(int atom_count, std::string source) : atom_count_(atom_count), source_(std::move(source)) {}

void AtomLabels::add(const std::string& label, int atom, const Location& where) {
  const std::string name{trim(label)};
  if (name.empty()) throw Error("empty atom label", where);
  if (atom < 1 || (atom_count_ > 0 && atom > atom_count_))
    throw Error(fmt::format("label '{}' names atom {}, but the structure has atoms 1 to {}", name, atom, atom_count_),
                where);
  auto [it, inserted] = by_label_.emplace(name, atom);
  if (!inserted && it->second != atom)
    throw Error(fmt::format("label '{}' names atom {} here but atom {} elsewhere", name, atom, it->second), where,
                "each label must name one atom");
  first_label_.emplace(atom, name);
}

namespace {

// An atom number as written, narrowed to int without wrapping around
// (2147483648 must not become -2147483648); add() then checks the range.
int atom_number(std::string_view text, const Location& where) {
  const long atom = parse_long(text, where);
  if (atom < std::numeric_limits<int>::min() || atom > std::numeric_limits<int>::max())
    throw Error(fmt::format("atom {} is out of range", atom), where, "atoms are numbered from 1");
  return static_cast<int>(atom);
}

}  // namespace

void AtomLabels::merge(const AtomLabels& other) {
  for (const auto& [label, atom] : other.by_label_) add(label, atom, Location(other.source_));
}

AtomLabels AtomLabels::from_csv(const std::string& path, int atom_count) {
  const CsvTable table = CsvTable::read_file(path);
  const std::size_t label_col = table.require_column("label");
  const std::size_t atom_col = table.require_column("atom");
  AtomLabels labels(atom_count, path);
  for (const auto& row : table.rows())
    labels.add(row.fields[label_col], atom_number(row.fields[atom_col], table.where(row, atom_col)),
               table.where(row, label_col));
  return labels;
}

AtomLabels AtomLabels::from_sdf_field(const OpenBabel::OBMol& mol, const std::string& source) {
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  AtomLabels labels(static_cast<int>(m.NumAtoms()), source);
  auto* data = dynamic_cast<OpenBabel::OBPairData*>(m.GetData(kSdfLabelField));
  if (!data) return labels;
  std::istringstream lines(data->GetValue());
  std::string line;
  int n = 0;
  while (std::getline(lines, line)) {
    ++n;
    if (trim(line).empty()) continue;
    std::istringstream words(line);
    std::string label, atom_text;
    Location where = Location::field_in(source, fmt::format("{} line {}", kSdfLabelField, n));
    if (!(words >> label >> atom_text))
      throw Error(fmt::format("'{}' is not a 'label atom' pair", line), where);
    labels.add(label, atom_number(atom_text, where), where);
  }
  return labels;
}

AtomLabels AtomLabels::from_residues(const OpenBabel::OBMol& mol, const std::string& source) {
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  AtomLabels labels(static_cast<int>(m.NumAtoms()), source);
  std::set<char> chains;
  for (auto it = m.BeginResidues(); it != m.EndResidues(); ++it) chains.insert((*it)->GetChain());
  for (auto it = m.BeginAtoms(); it != m.EndAtoms(); ++it) {
    OpenBabel::OBAtom* atom = *it;
    OpenBabel::OBResidue* res = atom->GetResidue();
    // Open Babel gives molecules from formats without residues (SDF) a
    // placeholder residue "UNL"; only real residue names make labels.
    if (!res || res->GetName().empty() || res->GetName() == "UNL") continue;
    const std::string name{trim(res->GetAtomID(atom))};
    if (name.empty()) continue;
    const char chain = res->GetChain();
    const std::string chain_text = (chain == ' ' || chain == 0) ? "_" : std::string(1, chain);
    const std::string full = fmt::format("{}:{}:{}", chain_text, res->GetNum(), name);
    // Duplicate names (alternate locations) keep the first atom.
    if (!labels.find(full)) labels.add(full, static_cast<int>(atom->GetIdx()), Location(source));
    if (chains.size() == 1) {
      const std::string short_name = fmt::format("{}:{}", res->GetNum(), name);
      if (!labels.find(short_name)) labels.add(short_name, static_cast<int>(atom->GetIdx()), Location(source));
    }
  }
  return labels;
}

AtomLabels AtomLabels::for_molecule(const OpenBabel::OBMol& mol, const std::string& source,
                                    const std::string& labels_csv) {
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  AtomLabels labels(static_cast<int>(m.NumAtoms()), source);
  labels.merge(from_residues(mol, source));
  labels.merge(from_sdf_field(mol, source));
  if (!labels_csv.empty()) labels.merge(from_csv(labels_csv, static_cast<int>(m.NumAtoms())));
  return labels;
}

std::optional<int> AtomLabels::find(std::string_view label) const {
  auto it = by_label_.find(std::string(trim(label)));
  if (it == by_label_.end()) return std::nullopt;
  return it->second;
}

int AtomLabels::resolve(std::string_view ref, const OpenBabel::OBMol* mol) const {
  const std::string text{trim(ref)};
  if (auto atom = find(text)) return *atom;
  // A plain index, or an element symbol followed by an index ("H12").
  std::size_t digits = text.size();
  while (digits > 0 && std::isdigit(static_cast<unsigned char>(text[digits - 1]))) --digits;
  const std::string element = text.substr(0, digits);
  const bool symbol_ok = element.empty() || (element.size() <= 2 && std::isupper(static_cast<unsigned char>(element[0])) &&
                                             (element.size() == 1 || std::islower(static_cast<unsigned char>(element[1]))));
  if (digits < text.size() && symbol_ok && text.size() - digits <= 7) {
    const int atom = std::stoi(text.substr(digits));
    if (atom < 1 || (atom_count_ > 0 && atom > atom_count_))
      throw Error(fmt::format("atom {} does not exist: {} has atoms 1 to {}", text, source_.empty() ? "the structure" : source_,
                              atom_count_),
                  Location(source_));
    if (!element.empty() && mol) {
      auto& m = const_cast<OpenBabel::OBMol&>(*mol);
      const std::string actual = OpenBabel::OBElements::GetSymbol(m.GetAtom(atom)->GetAtomicNum());
      if (actual != element)
        throw Error(fmt::format("atom {} is {}, not {}", atom, actual, element), Location(source_),
                    fmt::format("write {}{} or just {}", actual, atom, atom));
    }
    return atom;
  }
  std::string known;
  int shown = 0;
  for (const auto& [label, atom] : by_label_) {
    if (shown == 8) {
      known += ", ...";
      break;
    }
    known += (shown++ ? ", " : "") + label;
  }
  Location where(source_);
  where.atom = text;
  throw Error(fmt::format("unknown atom label '{}'", text), where,
              known.empty() ? "this structure has no labels; use 1-based atom indices (e.g. 12 or H12) or give a labels CSV"
                            : fmt::format("known labels: {}; or use a 1-based index", known));
}

std::string AtomLabels::label_of(int atom) const {
  auto it = first_label_.find(atom);
  return it == first_label_.end() ? std::string() : it->second;
}

std::string AtomLabels::describe(int atom, const OpenBabel::OBMol& mol) const {
  const std::string label = label_of(atom);
  return label.empty() ? atom_name(mol, atom) : label;
}

}  // namespace vicinal::structure
