#include "structure/rotamers.h"

#include <gtest/gtest.h>

#include <cmath>

#include "core/error.h"
#include "structure/molecule_io.h"

namespace vicinal::structure {
namespace {

double torsion(const Ensemble& e, std::size_t f, std::array<int, 4> t) {
  OpenBabel::OBMol m(e.topology);
  std::vector<double> xyz(e.frame(f).begin(), e.frame(f).end());
  m.SetCoordinates(xyz.data());
  return m.GetTorsion(t[0], t[1], t[2], t[3]);
}

double distance(const Ensemble& e, std::size_t f, int a, int b) {
  const auto x = e.frame(f);
  double s = 0;
  for (int k = 0; k < 3; ++k) s += std::pow(x[3 * (a - 1) + k] - x[3 * (b - 1) + k], 2);
  return std::sqrt(s);
}

TEST(Rotamers, ButaneStaggeredRotamersAboutC2C3) {
  const OpenBabel::OBMol mol = molecule_from_smiles("CCCC", true);
  const Ensemble e = staggered_rotamers(mol, {.a = 2, .b = 3});
  ASSERT_EQ(e.frame_count(), 3u);
  EXPECT_EQ(rotamer_reference(mol, {.a = 2, .b = 3}), (std::array<int, 4>{1, 2, 3, 4}));
  EXPECT_NEAR(torsion(e, 0, {1, 2, 3, 4}), 60, 0.5);
  EXPECT_NEAR(std::abs(torsion(e, 1, {1, 2, 3, 4})), 180, 0.5);
  EXPECT_NEAR(torsion(e, 2, {1, 2, 3, 4}), -60, 0.5);
  EXPECT_EQ(e.titles[1], "t (180)");
  // The rotation is rigid: the C1...C4 distance changes, bonds do not.
  for (std::size_t f = 0; f < 3; ++f) EXPECT_NEAR(distance(e, f, 3, 4), distance(e, 0, 3, 4), 1e-6);
  EXPECT_GT(distance(e, 1, 1, 4), distance(e, 0, 1, 4) + 0.5);
}

TEST(Rotamers, OffsetsAndBadBonds) {
  const OpenBabel::OBMol mol = molecule_from_smiles("CCCC", true);
  const Ensemble e = staggered_rotamers(mol, {.a = 2, .b = 3, .dihedral_deg = {70, 170, -50}});
  EXPECT_NEAR(torsion(e, 0, {1, 2, 3, 4}), 70, 0.5);
  EXPECT_EQ(e.titles[0], "rotamer 1 (70)");
  EXPECT_THROW(staggered_rotamers(mol, {.a = 1, .b = 3}), Error);  // not bonded
  const OpenBabel::OBMol ring = molecule_from_smiles("C1CCCCC1", true);
  EXPECT_THROW(staggered_rotamers(ring, {.a = 1, .b = 2}), Error);
}

}  // namespace
}  // namespace vicinal::structure
