#include "pucker/pseudorotation.h"

#include <cmath>
#include <numbers>

namespace vicinal::pucker {

namespace {
constexpr double kRad = std::numbers::pi / 180.0;
}

std::array<double, 5> endocyclic_torsions_deg(double phase_deg, double amplitude_deg) {
  std::array<double, 5> nu{};
  for (int j = 0; j < 5; ++j) nu[j] = amplitude_deg * std::cos((phase_deg + 144.0 * (j - 2)) * kRad);
  return nu;
}

double wrap_phase_deg(double phase_deg) {
  double p = std::fmod(phase_deg, 360.0);
  if (p < 0) p += 360.0;
  return p;
}

Pseudorotation pseudorotation_from_torsions(const std::array<double, 5>& nu) {
  const double denominator = 2.0 * nu[2] * (std::sin(36.0 * kRad) + std::sin(72.0 * kRad));
  const double numerator = (nu[4] + nu[1]) - (nu[3] + nu[0]);
  // atan2 picks the quadrant the paper's "add 180 when nu2 < 0" rule picks.
  const double phase = wrap_phase_deg(std::atan2(numerator, denominator) / kRad);
  // For ideal pseudorotation the numerator is 2 nu_max sin P (sin 36 + sin 72)
  // and nu2 = nu_max cos P, so nu_max = hypot of the two: the paper's nu2 / cos P
  // without its loss of precision where cos P -> 0.
  const double amplitude = std::hypot(nu[2], numerator / (2.0 * (std::sin(36.0 * kRad) + std::sin(72.0 * kRad))));
  return {phase, amplitude};
}

std::string envelope_name(double phase_deg, const std::array<std::string, 5>& ring_atoms, bool endo_exo_swapped) {
  const double p = wrap_phase_deg(phase_deg);
  std::string best;
  double best_distance = 1e9;
  for (int i = 0; i < 5; ++i)
    for (int side = 0; side < 2; ++side) {
      const double at = wrap_phase_deg(90.0 - 144.0 * i + 180.0 * side);
      double d = std::fabs(p - at);
      d = std::min(d, 360.0 - d);
      if (d < best_distance) {
        best_distance = d;
        best = ring_atoms[i] + ((side == 0) != endo_exo_swapped ? "-endo" : "-exo");
      }
    }
  return best;
}

}  // namespace vicinal::pucker
