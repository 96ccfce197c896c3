#include "spin/lineshape.h"

#include <gtest/gtest.h>

#include <algorithm>
#include <cmath>

#include "core/error.h"

namespace vicinal::spin {
namespace {

// Height at the centre equals the intensity and the width at half height equals
// the line width, for both shapes (their definitions).
TEST(LineShape, PeakHeightAndHalfWidth) {
  for (auto shape : {LineShape::Lorentzian, LineShape::Gaussian}) {
    const auto t = render_spectrum({{1000, 2.5, 3.0}}, 400, shape, 2.0);
    const auto top = std::max_element(t.intensity.begin(), t.intensity.end());
    EXPECT_NEAR(*top, 3.0, 1e-9);
    EXPECT_NEAR(t.hz[static_cast<std::size_t>(top - t.intensity.begin())], 1000, 1e-9);
    double above = 0;  // samples above half height, spaced width/8
    for (double y : t.intensity) above += y >= 1.5 ? 1 : 0;
    EXPECT_NEAR(above * (t.hz[1] - t.hz[0]), 2.0, 0.3);
    EXPECT_NEAR(t.ppm[0] * 400, t.hz[0], 1e-9);
  }
}

TEST(LineShape, RefusesBadWidthAndShape) {
  EXPECT_THROW(render_spectrum({{1, 0, 1}}, 400, LineShape::Gaussian, -1), Error);
  EXPECT_THROW(render_spectrum({{1, 0, 1}}, 400, LineShape::Gaussian, 0), Error);
  EXPECT_THROW(parse_line_shape("voigt"), Error);
  EXPECT_EQ(parse_line_shape("Gaussian"), LineShape::Gaussian);
}

}  // namespace
}  // namespace vicinal::spin
