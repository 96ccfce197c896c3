#include "report/axis_ticks.h"

#include <gtest/gtest.h>

#include <cmath>
#include <limits>

namespace vicinal::report {
namespace {

// Expected tick sets follow the 1-2-5 rule worked by hand (common practice, no source).
TEST(NiceTicks, PicksOneTwoFiveSteps) {
  Ticks t = nice_ticks(0, 10, 5);
  EXPECT_DOUBLE_EQ(t.step, 2);
  EXPECT_EQ(t.values, (std::vector<double>{0, 2, 4, 6, 8, 10}));

  t = nice_ticks(0, 1, 5);
  EXPECT_DOUBLE_EQ(t.step, 0.2);
  ASSERT_EQ(t.values.size(), 6u);
  EXPECT_NEAR(t.values.back(), 1.0, 1e-12);

  t = nice_ticks(-3.7, 12.2, 6);  // raw step 2.65 -> 5
  EXPECT_DOUBLE_EQ(t.step, 5);
  EXPECT_EQ(t.values, (std::vector<double>{0, 5, 10}));
  EXPECT_FALSE(std::signbit(t.values.front())) << "no negative zero";

  t = nice_ticks(3.88, 4.12, 5);  // a narrow ppm window
  EXPECT_NEAR(t.step, 0.05, 1e-15);
  EXPECT_NEAR(t.values.front(), 3.9, 1e-12);
  EXPECT_NEAR(t.values.back(), 4.1, 1e-12);
}

TEST(NiceTicks, SurvivesDegenerateRanges) {
  const double nan = std::numeric_limits<double>::quiet_NaN();
  EXPECT_GE(nice_ticks(5, 5, 5).values.size(), 2u);
  EXPECT_GE(nice_ticks(nan, 1, 5).values.size(), 2u);
  EXPECT_GE(nice_ticks(10, 0, 5).values.size(), 2u);  // reversed pair
  EXPECT_GE(nice_ticks(0, 1, 0).values.size(), 2u);
}

TEST(DrawableRange, WidensSwapsAndFallsBack) {
  EXPECT_EQ(drawable_range(3, 3), (std::pair<double, double>{2.7, 3.3}));
  EXPECT_EQ(drawable_range(0, 0), (std::pair<double, double>{-1, 1}));
  EXPECT_EQ(drawable_range(5, 1), (std::pair<double, double>{1, 5}));
  EXPECT_EQ(drawable_range(std::nan(""), 1), (std::pair<double, double>{0, 1}));
  EXPECT_EQ(drawable_range(0, std::numeric_limits<double>::infinity()), (std::pair<double, double>{0, 1}));
}

TEST(TickLabel, UsesJustEnoughDecimalsAndATrueMinus) {
  EXPECT_EQ(tick_label(0.5, 0.5), "0.5");
  EXPECT_EQ(tick_label(1.0, 0.5), "1.0");
  EXPECT_EQ(tick_label(120, 20), "120");
  EXPECT_EQ(tick_label(0.25, 0.25), "0.25");
  EXPECT_EQ(tick_label(-2, 1), "\u22122");
  EXPECT_EQ(tick_label(-1e-17, 0.1), "0.0");
  EXPECT_EQ(tick_label(2e7, 1e7), "2e+07");
  EXPECT_EQ(decimals_for(30), 0);
  EXPECT_EQ(decimals_for(0.05), 2);
  EXPECT_EQ(decimals_for(1.0 / 3.0), 6);
}

}  // namespace
}  // namespace vicinal::report
