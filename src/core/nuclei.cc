#include "core/nuclei.h"

#include <fmt/format.h>

#include <cctype>
#include <cmath>
#include <numbers>

#include "core/data_dir.h"
#include "core/error.h"
#include "core/json_file.h"

namespace vicinal {

NuclearTable NuclearTable::load(const std::string& path) {
  const Json doc = read_json_file(path);
  NuclearTable table;
  table.citation_ = json_string(json_member(doc, "source", path, ""), path, "source");
  const Json& list = json_member(doc, "nuclei", path, "");
  if (!list.is_array()) throw Error("'nuclei' must be an array", {path});
  for (std::size_t i = 0; i < list.size(); ++i) {
    const std::string ctx = fmt::format("nuclei[{}]", i);
    const Json& e = list[i];
    Nucleus n;
    n.isotope = json_string(json_member(e, "isotope", path, ctx), path, ctx + ".isotope");
    n.element = json_string(json_member(e, "element", path, ctx), path, ctx + ".element");
    n.mass_number = static_cast<int>(json_number(json_member(e, "mass_number", path, ctx), path, ctx));
    n.spin = json_number(json_member(e, "spin", path, ctx), path, ctx + ".spin");
    n.gamma_1e7_rad_per_t_s = json_number(json_member(e, "gamma_1e7_rad_per_t_s", path, ctx), path, ctx);
    n.abundance_percent = json_number(json_member(e, "abundance_percent", path, ctx), path, ctx);
    n.source = e.contains("source") ? json_string(e["source"], path, ctx + ".source") : table.citation_;
    if (n.spin < 0 || std::fmod(n.spin * 2, 1.0) != 0)
      throw Error("spin must be a non-negative multiple of 1/2", Location::field_in(path, ctx + ".spin"));
    table.nuclei_.push_back(std::move(n));
  }
  return table;
}

const NuclearTable& NuclearTable::shipped() {
  static const NuclearTable table = load(data_file("db/nuclei.json").string());
  return table;
}

const Nucleus& NuclearTable::find(const std::string& name) const {
  std::string key = name;
  if (!key.empty() && key.front() == '^') key.erase(0, 1);
  if (key == "D") key = "2H";
  if (key == "T") key = "3H";
  // "H1" -> "1H": element letters first, then the mass number.
  if (!key.empty() && std::isalpha(static_cast<unsigned char>(key.front()))) {
    const auto digits = key.find_first_of("0123456789");
    if (digits != std::string::npos) key = key.substr(digits) + key.substr(0, digits);
  }
  for (const auto& n : nuclei_)
    if (n.isotope == key) return n;
  // A bare element symbol means its most abundant spin-1/2 isotope, as NMR
  // usage has it ("H" = 1H, "C" = 13C, "N" = 15N).
  const Nucleus* best = nullptr;
  for (const auto& n : nuclei_)
    if (n.element == key && n.spin == 0.5 && (!best || n.abundance_percent > best->abundance_percent)) best = &n;
  if (best) return *best;
  std::vector<std::string> known;
  for (const auto& n : nuclei_) known.push_back(n.isotope);
  throw Error(fmt::format("unknown isotope '{}'", name), {},
              fmt::format("known: {}", fmt::join(known, " ")));
}

double scale_coupling_hz(double j_hz, const Nucleus& a1, const Nucleus& b1, const Nucleus& a2,
                         const Nucleus& b2) {
  if (a1.element != a2.element || b1.element != b2.element)
    throw Error(fmt::format("{}-{} and {}-{} are not isotopologues of one pair", a1.isotope, b1.isotope,
                            a2.isotope, b2.isotope),
                {}, "give the same elements in the same order");
  return j_hz * (a2.gamma_1e7_rad_per_t_s * b2.gamma_1e7_rad_per_t_s) /
         (a1.gamma_1e7_rad_per_t_s * b1.gamma_1e7_rad_per_t_s);
}

double reduced_coupling_1e19(double j_hz, const Nucleus& a, const Nucleus& b) {
  constexpr double planck_j_s = 6.62607015e-34;  // exact (SI 2019)
  const double ga = a.gamma_1e7_rad_per_t_s * 1e7, gb = b.gamma_1e7_rad_per_t_s * 1e7;
  const double k = 4 * std::numbers::pi * std::numbers::pi * j_hz / (planck_j_s * ga * gb);
  return k / 1e19;
}

}  // namespace vicinal
