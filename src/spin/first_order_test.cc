#include "spin/first_order.h"

#include <gtest/gtest.h>

#include <random>

#include "core/error.h"
#include "spin/simulate.h"

namespace vicinal::spin {
namespace {

// Peaks of an ideal first-order tree (coincident lines merged), with intensities.
PeakList tree_peaks(double center, const std::vector<double>& js, double merge_hz = 0.01) {
  std::vector<Line> lines{{center, 0, 1}};
  for (double j : js) {
    std::vector<Line> next;
    for (const auto& l : lines) {
      next.push_back({l.hz - j / 2, 0, l.intensity});
      next.push_back({l.hz + j / 2, 0, l.intensity});
    }
    lines = std::move(next);
  }
  PeakList peaks;
  for (const auto& l : merge_lines(lines, merge_hz)) {
    peaks.hz.push_back(l.hz);
    peaks.intensity.push_back(l.intensity);
  }
  return peaks;
}

TEST(FirstOrder, ReadsDddWithJournalNotation) {
  const auto result = analyse_first_order(tree_peaks(1200, {11.8, 4.9, 2.1}));
  const auto& best = result.trees.front();
  EXPECT_EQ(best.multiplicity(), "ddd");
  EXPECT_EQ(best.notation(), "ddd, J = 11.8, 4.9, 2.1 Hz");
  EXPECT_NEAR(best.center_hz, 1200, 1e-9);
  EXPECT_LT(best.residual_hz, 1e-9);
  EXPECT_FALSE(result.ambiguous);
}

TEST(FirstOrder, GroupsEqualCouplingsIntoTriplets) {
  const auto best = analyse_first_order(tree_peaks(900, {7.2, 7.2, 3.1})).trees.front();
  EXPECT_EQ(best.notation(), "td, J = 7.2, 3.1 Hz");
  ASSERT_EQ(best.groups.size(), 2u);
  EXPECT_EQ(best.groups[0].partners, 2);
  const auto dt = analyse_first_order(tree_peaks(900, {10.0, 3.0, 3.0})).trees.front();
  EXPECT_EQ(dt.multiplicity(), "dt");
  const auto q = analyse_first_order(tree_peaks(500, {7.0, 7.0, 7.0})).trees.front();
  EXPECT_EQ(q.notation(), "q, J = 7.0 Hz");
}

// J1 = J2 + J3 makes two centre lines coincide: 7 peaks, the middle one double.
TEST(FirstOrder, OverlappedCentreLinesAreCountedByIntensity) {
  const auto peaks = tree_peaks(1500, {10.0, 6.0, 4.0});
  ASSERT_EQ(peaks.hz.size(), 7u);
  const auto result = analyse_first_order(peaks);
  EXPECT_EQ(result.trees.front().notation(), "ddd, J = 10.0, 6.0, 4.0 Hz");
  EXPECT_EQ(result.trees.front().peaks[3].lines, 2);
  // Without intensities the same tree is still found first.
  PeakList bare{peaks.hz, {}};
  EXPECT_EQ(analyse_first_order(bare).trees.front().notation(), "ddd, J = 10.0, 6.0, 4.0 Hz");
}

// A dd with J1 = 2 J2 gives four equally spaced lines, like a quartet. Without
// intensities both readings must be offered; intensities decide.
TEST(FirstOrder, DdWithJ1TwiceJ2IsAmbiguousWithoutIntensities) {
  const auto dd = tree_peaks(1000, {8.0, 4.0});
  ASSERT_EQ(dd.hz.size(), 4u);
  const auto bare = analyse_first_order({dd.hz, {}});
  EXPECT_TRUE(bare.ambiguous);
  ASSERT_GE(bare.trees.size(), 2u);
  EXPECT_EQ(bare.trees[0].multiplicity(), "dd");
  EXPECT_EQ(bare.trees[1].multiplicity(), "q");

  const auto with_1111 = analyse_first_order(dd);
  EXPECT_EQ(with_1111.trees[0].notation(), "dd, J = 8.0, 4.0 Hz");
  EXPECT_FALSE(with_1111.ambiguous);

  PeakList quartet = dd;
  quartet.intensity = {1, 3, 3, 1};
  const auto q = analyse_first_order(quartet);
  EXPECT_EQ(q.trees[0].notation(), "q, J = 4.0 Hz");
  EXPECT_FALSE(q.ambiguous);
}

// Two nearly equal couplings whose centre lines do not resolve read as a triplet.
TEST(FirstOrder, UnresolvedDdReadsAsTriplet) {
  const auto peaks = tree_peaks(700, {7.1, 6.9}, 0.5);
  ASSERT_EQ(peaks.hz.size(), 3u);
  const auto best = analyse_first_order(peaks).trees.front();
  EXPECT_EQ(best.multiplicity(), "t");
  EXPECT_NEAR(best.groups[0].j_hz, 7.0, 0.01);
}

TEST(FirstOrder, RecoversCouplingsFromNoisyPeaks) {
  std::mt19937 rng(7);
  std::normal_distribution<double> position_noise(0, 0.04), intensity_noise(1, 0.05);
  for (int trial = 0; trial < 20; ++trial) {
    auto peaks = tree_peaks(1234.5, {12.4, 6.3, 2.6});
    for (auto& p : peaks.hz) p += position_noise(rng);
    for (auto& i : peaks.intensity) i *= intensity_noise(rng);
    const auto best = analyse_first_order(peaks).trees.front();
    ASSERT_EQ(best.multiplicity(), "ddd") << trial;
    EXPECT_NEAR(best.groups[0].j_hz, 12.4, 0.1);
    EXPECT_NEAR(best.groups[1].j_hz, 6.3, 0.1);
    EXPECT_NEAR(best.groups[2].j_hz, 2.6, 0.1);
    EXPECT_NEAR(best.center_hz, 1234.5, 0.05);
  }
}

// End to end: a multiplet simulated by the spin code (weakly coupled) is read back.
TEST(FirstOrder, ReadsASimulatedMultiplet) {
  SpinSystem s;
  s.field_mhz = 500;
  s.observe = NuclearTable::shipped().find("1H");
  s.groups = {{"A", s.observe, 4.10, 1}, {"B", s.observe, 1.20, 3}, {"C", s.observe, 6.50, 1}};
  s.couplings = {{0, 1, 6.8}, {0, 2, 15.2}};
  PeakList peaks;
  for (const auto& l : merge_lines(simulate(s).lines, 0.05))
    if (l.ppm > 4.0 && l.ppm < 4.2) {
      peaks.hz.push_back(l.hz);
      peaks.intensity.push_back(l.intensity);
    }
  const auto best = analyse_first_order(peaks).trees.front();
  EXPECT_EQ(best.multiplicity(), "dq");
  EXPECT_NEAR(best.groups[0].j_hz, 15.2, 0.05);
  EXPECT_NEAR(best.groups[1].j_hz, 6.8, 0.05);
  EXPECT_NEAR(best.center_hz, 2050, 0.1);
}

TEST(FirstOrder, RefusesWhatItCannotRead) {
  EXPECT_THROW(analyse_first_order({{}, {}}), Error);
  EXPECT_THROW(analyse_first_order({{1000}, {}}), Error);
  EXPECT_THROW(analyse_first_order({{1000, 1000.1}, {}}), Error);          // closer than the tolerance
  EXPECT_THROW(analyse_first_order({{1000, 1007}, {1, -1}}), Error);       // negative intensity
  EXPECT_THROW(analyse_first_order({{1000, 1007, 1010.5}, {}}), Error);    // no tree fits
}

}  // namespace
}  // namespace vicinal::spin
