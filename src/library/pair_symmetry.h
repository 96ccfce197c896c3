// Which pairs of atoms a molecule's graph symmetry maps onto each other, and
// whether keeping the 3D arrangement splits that set.
//
// Listing every automorphism of a molecule with hydrogens is hopeless for
// chains: each CH2 swaps its two protons, so a C20 chain has 2^20 of them.
// The group is instead taken apart: automorphisms of the skeleton (every atom
// that is not a leaf; usually a handful), times free permutations of the
// leaves that hang on one atom and look alike (the protons of a CH2 or CH3,
// the fluorines of a CF3). An orbit is then walked over the skeleton maps and
// the placements of only the leaves the pair contains; whether the 3D
// arrangement can be kept for a placement is decided atom by atom, since a
// leaf swap changes only its own atom's handedness (or the cis/trans relation
// across its atom's double bond).
//
// What keeps the 3D arrangement: every non-planar centre keeps its handedness,
// or every one inverts (a mirror image: enantiotopic nuclei give the same
// couplings in an achiral solvent), and the cis/trans relation across every
// non-aromatic double bond is kept. Flat (2D) structures carry no handedness,
// so there only cis/trans is told apart.
#pragma once

#include <openbabel/mol.h>

#include <memory>
#include <utility>
#include <vector>

namespace vicinal::library {

class PairSymmetry {
 public:
  using Side = std::vector<unsigned>;  // canonical ranks, ascending
  using Pair = std::pair<Side, Side>;  // first <= second

  // `symmetry_class` and `canonical_rank` are Open Babel's, by 0-based atom.
  PairSymmetry(OpenBabel::OBMol& mol, const std::vector<unsigned>& symmetry_class,
               const std::vector<unsigned>& canonical_rank);
  ~PairSymmetry();

  // False when the skeleton has too many automorphisms to list (a cage such
  // as a fullerene with many equivalent groups); orbit() is then unavailable.
  bool complete() const { return complete_; }

  struct Orbit {
    Pair smallest;           // the orbit's smallest image: the pair's name up to symmetry
    bool split_by_geometry;  // some images are reached only by changing the 3D arrangement
    Pair smallest_kept;      // the smallest image reached keeping it: names the pair up to 3D symmetry
  };
  // Whether some automorphism turns the 3D arrangement into its mirror image
  // (the molecule is achiral, or has enantiotopic groups). Without one, no
  // pair is the mirror image of another. True when not complete().
  bool has_mirror() const { return has_mirror_; }

  // The orbit of the pair of atom sets `a`, `b` (0-based atoms).
  Orbit orbit(const std::vector<unsigned>& a, const std::vector<unsigned>& b) const;

 private:
  struct Geometry;
  struct LeafGroup {
    unsigned parent;
    std::vector<unsigned> atoms;  // ascending
  };
  // One automorphism of the skeleton, extended to the leaves in a fixed way;
  // leaves of its fragment may then be permuted within their target groups.
  struct SkeletonMap {
    std::vector<unsigned> permutation;
    std::vector<int> target_group;  // by group; -1 outside the map's fragment
  };
  // Centres and double bonds whose test depends on the leaves of the same
  // atoms (linked through double bonds); tested together, apart from others.
  struct Component {
    std::vector<unsigned> units;  // atoms whose leaf groups are permuted
    std::vector<std::size_t> centres, bonds;
  };

  Pair image(const std::vector<unsigned>& a, const std::vector<unsigned>& b, const std::vector<unsigned>& p) const;
  // Whether the unpinned leaves can be placed so that every centre holds (or,
  // if `inverted`, inverts) and every double bond keeps cis/trans.
  bool holds(const SkeletonMap& map, std::vector<unsigned>& p, const std::vector<bool>& pinned, bool inverted) const;
  bool keeps_geometry(const SkeletonMap& map, std::vector<unsigned>& p, const std::vector<bool>& pinned) const;
  bool satisfiable(const Component& component, const SkeletonMap& map, std::vector<unsigned>& p,
                   const std::vector<bool>& pinned, bool inverted) const;
  bool component_holds(const Component& component, const std::vector<unsigned>& p, bool inverted) const;

  std::vector<unsigned> rank_;
  std::unique_ptr<Geometry> geometry_;
  std::vector<LeafGroup> groups_;
  std::vector<int> group_of_;                       // by atom; -1 for skeleton atoms
  std::vector<std::vector<std::size_t>> groups_at_;  // by atom: groups of leaves on it
  std::vector<SkeletonMap> maps_;
  std::vector<Component> components_;
  std::vector<std::size_t> fixed_centres_, fixed_bonds_;  // depend on no leaf permutation
  bool complete_ = true;
  bool has_mirror_ = true;  // assumed when the listing is incomplete
};

}  // namespace vicinal::library
