// The bonded path between two coupled nuclei: nJ is the number of bonds, and a
// vicinal (3J) coupling is measured on the four atoms of that path.
#pragma once

#include <openbabel/mol.h>

#include <array>
#include <vector>

namespace vicinal::structure {

struct CouplingPath {
  std::vector<int> atoms;  // 1-based, from the first nucleus to the second
  int bonds() const { return static_cast<int>(atoms.size()) - 1; }
  // The four atoms of a 3J path (vicinal::Error if bonds() != 3).
  std::array<int, 4> four() const;
};

// Every simple path of exactly `bonds` bonds from a to b (1-based atoms).
std::vector<CouplingPath> paths_of_length(const OpenBabel::OBMol& mol, int a, int b, int bonds);

// Fewest bonds between a and b; -1 when they are not connected.
int bond_distance(const OpenBabel::OBMol& mol, int a, int b);

// The unique path of `bonds` bonds between a and b. vicinal::Error, naming the
// atoms with `names` (e.g. their labels), when a == b, when no such path exists
// (saying how many bonds actually separate them), or when several exist (as in a
// four-membered ring; all of them are listed). `names` may be empty.
CouplingPath coupling_path(const OpenBabel::OBMol& mol, int a, int b, int bonds = 3,
                           const std::vector<std::string>& names = {});

}  // namespace vicinal::structure
