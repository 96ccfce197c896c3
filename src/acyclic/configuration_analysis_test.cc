#include "acyclic/configuration_analysis.h"

#include <gtest/gtest.h>

#include <cmath>

#include "core/error.h"

namespace vicinal::acyclic {
namespace {

Predictor predictor(bool x3_oxygen) {
  return Predictor(Rules::load("matsumori-1999"), karplus::SetCatalog::shipped(), x3_oxygen);
}

TEST(Arrangements, SixStaggeredWithTheExpectedGeometry) {
  const auto all = staggered_arrangements();
  ASSERT_EQ(all.size(), 6u);
  for (const auto& a : all) {
    // Staggered: every front/back pair is gauche (60) or anti (180).
    for (const char* f : {"H2", "X2", "C1"})
      for (const char* b : {"H3", "X3", "C4"}) {
        const double d = std::fabs(a.dihedral_deg(f, b));
        EXPECT_TRUE(std::fabs(d - 60) < 1e-9 || std::fabs(d - 180) < 1e-9) << a.name() << " " << f << b << " " << d;
      }
  }
  // Erythro eclipsed with C1 over C4 puts X3 over X2 (Fischer projection, same
  // side). Common practice, no source.
  Arrangement eclipsed{Configuration::Erythro, 0};
  EXPECT_NEAR(eclipsed.dihedral_deg("X2", "X3"), 0, 1e-9);
  EXPECT_NEAR(eclipsed.dihedral_deg("C1", "C4"), 0, 1e-9);
  Arrangement threo{Configuration::Threo, 0};
  EXPECT_NEAR(std::fabs(threo.dihedral_deg("X2", "X3")), 120, 1e-9);
}

TEST(Predictions, FollowTheCategories) {
  // Matsumori et al. 1999 (from memory): anti H/H gives a large 3J(H,H); the
  // oxygen on C2 gauche to H3 gives a large |2J(C2,H3)|.
  const auto p = predictor(false);
  for (const auto& a : staggered_arrangements()) {
    const Prediction hh = p.predict(a, p.spec("H2-H3"));
    EXPECT_EQ(hh.category, std::fabs(a.dihedral_deg("H2", "H3")) > 120 ? "large" : "small");
    if (hh.category == "large") EXPECT_GT(hh.j_hz, 7.0) << a.name();
    else EXPECT_LT(hh.j_hz, 5.0) << a.name();
    const Prediction two = p.predict(a, p.spec("C2-H3"));
    EXPECT_EQ(two.category, std::fabs(a.dihedral_deg("X2", "H3")) > 120 ? "small" : "large");
  }
}

std::vector<MeasuredCoupling> own_couplings(const Predictor& p, const Arrangement& a) {
  std::vector<MeasuredCoupling> m;
  for (const auto& s : p.specs()) m.push_back({s.name, p.predict(a, s).j_hz, 0.3, 0});
  return m;
}

TEST(Analysis, EachArrangementIsRecognisedFromItsOwnCouplings) {
  // The four arrangements with H2/H3 gauche are told apart by their couplings.
  // With H2/H3 anti, every coupling of a proton (3J(H,H), 3J(C,H), 2J(C,H))
  // is the same in erythro and threo: the method cannot decide from J alone
  // and needs an NOE (Matsumori et al., J. Org. Chem. 64, 866, 1999; from
  // memory). Both must then come out on top, reported as ambiguous.
  for (bool x3_oxygen : {false, true}) {
    const auto p = predictor(x3_oxygen);
    const auto all = staggered_arrangements();
    for (std::size_t i = 0; i < all.size(); ++i) {
      const Analysis a = analyse(p, own_couplings(p, all[i]));
      const bool hh_anti = std::fabs(all[i].dihedral_deg("H2", "H3")) > 120;
      if (!hh_anti) {
        ASSERT_EQ(a.candidates.front().members.size(), 1u) << all[i].name();
        EXPECT_EQ(a.candidates.front().members[0], static_cast<int>(i)) << all[i].name();
        EXPECT_EQ(a.verdict, Verdict::Clear) << all[i].name() << ": " << a.statement;
        continue;
      }
      EXPECT_EQ(a.verdict, Verdict::ConfigurationAmbiguous) << all[i].name();
      ASSERT_GE(a.candidates.size(), 2u);
      for (int k = 0; k < 2; ++k) {
        ASSERT_EQ(a.candidates[k].members.size(), 1u);
        EXPECT_GT(std::fabs(all[a.candidates[k].members[0]].dihedral_deg("H2", "H3")), 120) << a.candidates[k].name;
      }
      EXPECT_NE(a.candidates[0].configuration, a.candidates[1].configuration);
    }
  }
}

TEST(Analysis, FastExchangeOfTwoRotamersIsFound) {
  const auto p = predictor(false);
  const auto all = staggered_arrangements();
  // 60:40 mixture of the first two threo rotamers.
  std::vector<MeasuredCoupling> m;
  for (const auto& s : p.specs())
    m.push_back({s.name, 0.6 * p.predict(all[3], s).j_hz + 0.4 * p.predict(all[4], s).j_hz, 0.3, 0});
  const Analysis a = analyse(p, m);
  ASSERT_EQ(a.candidates.front().members.size(), 2u) << a.statement;
  EXPECT_EQ(a.candidates.front().configuration, Configuration::Threo);
  EXPECT_NEAR(a.candidates.front().fraction, 0.6, 0.02);
}

TEST(Analysis, OneLargeHHCouplingAloneIsAmbiguous) {
  // An anti H2/H3 pair exists in both configurations, so a large 3J(H,H) alone
  // cannot tell erythro from threo (Matsumori et al. 1999, the reason the
  // heteronuclear couplings are needed; from memory).
  const auto p = predictor(false);
  const Analysis a = analyse(p, {{"H2-H3", 9.5, 0.3, 2}});
  EXPECT_EQ(a.verdict, Verdict::ConfigurationAmbiguous);
  EXPECT_NE(a.statement.find("Ambiguous"), std::string::npos);
}

TEST(Analysis, BadInputNamesLineAndColumn) {
  const auto p = predictor(false);
  try {
    parse_measured("coupling,j_hz,sigma_hz\nH2-H3,9,0.3\nC3-H2,5,0.3\n", "m.csv", p);
    FAIL();
  } catch (const Error& e) {
    EXPECT_EQ(e.where().line, 3);  // C3-H2 needs an oxygen on C3
    EXPECT_EQ(e.where().field, "coupling");
  }
  EXPECT_THROW(parse_measured("coupling,j_hz,sigma_hz\nH2-H3,x,0.3\n", "m.csv", p), Error);
  EXPECT_THROW(parse_measured("coupling,j_hz,sigma_hz\nH2-H3,9,-1\n", "m.csv", p), Error);
  EXPECT_THROW(parse_measured("coupling,j_hz,sigma_hz\n", "m.csv", p), Error);
}

}  // namespace
}  // namespace vicinal::acyclic
