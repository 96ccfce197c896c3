#include "structure/substituents.h"

#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/elements.h>
#include <openbabel/obiter.h>

#include <cmath>

#include "core/data_dir.h"
#include "core/error.h"
#include "core/json_file.h"
#include "structure/atom_labels.h"
#include "structure/ensemble.h"

namespace vicinal::structure {

const Electronegativity& Electronegativity::shipped() {
  static const Electronegativity table = load(data_file("db/electronegativity.json").string());
  return table;
}

// Accepts {"elements": {"C": 2.60, ...}} or {"elements": {"C": {"chi": 2.60, ...}}}
// (also "huggins" or "value" as the key of the number), with the citation in
// "citation" or "source".
Electronegativity Electronegativity::load(const std::string& path) {
  const Json doc = read_json_file(path);
  Electronegativity table;
  table.file_ = path;
  for (const char* key : {"citation", "source"})
    if (doc.contains(key) && doc[key].is_string()) {
      table.citation_ = doc[key].get<std::string>();
      break;
    }
  const Json& elements = json_member(doc, "elements", path, "elements");
  if (!elements.is_object() && !elements.is_array())
    throw Error("'elements' must be an object or a list", Location::field_in(path, "elements"));
  const auto value_of = [&](const Json& v, const std::string& context) {
    if (v.is_number()) return json_number(v, path, context);
    for (const char* key : {"chi", "huggins", "value", "electronegativity"})
      if (v.is_object() && v.contains(key)) return json_number(v[key], path, context + "." + key);
    throw Error("no electronegativity value (expected a number or a 'chi' member)", Location::field_in(path, context));
  };
  if (elements.is_object()) {
    for (const auto& [symbol, v] : elements.items()) table.chi_[symbol] = value_of(v, "elements." + symbol);
  } else {
    for (std::size_t i = 0; i < elements.size(); ++i) {
      const std::string context = fmt::format("elements[{}]", i);
      const std::string symbol = json_string(json_member(elements[i], "element", path, context), path, context + ".element");
      table.chi_[symbol] = value_of(elements[i], context);
    }
  }
  if (!table.chi_.count("H")) throw Error("no value for hydrogen (H), the reference", Location(path));
  return table;
}

double Electronegativity::chi(const std::string& element) const {
  auto it = chi_.find(element);
  if (it == chi_.end())
    throw Error(fmt::format("no Huggins electronegativity for element {}", element), Location(file_),
                "the generalized Karplus equation cannot be applied to this substituent; choose a set without "
                "substituent terms");
  return it->second;
}

namespace {

struct Vec {
  double x, y, z;
  Vec operator-(const Vec& o) const { return {x - o.x, y - o.y, z - o.z}; }
  Vec operator*(double s) const { return {x * s, y * s, z * s}; }
  double dot(const Vec& o) const { return x * o.x + y * o.y + z * o.z; }
  Vec cross(const Vec& o) const { return {y * o.z - z * o.y, z * o.x - x * o.z, x * o.y - y * o.x}; }
};

Vec position(std::span<const double> xyz, int atom) {
  const std::size_t i = 3 * static_cast<std::size_t>(atom - 1);
  return {xyz[i], xyz[i + 1], xyz[i + 2]};
}

// Orientation sign xi of a substituent S on carbon C, whose coupled proton is H
// and whose partner carbon in the H-C-C-H fragment is C'. The rule of Haasnoot,
// de Leeuw and Altona (1980): in the Newman projection viewed along the C-C bond
// with the substituted carbon C in front, xi = +1 when S lies clockwise
// (+120 degrees) from the proton H on the same carbon, -1 when counter-clockwise.
// From coordinates: with the viewing axis u = C' - C (pointing away from the
// viewer) and h, s the components of H - C and S - C perpendicular to u, S is
// clockwise from H exactly when (h x s) . u > 0 (a right-handed turn about an
// axis that points away from the viewer looks clockwise).
int orientation_sign(std::span<const double> xyz, int h, int c, int c_other, int s) {
  const Vec carbon = position(xyz, c);
  const Vec u = position(xyz, c_other) - carbon;
  const auto perpendicular = [&](const Vec& v) { return v - u * (v.dot(u) / u.dot(u)); };
  const Vec hp = perpendicular(position(xyz, h) - carbon);
  const Vec sp = perpendicular(position(xyz, s) - carbon);
  return hp.cross(sp).dot(u) > 0 ? 1 : -1;
}

}  // namespace

std::vector<SubstituentDetail> haasnoot_substituents(const OpenBabel::OBMol& mol, const std::array<int, 4>& hcch,
                                                     double p7, std::span<const double> xyz) {
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  const auto element = [&](int atom) { return std::string(OpenBabel::OBElements::GetSymbol(m.GetAtom(atom)->GetAtomicNum())); };
  if (element(hcch[0]) != "H" || element(hcch[1]) != "C" || element(hcch[2]) != "C" || element(hcch[3]) != "H") {
    Location where;
    where.atom = fmt::format("{}-{}-{}-{}", atom_name(mol, hcch[0]), atom_name(mol, hcch[1]), atom_name(mol, hcch[2]),
                             atom_name(mol, hcch[3]));
    throw Error("the generalized Karplus equation (Haasnoot) applies to H-C-C-H fragments only", where,
                "choose a set for this kind of coupling with --set");
  }
  std::vector<double> own;
  if (xyz.empty()) {
    own = coordinates_of(mol);
    xyz = own;
  }
  const Electronegativity& en = Electronegativity::shipped();
  std::vector<SubstituentDetail> out;
  for (int side = 0; side < 2; ++side) {
    const int h = hcch[side == 0 ? 0 : 3];
    const int c = hcch[side == 0 ? 1 : 2];
    const int c_other = hcch[side == 0 ? 2 : 1];
    FOR_NBORS_OF_ATOM(nbr, m.GetAtom(c)) {
      const int s = static_cast<int>(nbr->GetIdx());
      if (s == c_other || nbr->GetAtomicNum() == 1) continue;
      SubstituentDetail d;
      d.atom = s;
      d.carbon = c;
      d.element = element(s);
      d.delta_chi_alpha = en.delta_from_hydrogen(d.element);
      std::vector<double> beta_delta_chi;
      FOR_NBORS_OF_ATOM(beta, &*nbr) {
        if (static_cast<int>(beta->GetIdx()) == c || beta->GetAtomicNum() == 1) continue;
        beta_delta_chi.push_back(en.delta_from_hydrogen(element(static_cast<int>(beta->GetIdx()))));
        d.sum_delta_chi_beta += beta_delta_chi.back();
      }
      d.delta_chi = karplus::beta_corrected_delta_chi(d.delta_chi_alpha, beta_delta_chi, p7);
      d.orientation = orientation_sign(xyz, h, c, c_other, s);
      out.push_back(d);
    }
  }
  return out;
}

std::vector<karplus::Substituent> as_karplus(const std::vector<SubstituentDetail>& details) {
  std::vector<karplus::Substituent> out;
  for (const auto& d : details) out.push_back({d.delta_chi, d.orientation});
  return out;
}

}  // namespace vicinal::structure
