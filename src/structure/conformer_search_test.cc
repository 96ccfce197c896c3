#include "structure/conformer_search.h"

#include <gtest/gtest.h>
#include <openbabel/atom.h>

#include <algorithm>
#include <cmath>

#include "structure/molecule_io.h"

namespace vicinal::structure {
namespace {

double torsion(const Ensemble& e, std::size_t f, int a = 1, int b = 2, int c = 3, int d = 4) {
  OpenBabel::OBMol m(e.topology);
  std::vector<double> xyz(e.frame(f).begin(), e.frame(f).end());
  m.SetCoordinates(xyz.data());
  return m.GetTorsion(a, b, c, d);
}

int hydrogen_on(const OpenBabel::OBMol& mol, int heavy) {
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  for (unsigned i = 1; i <= m.NumAtoms(); ++i)
    if (m.GetAtom(i)->GetAtomicNum() == 1 && m.GetBond(static_cast<int>(i), heavy)) return static_cast<int>(i);
  return 0;
}

// 2-(hydroxymethyl)oxan-3-ol: atoms O1 1, C2 2, CH2OH 3-4, C3 5, O3 6, C4 7,
// C5 8, C6 9. Each chair and its ring flip must both be found.
struct Chairs {
  Ensemble e;
  std::vector<double> h2_h3_deg;    // H2-C2-C3-H3 per frame
  std::vector<double> ring_deg;     // O1-C2-C3-C4 per frame (sign tells the chair)
};

Chairs oxanol_chairs(const std::string& smiles) {
  const OpenBabel::OBMol mol = molecule_from_smiles(smiles, true);
  ConformerReport report;
  Chairs out{generate_conformers(mol, {}, &report), {}, {}};
  EXPECT_EQ(report.flexible_rings, 1);
  EXPECT_EQ(report.ring_shapes, 2) << report.method;
  const int h2 = hydrogen_on(mol, 2), h3 = hydrogen_on(mol, 5);
  for (std::size_t f = 0; f < out.e.frame_count(); ++f) {
    out.h2_h3_deg.push_back(torsion(out.e, f, h2, 2, 5, h3));
    out.ring_deg.push_back(torsion(out.e, f, 1, 2, 5, 7));
  }
  return out;
}

// Butane has one anti and two mirror-image gauche conformers, the gauche ones
// higher by roughly 0.6-1 kcal/mol (from memory; MMFF94 gives about 0.8).
// Mirror images have equal energies once fully minimised; Open Babel's own
// conjugate gradients left them up to 0.24 kcal/mol apart, depending on the
// random 3D build.
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
  EXPECT_NEAR(e.energy_kcal_mol[1], e.energy_kcal_mol[2], 1e-4);
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

// Ring flips are sampled: trans-2,3-disubstituted oxane has a chair with both
// substituents equatorial (H2 and H3 axial, H-C-C-H near 180 deg) and, after
// the flip, one with both axial (H-C-C-H near 60 deg); the two chairs have
// ring torsions of opposite sign (common practice, no source). In the cis
// isomer both chairs have H-C-C-H gauche; they differ in the sign of the ring
// torsions (one substituent axial, the other equatorial, swapped).
// Not asserted: which trans chair is lower. Common practice expects the
// diequatorial one, but MMFF94 in the gas phase (hydroxyl hydrogens not
// searched) puts the two within a few tenths of a kcal/mol.
TEST(ConformerSearch, RingFlipsGiveBothChairsOfAnOxane) {
  const Chairs trans = oxanol_chairs("O1[C@H](CO)[C@@H](O)CCC1");
  ASSERT_GT(trans.e.frame_count(), 1u);
  const auto anti = [](double t) { return std::abs(t) > 150; };
  const auto gauche = [](double t) { return std::abs(t) > 35 && std::abs(t) < 85; };
  EXPECT_TRUE(std::any_of(trans.h2_h3_deg.begin(), trans.h2_h3_deg.end(), anti));
  EXPECT_TRUE(std::any_of(trans.h2_h3_deg.begin(), trans.h2_h3_deg.end(), gauche));
  for (std::size_t f = 0; f < trans.e.frame_count(); ++f)
    for (std::size_t g = 0; g < trans.e.frame_count(); ++g)
      if (anti(trans.h2_h3_deg[f]) && gauche(trans.h2_h3_deg[g])) {
        EXPECT_LT(trans.ring_deg[f] * trans.ring_deg[g], 0);
      }

  const Chairs cis = oxanol_chairs("O1[C@H](CO)[C@H](O)CCC1");
  ASSERT_GT(cis.e.frame_count(), 1u);
  for (double t : cis.h2_h3_deg) EXPECT_TRUE(gauche(t)) << t;
  const auto chair_torsion = [](double t) { return std::abs(t) > 40 && std::abs(t) < 75; };
  EXPECT_TRUE(std::any_of(cis.ring_deg.begin(), cis.ring_deg.end(), [&](double t) { return chair_torsion(t) && t > 0; }));
  EXPECT_TRUE(std::any_of(cis.ring_deg.begin(), cis.ring_deg.end(), [&](double t) { return chair_torsion(t) && t < 0; }));
}

}  // namespace
}  // namespace vicinal::structure
