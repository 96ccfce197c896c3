#include "pucker/pseudorotation.h"

#include <gtest/gtest.h>

#include <cmath>
#include <numbers>

namespace vicinal::pucker {
namespace {

const std::array<std::string, 5> kFuranose = {"O4'", "C1'", "C2'", "C3'", "C4'"};

double cosd(double deg) { return std::cos(deg * std::numbers::pi / 180); }

TEST(Pseudorotation, TorsionsFollowThePhaseFormula) {
  // nu_j = nu_max cos(P + 144 (j - 2)); Altona and Sundaralingam 1972 (from memory).
  const auto nu = endocyclic_torsions_deg(18.0, 38.0);
  EXPECT_NEAR(nu[2], 38.0 * cosd(18.0), 1e-12);
  EXPECT_NEAR(nu[3], 38.0 * cosd(162.0), 1e-12);
  // The five torsions of an ideal pseudorotating ring sum to zero.
  EXPECT_NEAR(nu[0] + nu[1] + nu[2] + nu[3] + nu[4], 0.0, 1e-9);
}

TEST(Pseudorotation, EnvelopesHaveOneVanishingTorsion) {
  // C3'-endo (P = 18) leaves C4', O4', C1', C2' coplanar: nu0 = 0; C2'-endo
  // (P = 162) leaves C3', C4', O4', C1' coplanar: nu4 = 0.
  // Source: common practice (P = 18 C3'-endo, P = 162 C2'-endo), no source.
  EXPECT_NEAR(endocyclic_torsions_deg(18.0, 38.0)[0], 0.0, 1e-9);
  EXPECT_NEAR(endocyclic_torsions_deg(162.0, 38.0)[4], 0.0, 1e-9);
  EXPECT_NEAR(endocyclic_torsions_deg(90.0, 38.0)[2], 0.0, 1e-9);  // O4'-endo: nu2 = 0
}

TEST(Pseudorotation, BackboneDeltaFollowsNu3) {
  // The ideal relation delta = 40 cos(P + 144) + 120 between the backbone torsion
  // delta and the phase uses nu3 of this convention with nu_max = 40 and gives
  // delta ~ 82 for C3'-endo and ~ 144 for C2'-endo.
  // Source: Dickerson, International Tables for Crystallography Vol. F (2006),
  // ch. 23.3, Fig. 23.3.2.6.
  EXPECT_NEAR(endocyclic_torsions_deg(18.0, 40.0)[3] + 120.0, 40.0 * cosd(162.0) + 120.0, 1e-12);
  EXPECT_NEAR(endocyclic_torsions_deg(18.0, 40.0)[3] + 120.0, 82.0, 0.1);
  EXPECT_NEAR(endocyclic_torsions_deg(162.0, 40.0)[3] + 120.0, 143.5, 0.1);
}

TEST(Pseudorotation, InverseRecoversPhaseAndAmplitude) {
  for (double p = 0; p < 360; p += 17)
    for (double amp : {25.0, 38.0, 45.0}) {
      const auto back = pseudorotation_from_torsions(endocyclic_torsions_deg(p, amp));
      EXPECT_NEAR(back.phase_deg, p, 1e-9);
      EXPECT_NEAR(back.amplitude_deg, amp, 1e-9);
    }
}

TEST(Pseudorotation, InverseOnMeasuredTorsions) {
  // Endocyclic torsions of residue G4 of the DNA dodecamer in PDB entry 1BNA:
  // nu0..nu4 = -26.7, 46.3, -47.1, 33.4, -4.4. P and nu_max by hand with the
  // formula of the mmCIF dictionary item _struct_mon_nucl.P (Altona and
  // Sundaralingam 1972): tan P = 35.2 / (2 x -47.1 x 1.5388), P = 166.35,
  // nu_max = nu2 / cos P = 48.47. Source: IUCr mmCIF dictionary, _struct_mon_nucl.P.
  const auto r = pseudorotation_from_torsions({-26.7, 46.3, -47.1, 33.4, -4.4});
  EXPECT_NEAR(r.phase_deg, 166.35, 0.01);
  EXPECT_NEAR(r.amplitude_deg, 48.47, 0.01);
  EXPECT_EQ(envelope_name(r.phase_deg, kFuranose), "C2'-endo");
}

TEST(Pseudorotation, EnvelopeNames) {
  // Source: common practice, no source (the ten envelopes 36 degrees apart).
  EXPECT_EQ(envelope_name(18, kFuranose), "C3'-endo");
  EXPECT_EQ(envelope_name(162, kFuranose), "C2'-endo");
  EXPECT_EQ(envelope_name(90, kFuranose), "O4'-endo");
  EXPECT_EQ(envelope_name(342, kFuranose), "C2'-exo");
  EXPECT_EQ(envelope_name(198, kFuranose), "C3'-exo");
  EXPECT_EQ(envelope_name(-18, kFuranose), "C2'-exo");
}

TEST(Pseudorotation, ProlineNamesTheSidesTheOtherWay) {
  // Proline calls C-gamma-endo the pucker towards the carbonyl carbon, chi1 > 0,
  // P near 180 with this atom order (common practice, from memory; checked on
  // RDKit geometries in tests/validation/proline_pucker_rdkit.py).
  const std::array<std::string, 5> proline = {"N", "CA", "CB", "CG", "CD"};
  EXPECT_EQ(envelope_name(198, proline, true), "CG-endo");
  EXPECT_EQ(envelope_name(18, proline, true), "CG-exo");
  EXPECT_EQ(envelope_name(162, proline, true), "CB-exo");
  EXPECT_GT(endocyclic_torsions_deg(198, 38)[1], 0);  // chi1 = nu1 positive for endo
  EXPECT_LT(endocyclic_torsions_deg(18, 38)[1], 0);
}

}  // namespace
}  // namespace vicinal::pucker
