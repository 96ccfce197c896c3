// Turns parsed input (a structure, its labels, conditions and coupling rows)
// into library records: resolves atom references, finds bonded paths and
// isotopes, and computes canonical ranks and identity keys. Every importer
// (CSV, JSON, SDF) goes through here, so the same input gives the same
// records whatever its format. Open Babel work happens once per compound.
#pragma once

#include <openbabel/mol.h>

#include <array>
#include <map>
#include <memory>
#include <optional>
#include <string>
#include <vector>

#include "core/error.h"
#include "library/identity.h"
#include "library/records.h"
#include "structure/atom_labels.h"

namespace vicinal::library {

// How a compound's structure is given in an input file.
struct StructureSpec {
  enum class Kind { Smiles, File, Molfile };
  Kind kind = Kind::Smiles;
  std::string text;         // SMILES, resolved path, or SDF/molfile text
  std::string labels_file;  // optional labels CSV (label,atom), resolved path
};

// One compound being imported: its structure parsed once, then any number of
// couplings resolved against it.
class CompoundBuilder {
 public:
  // vicinal::Error (at `where`) when the structure cannot be read or identified.
  CompoundBuilder(const std::string& name, const StructureSpec& spec, const Location& where);

  // What a builder keeps while it is put aside (library/compound_cache.h):
  // its record, from whose molfile the molecule, labels and keys are worked
  // out again, as the library does for a stored compound.
  struct Parked {
    CompoundRecord record;
    std::string source;
  };
  // vicinal::Error when the record's molfile cannot be read.
  explicit CompoundBuilder(Parked parked);
  // False for a structure from a PDB file: its labels come from the residues,
  // which the molfile does not keep.
  bool can_park() const { return can_park_; }
  Parked park() && { return {std::move(record_), std::move(source_)}; }

  const CompoundRecord& record() const { return record_; }
  const OpenBabel::OBMol& molecule() const { return mol_; }
  CompoundIdentity& identity() { return *identity_; }

  // A coupling between two sides of references (labels, indices, element +
  // index; a side with several entries is a stereo-unassigned pair).
  // vicinal::Error at `where` for unknown atoms, a nucleus coupled to itself,
  // or nuclei that are not connected.
  CouplingRecord coupling(const std::array<std::vector<std::string>, 2>& nuclei, double j_hz,
                          std::optional<double> sigma_hz, const Location& where);

 private:
  // What a pair of atom sets gives every row that names it: worked out once
  // per pair, as files repeat a pair over many measurement sets.
  struct PairFacts {
    std::vector<int> path;
    int bond_count = 0;
    std::string isotope_a, isotope_b, ranks_a, ranks_b, identity;
  };
  // Nothing when the atoms are not connected by bonds.
  std::optional<PairFacts> facts_of(const std::vector<int>& atoms_a, const std::vector<int>& atoms_b);

  std::map<std::pair<std::vector<int>, std::vector<int>>, PairFacts> pair_facts_;
  OpenBabel::OBMol mol_;
  structure::AtomLabels labels_;
  std::unique_ptr<CompoundIdentity> identity_;
  CompoundRecord record_;
  std::string source_;
  bool can_park_ = true;
};

// Our molfile text for a molecule (V2000 with a fixed header line, so that the
// same molecule always gives the same text) with the labels in the SDF data
// field structure::kSdfLabelField, ending with "$$$$".
std::string molfile_with_labels(const OpenBabel::OBMol& mol, const std::vector<std::pair<std::string, int>>& labels);

// Reads one record written by molfile_with_labels (or any complete 3D SDF
// record with explicit hydrogens). `source` for messages.
OpenBabel::OBMol molecule_from_molfile(const std::string& text, const std::string& source);

// The nucleus observed for an atom: its isotope if the structure sets one,
// else the element's most abundant spin-1/2 isotope from db/nuclei.json
// (most abundant of any spin when none has spin 1/2).
std::string observed_isotope(const OpenBabel::OBMol& mol, int atom);

// Physical ranges the schema enforces, checked early so that the message names
// the input line: |J| <= 1000 Hz, sigma >= 0, 0 < T < 1000 K, field > 0, 0 <= pH <= 14.
void check_coupling_values(double j_hz, std::optional<double> sigma_hz, const Location& where);
void check_conditions(const Conditions& c, const Location& where);

}  // namespace vicinal::library
