#include "spin/spin_system.h"

#include <fmt/format.h>

#include <cmath>
#include <set>

#include "core/error.h"

namespace vicinal::spin {

namespace {

constexpr int kMaxCount = 64;  // more equivalent nuclei than any molecule fragment needs
// Bounds far beyond any real spectrum (common practice, no source): the largest
// magnets are near 1.2 GHz, shift ranges of heavy nuclei span some 10^4 ppm and
// one-bond couplings to metals reach a few kHz. Larger values are damaged input
// (a 40-digit number, say), not data.
constexpr double kMaxFieldMhz = 10000;
constexpr double kMaxShiftPpm = 100000;
constexpr double kMaxCouplingHz = 100000;

Location field(const std::string& source, const std::string& path) {
  return Location::field_in(source, path);
}

std::size_t find_label(const std::vector<SpinGroup>& groups, const std::string& label,
                       const std::string& source, const std::string& path) {
  for (std::size_t i = 0; i < groups.size(); ++i)
    if (groups[i].label == label) return i;
  std::string known;
  for (const auto& g : groups) known += (known.empty() ? "" : ", ") + g.label;
  throw Error(fmt::format("unknown label '{}'", label), field(source, path),
              "labels defined under 'spins': " + known);
}

int json_count(const Json& value, const std::string& source, const std::string& path) {
  const double v = json_number(value, source, path);
  if (v != std::floor(v) || v < 1 || v > kMaxCount)
    throw Error(fmt::format("count must be a whole number from 1 to {}, found {}", kMaxCount, value.dump()),
                field(source, path));
  return static_cast<int>(v);
}

}  // namespace

double SpinSystem::observe_mhz() const {
  const Nucleus& proton = NuclearTable::shipped().find("1H");
  return field_mhz * std::abs(observe.gamma_1e7_rad_per_t_s / proton.gamma_1e7_rad_per_t_s);
}

double SpinSystem::coupling_hz(std::size_t i, std::size_t j) const {
  double sum = 0;
  for (const auto& c : couplings)
    if ((c.a == i && c.b == j) || (c.a == j && c.b == i)) sum += c.j_hz;
  return sum;
}

void check_spin_system(const SpinSystem& s, const std::string& source) {
  if (!(s.field_mhz > 0) || !(s.field_mhz <= kMaxFieldMhz))
    throw Error(fmt::format("field must be a 1H frequency from 0 to {} MHz, found {:g}", kMaxFieldMhz, s.field_mhz),
                field(source, "field_mhz"));
  if (s.groups.empty()) throw Error("no spins given", field(source, "spins"));
  std::set<std::string> labels;
  bool observed = false;
  for (std::size_t i = 0; i < s.groups.size(); ++i) {
    const auto& g = s.groups[i];
    const std::string at = fmt::format("spins[{}]", i);
    if (g.label.empty()) throw Error("empty label", field(source, at + ".label"));
    if (!labels.insert(g.label).second)
      throw Error(fmt::format("label '{}' is used twice", g.label), field(source, at + ".label"),
                  "give every group its own label; use 'count' for equivalent nuclei");
    if (g.count < 1 || g.count > kMaxCount)
      throw Error(fmt::format("count must be from 1 to {}", kMaxCount), field(source, at + ".count"));
    if (!(std::fabs(g.shift_ppm) <= kMaxShiftPpm))
      throw Error(fmt::format("shift {:g} ppm is outside -{} to {} ppm", g.shift_ppm, kMaxShiftPpm, kMaxShiftPpm),
                  field(source, at + ".shift_ppm"));
    observed = observed || s.is_observed(g);
  }
  if (!observed)
    throw Error(fmt::format("no spin of the observed isotope {}", s.observe.isotope), field(source, "observe"),
                "add a group of that isotope or observe another one");
  std::set<std::pair<std::size_t, std::size_t>> pairs;
  for (std::size_t k = 0; k < s.couplings.size(); ++k) {
    const auto& c = s.couplings[k];
    const std::string at = fmt::format("couplings[{}]", k);
    if (c.a >= s.groups.size() || c.b >= s.groups.size())
      throw Error("coupling refers to a missing group", field(source, at + ".between"));
    if (!(std::fabs(c.j_hz) <= kMaxCouplingHz))
      throw Error(fmt::format("coupling {:g} Hz is outside -{} to {} Hz", c.j_hz, kMaxCouplingHz, kMaxCouplingHz),
                  field(source, at + ".j_hz"));
    if (c.a == c.b && s.groups[c.a].count < 2)
      throw Error(fmt::format("'{}' is a single nucleus and cannot couple to itself", s.groups[c.a].label),
                  field(source, at + ".between"));
    if (!pairs.insert(std::minmax(c.a, c.b)).second)
      throw Error(fmt::format("coupling between '{}' and '{}' is given twice", s.groups[c.a].label,
                              s.groups[c.b].label),
                  field(source, at + ".between"));
  }
}

SpinSystem spin_system_from_json(const Json& doc, const std::string& source) {
  if (!doc.is_object()) throw Error("a spin system must be a JSON object", {source});
  // A misspelt key ("shift" for "shift_ppm") would otherwise be dropped without a word.
  json_require_keys(doc, {"description", "field_mhz", "observe", "spins", "couplings"}, source, "");
  const auto& table = NuclearTable::shipped();
  SpinSystem s;
  s.field_mhz = json_number(json_member(doc, "field_mhz", source, ""), source, "field_mhz");
  const std::string observe = json_string(json_member(doc, "observe", source, ""), source, "observe");
  try {
    s.observe = table.find(observe);
  } catch (const Error& e) {
    throw Error(e.what_happened(), field(source, "observe"), e.hint());
  }

  const Json& spins = json_member(doc, "spins", source, "");
  if (!spins.is_array()) throw Error("'spins' must be a list", field(source, "spins"));
  for (std::size_t i = 0; i < spins.size(); ++i) {
    const std::string at = fmt::format("spins[{}]", i);
    const Json& item = spins[i];
    json_require_keys(item, {"label", "isotope", "shift_ppm", "count"}, source, at);
    SpinGroup g;
    g.label = json_string(json_member(item, "label", source, at), source, at + ".label");
    const std::string isotope = json_string(json_member(item, "isotope", source, at), source, at + ".isotope");
    try {
      g.nucleus = table.find(isotope);
    } catch (const Error& e) {
      throw Error(e.what_happened(), field(source, at + ".isotope"), e.hint());
    }
    // Shifts matter only for the observed isotope (others are weakly coupled).
    if (item.is_object() && item.contains("shift_ppm"))
      g.shift_ppm = json_number(item["shift_ppm"], source, at + ".shift_ppm");
    else if (g.nucleus.isotope == s.observe.isotope)
      json_member(item, "shift_ppm", source, at);  // throws "missing key"
    if (item.is_object() && item.contains("count")) g.count = json_count(item["count"], source, at + ".count");
    for (const auto& earlier : s.groups)
      if (earlier.label == g.label)
        throw Error(fmt::format("label '{}' is used twice", g.label), field(source, at + ".label"),
                    "give every group its own label; use 'count' for equivalent nuclei");
    s.groups.push_back(std::move(g));
  }

  if (doc.contains("couplings")) {
    const Json& couplings = doc["couplings"];
    if (!couplings.is_array()) throw Error("'couplings' must be a list", field(source, "couplings"));
    for (std::size_t k = 0; k < couplings.size(); ++k) {
      const std::string at = fmt::format("couplings[{}]", k);
      json_require_keys(couplings[k], {"between", "j_hz"}, source, at);
      const Json& between = json_member(couplings[k], "between", source, at);
      if (!between.is_array() || between.size() != 2)
        throw Error("'between' must be a list of two labels", field(source, at + ".between"));
      GroupCoupling c;
      c.a = find_label(s.groups, json_string(between[0], source, at + ".between"), source, at + ".between");
      c.b = find_label(s.groups, json_string(between[1], source, at + ".between"), source, at + ".between");
      c.j_hz = json_number(json_member(couplings[k], "j_hz", source, at), source, at + ".j_hz");
      s.couplings.push_back(c);
    }
  }
  check_spin_system(s, source);
  return s;
}

SpinSystem read_spin_system(const std::string& path) {
  return spin_system_from_json(read_json_file(path), path);
}

}  // namespace vicinal::spin
