#include "acyclic/predict_couplings.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "core/error.h"
#include "structure/substituents.h"

namespace vicinal::acyclic {

std::vector<CouplingSpec> coupling_specs(bool x3_is_oxygen) {
  std::vector<CouplingSpec> s = {
      {"H2-H3", Kind::ThreeBondHH, "H2", "H3"},
      {"H2-C4", Kind::ThreeBondCH, "H2", "C4"},
      {"H3-C1", Kind::ThreeBondCH, "C1", "H3"},
      // 2J(C2,H3): the oxygen on C2 against H3 on the neighbouring carbon.
      {"C2-H3", Kind::TwoBondCH, "X2", "H3"},
  };
  if (x3_is_oxygen) s.push_back({"C3-H2", Kind::TwoBondCH, "H2", "X3"});
  else s.push_back({"H2-X3", Kind::ThreeBondCH, "H2", "X3"});
  return s;
}

namespace {

const karplus::ParameterSet* find_set(const karplus::SetCatalog& catalog, const std::string& id) {
  if (id.empty()) return nullptr;
  return &catalog.find(id);
}

bool is_anti(double dihedral_deg) { return std::fabs(dihedral_deg) > 120; }

}  // namespace

Predictor::Predictor(Rules rules, const karplus::SetCatalog& catalog, bool x3_is_oxygen)
    : rules_(std::move(rules)), x3_oxygen_(x3_is_oxygen), specs_(coupling_specs(x3_is_oxygen)) {
  hh_set_ = find_set(catalog, rules_.rule(Kind::ThreeBondHH).karplus_set);
  ch_set_ = find_set(catalog, rules_.rule(Kind::ThreeBondCH).karplus_set);
}

const CouplingSpec& Predictor::spec(const std::string& name) const {
  for (const auto& s : specs_)
    if (s.name == name) return s;
  std::vector<std::string> names;
  for (const auto& s : specs_) names.push_back(s.name);
  throw Error(fmt::format("unknown coupling '{}'", name), {},
              fmt::format("for X3 = {} the couplings are {}", x3_oxygen_ ? "oxygen" : "carbon", fmt::join(names, ", ")));
}

Prediction Predictor::predict(const Arrangement& a, const CouplingSpec& c) const {
  Prediction p;
  p.dihedral_deg = a.dihedral_deg(c.front, c.back);
  const CategoryRule& rule = rules_.rule(c.kind);
  // 3J: anti gives large; 2J(C,H): the oxygen gauche to the proton gives large |2J|.
  const bool large = c.kind == Kind::TwoBondCH ? !is_anti(p.dihedral_deg) : is_anti(p.dihedral_deg);
  p.category = large ? "large" : "small";
  const karplus::ParameterSet* set = c.kind == Kind::ThreeBondHH ? hh_set_ : c.kind == Kind::ThreeBondCH ? ch_set_ : nullptr;
  if (set) {
    std::vector<karplus::Substituent> subs;
    if (set->form == karplus::Form::Haasnoot) {
      // Substituents of H2-C2-C3-H3 with their group electronegativities and
      // orientation signs xi (Haasnoot et al. 1980): viewed along C-C from the
      // substituted carbon, +1 when the substituent lies 120 degrees clockwise
      // of that carbon's proton. From C2 (front) that is +120 in our angles;
      // from C3 the view is reversed, so +1 there means -120 in our angles.
      const double p7 = set->coefficients.size() > 6 ? set->coefficients[6] : 0.0;
      const auto& en = structure::Electronegativity::shipped();
      const auto group_chi = [&](const std::string& g) {
        const GroupModel& m = rules_.group(g);
        double beta = 0;
        for (const auto& b : m.beta) beta += en.delta_from_hydrogen(b);
        return en.delta_from_hydrogen(m.element) - p7 * beta;
      };
      const auto turn = [&](const std::string& from, const std::string& to) {
        return std::fmod(a.angle_deg(to) - a.angle_deg(from) + 360.0, 360.0);
      };
      subs.push_back({group_chi("X2"), std::fabs(turn("H2", "X2") - 120) < 1 ? 1 : -1});
      subs.push_back({group_chi("C1"), std::fabs(turn("H2", "C1") - 120) < 1 ? 1 : -1});
      subs.push_back({group_chi(x3_oxygen_ ? "X3_oxygen" : "X3_carbon"), std::fabs(turn("H3", "X3") - 240) < 1 ? 1 : -1});
      subs.push_back({group_chi("C4"), std::fabs(turn("H3", "C4") - 240) < 1 ? 1 : -1});
    }
    p.j_hz = std::fabs(karplus::j_hz(*set, p.dihedral_deg, subs));
    p.tolerance_hz = std::max(set->rms_hz, kMinimumModelToleranceHz);
    p.basis = set->id;
    return p;
  }
  const double from = large ? rule.large_from_hz : rule.small_from_hz;
  const double to = large ? rule.large_to_hz : rule.small_to_hz;
  p.j_hz = (from + to) / 2;
  p.tolerance_hz = (to - from) / 2;
  p.basis = "categories";
  return p;
}

}  // namespace vicinal::acyclic
