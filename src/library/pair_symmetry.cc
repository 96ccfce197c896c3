#include "library/pair_symmetry.h"

#include <openbabel/atom.h>
#include <openbabel/bond.h>
#include <openbabel/isomorphism.h>
#include <openbabel/obiter.h>

#include <algorithm>
#include <cmath>
#include <functional>
#include <map>
#include <numeric>
#include <set>
#include <tuple>

namespace vicinal::library {

namespace {

// Above this many skeleton automorphisms (a cage with many equivalent groups)
// the listing stops and the pair keys use symmetry classes instead.
constexpr std::size_t kMaxSkeletonMaps = 20'000;

// Orientation of a centre (0-based atoms): with four or more neighbours, the
// signed volume of the tetrahedron of the first four, which does not depend on
// where the centre sits or on distorted angles, and changes sign exactly with
// the parity of a permutation of those neighbours; with three, the signed
// volume they span around the centre (pyramidal N, P, S).
double handedness(const std::vector<double>& xyz, unsigned n0, unsigned n1, unsigned n2, unsigned o) {
  auto d = [&](unsigned a, int k) { return xyz[3 * a + k] - xyz[3 * o + k]; };
  const double ax = d(n0, 0), ay = d(n0, 1), az = d(n0, 2);
  const double bx = d(n1, 0), by = d(n1, 1), bz = d(n1, 2);
  const double cx = d(n2, 0), cy = d(n2, 1), cz = d(n2, 2);
  return ax * (by * cz - bz * cy) + ay * (bz * cx - bx * cz) + az * (bx * cy - by * cx);
}

double dot_of_bonds(const std::vector<double>& xyz, unsigned x, unsigned u, unsigned y, unsigned v) {
  double sum = 0;
  for (int k = 0; k < 3; ++k) sum += (xyz[3 * x + k] - xyz[3 * u + k]) * (xyz[3 * y + k] - xyz[3 * v + k]);
  return sum;
}

bool has_depth(OpenBabel::OBMol& mol) {
  FOR_ATOMS_OF_MOL(atom, mol)
    if (std::fabs(atom->GetZ()) > 1e-4) return true;
  return false;
}

// Collects skeleton automorphisms as permutations, stopping past the limit.
class CollectMaps : public OpenBabel::OBIsomorphismMapper::Functor {
 public:
  explicit CollectMaps(unsigned atoms) : atoms_(atoms) {}
  bool operator()(OpenBabel::OBIsomorphismMapper::Mapping& map) override {
    if (maps.size() >= kMaxSkeletonMaps) {
      overflow = true;
      return true;
    }
    std::vector<unsigned> p(atoms_);
    std::iota(p.begin(), p.end(), 0u);
    std::vector<bool> domain(atoms_, false);
    for (const auto& [from, to] : map) {
      p[from] = to;
      domain[from] = true;
    }
    maps.push_back(std::move(p));
    domains.push_back(std::move(domain));
    return false;
  }
  std::vector<std::vector<unsigned>> maps;
  std::vector<std::vector<bool>> domains;  // the skeleton atoms each map covers: one fragment
  bool overflow = false;

 private:
  unsigned atoms_;
};

// Disjoint-set forest over atoms, to group centres and double bonds that share
// permuted leaves.
struct Forest {
  std::vector<unsigned> up;
  explicit Forest(unsigned n) : up(n) { std::iota(up.begin(), up.end(), 0u); }
  unsigned root(unsigned x) { return up[x] == x ? x : up[x] = root(up[x]); }
  void join(unsigned x, unsigned y) { up[root(x)] = root(y); }
};

}  // namespace

// The 3D arrangement of the input, measured once: non-planar centres with the
// sign of their handedness, and bonded pairs across double bonds with the sign
// of their cis/trans relation. Planar or flat (2D) centres are not tested.
struct PairSymmetry::Geometry {
  struct Centre {
    unsigned atom;
    std::vector<unsigned> neighbours;
    bool positive;
  };
  struct DoubleBond {
    unsigned u, v, x, y;  // x on u, y on v
    bool positive;        // sign of (x - u).(y - v) in the input
  };
  std::vector<double> xyz;
  std::vector<Centre> centres;
  std::vector<DoubleBond> bonds;

  explicit Geometry(OpenBabel::OBMol& mol) {
    FOR_ATOMS_OF_MOL(atom, mol) {
      xyz.push_back(atom->GetX());
      xyz.push_back(atom->GetY());
      xyz.push_back(atom->GetZ());
    }
    if (has_depth(mol)) {
      FOR_ATOMS_OF_MOL(atom, mol) {
        std::vector<unsigned> n;
        FOR_NBORS_OF_ATOM(nb, &*atom) n.push_back(nb->GetIdx() - 1);
        if (n.size() < 3) continue;
        const unsigned c = atom->GetIdx() - 1;
        const double before = orientation(c, n, nullptr);
        // Below ~0.1 A^3 the centre is planar (sp2) and has no handedness.
        if (std::fabs(before) < 0.1) continue;
        centres.push_back({c, std::move(n), before > 0});
      }
    }
    FOR_BONDS_OF_MOL(bond, mol) {
      if (bond->GetBondOrder() != 2 || bond->IsAromatic()) continue;
      const unsigned u = bond->GetBeginAtomIdx() - 1, v = bond->GetEndAtomIdx() - 1;
      FOR_NBORS_OF_ATOM(x, bond->GetBeginAtom()) {
        if (x->GetIdx() - 1 == v) continue;
        FOR_NBORS_OF_ATOM(y, bond->GetEndAtom()) {
          if (y->GetIdx() - 1 == u) continue;
          const unsigned xi = x->GetIdx() - 1, yi = y->GetIdx() - 1;
          const double before = dot_of_bonds(xyz, xi, u, yi, v);
          if (std::fabs(before) > 1e-3) bonds.push_back({u, v, xi, yi, before > 0});
        }
      }
    }
  }

  // Handedness of centre c with neighbours n, each mapped through p (if given).
  double orientation(unsigned c, const std::vector<unsigned>& n, const std::vector<unsigned>* p) const {
    auto m = [&](unsigned a) { return p ? (*p)[a] : a; };
    const unsigned o = n.size() >= 4 ? m(n[3]) : m(c);
    return handedness(xyz, m(n[0]), m(n[1]), m(n[2]), o);
  }
  // Whether centre i under p has the handedness it had (or, if `inverted`, the opposite).
  bool centre_holds(std::size_t i, const std::vector<unsigned>& p, bool inverted) const {
    const Centre& c = centres[i];
    return ((orientation(c.atom, c.neighbours, &p) > 0) == c.positive) != inverted;
  }
  bool bond_holds(std::size_t i, const std::vector<unsigned>& p) const {
    const DoubleBond& b = bonds[i];
    return (dot_of_bonds(xyz, p[b.x], p[b.u], p[b.y], p[b.v]) > 0) == b.positive;
  }
};

PairSymmetry::~PairSymmetry() = default;

PairSymmetry::PairSymmetry(OpenBabel::OBMol& mol, const std::vector<unsigned>& symmetry_class,
                           const std::vector<unsigned>& canonical_rank)
    : rank_(canonical_rank), geometry_(std::make_unique<Geometry>(mol)) {
  const unsigned n = mol.NumAtoms();
  group_of_.assign(n, -1);
  groups_at_.resize(n);

  // Leaves: atoms with one bond, to an atom with more. Those on one atom with
  // the same symmetry class and bond order are interchangeable.
  std::map<std::tuple<unsigned, unsigned, unsigned>, std::size_t> group_by_kind;
  OpenBabel::OBBitVec skeleton;
  FOR_ATOMS_OF_MOL(atom, mol) {
    const unsigned i = atom->GetIdx() - 1;
    OpenBabel::OBBond* only = atom->GetExplicitDegree() == 1 ? &*OpenBabel::OBAtomBondIter(&*atom) : nullptr;
    if (!only || only->GetNbrAtom(&*atom)->GetExplicitDegree() < 2) {
      skeleton.SetBitOn(i + 1);
      continue;
    }
    const unsigned parent = only->GetNbrAtom(&*atom)->GetIdx() - 1;
    const auto kind = std::make_tuple(parent, symmetry_class.at(i), only->GetBondOrder());
    auto [it, added] = group_by_kind.emplace(kind, groups_.size());
    if (added) {
      groups_.push_back({parent, {}});
      groups_at_[parent].push_back(it->second);
    }
    groups_[it->second].atoms.push_back(i);
    group_of_[i] = static_cast<int>(it->second);
  }

  CollectMaps collect(n);
  OpenBabel::FindAutomorphisms(collect, &mol, symmetry_class, skeleton);
  if (collect.overflow || collect.maps.empty()) {
    complete_ = false;
    return;
  }
  // Each skeleton map moves one connected fragment; its leaves follow their
  // atoms, the i-th leaf of a group to the i-th of the matching group.
  for (std::size_t m = 0; m < collect.maps.size(); ++m) {
    SkeletonMap map{std::move(collect.maps[m]), std::vector<int>(groups_.size(), -1)};
    for (std::size_t g = 0; g < groups_.size(); ++g) {
      const unsigned parent = groups_[g].parent, target_parent = map.permutation[parent];
      if (!collect.domains[m][parent]) continue;  // another fragment: its leaves stay
      const unsigned leaf = groups_[g].atoms.front();
      const auto kind = std::make_tuple(target_parent, symmetry_class[leaf],
                                        mol.GetBond(mol.GetAtom(leaf + 1), mol.GetAtom(parent + 1))->GetBondOrder());
      const auto it = group_by_kind.find(kind);
      if (it == group_by_kind.end() || groups_[it->second].atoms.size() != groups_[g].atoms.size()) {
        complete_ = false;  // symmetry classes that a leaf count contradicts: do not trust the listing
        return;
      }
      map.target_group[g] = static_cast<int>(it->second);
      for (std::size_t k = 0; k < groups_[g].atoms.size(); ++k)
        map.permutation[groups_[g].atoms[k]] = groups_[it->second].atoms[k];
    }
    maps_.push_back(std::move(map));
  }

  // Centres and double bonds, grouped by the atoms whose leaves they watch.
  auto is_unit = [&](unsigned atom) {
    return std::any_of(groups_at_[atom].begin(), groups_at_[atom].end(),
                       [&](std::size_t g) { return groups_[g].atoms.size() >= 2; });
  };
  Forest forest(n);
  for (const auto& b : geometry_->bonds)
    if (is_unit(b.u) && is_unit(b.v)) forest.join(b.u, b.v);
  std::map<unsigned, std::size_t> component_of_root;
  auto component_for = [&](unsigned atom) -> Component& {
    auto [it, added] = component_of_root.emplace(forest.root(atom), components_.size());
    if (added) components_.emplace_back();
    Component& c = components_[it->second];
    if (std::find(c.units.begin(), c.units.end(), atom) == c.units.end()) c.units.push_back(atom);
    return c;
  };
  for (std::size_t i = 0; i < geometry_->centres.size(); ++i) {
    const unsigned atom = geometry_->centres[i].atom;
    if (is_unit(atom)) component_for(atom).centres.push_back(i);
    else fixed_centres_.push_back(i);
  }
  for (std::size_t i = 0; i < geometry_->bonds.size(); ++i) {
    const auto& b = geometry_->bonds[i];
    if (!is_unit(b.u) && !is_unit(b.v)) {
      fixed_bonds_.push_back(i);
      continue;
    }
    // u and v, when both are units, were joined above: one component, which
    // the second call finds (so the first call's component is not moved).
    Component* component = nullptr;
    for (unsigned end : {b.u, b.v})
      if (is_unit(end)) component = &component_for(end);
    component->bonds.push_back(i);
  }
  // A mirror symmetry: some automorphism inverts every centre and keeps
  // every double bond.
  const std::vector<bool> none(n, false);
  has_mirror_ = std::any_of(maps_.begin(), maps_.end(), [&](const SkeletonMap& map) {
    std::vector<unsigned> p = map.permutation;
    return holds(map, p, none, true);
  });
}

PairSymmetry::Pair PairSymmetry::image(const std::vector<unsigned>& a, const std::vector<unsigned>& b,
                                       const std::vector<unsigned>& p) const {
  auto side = [&](const std::vector<unsigned>& atoms) {
    Side out;
    for (unsigned atom : atoms) out.push_back(rank_[p[atom]]);
    std::sort(out.begin(), out.end());
    return out;
  };
  Side x = side(a), y = side(b);
  if (y < x) std::swap(x, y);
  return {std::move(x), std::move(y)};
}

bool PairSymmetry::component_holds(const Component& component, const std::vector<unsigned>& p, bool inverted) const {
  for (std::size_t i : component.centres)
    if (!geometry_->centre_holds(i, p, inverted)) return false;
  for (std::size_t i : component.bonds)
    if (!geometry_->bond_holds(i, p)) return false;
  return true;
}

// Whether some placement of the component's unpinned leaves (within their
// target groups) makes all its centres hold (or all invert) and its double
// bonds keep cis/trans. Tries placements group by group; groups are small.
bool PairSymmetry::satisfiable(const Component& component, const SkeletonMap& map, std::vector<unsigned>& p,
                               const std::vector<bool>& pinned, bool inverted) const {
  std::vector<std::size_t> free_groups;
  for (unsigned unit : component.units)
    for (std::size_t g : groups_at_[unit])
      if (groups_[g].atoms.size() >= 2 && map.target_group[g] >= 0) free_groups.push_back(g);

  std::function<bool(std::size_t)> place = [&](std::size_t k) -> bool {
    if (k == free_groups.size()) return component_holds(component, p, inverted);
    const auto& sources = groups_[free_groups[k]].atoms;
    const auto& slots = groups_[static_cast<std::size_t>(map.target_group[free_groups[k]])].atoms;
    std::vector<unsigned> movable, open;
    for (unsigned s : sources)
      if (!pinned[s]) movable.push_back(s);
    for (unsigned t : slots)
      if (std::none_of(sources.begin(), sources.end(), [&](unsigned s) { return pinned[s] && p[s] == t; }))
        open.push_back(t);
    const std::vector<unsigned> saved = [&] {
      std::vector<unsigned> v;
      for (unsigned s : movable) v.push_back(p[s]);
      return v;
    }();
    bool found = false;
    do {
      for (std::size_t i = 0; i < movable.size(); ++i) p[movable[i]] = open[i];
      found = place(k + 1);
    } while (!found && std::next_permutation(open.begin(), open.end()));
    for (std::size_t i = 0; i < movable.size(); ++i) p[movable[i]] = saved[i];
    return found;
  };
  return place(0);
}

bool PairSymmetry::holds(const SkeletonMap& map, std::vector<unsigned>& p, const std::vector<bool>& pinned,
                         bool inverted) const {
  for (std::size_t i : fixed_centres_)
    if (!geometry_->centre_holds(i, p, inverted)) return false;
  for (std::size_t i : fixed_bonds_)
    if (!geometry_->bond_holds(i, p)) return false;
  for (const auto& component : components_)
    if (!satisfiable(component, map, p, pinned, inverted)) return false;
  return true;
}

bool PairSymmetry::keeps_geometry(const SkeletonMap& map, std::vector<unsigned>& p,
                                  const std::vector<bool>& pinned) const {
  return holds(map, p, pinned, false) || holds(map, p, pinned, true);
}

PairSymmetry::Orbit PairSymmetry::orbit(const std::vector<unsigned>& a, const std::vector<unsigned>& b) const {
  std::vector<unsigned> involved(a);
  involved.insert(involved.end(), b.begin(), b.end());
  std::sort(involved.begin(), involved.end());
  involved.erase(std::unique(involved.begin(), involved.end()), involved.end());

  std::set<Pair> all, kept;
  std::vector<bool> pinned(rank_.size(), false);
  for (const auto& map : maps_) {
    std::vector<unsigned> p = map.permutation;
    // Leaves of the pair that this map may place anywhere in their target group.
    std::vector<unsigned> placed;
    for (unsigned atom : involved) {
      const int g = group_of_[atom];
      if (g >= 0 && map.target_group[static_cast<std::size_t>(g)] >= 0) placed.push_back(atom);
      pinned[atom] = true;
    }
    std::vector<unsigned> used;
    std::function<void(std::size_t)> place = [&](std::size_t k) {
      if (k == placed.size()) {
        Pair pair = image(a, b, p);
        if (!kept.count(pair) && keeps_geometry(map, p, pinned)) kept.insert(pair);
        all.insert(std::move(pair));
        return;
      }
      const unsigned atom = placed[k];
      const auto& slots = groups_[static_cast<std::size_t>(map.target_group[static_cast<std::size_t>(group_of_[atom])])].atoms;
      const unsigned before = p[atom];
      for (unsigned slot : slots) {
        if (std::find(used.begin(), used.end(), slot) != used.end()) continue;
        p[atom] = slot;
        used.push_back(slot);
        place(k + 1);
        used.pop_back();
      }
      p[atom] = before;
    };
    place(0);
    for (unsigned atom : involved) pinned[atom] = false;
  }
  // The identity keeps the arrangement, so `kept` is never empty.
  return {*all.begin(), kept.size() != all.size(), kept.empty() ? *all.begin() : *kept.begin()};
}

}  // namespace vicinal::library
