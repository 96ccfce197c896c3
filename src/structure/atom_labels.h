// Names people give atoms ("H-2", "H-6a", "C-1", "A:12:HA") mapped to the
// 1-based atom indices of one structure. Sources: a labels CSV (columns
// `label,atom`), the SDF data field `vicinal_atom_labels` (one "label atom"
// pair per line), and PDB atom/residue names, referenced as CHAIN:RESNUM:ATOM
// ("A:12:HA"), or RESNUM:ATOM when the structure has a single chain.
#pragma once

#include <openbabel/mol.h>

#include <map>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/error.h"

namespace vicinal::structure {

// The SDF data field our own files use for atom labels.
inline constexpr const char* kSdfLabelField = "vicinal_atom_labels";

class AtomLabels {
 public:
  AtomLabels() = default;
  // `atom_count` bounds every index; `source` names the structure in errors.
  AtomLabels(int atom_count, std::string source);

  // Reads `label,atom` rows (header required); errors name line and column.
  static AtomLabels from_csv(const std::string& path, int atom_count);
  // The kSdfLabelField data field of the molecule (none -> empty map).
  static AtomLabels from_sdf_field(const OpenBabel::OBMol& mol, const std::string& source);
  // CHAIN:RESNUM:ATOM (and RESNUM:ATOM for single-chain structures) for every
  // atom that carries residue information (PDB input).
  static AtomLabels from_residues(const OpenBabel::OBMol& mol, const std::string& source);
  // Everything the molecule itself carries (SDF field, PDB names) plus an
  // optional labels CSV; a CSV label that repeats a structure label must agree.
  static AtomLabels for_molecule(const OpenBabel::OBMol& mol, const std::string& source,
                                 const std::string& labels_csv = "");

  // Adds one label; a label already bound to another atom is an error.
  void add(const std::string& label, int atom, const Location& where = {});
  void merge(const AtomLabels& other);

  // A label, a 1-based index ("12") or element+index ("H12", checked against
  // the element when `mol` is given). Unknown references are errors naming the
  // reference and listing some known labels.
  int resolve(std::string_view ref, const OpenBabel::OBMol* mol = nullptr) const;
  std::optional<int> find(std::string_view label) const;

  // The first label given to an atom, or "" when it has none.
  std::string label_of(int atom) const;
  // A label if the atom has one, else element symbol + index ("H12").
  std::string describe(int atom, const OpenBabel::OBMol& mol) const;

  bool empty() const { return by_label_.empty(); }
  std::size_t size() const { return by_label_.size(); }
  const std::map<std::string, int>& all() const { return by_label_; }
  int atom_count() const { return atom_count_; }

 private:
  int atom_count_ = 0;
  std::string source_;
  std::map<std::string, int> by_label_;
  std::map<int, std::string> first_label_;
};

// Element symbol + 1-based index, e.g. "H12": how atoms are named when they
// have no label.
std::string atom_name(const OpenBabel::OBMol& mol, int atom);

}  // namespace vicinal::structure
