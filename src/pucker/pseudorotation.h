// The pseudorotation description of five-membered rings (Altona and
// Sundaralingam, J. Am. Chem. Soc. 94, 8205, 1972): the five endocyclic
// torsions follow from a phase P and an amplitude nu_max,
//   nu_j = nu_max cos(P + 144 deg (j - 2)),  j = 0..4,
// where nu_j is the torsion about ring bond j -> j+1 of the ring atom list
// (for furanoses O4', C1', C2', C3', C4': nu0 = C4'-O4'-C1'-C2', nu2 =
// C1'-C2'-C3'-C4'). Formula and index convention from memory; the unit tests
// check them against the envelope forms they must produce.
#pragma once

#include <array>
#include <string>

namespace vicinal::pucker {

std::array<double, 5> endocyclic_torsions_deg(double phase_deg, double amplitude_deg);

struct Pseudorotation {
  double phase_deg;      // in [0, 360)
  double amplitude_deg;  // >= 0
};

// The inverse of the paper: tan P = ((nu4 + nu1) - (nu3 + nu0)) / (2 nu2 (sin 36 + sin 72)),
// nu_max = nu2 / cos P.
Pseudorotation pseudorotation_from_torsions(const std::array<double, 5>& nu_deg);

// Phase in [0, 360).
double wrap_phase_deg(double phase_deg);

// The nearest envelope form, e.g. "C3'-endo" for P near 18 with the furanose
// atom list: atom i lies out of the plane of the other four where the torsion
// opposite it vanishes, which the formula places at P = 90 - 144 i (endo, the
// side of positive nu_j ordering) and 180 degrees further (exo). Rings whose
// trade convention names the sides the other way round (proline: endo = towards
// the carbonyl carbon) pass `endo_exo_swapped`.
std::string envelope_name(double phase_deg, const std::array<std::string, 5>& ring_atoms,
                          bool endo_exo_swapped = false);

}  // namespace vicinal::pucker
