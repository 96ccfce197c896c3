#include "fit/statistics.h"

#include <gtest/gtest.h>

namespace vicinal::fit {
namespace {

// Reference values: scipy.stats.chi2.ppf / chi2.sf / norm.ppf (SciPy 1.10),
// which agree with printed tables (e.g. Abramowitz & Stegun 1964, Table 26.8).
TEST(Statistics, ChiSquareQuantiles) {
  EXPECT_NEAR(chi2_quantile(0.95, 1), 3.841458820694124, 1e-9);
  EXPECT_NEAR(chi2_quantile(0.68268949213708585, 1), 1.0, 1e-9);
  EXPECT_NEAR(chi2_quantile(0.95, 10), 18.307038053275146, 1e-8);
  EXPECT_NEAR(chi2_quantile(0.99, 3), 11.344866730144373, 1e-8);
}

TEST(Statistics, ChiSquareTail) {
  EXPECT_NEAR(chi2_survival(3.841458820694124, 1), 0.05, 1e-12);
  EXPECT_NEAR(chi2_survival(18.307038053275146, 10), 0.05, 1e-12);
  EXPECT_NEAR(chi2_survival(2.0, 2), 0.36787944117144233, 1e-14);  // exp(-1)
  EXPECT_NEAR(chi2_survival(100.0, 5), 5.285148360943219e-20, 1e-30);
}

TEST(Statistics, NormalQuantile) {
  EXPECT_NEAR(normal_quantile(0.975), 1.959963984540054, 1e-12);
  EXPECT_NEAR(normal_quantile(0.5), 0.0, 1e-14);
  EXPECT_NEAR(normal_quantile(0.001), -3.090232306167813, 1e-11);
}

}  // namespace
}  // namespace vicinal::fit
