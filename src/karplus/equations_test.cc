// Forward evaluation: every shipped set against its published equation, the
// analytic extrema of a three-term curve, the Haasnoot substituent terms and
// the array overload.
#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>
#include <set>
#include <numbers>
#include <vector>

#include "core/error.h"
#include "karplus/karplus.h"

namespace vicinal::karplus {
namespace {

const ParameterSet& set(const std::string& id) { return SetCatalog::shipped().find(id); }

struct HandValue {
  const char* id;
  double dihedral_deg, j_hz;
};

// J of every shipped set at five angles, evaluated from each paper's equation
// as written in its set file (three-term A cos^2 t + B cos t + C, Karplus 1959
// branches, cosine series C0 + C1 cos t + C2 cos 2t, Haasnoot without
// substituents = P1 cos^2 t + P2 cos t + P3), with t = dihedral + offset, by a
// separate script outside this code base.
// Source: the papers cited in each db/karplus/*.json file (coefficients from memory where the file says so).
const HandValue kHandValues[] = {
    {"ch-coch-tvaroska-1989", -120.0, 2.2250000000},
    {"ch-coch-tvaroska-1989", -60.0, 1.6250000000},
    {"ch-coch-tvaroska-1989", 0.0, 5.6000000000},
    {"ch-coch-tvaroska-1989", 75.0, 0.7265361722},
    {"ch-coch-tvaroska-1989", 180.0, 6.8000000000},
    {"ch-wasylishen-schaefer-1972", -120.0, 2.9800000000},
    {"ch-wasylishen-schaefer-1972", -60.0, 1.9800000000},
    {"ch-wasylishen-schaefer-1972", 0.0, 6.8200000000},
    {"ch-wasylishen-schaefer-1972", 75.0, 0.9181305174},
    {"ch-wasylishen-schaefer-1972", 180.0, 8.8200000000},
    {"co-co-hu-bax-1997", -120.0, 1.4050000000},
    {"co-co-hu-bax-1997", -60.0, 0.4750000000},
    {"co-co-hu-bax-1997", 0.0, 1.0300000000},
    {"co-co-hu-bax-1997", 75.0, 0.4504010135},
    {"co-co-hu-bax-1997", 180.0, 2.8900000000},
    {"co-co-schmidt-1999", -120.0, 1.4425000000},
    {"co-co-schmidt-1999", -60.0, 0.3525000000},
    {"co-co-schmidt-1999", 0.0, 0.9400000000},
    {"co-co-schmidt-1999", 75.0, 0.3390380610},
    {"co-co-schmidt-1999", 180.0, 3.1200000000},
    {"cp-lankhorst-1984", -120.0, 4.1250000000},
    {"cp-lankhorst-1984", -60.0, 0.7250000000},
    {"cp-lankhorst-1984", 0.0, 4.2000000000},
    {"cp-lankhorst-1984", 75.0, 0.2822276036},
    {"cp-lankhorst-1984", 180.0, 11.0000000000},
    {"ha-co-hu-bax-1997", -120.0, 2.8200000000},
    {"ha-co-hu-bax-1997", -60.0, 1.1200000000},
    {"ha-co-hu-bax-1997", 0.0, 3.3000000000},
    {"ha-co-hu-bax-1997", 75.0, 6.8565255523},
    {"ha-co-hu-bax-1997", 180.0, 1.1200000000},
    {"ha-co-schmidt-1999", -120.0, 3.0200000000},
    {"ha-co-schmidt-1999", -60.0, 1.0150000000},
    {"ha-co-schmidt-1999", 0.0, 2.6450000000},
    {"ha-co-schmidt-1999", 75.0, 5.9725868560},
    {"ha-co-schmidt-1999", 180.0, 1.0150000000},
    {"ha-hb-demarco-1978", -120.0, 4.9750000000},
    {"ha-hb-demarco-1978", -60.0, 3.3750000000},
    {"ha-hb-demarco-1978", 0.0, 9.7000000000},
    {"ha-hb-demarco-1978", 75.0, 2.0222688599},
    {"ha-hb-demarco-1978", 180.0, 12.9000000000},
    {"ha-hb-perez-2001-ch2", -120.0, 4.8925000000},
    {"ha-hb-perez-2001-ch2", -60.0, 3.5225000000},
    {"ha-hb-perez-2001-ch2", 0.0, 8.2600000000},
    {"ha-hb-perez-2001-ch2", 75.0, 2.5297360735},
    {"ha-hb-perez-2001-ch2", 180.0, 11.0000000000},
    {"ha-hb-perez-2001-cys", -120.0, 4.2025000000},
    {"ha-hb-perez-2001-cys", -60.0, 2.8325000000},
    {"ha-hb-perez-2001-cys", 0.0, 7.5700000000},
    {"ha-hb-perez-2001-cys", 75.0, 1.8397360735},
    {"ha-hb-perez-2001-cys", 180.0, 10.3100000000},
    {"ha-hb-perez-2001-ile-val", -120.0, 4.2825000000},
    {"ha-hb-perez-2001-ile-val", -60.0, 2.9125000000},
    {"ha-hb-perez-2001-ile-val", 0.0, 7.6500000000},
    {"ha-hb-perez-2001-ile-val", 75.0, 1.9197360735},
    {"ha-hb-perez-2001-ile-val", 180.0, 10.3900000000},
    {"ha-hb-perez-2001-ser", -120.0, 3.9125000000},
    {"ha-hb-perez-2001-ser", -60.0, 2.5425000000},
    {"ha-hb-perez-2001-ser", 0.0, 7.2800000000},
    {"ha-hb-perez-2001-ser", 75.0, 1.5497360735},
    {"ha-hb-perez-2001-ser", 180.0, 10.0200000000},
    {"ha-hb-perez-2001-thr", -120.0, 3.3025000000},
    {"ha-hb-perez-2001-thr", -60.0, 1.9325000000},
    {"ha-hb-perez-2001-thr", 0.0, 6.6700000000},
    {"ha-hb-perez-2001-thr", 75.0, 0.9397360735},
    {"ha-hb-perez-2001-thr", 180.0, 9.4100000000},
    {"hh-haasnoot-1980-four-substituents", -120.0, 3.7650000000},
    {"hh-haasnoot-1980-four-substituents", -60.0, 2.8550000000},
    {"hh-haasnoot-1980-four-substituents", 0.0, 12.3300000000},
    {"hh-haasnoot-1980-four-substituents", 75.0, 0.6513864959},
    {"hh-haasnoot-1980-four-substituents", 180.0, 14.1500000000},
    {"hh-haasnoot-1980-general", -120.0, 3.7900000000},
    {"hh-haasnoot-1980-general", -60.0, 3.0600000000},
    {"hh-haasnoot-1980-general", 0.0, 12.9700000000},
    {"hh-haasnoot-1980-general", 75.0, 0.7287880812},
    {"hh-haasnoot-1980-general", 180.0, 14.4300000000},
    {"hh-haasnoot-1980-three-substituents", -120.0, 3.8000000000},
    {"hh-haasnoot-1980-three-substituents", -60.0, 2.8100000000},
    {"hh-haasnoot-1980-three-substituents", 0.0, 12.2300000000},
    {"hh-haasnoot-1980-three-substituents", 75.0, 0.6293412263},
    {"hh-haasnoot-1980-three-substituents", 180.0, 14.2100000000},
    {"hh-karplus-1959", -120.0, 2.0950000000},
    {"hh-karplus-1959", -60.0, 1.8450000000},
    {"hh-karplus-1959", 0.0, 8.2200000000},
    {"hh-karplus-1959", 75.0, 0.2893920339},
    {"hh-karplus-1959", 180.0, 9.2200000000},
    {"hh-karplus-1963", -120.0, 5.0000000000},
    {"hh-karplus-1963", -60.0, 4.0000000000},
    {"hh-karplus-1963", 0.0, 11.0000000000},
    {"hh-karplus-1963", 75.0, 2.4110539360},
    {"hh-karplus-1963", 180.0, 13.0000000000},
    {"hn-cb-hu-bax-1997", -120.0, 0.5250000000},
    {"hn-cb-hu-bax-1997", -60.0, 2.4500000000},
    {"hn-cb-hu-bax-1997", 0.0, 0.5250000000},
    {"hn-cb-hu-bax-1997", 75.0, 2.1832590181},
    {"hn-cb-hu-bax-1997", 180.0, 1.2650000000},
    {"hn-cb-schmidt-1999", -120.0, 0.6250000000},
    {"hn-cb-schmidt-1999", -60.0, 2.5200000000},
    {"hn-cb-schmidt-1999", 0.0, 0.6250000000},
    {"hn-cb-schmidt-1999", 75.0, 2.0259797975},
    {"hn-cb-schmidt-1999", 180.0, 1.1850000000},
    {"hn-cb-vogeli-2007-dynamic", -120.0, 0.7125000000},
    {"hn-cb-vogeli-2007-dynamic", -60.0, 3.2000000000},
    {"hn-cb-vogeli-2007-dynamic", 0.0, 0.7125000000},
    {"hn-cb-vogeli-2007-dynamic", 75.0, 2.3521930009},
    {"hn-cb-vogeli-2007-dynamic", 180.0, 1.3025000000},
    {"hn-cb-vogeli-2007", -120.0, 0.7525000000},
    {"hn-cb-vogeli-2007", -60.0, 3.1200000000},
    {"hn-cb-vogeli-2007", 0.0, 0.7525000000},
    {"hn-cb-vogeli-2007", 75.0, 2.2697665940},
    {"hn-cb-vogeli-2007", 180.0, 1.2825000000},
    {"hn-co-hu-bax-1997", -120.0, 0.5675000000},
    {"hn-co-hu-bax-1997", -60.0, 1.5775000000},
    {"hn-co-hu-bax-1997", 0.0, 5.3000000000},
    {"hn-co-hu-bax-1997", 75.0, 0.5487827444},
    {"hn-co-hu-bax-1997", 180.0, 3.2800000000},
    {"hn-co-schmidt-1999", -120.0, 0.6625000000},
    {"hn-co-schmidt-1999", -60.0, 2.0225000000},
    {"hn-co-schmidt-1999", 0.0, 6.0100000000},
    {"hn-co-schmidt-1999", 75.0, 0.8874078860},
    {"hn-co-schmidt-1999", 180.0, 3.2900000000},
    {"hn-co-vogeli-2007-dynamic", -120.0, 0.5400000000},
    {"hn-co-vogeli-2007-dynamic", -60.0, 1.6200000000},
    {"hn-co-vogeli-2007-dynamic", 0.0, 5.4300000000},
    {"hn-co-vogeli-2007-dynamic", 75.0, 0.5615891885},
    {"hn-co-vogeli-2007-dynamic", 180.0, 3.2700000000},
    {"hn-co-vogeli-2007", -120.0, 0.5900000000},
    {"hn-co-vogeli-2007", -60.0, 1.6900000000},
    {"hn-co-vogeli-2007", 0.0, 5.3300000000},
    {"hn-co-vogeli-2007", 75.0, 0.6706886178},
    {"hn-co-vogeli-2007", 180.0, 3.1300000000},
    {"hn-ha-hu-bax-1997", -120.0, 10.0600000000},
    {"hn-ha-hu-bax-1997", -60.0, 4.0325000000},
    {"hn-ha-hu-bax-1997", 0.0, 2.6125000000},
    {"hn-ha-hu-bax-1997", 75.0, 6.7934453831},
    {"hn-ha-hu-bax-1997", 180.0, 4.0325000000},
    {"hn-ha-pardi-1984", -120.0, 9.7000000000},
    {"hn-ha-pardi-1984", -60.0, 4.2000000000},
    {"hn-ha-pardi-1984", 0.0, 2.8000000000},
    {"hn-ha-pardi-1984", 75.0, 6.5189851353},
    {"hn-ha-pardi-1984", 180.0, 4.2000000000},
    {"hn-ha-schmidt-1999", -120.0, 9.6000000000},
    {"hn-ha-schmidt-1999", -60.0, 3.1500000000},
    {"hn-ha-schmidt-1999", 0.0, 2.1000000000},
    {"hn-ha-schmidt-1999", 75.0, 7.0065782273},
    {"hn-ha-schmidt-1999", 180.0, 3.1500000000},
    {"hn-ha-vogeli-2007-dynamic", -120.0, 10.0900000000},
    {"hn-ha-vogeli-2007-dynamic", -60.0, 3.1100000000},
    {"hn-ha-vogeli-2007-dynamic", 0.0, 1.7500000000},
    {"hn-ha-vogeli-2007-dynamic", 75.0, 6.8536475721},
    {"hn-ha-vogeli-2007-dynamic", 180.0, 3.1100000000},
    {"hn-ha-vogeli-2007", -120.0, 9.8600000000},
    {"hn-ha-vogeli-2007", -60.0, 3.2525000000},
    {"hn-ha-vogeli-2007", 0.0, 1.9925000000},
    {"hn-ha-vogeli-2007", 75.0, 6.8490446930},
    {"hn-ha-vogeli-2007", 180.0, 3.2525000000},
    {"hn-ha-vuister-bax-1993", -120.0, 9.8700000000},
    {"hn-ha-vuister-bax-1993", -60.0, 4.1075000000},
    {"hn-ha-vuister-bax-1993", 0.0, 2.3475000000},
    {"hn-ha-vuister-bax-1993", 75.0, 5.9738832350},
    {"hn-ha-vuister-bax-1993", 180.0, 4.1075000000},
    {"hn-ha-wang-bax-1996", -120.0, 10.0800000000},
    {"hn-ha-wang-bax-1996", -60.0, 4.1550000000},
    {"hn-ha-wang-bax-1996", 0.0, 2.7750000000},
    {"hn-ha-wang-bax-1996", 75.0, 6.8994510189},
    {"hn-ha-wang-bax-1996", 180.0, 4.1550000000},
    {"hp-lankhorst-1984", -120.0, 8.4750000000},
    {"hp-lankhorst-1984", -60.0, 2.3750000000},
    {"hp-lankhorst-1984", 0.0, 10.8000000000},
    {"hp-lankhorst-1984", 75.0, 1.0461094859},
    {"hp-lankhorst-1984", 180.0, 23.0000000000}
};

TEST(Equations, EveryShippedSetMatchesItsPublishedEquation) {
  std::set<std::string> covered;
  for (const auto& h : kHandValues) {
    EXPECT_NEAR(j_hz(set(h.id), h.dihedral_deg), h.j_hz, 1e-9) << h.id << " at " << h.dihedral_deg;
    covered.insert(h.id);
  }
  // A set added to db/karplus/ without hand values here fails this test.
  for (const auto& s : SetCatalog::shipped().all()) EXPECT_TRUE(covered.count(s.id)) << s.id << " has no hand values";
}

// Hu & Bax 1997, 3J(HN,HA) = 7.09 cos^2(phi - 60) - 1.42 cos(phi - 60) + 1.55, worked by hand.
// Source: Hu & Bax, J. Am. Chem. Soc. 119, 6360 (1997), Table 2.
TEST(Equations, HuBaxWorkedByHand) {
  const auto& s = set("hn-ha-hu-bax-1997");
  EXPECT_NEAR(j_hz(s, -60), 7.09 * 0.25 + 1.42 * 0.5 + 1.55, 1e-12);  // cos(-120) = -1/2: 4.0325 Hz (helix)
  EXPECT_NEAR(j_hz(s, -120), 7.09 + 1.42 + 1.55, 1e-12);               // cos(-180) = -1: 10.06 Hz (sheet)
  EXPECT_NEAR(j_hz(s, 60), 7.09 - 1.42 + 1.55, 1e-12);                 // cos(0) = 1: 7.22 Hz
  EXPECT_NEAR(j_hz(s, 150), 1.55, 1e-12);                              // cos(90) = 0
}

// A cos^2 t + B cos t + C has extrema at cos t = 1 (A + B + C), cos t = -1
// (A - B + C) and, when |B| < 2A, cos t = -B/2A (C - B^2/4A). Common practice, no source.
TEST(Equations, ThreeTermExtremaAreAnalytic) {
  for (const auto& s : SetCatalog::shipped().all()) {
    if (s.form != Form::ThreeTerm) continue;
    const double a = s.coefficients[0], b = s.coefficients[1], c = s.coefficients[2];
    std::vector<double> candidates{a + b + c, a - b + c};
    if (std::abs(b) < 2 * std::abs(a)) candidates.push_back(c - b * b / (4 * a));
    const auto r = j_range(s);
    EXPECT_NEAR(r.max_hz, *std::max_element(candidates.begin(), candidates.end()), 1e-10) << s.id;
    EXPECT_NEAR(r.min_hz, *std::min_element(candidates.begin(), candidates.end()), 1e-10) << s.id;
    EXPECT_NEAR(j_hz(s, r.max_at_deg), r.max_hz, 1e-12) << s.id;
    EXPECT_NEAR(j_hz(s, r.min_at_deg), r.min_hz, 1e-12) << s.id;
  }
  // Hu & Bax: the maximum sits at cos(phi - 60) = -1, phi = -120; the minimum at
  // cos(phi - 60) = 1.42 / 14.18, i.e. phi = 60 +- acos(0.10014) = -24.25 or 144.25 deg.
  const auto r = j_range(set("hn-ha-hu-bax-1997"));
  EXPECT_NEAR(r.max_at_deg, -120.0, 1e-5);
  const double t_min = std::acos(1.42 / 14.18) * 180 / std::numbers::pi;
  EXPECT_TRUE(std::abs(r.min_at_deg - (60 - t_min)) < 1e-5 || std::abs(r.min_at_deg - (60 + t_min)) < 1e-5)
      << r.min_at_deg;
}

// Haasnoot, de Leeuw & Altona 1980: J = P1 cos^2 t + P2 cos t + P3 +
// sum dchi_i (P4 + P5 cos^2(xi_i t + P6 |dchi_i|)), P6 in degrees; worked by a
// separate script for an O (dchi 1.3, xi +1) and a C (dchi 0.4, xi -1)
// substituent with the general set (13.70, -0.73, 0, 0.56, -2.47, 16.9).
// Source: Haasnoot et al., Tetrahedron 36, 2783 (1980), equation; coefficients from memory.
TEST(Equations, HaasnootSubstituentTerms) {
  const auto& s = set("hh-haasnoot-1980-general");
  const Substituent subs[] = {{1.3, 1}, {0.4, -1}};
  EXPECT_NEAR(j_hz(s, 0, subs), 10.1861222154, 1e-9);
  EXPECT_NEAR(j_hz(s, 60, subs), 3.5954796186, 1e-9);
  EXPECT_NEAR(j_hz(s, -60, subs), 1.8658981660, 1e-9);
  EXPECT_NEAR(j_hz(s, 120, subs), 2.5958981660, 1e-9);
  EXPECT_NEAR(j_hz(s, 180, subs), 11.6461222154, 1e-9);
  // Swapping every orientation sign mirrors the curve: J(t; xi) = J(-t; -xi).
  const Substituent mirrored[] = {{1.3, -1}, {0.4, 1}};
  for (double t = -180; t < 180; t += 7.5) EXPECT_NEAR(j_hz(s, t, subs), j_hz(s, -t, mirrored), 1e-12) << t;
}

TEST(Equations, BetaCorrection) {
  // dchi = dchi_alpha - P7 * sum(dchi_beta): an OH oxygen with a beta carbon
  // (1.3 - 0.14 * 0.4) and with nothing beyond it.
  const double beta[] = {0.4};
  EXPECT_NEAR(beta_corrected_delta_chi(1.3, beta, 0.14), 1.3 - 0.056, 1e-15);
  EXPECT_DOUBLE_EQ(beta_corrected_delta_chi(1.3, {}, 0.14), 1.3);
  EXPECT_DOUBLE_EQ(set("hh-haasnoot-1980-general").beta_factor(), 0.14);
  EXPECT_THROW(set("hn-ha-hu-bax-1997").beta_factor(), Error);
}

TEST(Equations, SubstituentsAreCheckedAndOnlyForHaasnoot) {
  const Substituent one[] = {{1.3, 1}};
  EXPECT_THROW(j_hz(set("hn-ha-hu-bax-1997"), 0, one), Error);
  const Substituent bad_sign[] = {{1.3, 2}};
  EXPECT_THROW(j_hz(set("hh-haasnoot-1980-general"), 0, bad_sign), Error);
  const Substituent five[] = {{0.4, 1}, {0.4, 1}, {0.4, -1}, {0.4, -1}, {0.4, 1}};
  EXPECT_THROW(j_hz(set("hh-haasnoot-1980-general"), 0, five), Error);
  const Substituent nan_chi[] = {{std::nan(""), 1}};
  EXPECT_THROW(j_hz(set("hh-haasnoot-1980-general"), 0, nan_chi), Error);
}

TEST(Equations, ArrayOverloadEqualsScalar) {
  std::vector<double> angles;
  for (double t = -180; t <= 180; t += 0.7) angles.push_back(t);
  std::vector<double> out(angles.size());
  const Substituent subs[] = {{1.3, 1}, {0.4, -1}, {0.85, 1}};
  for (const auto& s : SetCatalog::shipped().all()) {
    const std::span<const Substituent> use = s.is_haasnoot() ? std::span<const Substituent>(subs) : std::span<const Substituent>();
    j_hz(s, angles, out, use);
    for (std::size_t i = 0; i < angles.size(); ++i) ASSERT_DOUBLE_EQ(out[i], j_hz(s, angles[i], use)) << s.id;
  }
}

TEST(Equations, PiecewiseBranchesMeetAtNinetyDegrees) {
  // Karplus 1959: 8.5 cos^2 t - 0.28 up to 90 deg, 9.5 cos^2 t - 0.28 beyond. From memory.
  const auto& s = set("hh-karplus-1959");
  EXPECT_NEAR(j_hz(s, 89.999999), -0.28, 1e-9);
  EXPECT_NEAR(j_hz(s, 90.000001), -0.28, 1e-9);
  EXPECT_NEAR(j_hz(s, 0), 8.22, 1e-12);
  EXPECT_NEAR(j_hz(s, 180), 9.22, 1e-12);
  EXPECT_NEAR(j_hz(s, -135), 9.5 * 0.5 - 0.28, 1e-12);
}

TEST(Equations, FormNamesRoundTrip) {
  for (Form f : {Form::ThreeTerm, Form::PiecewiseThreeTerm, Form::Fourier, Form::Haasnoot})
    EXPECT_EQ(parse_form(form_name(f)), f);
  EXPECT_THROW(parse_form("cubic"), Error);
}

}  // namespace
}  // namespace vicinal::karplus
