// Which Karplus set describes a coupling, and where its four pattern atoms are
// in a molecule. A set's pattern (SMARTS, atom maps 1-4) defines the dihedral;
// the coupled nuclei are either the pattern's end atoms (H-C-C-H, C-C-C-H) or
// atoms bonded to its central pair, named by the trade names in the set's
// `coupling` field (HN: the H on the central N; HA and CB: the H and C on the
// central sp3 carbon; C': a carbonyl end atom of the pattern).
#pragma once

#include <openbabel/mol.h>

#include <array>
#include <map>
#include <string>
#include <vector>

#include "karplus/karplus.h"

namespace vicinal::predict {

// One occurrence of a set's pattern and the coupled pairs it defines.
struct SetOccurrence {
  std::array<int, 4> dihedral{};                // 1-based, pattern map order
  std::vector<std::array<int, 2>> nuclei_pairs;  // (nucleus of set.nuclei[0], of set.nuclei[1])
};

class SetMatcher {
 public:
  explicit SetMatcher(const OpenBabel::OBMol& mol) : mol_(mol) {}
  // Every occurrence of the set's pattern (cached per pattern).
  const std::vector<SetOccurrence>& occurrences(const karplus::ParameterSet& set);
  // The occurrence whose nuclei pairs include {a, b} (either order), or nullptr.
  const SetOccurrence* occurrence_for(const karplus::ParameterSet& set, int a, int b);

 private:
  const OpenBabel::OBMol& mol_;
  std::map<std::string, std::vector<SetOccurrence>> cache_;  // by set id
};

// Non-hydrogen neighbours of the two carbons of an H-C-C-H path, other than each other.
int substituent_count(const OpenBabel::OBMol& mol, const std::array<int, 4>& hcch);

}  // namespace vicinal::predict
