#include "structure/rotamers.h"

#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/bond.h>
#include <openbabel/obiter.h>

#include <cmath>

#include "core/error.h"
#include "structure/atom_labels.h"

namespace vicinal::structure {

namespace {

// The heaviest neighbour of `atom` other than `partner` (ties: lowest index).
int reference_neighbour(OpenBabel::OBMol& mol, int atom, int partner) {
  int best = 0;
  double best_mass = -1;
  FOR_NBORS_OF_ATOM(nbr, mol.GetAtom(atom)) {
    const int idx = static_cast<int>(nbr->GetIdx());
    if (idx == partner) continue;
    if (nbr->GetAtomicMass() > best_mass + 1e-9) {
      best = idx;
      best_mass = nbr->GetAtomicMass();
    }
  }
  return best;
}

}  // namespace

std::array<int, 4> rotamer_reference(const OpenBabel::OBMol& mol, const RotamerSpec& spec) {
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  const int n = static_cast<int>(m.NumAtoms());
  for (int atom : {spec.a, spec.b})
    if (atom < 1 || atom > n) throw Error(fmt::format("atom {} does not exist (the structure has atoms 1 to {})", atom, n));
  Location where;
  where.atom = fmt::format("{}-{}", atom_name(mol, spec.a), atom_name(mol, spec.b));
  OpenBabel::OBBond* bond = m.GetBond(spec.a, spec.b);
  if (!bond) throw Error(fmt::format("{} and {} are not bonded", atom_name(mol, spec.a), atom_name(mol, spec.b)), where);
  if (bond->IsInRing())
    throw Error("the bond is in a ring, so it cannot be rotated freely", where, "choose an acyclic bond");
  const int ra = spec.ref_a ? spec.ref_a : reference_neighbour(m, spec.a, spec.b);
  const int rb = spec.ref_b ? spec.ref_b : reference_neighbour(m, spec.b, spec.a);
  if (ra == 0 || rb == 0)
    throw Error("both ends of the bond need another neighbour to define the rotamers", where);
  if (!m.GetBond(ra, spec.a) || !m.GetBond(rb, spec.b))
    throw Error(fmt::format("reference atoms {} and {} must be bonded to {} and {}", atom_name(mol, ra),
                            atom_name(mol, rb), atom_name(mol, spec.a), atom_name(mol, spec.b)),
                where);
  return {ra, spec.a, spec.b, rb};
}

Ensemble staggered_rotamers(const OpenBabel::OBMol& mol, const RotamerSpec& spec) {
  const auto ref = rotamer_reference(mol, spec);
  Ensemble e;
  e.topology = mol;
  static const char* kNames[3] = {"g+", "t", "g-"};
  for (int r = 0; r < 3; ++r) {
    OpenBabel::OBMol copy(mol);
    // SetTorsion moves the atoms on the side of the third atom (b) rigidly.
    copy.SetTorsion(copy.GetAtom(ref[0]), copy.GetAtom(ref[1]), copy.GetAtom(ref[2]), copy.GetAtom(ref[3]),
                    spec.dihedral_deg[r] * M_PI / 180.0);
    e.add_frame(coordinates_of(copy));
    const bool standard = std::abs(spec.dihedral_deg[r] - RotamerSpec{}.dihedral_deg[r]) < 1e-9;
    e.titles.push_back(standard ? fmt::format("{} ({:g})", kNames[r], spec.dihedral_deg[r])
                                : fmt::format("rotamer {} ({:g})", r + 1, spec.dihedral_deg[r]));
  }
  e.topology.SetCoordinates(e.xyz.data());
  return e;
}

}  // namespace vicinal::structure
