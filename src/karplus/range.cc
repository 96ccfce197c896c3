// Extrema and range of a curve over one turn: a scan on a 0.1 degree grid
// finds every local extremum (the curves here are low-order trigonometric
// polynomials, whose extrema are much further apart than the grid step), and
// golden-section search refines each. Near a flat extremum J changes by less
// than double precision over ~1e-6 degrees, so that is how well its position
// is known; the extreme J values themselves are exact to ~1e-12 Hz.
#include <algorithm>
#include <cmath>

#include "karplus/curve.h"
#include "karplus/karplus.h"

namespace vicinal::karplus {

namespace detail {

namespace {

constexpr int kGrid = 3600;
constexpr double kStepDeg = 360.0 / kGrid;

double wrap_deg(double a) { return a - 360.0 * std::floor((a + 180.0) / 360.0); }

// Golden-section search for the maximum of sign*J on [a, b].
double refine(const Curve& curve, double a, double b, double sign) {
  const double g = (std::sqrt(5.0) - 1) / 2;
  double x1 = b - g * (b - a), x2 = a + g * (b - a);
  double f1 = sign * curve.at_deg(x1), f2 = sign * curve.at_deg(x2);
  while (b - a > 1e-9) {
    if (f1 < f2) {
      a = x1;
      x1 = x2;
      f1 = f2;
      x2 = a + g * (b - a);
      f2 = sign * curve.at_deg(x2);
    } else {
      b = x2;
      x2 = x1;
      f2 = f1;
      x1 = b - g * (b - a);
      f1 = sign * curve.at_deg(x1);
    }
  }
  return (a + b) / 2;
}

}  // namespace

std::vector<Extremum> extrema(const Curve& curve) {
  std::vector<double> j(kGrid);
  for (int i = 0; i < kGrid; ++i) j[i] = curve.at_deg(-180.0 + i * kStepDeg);
  std::vector<Extremum> found;
  for (int i = 0; i < kGrid; ++i) {
    const double prev = j[(i + kGrid - 1) % kGrid], here = j[i], next = j[(i + 1) % kGrid];
    const bool is_max = here > prev && here >= next, is_min = here < prev && here <= next;
    if (!is_max && !is_min) continue;
    const double centre = -180.0 + i * kStepDeg;
    const double at = wrap_deg(refine(curve, centre - kStepDeg, centre + kStepDeg, is_max ? 1.0 : -1.0));
    found.push_back({at, curve.at_deg(at), is_max});
  }
  std::sort(found.begin(), found.end(), [](const Extremum& a, const Extremum& b) { return a.at_deg < b.at_deg; });
  return found;
}

}  // namespace detail

JRange j_range(const ParameterSet& set, std::span<const Substituent> substituents) {
  const detail::Curve curve = detail::compile(set, substituents);
  const auto ext = detail::extrema(curve);
  const double j0 = curve.at_deg(-180.0);
  JRange r{j0, -180.0, j0, -180.0};  // a flat curve has no extrema
  bool first = true;
  for (const auto& e : ext) {
    if (first || e.j_hz < r.min_hz) r.min_hz = e.j_hz, r.min_at_deg = e.at_deg;
    if (first || e.j_hz > r.max_hz) r.max_hz = e.j_hz, r.max_at_deg = e.at_deg;
    first = false;
  }
  return r;
}

}  // namespace vicinal::karplus
