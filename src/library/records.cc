#include "library/records.h"

#include <fmt/format.h>

#include <algorithm>
#include <charconv>
#include <map>

#include "core/error.h"

namespace vicinal::library {

std::string conditions_key(const Conditions& c) {
  auto number = [](const std::optional<double>& v) { return v ? fmt::format("{}", *v) : std::string("-"); };
  return fmt::format("{}\x1f{}\x1f{}\x1f{}\x1f{}\x1f{}\x1f{}\x1f{}\x1f{}\x1f{}", c.name, c.solvent,
                     number(c.temperature_k), number(c.field_mhz), number(c.ph), c.instrument, c.method,
                     c.measured_by, c.measured_on, c.source);
}

std::string join_atoms(const std::vector<int>& atoms, char separator) {
  std::string out;
  for (int a : atoms) {
    if (!out.empty()) out += separator;
    out += std::to_string(a);
  }
  return out;
}

std::vector<int> split_atoms(const std::string& text, char separator) {
  std::vector<int> out;
  if (text.empty()) return out;
  const char* p = text.data();
  const char* const end = p + text.size();
  for (;;) {
    int value = 0;
    const auto [next, ec] = std::from_chars(p, end, value);
    if (ec != std::errc() || next == p || (next != end && *next != separator))
      throw Error(fmt::format("stored atom list '{}' is damaged", text), {}, "run 'vicinal library check'");
    out.push_back(value);
    if (next == end) break;
    p = next + 1;
  }
  return out;
}

void number_unassigned_groups(SetRecord& set) {
  std::map<std::string, std::vector<CouplingRecord*>> groups;
  for (auto& c : set.couplings)
    if (c.stereo_unassigned) groups[c.identity].push_back(&c);
  for (auto& [key, members] : groups) {
    std::stable_sort(members.begin(), members.end(),
                     [](const CouplingRecord* a, const CouplingRecord* b) { return a->j_hz > b->j_hz; });
    for (std::size_t i = 0; i < members.size(); ++i) members[i]->identity = key + "#" + std::to_string(i + 1);
  }
}

}  // namespace vicinal::library
