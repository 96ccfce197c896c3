#include "spin/simulate.h"

#include <gtest/gtest.h>

#include <cmath>

#include "core/error.h"

namespace vicinal::spin {
namespace {

const Nucleus& nucleus(const std::string& name) { return NuclearTable::shipped().find(name); }

SpinSystem proton_system(double field_mhz) {
  SpinSystem s;
  s.field_mhz = field_mhz;
  s.observe = nucleus("1H");
  return s;
}

std::size_t add(SpinSystem& s, const std::string& label, const std::string& isotope, double ppm, int count = 1) {
  s.groups.push_back({label, nucleus(isotope), ppm, count});
  return s.groups.size() - 1;
}

double total_intensity(const Simulation& sim) {
  double t = 0;
  for (const auto& l : sim.lines) t += l.intensity;
  return t;
}

TEST(Simulate, SingleProtonIsOneLineAtItsShift) {
  auto s = proton_system(400);
  add(s, "A", "1H", 2.5);
  const auto sim = simulate(s);
  ASSERT_EQ(sim.lines.size(), 1u);
  EXPECT_NEAR(sim.lines[0].hz, 1000.0, 1e-9);
  EXPECT_NEAR(sim.lines[0].ppm, 2.5, 1e-12);
  EXPECT_NEAR(sim.lines[0].intensity, 1.0, 1e-12);
}

// AB quartet in closed form: C = sqrt(dnu^2 + J^2) / 2, lines at the mean
// +- J/2 +- C, inner intensities 1 + J/(2C), outer 1 - J/(2C) (relative).
// Source: Pople, Schneider and Bernstein, High-resolution NMR, 1959 (textbook result).
TEST(Simulate, AbQuartetMatchesClosedForm) {
  const double field = 100, nu_a = 110, nu_b = 100, j = 7;  // dnu / J = 10/7: strongly coupled
  auto s = proton_system(field);
  const auto a = add(s, "A", "1H", nu_a / field), b = add(s, "B", "1H", nu_b / field);
  s.couplings.push_back({a, b, j});
  const auto sim = simulate(s);
  ASSERT_EQ(sim.lines.size(), 4u);
  const double c = 0.5 * std::hypot(nu_a - nu_b, j), mean = 0.5 * (nu_a + nu_b), sin2t = j / (2 * c);
  const double want_hz[4] = {mean - j / 2 - c, mean + j / 2 - c, mean - j / 2 + c, mean + j / 2 + c};
  const double want_i[4] = {1 - sin2t, 1 + sin2t, 1 + sin2t, 1 - sin2t};
  for (int k = 0; k < 4; ++k) {
    EXPECT_NEAR(sim.lines[k].hz, want_hz[k], 1e-9) << k;
    EXPECT_NEAR(sim.lines[k].intensity, want_i[k] / 2, 1e-9) << k;  // all lines sum to 2 nuclei
  }
}

// Roof effect: the inner lines of an AB pattern grow and the outer ones
// shrink as dnu/J falls (common practice, no source).
TEST(Simulate, RoofEffectGrowsAsShiftDifferenceShrinks) {
  double previous_ratio = 1.0;
  for (double dnu : {200.0, 40.0, 15.0, 5.0}) {
    auto s = proton_system(100);
    const auto a = add(s, "A", "1H", 1.0), b = add(s, "B", "1H", 1.0 + dnu / 100);
    s.couplings.push_back({a, b, 8});
    const auto lines = simulate(s).lines;
    ASSERT_EQ(lines.size(), 4u);
    // The doublet of A (lower frequency) leans towards B: its higher line is stronger.
    EXPECT_GT(lines[1].intensity, lines[0].intensity);
    const double ratio = lines[1].intensity / lines[0].intensity;
    EXPECT_GT(ratio, previous_ratio) << "dnu " << dnu;
    previous_ratio = ratio;
  }
}

// n equivalent spin-1/2 neighbours give n + 1 lines with binomial
// intensities (common practice, no source).
TEST(Simulate, EquivalentNeighboursGiveBinomialMultiplets) {
  for (int n = 1; n <= 6; ++n) {
    auto s = proton_system(600);
    const auto a = add(s, "A", "1H", 1.0), x = add(s, "X", "1H", 100.0, n);  // dnu/J = 8500
    s.couplings.push_back({a, x, 7.0});
    // Second-order shifts of order J^2/dnu (0.03 Hz) split coincident lines slightly: merge them.
    auto lines = merge_lines(simulate(s).lines, 0.05);
    std::erase_if(lines, [](const Line& l) { return l.hz > 1000; });  // keep A's multiplet
    ASSERT_EQ(lines.size(), static_cast<std::size_t>(n + 1)) << n;
    double binomial = 1;
    for (int k = 0; k <= n; ++k) {
      EXPECT_NEAR(lines[k].hz, 600 + 7.0 * (k - n / 2.0), 0.05) << n << " " << k;  // first order
      EXPECT_NEAR(lines[k].intensity / lines[0].intensity, binomial, 0.02 * binomial) << n << " " << k;
      binomial = binomial * (n - k) / (k + 1);
    }
  }
}

// A proton coupled to one deuteron (I = 1) is a 1:1:1 triplet split by
// J(H,D) = J(H,H) x gamma(2H)/gamma(1H) (common practice; the ratio comes
// from db/nuclei.json, Source: Harris et al., Pure Appl. Chem. 73, 1795 (2001)).
TEST(Simulate, DeuteronGivesOneToOneToOneTriplet) {
  const double j_hh = 7.0;
  const double j_hd = j_hh * nucleus("2H").gamma_1e7_rad_per_t_s / nucleus("1H").gamma_1e7_rad_per_t_s;
  auto s = proton_system(400);
  const auto a = add(s, "A", "1H", 2.0), d = add(s, "D", "2H", 0);
  s.couplings.push_back({a, d, j_hd});
  const auto lines = simulate(s).lines;
  ASSERT_EQ(lines.size(), 3u);
  for (int k = 0; k < 3; ++k) {
    EXPECT_NEAR(lines[k].hz, 800 + (k - 1) * j_hd, 1e-9);
    EXPECT_NEAR(lines[k].intensity, 1.0 / 3, 1e-9);
  }
  EXPECT_NEAR(lines[2].hz - lines[0].hz, 2 * 1.0745, 1e-3);  // 7 Hz x 0.15350

  // Two deuterons (CHD2): 2nI + 1 = 5 lines, 1:2:3:2:1.
  s.groups[d].count = 2;
  const auto quintet = simulate(s).lines;
  ASSERT_EQ(quintet.size(), 5u);
  const double want[5] = {1, 2, 3, 2, 1};
  for (int k = 0; k < 5; ++k) EXPECT_NEAR(quintet[k].intensity * 9, want[k], 1e-9);

  // Decoupling 2H leaves a singlet.
  SimulationOptions decoupled;
  decoupled.decouple = {"2H"};
  EXPECT_EQ(simulate(s, decoupled).lines.size(), 1u);
  decoupled.decouple = {"1H"};
  EXPECT_THROW(simulate(s, decoupled), Error);
}

// Magnetically equivalent nuclei show no splitting from their mutual coupling
// (common practice, no source). Checked two ways: the group treated as
// composite spins (count = 2) against two separate nuclei with a large mutual
// coupling, which goes through the full product-basis Hamiltonian.
TEST(Simulate, MutualCouplingOfEquivalentNucleiIsInvisible) {
  auto grouped = proton_system(100);
  const auto a = add(grouped, "A", "1H", 1.00, 2), b = add(grouped, "B", "1H", 1.12, 2);
  grouped.couplings.push_back({a, b, 6.5});
  grouped.couplings.push_back({a, a, 13.0});

  auto split = proton_system(100);
  add(split, "A1", "1H", 1.00);
  add(split, "A2", "1H", 1.00);
  add(split, "B1", "1H", 1.12);
  add(split, "B2", "1H", 1.12);
  for (std::size_t i : {0, 1})
    for (std::size_t k : {2, 3}) split.couplings.push_back({i, k, 6.5});
  split.couplings.push_back({0, 1, 13.0});   // A1-A2
  split.couplings.push_back({2, 3, -11.0});  // B1-B2

  const auto g = simulate(grouped).lines, p = simulate(split).lines;
  ASSERT_EQ(g.size(), p.size());
  for (std::size_t k = 0; k < g.size(); ++k) {
    EXPECT_NEAR(g[k].hz, p[k].hz, 1e-6);
    EXPECT_NEAR(g[k].intensity, p[k].intensity, 1e-6);
  }
  // A2 alone: one line carrying both nuclei.
  auto alone = proton_system(100);
  add(alone, "A", "1H", 1.0, 2);
  alone.couplings.push_back({0, 0, 13.0});
  const auto lines = simulate(alone).lines;
  ASSERT_EQ(lines.size(), 1u);
  EXPECT_NEAR(lines[0].intensity, 2.0, 1e-12);
}

TEST(Simulate, IntensitiesSumToObservedNuclei) {
  auto s = proton_system(300);
  add(s, "A", "1H", 1.0, 3);
  add(s, "B", "1H", 1.1, 2);
  add(s, "C", "1H", 1.3);
  add(s, "F", "19F", 0);
  s.couplings = {{0, 1, 7}, {1, 2, 5}, {0, 2, 1}, {2, 3, 48}};
  EXPECT_NEAR(total_intensity(simulate(s)), 6.0, 1e-6);
}

TEST(Simulate, OtherIsotopeUsesItsOwnFrequency) {
  SpinSystem s;
  s.field_mhz = 400;
  s.observe = nucleus("13C");
  add(s, "C1", "13C", 100.0);
  add(s, "H", "1H", 0, 3);
  s.couplings.push_back({0, 1, 125});
  const auto sim = simulate(s);
  EXPECT_NEAR(sim.observe_mhz, 400 * 6.728284 / 26.7522128, 1e-9);
  ASSERT_EQ(sim.lines.size(), 4u);  // quartet from three protons
  EXPECT_NEAR(sim.lines[0].ppm * sim.observe_mhz, sim.lines[0].hz, 1e-9);
  EXPECT_NEAR(sim.lines[1].hz - sim.lines[0].hz, 125, 1e-9);
}

TEST(Simulate, TwelveIndependentProtonsWorkAndFourteenAreRefused) {
  auto s = proton_system(400);
  for (int i = 0; i < 12; ++i) add(s, "H" + std::to_string(i + 1), "1H", 1.0 + 0.4 * i);
  for (std::size_t i = 0; i + 1 < s.groups.size(); ++i) s.couplings.push_back({i, i + 1, 7.0});
  const auto sim = simulate(s);
  EXPECT_EQ(sim.largest_block, 924u);  // 12 choose 6
  EXPECT_NEAR(total_intensity(sim), 12.0, 1e-4);  // minus the weakest lines dropped
  add(s, "H13", "1H", 6.0);
  add(s, "H14", "1H", 6.4);
  EXPECT_THROW(simulate(s), Error);
}

TEST(MergeLines, MergesWithinTolerance) {
  const auto merged = merge_lines({{1.0, 0, 1}, {1.0005, 0, 1}, {2, 0, 1}}, 1e-3);
  ASSERT_EQ(merged.size(), 2u);
  EXPECT_NEAR(merged[0].hz, 1.00025, 1e-12);
  EXPECT_NEAR(merged[0].intensity, 2, 1e-12);
}

}  // namespace
}  // namespace vicinal::spin
