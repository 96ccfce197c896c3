// Numbering-independent identity of compounds and couplings, through Open
// Babel. A compound is its standard InChIKey (stereo included). An atom is its
// canonical rank. A coupling is the pair of its nuclei's canonical ranks,
// reduced over the molecule's graph symmetry (library/pair_symmetry.h) so that
// the same coupling read from files with different atom numbering gets the
// same key.
//
// Graph symmetry alone would merge couplings that differ only in 3D (to one
// or the other diastereotopic proton of a CH2, cis or trans across C=C). When
// keeping the 3D arrangement splits a pair's orbit, the key also carries the
// canonical isomeric SMILES of the molecule with the two nuclei replaced by
// marker elements, in which Open Babel perceives the stereo the marks create.
// Mirror-image marked SMILES count as one: enantiotopic nuclei give the same
// couplings in an achiral solvent.
#pragma once

#include <openbabel/mol.h>

#include "library/pair_symmetry.h"

#include <map>
#include <memory>
#include <string>
#include <vector>

namespace vicinal::library {

class CompoundIdentity {
 public:
  // What to work out besides the ranks and coupling keys.
  enum class Names {
    All,       // InChI, InChIKey and canonical SMILES too
    KeysOnly,  // not them (a stored compound has them): its keys cost half as much
  };
  // vicinal::Error when Open Babel cannot produce an InChI for the molecule.
  // `source` names the structure in messages.
  CompoundIdentity(const OpenBabel::OBMol& mol, const std::string& source, Names names = Names::All);

  // Empty with Names::KeysOnly.
  const std::string& inchi() const { return inchi_; }
  const std::string& inchikey() const { return inchikey_; }
  const std::string& smiles() const { return smiles_; }  // canonical isomeric SMILES
  // Canonical rank of a 1-based atom (ranks are 1-based).
  unsigned rank(int atom) const { return canonical_rank_.at(static_cast<std::size_t>(atom - 1)); }
  int atom_count() const { return static_cast<int>(canonical_rank_.size()); }

  // Key of a coupling between the nuclei `a` and `b` (1-based atoms; a side may
  // hold alternatives, a stereo-unassigned pair). Unordered in the two sides.
  std::string coupling_key(const std::vector<int>& a, const std::vector<int>& b);
  // Canonical ranks of atoms, '|'-joined in ascending order.
  std::string ranks_text(const std::vector<int>& atoms) const;

 private:
  // Open Babel's symmetry classes of atoms (numbering-independent), ascending.
  std::vector<unsigned> classes_of(const std::vector<int>& atoms) const;
  std::string marked_smiles(const std::vector<int>& a, const std::vector<int>& b) const;

  OpenBabel::OBMol mol_;
  std::string source_, inchi_, inchikey_, smiles_;
  std::vector<unsigned> canonical_rank_, symmetry_class_;
  std::unique_ptr<PairSymmetry> symmetry_;
  std::map<std::pair<std::vector<int>, std::vector<int>>, std::string> cache_;
  std::map<PairSymmetry::Pair, std::string> marked_by_kept_orbit_;
};

// Turns the perceived stereo of `mol` into that of its mirror image without
// perceiving it again: a reflection inverts every tetrahedral centre and
// leaves cis/trans and square-planar units as they are. Cheaper than
// perceiving from mirrored coordinates, which computes the graph symmetry
// again.
void reflect_stereo(OpenBabel::OBMol& mol);

// The InChI/InChIKey of a molecule alone (for checks and tests).
std::string inchi_of(const OpenBabel::OBMol& mol);
std::string inchikey_of(const OpenBabel::OBMol& mol);

}  // namespace vicinal::library
