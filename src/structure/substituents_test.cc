#include "structure/substituents.h"

#include <gtest/gtest.h>
#include <openbabel/atom.h>
#include <openbabel/obiter.h>

#include "core/error.h"
#include "structure/ensemble.h"
#include "structure/molecule_io.h"

namespace vicinal::structure {
namespace {

int hydrogen_on(OpenBabel::OBMol& mol, int heavy) {
  FOR_NBORS_OF_ATOM(n, mol.GetAtom(heavy)) if (n->GetAtomicNum() == 1) return static_cast<int>(n->GetIdx());
  return 0;
}

// 1-chloro-2-methoxypropane fragment: C1(Cl) - C2(H)(OCH3) - C3H3.
// SMILES atoms: Cl1 C2 C3 O4 C5 C6.
class SubstituentsTest : public ::testing::Test {
 protected:
  void SetUp() override { mol = molecule_from_smiles("ClC[C@H](OC)C", true); }
  OpenBabel::OBMol mol;
};

TEST_F(SubstituentsTest, ElectronegativityDifferencesWithBetaCorrection) {
  const std::array<int, 4> hcch{hydrogen_on(mol, 2), 2, 3, hydrogen_on(mol, 3)};
  const double p7 = 0.14;
  const auto subs = haasnoot_substituents(mol, hcch, p7);
  ASSERT_EQ(subs.size(), 3u);  // Cl on C2; O and CH3 on C3
  const auto& en = Electronegativity::shipped();
  for (const auto& s : subs) {
    EXPECT_DOUBLE_EQ(s.delta_chi_alpha, en.chi(s.element) - en.chi("H"));
    if (s.element == "O") {
      // The methoxy O carries one beta substituent, its methyl carbon.
      EXPECT_DOUBLE_EQ(s.sum_delta_chi_beta, en.chi("C") - en.chi("H"));
      EXPECT_DOUBLE_EQ(s.delta_chi, s.delta_chi_alpha - p7 * (en.chi("C") - en.chi("H")));
    } else {
      EXPECT_DOUBLE_EQ(s.sum_delta_chi_beta, 0.0);  // Cl has none; CH3 only hydrogens
    }
  }
}

TEST_F(SubstituentsTest, TwoSubstituentsOnOneCarbonHaveOppositeSignsAndMirrorImagesFlipThem) {
  const std::array<int, 4> hcch{hydrogen_on(mol, 2), 2, 3, hydrogen_on(mol, 3)};
  const auto subs = haasnoot_substituents(mol, hcch, 0.14);
  int sum_on_c3 = 0;
  for (const auto& s : subs)
    if (s.carbon == 3) sum_on_c3 += s.orientation;
  // In the Newman projection the two substituents on C3 sit at +120 and -120
  // degrees from its proton, so their signs differ. Geometry, no source needed.
  EXPECT_EQ(sum_on_c3, 0);
  // The mirror image (x -> -x) reverses every orientation sign.
  auto xyz = coordinates_of(mol);
  for (std::size_t i = 0; i < xyz.size(); i += 3) xyz[i] = -xyz[i];
  const auto mirrored = haasnoot_substituents(mol, hcch, 0.14, xyz);
  ASSERT_EQ(mirrored.size(), subs.size());
  for (std::size_t i = 0; i < subs.size(); ++i) EXPECT_EQ(mirrored[i].orientation, -subs[i].orientation);
}

TEST_F(SubstituentsTest, RejectsFragmentsThatAreNotHCCH) {
  EXPECT_THROW(haasnoot_substituents(mol, {1, 2, 3, 4}, 0.14), Error);
}

}  // namespace
}  // namespace vicinal::structure
