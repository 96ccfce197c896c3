// Internal: a parameter set compiled for fast evaluation. The coefficients of
// the set's form are copied into a flat, fixed-size record (substituent terms
// included), so that evaluating J costs one sin/cos pair and a few
// multiply-adds, with no allocation and no dispatch inside loops.
#pragma once

#include <array>
#include <cmath>
#include <numbers>
#include <span>
#include <vector>

#include "karplus/karplus.h"

namespace vicinal::karplus::detail {

inline constexpr double kRadPerDeg = std::numbers::pi / 180.0;

struct Curve {
  Form form = Form::ThreeTerm;
  double offset_deg = 0;
  // ThreeTerm: A B C; PiecewiseThreeTerm: A1 B1 C1 A2 B2 C2; Haasnoot: P1 P2 P3.
  std::array<double, 6> c{};
  // Fourier: C0, then (Ck, Sk) pairs; points into the set's coefficients.
  std::span<const double> fourier;
  // Haasnoot substituent terms, each dchi * P4 + dchi * P5 * cos^2(xi t + P6 |dchi|),
  // with cos(xi t + phase) = cos t cos(phase) - xi sin t sin(phase).
  std::size_t substituents = 0;
  std::array<double, kMaxSubstituents> sub_constant{}, sub_amplitude{}, sub_cos_phase{}, sub_xi_sin_phase{};

  // J at theta (radians; theta = dihedral + offset).
  double at_theta(double theta_rad) const {
    switch (form) {
      case Form::ThreeTerm: {
        const double x = std::cos(theta_rad);
        return (c[0] * x + c[1]) * x + c[2];
      }
      case Form::PiecewiseThreeTerm: {
        const double x = std::cos(theta_rad);
        return x >= 0 ? (c[0] * x + c[1]) * x + c[2] : (c[3] * x + c[4]) * x + c[5];
      }
      case Form::Fourier: return fourier_at(std::cos(theta_rad), std::sin(theta_rad));
      case Form::Haasnoot: return haasnoot_at(std::cos(theta_rad), std::sin(theta_rad));
    }
    return 0;
  }
  double at_deg(double dihedral_deg) const { return at_theta((dihedral_deg + offset_deg) * kRadPerDeg); }

  double fourier_at(double x, double y) const {
    // cos(kt), sin(kt) by the angle-addition recurrence from cos t, sin t.
    double sum = fourier[0], ck = 1, sk = 0;
    for (std::size_t i = 1; i + 1 < fourier.size(); i += 2) {
      const double next_c = ck * x - sk * y, next_s = sk * x + ck * y;
      ck = next_c;
      sk = next_s;
      sum += fourier[i] * ck + fourier[i + 1] * sk;
    }
    return sum;
  }

  double haasnoot_at(double x, double y) const {
    double sum = (c[0] * x + c[1]) * x + c[2];
    for (std::size_t i = 0; i < substituents; ++i) {
      const double u = x * sub_cos_phase[i] - y * sub_xi_sin_phase[i];
      sum += sub_constant[i] + sub_amplitude[i] * u * u;
    }
    return sum;
  }
};

// Checks the coefficient count for the form and the substituents (count,
// finiteness, orientation +-1); vicinal::Error names the set otherwise.
Curve compile(const ParameterSet& set, std::span<const Substituent> substituents);

// Local extrema of the curve over one turn (position to ~1e-6 degrees, J to ~1e-12 Hz),
// sorted by angle in [-180, 180).
struct Extremum {
  double at_deg, j_hz;
  bool is_max;
};
std::vector<Extremum> extrema(const Curve& curve);

}  // namespace vicinal::karplus::detail
