// Couplings of one staggered arrangement: a number from a Karplus set where
// the rules name one (3J(H,H) through the generalized equation with the
// substituents of the arrangement, 3J(C,H) through a C-C-C-H set), else the
// small/large category of Matsumori et al. (1999) as its mid-point with half
// its width as tolerance.
#pragma once

#include <string>
#include <vector>

#include "acyclic/arrangements.h"
#include "acyclic/rules.h"
#include "karplus/karplus.h"

namespace vicinal::acyclic {

// The couplings we can predict. `front`/`back` are the two ends (for 2J the
// oxygen-bearing carbon's oxygen and the proton whose orientation to it matters).
struct CouplingSpec {
  std::string name;  // as written in the input: "H2-H3", "H2-C4", "H3-C1", "H2-X3", "C2-H3", "C3-H2"
  Kind kind{};
  std::string front, back;  // atoms whose torsion decides the value
};

// The couplings available for the system: X3 an oxygen adds 2J(C3,H2); X3 a
// carbon adds 3J(H2,X3).
std::vector<CouplingSpec> coupling_specs(bool x3_is_oxygen);

struct Prediction {
  double j_hz = 0, tolerance_hz = 0;
  std::string category;  // "small" or "large"
  std::string basis;     // the set id, or "categories"
  double dihedral_deg = 0;
};

// A Karplus set's own rms is widened to at least this much, because a real
// rotamer deviates from the ideal 60/180 degrees (our own choice).
inline constexpr double kMinimumModelToleranceHz = 1.0;

class Predictor {
 public:
  Predictor(Rules rules, const karplus::SetCatalog& catalog, bool x3_is_oxygen);
  Prediction predict(const Arrangement& a, const CouplingSpec& c) const;
  const std::vector<CouplingSpec>& specs() const { return specs_; }
  // vicinal::Error listing the accepted names when `name` is not one of them.
  const CouplingSpec& spec(const std::string& name) const;
  const Rules& rules() const { return rules_; }
  bool x3_is_oxygen() const { return x3_oxygen_; }

 private:
  Rules rules_;
  bool x3_oxygen_;
  std::vector<CouplingSpec> specs_;
  const karplus::ParameterSet* hh_set_ = nullptr;
  const karplus::ParameterSet* ch_set_ = nullptr;
};

}  // namespace vicinal::acyclic
