#include "predict/j_matrix.h"

#include <gtest/gtest.h>
#include <openbabel/atom.h>
#include <openbabel/obiter.h>

#include <cmath>

#include "structure/molecule_io.h"
#include "structure/rotamers.h"

namespace vicinal::predict {
namespace {

// Four points with a known dihedral: the last atom rotated by `deg` about the z axis.
std::vector<double> four_points(double deg) {
  const double r = deg * M_PI / 180.0;
  return {1, 0, -1,  0, 0, -0.5,  0, 0, 0.5,  std::cos(r), std::sin(r), 1};
}

// Sign convention of IUPAC (Moss, Pure Appl. Chem. 68, 2193, 1996; from memory):
// viewed along the bond 2->3, the torsion is positive when the front bond 1-2
// turns clockwise onto the back bond 3-4. Here the viewer looks along +z from
// below, so an angle counted counter-clockwise in the usual xy frame (seen from
// above) appears clockwise: the torsion is +deg.
TEST(Dihedral, KnownAnglesAndSign) {
  for (double deg : {0.0, 60.0, 120.0, 179.0, -60.0, -150.0}) {
    const auto xyz = four_points(deg);
    EXPECT_NEAR(dihedral_deg(xyz, {1, 2, 3, 4}), deg, 1e-9) << deg;
    EXPECT_NEAR(dihedral_deg(xyz, {4, 3, 2, 1}), deg, 1e-9) << "reversed order keeps the value";
  }
  EXPECT_NEAR(dihedral_deg(four_points(180), {1, 2, 3, 4}), 180, 1e-9);
}

int hydrogen_on(OpenBabel::OBMol& mol, int heavy) {
  FOR_NBORS_OF_ATOM(n, mol.GetAtom(heavy)) if (n->GetAtomicNum() == 1) return static_cast<int>(n->GetIdx());
  return 0;
}

TEST(JMatrix, EnsembleAverageAndThreadsAgree) {
  const OpenBabel::OBMol mol = structure::molecule_from_smiles("CCCC", true);
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  const structure::AtomLabels labels(static_cast<int>(m.NumAtoms()), "butane");
  const std::array<std::string, 2> refs{std::to_string(hydrogen_on(m, 2)), std::to_string(hydrogen_on(m, 3))};
  const CouplingSpec spec = resolve_coupling(mol, labels, refs, "hh-karplus-1959");
  EXPECT_EQ(spec.set->id, "hh-karplus-1959");
  EXPECT_EQ(spec.path[0], hydrogen_on(m, 2));
  structure::Ensemble e = structure::staggered_rotamers(mol, {.a = 2, .b = 3});
  // A larger ensemble: the three rotamers repeated, so threads have work to share.
  const auto base = e.xyz;
  for (int r = 0; r < 300; ++r) e.xyz.insert(e.xyz.end(), base.begin(), base.end());
  const JMatrix one = compute_j_matrix({spec}, e, 1);
  const JMatrix four = compute_j_matrix({spec}, e, 4);
  ASSERT_EQ(one.frames, 903u);
  EXPECT_EQ(one.j_hz, four.j_hz);
  for (std::size_t f = 0; f < 3; ++f) {
    const double expect = karplus::j_hz(*spec.set, one.dihedral(f, 0));
    EXPECT_DOUBLE_EQ(one.j(f, 0), expect);
  }
  // Weighted average by hand.
  std::vector<double> w(one.frames, 0.0);
  w[0] = 0.5;
  w[1] = 0.25;
  w[2] = 0.25;
  EXPECT_NEAR(one.average_j_hz(w)[0], 0.5 * one.j(0, 0) + 0.25 * one.j(1, 0) + 0.25 * one.j(2, 0), 1e-12);
}

TEST(JMatrix, AutoChoosesHaasnootBySubstituentCountAndRejectsBadPairs) {
  const OpenBabel::OBMol mol = structure::molecule_from_smiles("CCCC", true);
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  const structure::AtomLabels labels(static_cast<int>(m.NumAtoms()), "butane");
  const CouplingSpec spec = resolve_coupling(
      mol, labels, {std::to_string(hydrogen_on(m, 2)), std::to_string(hydrogen_on(m, 3))}, kAutoSet);
  EXPECT_TRUE(spec.set->is_haasnoot());
  EXPECT_EQ(spec.substituents.size(), 2u);  // C1 on C2 and C4 on C3
  EXPECT_NE(spec.set_reason.find("2 substituents"), std::string::npos);
  EXPECT_THROW(resolve_coupling(mol, labels, {std::to_string(hydrogen_on(m, 1)), std::to_string(hydrogen_on(m, 4))},
                                kAutoSet),
               Error);
  EXPECT_THROW(resolve_coupling(mol, labels, {"1", "1"}, kAutoSet), Error);
  // A set whose pattern does not describe the pair.
  EXPECT_THROW(resolve_coupling(mol, labels, {std::to_string(hydrogen_on(m, 2)), std::to_string(hydrogen_on(m, 3))},
                                "hn-ha-vogeli-2007"),
               Error);
  // Every H-C-C-H of butane: 3 x 2 + 2 x 2 + 2 x 3 = 16 pairs.
  EXPECT_EQ(couplings_from_pattern(mol, labels, kAutoSet).size(), 16u);
}

}  // namespace
}  // namespace vicinal::predict
