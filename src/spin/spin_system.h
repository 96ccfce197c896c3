// A spin system as chemists write it down: groups of magnetically equivalent
// nuclei (label, isotope, shift, count) and the couplings between groups, on a
// spectrometer named by its 1H frequency. Read from our JSON format:
//   {"field_mhz": 400, "observe": "1H",
//    "spins": [{"label": "A", "isotope": "1H", "shift_ppm": 3.95, "count": 1}, ...],
//    "couplings": [{"between": ["A", "M"], "j_hz": 1.1}, ...]}
// plus an optional "description". Unknown keys are refused, so that a misspelt
// one ("shift" for "shift_ppm") is not silently lost.
#pragma once

#include <cstddef>
#include <string>
#include <vector>

#include "core/json_file.h"
#include "core/nuclei.h"

namespace vicinal::spin {

struct SpinGroup {
  std::string label;
  Nucleus nucleus;
  double shift_ppm = 0;  // only used for the observed isotope
  int count = 1;         // magnetically equivalent nuclei in the group
};

// Scalar coupling between two groups (indices into SpinSystem::groups). A
// coupling of a group with itself (a == b) is allowed: it is the mutual
// coupling of equivalent nuclei, which has no effect on the spectrum.
struct GroupCoupling {
  std::size_t a = 0, b = 0;
  double j_hz = 0;
};

struct SpinSystem {
  double field_mhz = 0;     // 1H Larmor frequency of the spectrometer
  Nucleus observe;          // the isotope whose spectrum is simulated
  std::vector<SpinGroup> groups;
  std::vector<GroupCoupling> couplings;

  // Larmor frequency of the observed isotope on this spectrometer:
  // field_mhz x |gamma(observed) / gamma(1H)|; equals field_mhz for 1H.
  double observe_mhz() const;
  bool is_observed(const SpinGroup& g) const { return g.nucleus.isotope == observe.isotope; }
  // Sum of J over couplings between groups i and j (0 when not coupled).
  double coupling_hz(std::size_t i, std::size_t j) const;
};

// Parses and checks a spin system; errors name `source` and the key path,
// e.g. "system.json: 'couplings[1].between': unknown label 'X'".
SpinSystem spin_system_from_json(const Json& doc, const std::string& source);
SpinSystem read_spin_system(const std::string& path);

// Structural checks shared by the JSON reader and programmatic callers:
// positive field, counts >= 1, unique labels, valid coupling indices, at least
// one group of the observed isotope.
void check_spin_system(const SpinSystem& system, const std::string& source);

}  // namespace vicinal::spin
