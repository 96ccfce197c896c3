#include "predict/set_choice.h"

#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/elements.h>
#include <openbabel/obiter.h>
#include <openbabel/parsmart.h>

#include <algorithm>
#include <cctype>
#include <set>

#include "core/error.h"

namespace vicinal::predict {

namespace {

int element_of_isotope(const std::string& isotope) {
  std::string symbol;
  for (char c : isotope)
    if (std::isalpha(static_cast<unsigned char>(c))) symbol += c;
  if (symbol == "D" || symbol == "T") symbol = "H";
  return OpenBabel::OBElements::GetAtomicNum(symbol.c_str());
}

// "3J(HA,C')" -> {"HA", "C'"}; empty when the field has another shape.
std::vector<std::string> coupling_tokens(const std::string& coupling) {
  const auto open = coupling.find('('), comma = coupling.find(','), close = coupling.rfind(')');
  if (open == std::string::npos || comma == std::string::npos || close == std::string::npos || comma < open ||
      close < comma)
    return {};
  return {coupling.substr(open + 1, comma - open - 1), coupling.substr(comma + 1, close - comma - 1)};
}

int atomic_number(OpenBabel::OBMol& mol, int atom) { return mol.GetAtom(atom)->GetAtomicNum(); }

std::vector<int> neighbours_with(OpenBabel::OBMol& mol, int centre, int element, const std::array<int, 4>& exclude) {
  std::vector<int> out;
  FOR_NBORS_OF_ATOM(nbr, mol.GetAtom(centre)) {
    const int idx = static_cast<int>(nbr->GetIdx());
    if (static_cast<int>(nbr->GetAtomicNum()) != element) continue;
    if (std::find(exclude.begin(), exclude.end(), idx) != exclude.end()) continue;
    out.push_back(idx);
  }
  return out;
}

// Candidates for one nucleus on one side of the central bond. side 0: end m1,
// centre m2; side 1: end m4, centre m3.
std::vector<int> side_candidates(OpenBabel::OBMol& mol, const std::array<int, 4>& m, int side, int element,
                                 const std::string& token) {
  const int end = side == 0 ? m[0] : m[3];
  const int centre = side == 0 ? m[1] : m[2];
  const std::string symbol = OpenBabel::OBElements::GetSymbol(element);
  const bool names_end = token.empty() || token == symbol || token.find('\'') != std::string::npos || token == "CO";
  if (names_end) return atomic_number(mol, end) == element ? std::vector<int>{end} : std::vector<int>{};
  return neighbours_with(mol, centre, element, m);
}

// Which side of the pattern a named nucleus sits on: HN on the central N; HA,
// CB (and other H*/C* names with a Greek-letter suffix) on the central carbon;
// -1 when the name does not fix a side.
int side_of_token(OpenBabel::OBMol& mol, const std::array<int, 4>& m, const std::string& token) {
  const auto centre_element = [&](int side) { return atomic_number(mol, side == 0 ? m[1] : m[2]); };
  if (token == "HN" || token == "H(N)") {
    for (int s = 0; s < 2; ++s)
      if (centre_element(s) == 7) return s;
  }
  if (token == "HA" || token == "CB") {
    for (int s = 0; s < 2; ++s)
      if (centre_element(s) == 6) return s;
  }
  return -1;
}

}  // namespace

int substituent_count(const OpenBabel::OBMol& mol, const std::array<int, 4>& hcch) {
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  int count = 0;
  for (int side = 1; side <= 2; ++side) {
    const int other = side == 1 ? hcch[2] : hcch[1];
    FOR_NBORS_OF_ATOM(nbr, m.GetAtom(hcch[side]))
      if (nbr->GetAtomicNum() != 1 && static_cast<int>(nbr->GetIdx()) != other) ++count;
  }
  return count;
}

const std::vector<SetOccurrence>& SetMatcher::occurrences(const karplus::ParameterSet& set) {
  if (auto it = cache_.find(set.id); it != cache_.end()) return it->second;
  auto& mol = const_cast<OpenBabel::OBMol&>(mol_);
  OpenBabel::OBSmartsPattern pattern;
  if (!pattern.Init(set.pattern_smarts))
    throw Error(fmt::format("set '{}' has a pattern that does not parse: {}", set.id, set.pattern_smarts),
                Location::field_in(set.file, "pattern_smarts"));
  // Pattern atom -> map number 1-4 (Open Babel calls atom maps "vector bindings").
  std::array<int, 4> position{-1, -1, -1, -1};
  for (int i = 0; i < static_cast<int>(pattern.NumAtoms()); ++i) {
    const int map = pattern.GetVectorBinding(i);
    if (map >= 1 && map <= 4) position[map - 1] = i;
  }
  if (std::count(position.begin(), position.end(), -1))
    throw Error(fmt::format("set '{}' pattern lacks atom maps 1 to 4: {}", set.id, set.pattern_smarts),
                Location::field_in(set.file, "pattern_smarts"));
  const int e0 = element_of_isotope(set.nuclei[0]), e1 = element_of_isotope(set.nuclei[1]);
  const auto tokens = coupling_tokens(set.coupling);
  std::vector<SetOccurrence> found;
  std::set<std::array<int, 4>> seen;
  pattern.Match(mol);
  for (const auto& match : pattern.GetMapList()) {
    SetOccurrence occ;
    for (int k = 0; k < 4; ++k) occ.dihedral[k] = match[position[k]];
    if (!seen.insert(occ.dihedral).second) continue;
    // Nucleus 0 on side s0 and nucleus 1 on the other side; a name that fixes a
    // side decides, otherwise both placements are tried.
    std::vector<int> first_sides{0, 1};
    if (tokens.size() == 2) {
      const int s0 = side_of_token(mol, occ.dihedral, tokens[0]);
      const int s1 = side_of_token(mol, occ.dihedral, tokens[1]);
      if (s0 >= 0) first_sides = {s0};
      else if (s1 >= 0) first_sides = {1 - s1};
    }
    std::set<std::array<int, 2>> pairs;
    for (int s0 : first_sides) {
      const auto a = side_candidates(mol, occ.dihedral, s0, e0, tokens.size() == 2 ? tokens[0] : "");
      const auto b = side_candidates(mol, occ.dihedral, 1 - s0, e1, tokens.size() == 2 ? tokens[1] : "");
      for (int x : a)
        for (int y : b)
          if (x != y) pairs.insert({x, y});
    }
    occ.nuclei_pairs.assign(pairs.begin(), pairs.end());
    if (!occ.nuclei_pairs.empty()) found.push_back(std::move(occ));
  }
  return cache_.emplace(set.id, std::move(found)).first->second;
}

const SetOccurrence* SetMatcher::occurrence_for(const karplus::ParameterSet& set, int a, int b) {
  // Prefer the occurrence that runs from a to b, so that the dihedral reads in
  // the order the user named the nuclei.
  const SetOccurrence* either = nullptr;
  for (const auto& occ : occurrences(set))
    for (const auto& pair : occ.nuclei_pairs) {
      if (pair[0] == a && pair[1] == b && occ.dihedral[0] == a) return &occ;
      if (!either && ((pair[0] == a && pair[1] == b) || (pair[0] == b && pair[1] == a))) either = &occ;
    }
  return either;
}

}  // namespace vicinal::predict
