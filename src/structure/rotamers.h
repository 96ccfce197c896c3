// The three staggered rotamers about one bond, built from one structure by
// setting a torsion (everything on the far side of the bond moves rigidly).
#pragma once

#include <openbabel/mol.h>

#include <array>

#include "structure/ensemble.h"

namespace vicinal::structure {

struct RotamerSpec {
  int a = 0, b = 0;  // the bond, 1-based atoms (b's side is rotated)
  // Dihedral of the reference atoms (ref_a-a-b-ref_b) in each rotamer; the
  // staggered positions +60, 180, -60 unless offsets are wanted.
  std::array<double, 3> dihedral_deg = {60.0, 180.0, -60.0};
  // Reference neighbours defining the dihedral; 0 = the heaviest neighbour
  // (ties: lowest index) other than the bond partner.
  int ref_a = 0, ref_b = 0;
};

// Frames titled "g+ (60)", "t (180)", "g- (-60)" (angles as built). vicinal::Error
// when a and b are not bonded, the bond is in a ring (it cannot rotate freely),
// or either end has no other neighbour.
Ensemble staggered_rotamers(const OpenBabel::OBMol& mol, const RotamerSpec& spec);

// The reference atoms actually used for `spec` (after resolving 0s).
std::array<int, 4> rotamer_reference(const OpenBabel::OBMol& mol, const RotamerSpec& spec);

}  // namespace vicinal::structure
