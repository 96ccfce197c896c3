#include "structure/conformer_search.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

#include "structure/molecule_io.h"

namespace vicinal::structure {
namespace {

double torsion(const Ensemble& e, std::size_t f) {
  OpenBabel::OBMol m(e.topology);
  std::vector<double> xyz(e.frame(f).begin(), e.frame(f).end());
  m.SetCoordinates(xyz.data());
  return m.GetTorsion(1, 2, 3, 4);
}

// Butane has one anti and two mirror-image gauche conformers, the gauche ones
// higher by roughly 0.6-1 kcal/mol (from memory; MMFF94 gives about 0.8).
TEST(ConformerSearch, ButaneGivesAntiAndBothGauche) {
  const OpenBabel::OBMol mol = molecule_from_smiles("CCCC", true);
  ConformerReport report;
  const Ensemble e = generate_conformers(mol, {}, &report);
  EXPECT_EQ(report.rotors, 1);
  ASSERT_EQ(e.frame_count(), 3u) << report.method;
  EXPECT_NEAR(std::abs(torsion(e, 0)), 180, 15);  // lowest energy first
  EXPECT_NEAR(std::abs(torsion(e, 1)), 65, 15);
  EXPECT_NEAR(torsion(e, 1), -torsion(e, 2), 5);
  const double gap = e.energy_kcal_mol[1] - e.energy_kcal_mol[0];
  EXPECT_GT(gap, 0.4);
  EXPECT_LT(gap, 1.3);
  EXPECT_NEAR(e.energy_kcal_mol[1], e.energy_kcal_mol[2], 0.05);
  double sum = 0;
  for (double w : e.weight) sum += w;
  EXPECT_NEAR(sum, 1.0, 1e-12);
  EXPECT_GT(e.weight[0], e.weight[1]);
}

TEST(ConformerSearch, LooseThresholdsMergeConformers) {
  const OpenBabel::OBMol mol = molecule_from_smiles("CCCC", true);
  ConformerOptions options;
  options.rmsd_angstrom = 5;
  options.torsion_deg = 360;
  EXPECT_EQ(generate_conformers(mol, options).frame_count(), 1u);
  options = {};
  options.max_conformers = 2;
  EXPECT_EQ(generate_conformers(mol, options).frame_count(), 2u);
}

}  // namespace
}  // namespace vicinal::structure
