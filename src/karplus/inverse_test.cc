// Inverse map J -> dihedrals, checked against a dense scan of the forward
// curve (property test over random J for every shipped set), against the
// analytic roots of a three-term curve, and on the awkward cases: intervals
// through +-180, a band that only touches an extremum, J outside the curve.
#include <gtest/gtest.h>

#include <cmath>
#include <numbers>
#include <random>
#include <algorithm>

#include "core/error.h"
#include "karplus/karplus.h"

namespace vicinal::karplus {
namespace {

const ParameterSet& set(const std::string& id) { return SetCatalog::shipped().find(id); }

bool inside(const AngleSolution& s, double t) {
  for (const auto& iv : s.intervals)
    if (t >= iv.from_deg - 1e-7 && t <= iv.to_deg + 1e-7) return true;
  return false;
}

// Property: with a dense 0.01 degree scan of the forward curve, every angle
// clearly inside the band lies in a reported interval, every angle clearly
// outside lies in none, each sign change of J - j has a reported root within
// one grid step, and every reported root solves J = j.
void check_against_scan(const ParameterSet& s, double j, double sigma, std::span<const Substituent> subs) {
  AngleSolution sol;
  try {
    sol = allowed_dihedrals(s, j, sigma, 2.0, subs);
  } catch (const Error&) {
    const auto r = j_range(s, subs);
    const double tol = 2.0 * std::hypot(sigma, s.rms_hz);
    EXPECT_TRUE(j - tol > r.max_hz - 1e-9 || j + tol < r.min_hz + 1e-9) << s.id << " refused J = " << j;
    return;
  }
  const double tol = sol.tolerance_hz;
  const int n = 36000;
  double prev_t = -180, prev_d = j_hz(s, -180, subs) - j;
  for (int i = 0; i <= n; ++i) {
    const double t = -180.0 + 360.0 * i / n;
    const double d = j_hz(s, t, subs) - j;
    if (std::abs(d) < tol - 1e-6) {
      ASSERT_TRUE(inside(sol, t)) << s.id << " J=" << j << " t=" << t;
    }
    if (std::abs(d) > tol + 1e-6) {
      ASSERT_FALSE(inside(sol, t)) << s.id << " J=" << j << " t=" << t;
    }
    if (i > 0 && prev_d * d < 0 && std::abs(prev_d) > 1e-6 && std::abs(d) > 1e-6) {
      bool found = false;
      for (double r : sol.exact_deg) found |= r >= prev_t - 1e-7 && r <= t + 1e-7;
      ASSERT_TRUE(found) << s.id << " J=" << j << ": no root between " << prev_t << " and " << t;
    }
    prev_t = t;
    prev_d = d;
  }
  for (double r : sol.exact_deg) EXPECT_NEAR(j_hz(s, r, subs), j, 1e-7) << s.id;
  for (const auto& iv : sol.intervals) {
    EXPECT_LE(iv.from_deg, iv.to_deg);
    EXPECT_GE(iv.best_deg, iv.from_deg - 1e-9);
    EXPECT_LE(iv.best_deg, iv.to_deg + 1e-9);
  }
}

TEST(Inverse, MatchesDenseScanForEverySet) {
  std::mt19937 rng(20261201);
  const Substituent subs[] = {{1.26, 1}, {0.35, -1}, {0.85, -1}};
  for (const auto& s : SetCatalog::shipped().all()) {
    const auto use = s.is_haasnoot() ? std::span<const Substituent>(subs) : std::span<const Substituent>();
    const auto r = j_range(s, use);
    std::uniform_real_distribution<double> pick_j(r.min_hz - 1.0, r.max_hz + 1.0), pick_sigma(0.0, 0.4);
    for (int trial = 0; trial < 12; ++trial) check_against_scan(s, pick_j(rng), pick_sigma(rng), use);
    // With no tolerance at all the band is the root set itself.
    ParameterSet exact = s;
    exact.rms_hz = 0;
    for (int trial = 0; trial < 4; ++trial) check_against_scan(exact, pick_j(rng), 0.0, use);
  }
}

// A cos^2 t + B cos t + C = j  <=>  cos t = (-B +- sqrt(B^2 - 4A(C - j))) / 2A,
// two angles +-acos(x) per admissible x: up to four roots. Common practice, no source.
TEST(Inverse, ThreeTermRootsAreAnalytic) {
  ParameterSet s = set("hn-ha-hu-bax-1997");  // 7.09, -1.42, 1.55, offset -60
  s.rms_hz = 0;
  const double a = 7.09, b = -1.42, c = 1.55, j = 5.0;
  std::vector<double> expected;
  for (double sign : {-1.0, 1.0}) {
    const double x = (-b + sign * std::sqrt(b * b - 4 * a * (c - j))) / (2 * a);
    if (std::abs(x) > 1) continue;
    for (double t : {std::acos(x), -std::acos(x)}) {
      double phi = t * 180 / std::numbers::pi + 60;
      if (phi >= 180) phi -= 360;
      expected.push_back(phi);
    }
  }
  std::sort(expected.begin(), expected.end());
  ASSERT_EQ(expected.size(), 4u);
  const auto sol = allowed_dihedrals(s, j, 0.0, 2.0);
  ASSERT_EQ(sol.exact_deg.size(), 4u);
  for (int i = 0; i < 4; ++i) EXPECT_NEAR(sol.exact_deg[i], expected[i], 1e-8);
}

TEST(Inverse, IntervalThroughOneEightyIsSplitAndFlagged) {
  // Karplus 1963 peaks at t = 180 (7 + 1 + 5 = 13 Hz): J = 12.8 Hz +- 0.3 Hz
  // (k = 2, sigma = 0.15, no stated rms) is one arc around 180 deg, reported
  // as [from, 180] and [-180, to].
  const auto sol = allowed_dihedrals(set("hh-karplus-1963"), 12.8, 0.15, 2.0);
  ASSERT_EQ(sol.intervals.size(), 2u);
  const auto& left = sol.intervals[0];
  const auto& right = sol.intervals[1];
  EXPECT_TRUE(left.wraps && right.wraps);
  EXPECT_DOUBLE_EQ(left.from_deg, -180.0);
  EXPECT_DOUBLE_EQ(right.to_deg, 180.0);
  EXPECT_NEAR(left.to_deg, -right.from_deg, 1e-8);  // the curve is symmetric about 180
  EXPECT_NEAR(j_hz(set("hh-karplus-1963"), left.to_deg), 12.8 - 0.3, 1e-8);
  ASSERT_EQ(sol.exact_deg.size(), 2u);
  EXPECT_NEAR(sol.exact_deg[0], -sol.exact_deg[1], 1e-8);
}

TEST(Inverse, IntervalAcrossTheScanSeamIsOneInterval) {
  // The segments start at the first extremum, for Hu & Bax the maximum at
  // phi = -120; a band around that maximum must come back as one interval.
  const auto sol = allowed_dihedrals(set("hn-ha-hu-bax-1997"), 9.8, 0.1, 2.0);
  ASSERT_EQ(sol.intervals.size(), 1u);
  EXPECT_LT(sol.intervals[0].from_deg, -120.0);
  EXPECT_GT(sol.intervals[0].to_deg, -120.0);
  EXPECT_FALSE(sol.intervals[0].wraps);
  ASSERT_EQ(sol.exact_deg.size(), 2u);
}

TEST(Inverse, TangentialTouchIsFound) {
  // J equal to the maximum of Hu & Bax (A - B + C = 10.06 Hz at phi = -120)
  // with no tolerance: exactly one root, at the extremum.
  ParameterSet s = set("hn-ha-hu-bax-1997");
  s.rms_hz = 0;
  const auto sol = allowed_dihedrals(s, 7.09 + 1.42 + 1.55, 0.0, 2.0);
  ASSERT_EQ(sol.exact_deg.size(), 1u);
  EXPECT_NEAR(sol.exact_deg[0], -120.0, 1e-6);
  ASSERT_EQ(sol.intervals.size(), 1u);
  EXPECT_NEAR(sol.intervals[0].best_deg, -120.0, 1e-6);
  // A band whose upper edge only just reaches the maximum is still one interval.
  const auto edge = allowed_dihedrals(set("hn-ha-hu-bax-1997"), 10.06 - 2 * 0.39, 0.0, 2.0);
  EXPECT_FALSE(edge.intervals.empty());
}

TEST(Inverse, OutOfRangeNamesTheNearestJ) {
  try {
    allowed_dihedrals(set("hh-karplus-1963"), 20.0, 0.3, 2.0);
    FAIL() << "no error";
  } catch (const Error& e) {
    const std::string text = e.what();
    EXPECT_NE(text.find("outside the curve"), std::string::npos) << text;
    EXPECT_NE(text.find("nearest attainable J is 13.00 Hz"), std::string::npos) << text;
  }
  try {
    allowed_dihedrals(set("hn-ha-hu-bax-1997"), -3.0, 0.1, 2.0);
    FAIL() << "no error";
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("nearest attainable J is 1.48 Hz"), std::string::npos) << e.what();
  }
}

TEST(Inverse, BadNumbersAreRefused) {
  const auto& s = set("hn-ha-hu-bax-1997");
  EXPECT_THROW(allowed_dihedrals(s, 7.4, -0.1, 2.0), Error);
  EXPECT_THROW(allowed_dihedrals(s, std::nan(""), 0.3, 2.0), Error);
  EXPECT_THROW(allowed_dihedrals(s, 7.4, std::nan(""), 2.0), Error);
  EXPECT_THROW(allowed_dihedrals(s, 7.4, 0.3, 0.0), Error);
  EXPECT_THROW(allowed_dihedrals(s, 7.4, 0.3, -1.0), Error);
  EXPECT_THROW(allowed_dihedrals(s, INFINITY, 0.3, 2.0), Error);
}

TEST(Inverse, ToleranceCombinesSigmaAndSetRms) {
  const auto sol = allowed_dihedrals(set("hn-ha-hu-bax-1997"), 7.4, 0.3, 2.0);
  EXPECT_NEAR(sol.tolerance_hz, 2.0 * std::sqrt(0.3 * 0.3 + 0.39 * 0.39), 1e-12);
}

}  // namespace
}  // namespace vicinal::karplus
