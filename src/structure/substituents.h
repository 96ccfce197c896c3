// Substituents of an H-C-C-H fragment as the generalized Karplus equation of
// Haasnoot, de Leeuw and Altona (Tetrahedron 36, 2783, 1980) needs them: each
// non-hydrogen substituent on the two carbons, its electronegativity
// difference from hydrogen (Huggins scale, db/electronegativity.json) with the
// beta-substituent correction, and its orientation sign from the geometry.
#pragma once

#include <openbabel/mol.h>

#include <array>
#include <map>
#include <span>
#include <string>
#include <vector>

#include "karplus/karplus.h"

namespace vicinal::structure {

// Huggins electronegativities from db/electronegativity.json (or another file).
class Electronegativity {
 public:
  static const Electronegativity& shipped();
  static Electronegativity load(const std::string& path);
  // vicinal::Error naming the element and the file when it has no value.
  double chi(const std::string& element) const;
  double delta_from_hydrogen(const std::string& element) const { return chi(element) - chi("H"); }
  const std::string& citation() const { return citation_; }

 private:
  std::map<std::string, double> chi_;
  std::string citation_;
  std::string file_;
};

struct SubstituentDetail {
  int atom = 0;               // 1-based substituent atom
  int carbon = 0;             // the path carbon it is attached to
  std::string element;
  double delta_chi_alpha = 0; // chi(substituent) - chi(H)
  double sum_delta_chi_beta = 0;  // over the substituent's own non-H neighbours (not the carbon)
  double delta_chi = 0;       // delta_chi_alpha - P7 * sum_delta_chi_beta
  int orientation = 1;        // xi, +1 or -1
};

// Substituents of the H-C-C-H path `hcch` (1-based atoms H1, C1, C2, H2),
// `p7` the set's beta-substituent factor. Orientation from `xyz` (frame
// coordinates, 0-based atom-major x,y,z) or, when empty, the molecule's own.
// vicinal::Error when the path is not H-C-C-H.
std::vector<SubstituentDetail> haasnoot_substituents(const OpenBabel::OBMol& mol,
                                                     const std::array<int, 4>& hcch, double p7,
                                                     std::span<const double> xyz = {});

std::vector<karplus::Substituent> as_karplus(const std::vector<SubstituentDetail>& details);

}  // namespace vicinal::structure
