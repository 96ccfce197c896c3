#include "structure/coupling_path.h"

#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/obiter.h>

#include <algorithm>
#include <deque>

#include "core/error.h"
#include "structure/atom_labels.h"

namespace vicinal::structure {

namespace {

void extend(OpenBabel::OBMol& mol, std::vector<int>& path, int target, int bonds, std::vector<CouplingPath>& out) {
  const int here = path.back();
  if (static_cast<int>(path.size()) - 1 == bonds) {
    if (here == target) out.push_back({path});
    return;
  }
  FOR_NBORS_OF_ATOM(nbr, mol.GetAtom(here)) {
    const int next = static_cast<int>(nbr->GetIdx());
    if (std::find(path.begin(), path.end(), next) != path.end()) continue;
    path.push_back(next);
    extend(mol, path, target, bonds, out);
    path.pop_back();
  }
}

void check_atom(const OpenBabel::OBMol& mol, int atom) {
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  if (atom < 1 || atom > static_cast<int>(m.NumAtoms()))
    throw Error(fmt::format("atom {} does not exist (the structure has atoms 1 to {})", atom, m.NumAtoms()));
}

}  // namespace

std::array<int, 4> CouplingPath::four() const {
  if (atoms.size() != 4) throw Error(fmt::format("a {}-bond path has no dihedral angle", bonds()));
  return {atoms[0], atoms[1], atoms[2], atoms[3]};
}

std::vector<CouplingPath> paths_of_length(const OpenBabel::OBMol& mol, int a, int b, int bonds) {
  check_atom(mol, a);
  check_atom(mol, b);
  std::vector<CouplingPath> out;
  std::vector<int> path{a};
  extend(const_cast<OpenBabel::OBMol&>(mol), path, b, bonds, out);
  return out;
}

int bond_distance(const OpenBabel::OBMol& mol, int a, int b) {
  check_atom(mol, a);
  check_atom(mol, b);
  auto& m = const_cast<OpenBabel::OBMol&>(mol);
  std::vector<int> dist(m.NumAtoms() + 1, -1);
  std::deque<int> queue{a};
  dist[a] = 0;
  while (!queue.empty()) {
    const int here = queue.front();
    queue.pop_front();
    if (here == b) return dist[here];
    FOR_NBORS_OF_ATOM(nbr, m.GetAtom(here)) {
      const int next = static_cast<int>(nbr->GetIdx());
      if (dist[next] < 0) {
        dist[next] = dist[here] + 1;
        queue.push_back(next);
      }
    }
  }
  return -1;
}

CouplingPath coupling_path(const OpenBabel::OBMol& mol, int a, int b, int bonds, const std::vector<std::string>& names) {
  const auto name = [&](int atom) {
    if (atom >= 1 && atom <= static_cast<int>(names.size()) && !names[atom - 1].empty()) return names[atom - 1];
    return atom_name(mol, atom);
  };
  Location where;
  where.atom = fmt::format("{},{}", name(a), name(b));
  if (a == b)
    throw Error(fmt::format("a coupling needs two different atoms, but both are {}", name(a)), where);
  auto paths = paths_of_length(mol, a, b, bonds);
  if (paths.empty()) {
    const int d = bond_distance(mol, a, b);
    throw Error(d < 0 ? fmt::format("{} and {} are not connected by bonds", name(a), name(b))
                      : fmt::format("{} and {} are {} bond{} apart (a {}J pair), not {} bonds", name(a), name(b), d,
                                    d == 1 ? "" : "s", d, bonds),
                where, bonds == 3 ? "a vicinal coupling joins atoms three bonds apart: H-C-C-H, H-N-C-H, ..." : "");
  }
  if (paths.size() > 1) {
    std::string list;
    for (const auto& p : paths) {
      std::string text;
      for (int atom : p.atoms) text += (text.empty() ? "" : "-") + name(atom);
      list += (list.empty() ? "" : "; ") + text;
    }
    throw Error(fmt::format("{} and {} are joined by {} different {}-bond paths ({}), so the coupling has no single "
                            "dihedral",
                            name(a), name(b), paths.size(), bonds, list),
                where, "small rings give several paths; such couplings cannot be predicted from one dihedral");
  }
  return paths.front();
}

}  // namespace vicinal::structure
