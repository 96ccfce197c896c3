#include "structure/coupling_path.h"

#include <gtest/gtest.h>

#include <openbabel/atom.h>
#include <openbabel/obiter.h>

#include "core/error_testing.h"
#include "core/error.h"
#include "structure/molecule_io.h"

namespace vicinal::structure {
namespace {

// First hydrogen bonded to heavy atom `heavy` (1-based).
int hydrogen_on(OpenBabel::OBMol& mol, int heavy) {
  FOR_NBORS_OF_ATOM(n, mol.GetAtom(heavy)) if (n->GetAtomicNum() == 1) return static_cast<int>(n->GetIdx());
  return 0;
}

using vicinal::testing::error_of;

TEST(CouplingPath, FindsTheVicinalPathOfButane) {
  OpenBabel::OBMol mol = molecule_from_smiles("CCCC", false);
  const int h1 = hydrogen_on(mol, 2), h2 = hydrogen_on(mol, 3);
  const CouplingPath p = coupling_path(mol, h1, h2);
  EXPECT_EQ(p.bonds(), 3);
  EXPECT_EQ(p.four(), (std::array<int, 4>{h1, 2, 3, h2}));
  EXPECT_EQ(bond_distance(mol, h1, h2), 3);
  EXPECT_EQ(bond_distance(mol, h1, hydrogen_on(mol, 4)), 4);
}

TEST(CouplingPath, RejectsSameAtomAndWrongDistanceNamingTheAtoms) {
  OpenBabel::OBMol mol = molecule_from_smiles("CCCC", false);
  const int h2 = hydrogen_on(mol, 2), h4 = hydrogen_on(mol, 4);
  EXPECT_NE(error_of([&] { coupling_path(mol, h2, h2); }).find("both are H"), std::string::npos);
  const std::string far = error_of([&] { coupling_path(mol, h2, h4); });
  EXPECT_NE(far.find("4 bonds apart"), std::string::npos) << far;
  EXPECT_NE(far.find("H" + std::to_string(h2)), std::string::npos) << far;
  // Geminal pair: two bonds.
  int second = 0;
  FOR_NBORS_OF_ATOM(n, mol.GetAtom(2)) if (n->GetAtomicNum() == 1 && static_cast<int>(n->GetIdx()) != h2) second = n->GetIdx();
  EXPECT_NE(error_of([&] { coupling_path(mol, h2, second); }).find("2 bonds apart"), std::string::npos);
  // Labels replace element+index names in messages.
  std::vector<std::string> names(mol.NumAtoms());
  names[h2 - 1] = "H-2";
  EXPECT_NE(error_of([&] { coupling_path(mol, h2, h4, 3, names); }).find("H-2 and"), std::string::npos);
}

TEST(CouplingPath, FourMemberedRingGivesTwoPathsAndBothAreReported) {
  // Cyclobutane: a hydrogen on C1 and C3 are joined through C2 and through C4.
  OpenBabel::OBMol mol = molecule_from_smiles("C1CCC1", false);
  const int h1 = hydrogen_on(mol, 1);
  EXPECT_EQ(paths_of_length(mol, h1, 3, 3).size(), 2u);
  const std::string e = error_of([&] { coupling_path(mol, h1, 3); });
  EXPECT_NE(e.find("2 different 3-bond paths"), std::string::npos) << e;
  EXPECT_NE(e.find("C1-C2-C3"), std::string::npos) << e;
  EXPECT_NE(e.find("C1-C4-C3"), std::string::npos) << e;
}

TEST(CouplingPath, UnconnectedAtoms) {
  OpenBabel::OBMol mol = molecule_from_smiles("C.C", false);
  EXPECT_NE(error_of([&] { coupling_path(mol, 1, 2); }).find("not connected"), std::string::npos);
  EXPECT_EQ(bond_distance(mol, 1, 2), -1);
}

}  // namespace
}  // namespace vicinal::structure
