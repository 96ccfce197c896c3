#include "library/identity.h"

#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/bond.h>
#include <openbabel/canon.h>
#include <openbabel/graphsym.h>
#include <openbabel/isomorphism.h>
#include <openbabel/obconversion.h>
#include <openbabel/obiter.h>
#include <openbabel/stereo/stereo.h>

#include <algorithm>
#include <cmath>
#include <cstdint>
#include <set>

#include "core/error.h"
#include "structure/openbabel_log.h"

namespace vicinal::library {

namespace {

// Above this many bytes of automorphism maps (many equivalent methyl groups)
// the enumeration stops and pair keys use symmetry classes instead.
constexpr std::size_t kAutomorphismMemory = 4'000'000;
// Elements that mark the two nuclei of a pair (livermorium, tennessine: never
// in a molecule that has couplings measured). Isotopes would not do: Open
// Babel's symmetry classes, and so its stereo perception, ignore isotopes.
constexpr unsigned kMarkA = 116, kMarkB = 117;

std::string write_as(OpenBabel::OBMol& mol, const char* format, const char* options = nullptr) {
  OpenBabel::OBConversion conv;
  if (!conv.SetOutFormat(format)) throw Error(fmt::format("Open Babel lacks the '{}' format", format));
  if (options) conv.AddOption(options, OpenBabel::OBConversion::OUTOPTIONS);
  std::string out = conv.WriteString(&mol, true);
  while (!out.empty() && (out.back() == '\n' || out.back() == '\r' || out.back() == ' ')) out.pop_back();
  return out;
}

std::string join(const std::vector<unsigned>& values) {
  std::string out;
  for (unsigned v : values) out += (out.empty() ? "" : "|") + std::to_string(v);
  return out;
}

// Coordinates of every atom, 0-based, three per atom: the geometry test below
// runs once per automorphism (thousands for a long chain), and reading
// positions through OBMol there cost more than the arithmetic.
std::vector<double> coordinates(const OpenBabel::OBMol& mol) {
  std::vector<double> xyz;
  FOR_ATOMS_OF_MOL(atom, const_cast<OpenBabel::OBMol&>(mol)) {
    xyz.push_back(atom->GetX());
    xyz.push_back(atom->GetY());
    xyz.push_back(atom->GetZ());
  }
  return xyz;
}

// Orientation of a centre (0-based atoms): with four or more neighbours, the
// signed volume of the tetrahedron of the first four, which does not depend on
// where the centre sits or on distorted angles, and changes sign exactly with
// the parity of a permutation of those neighbours; with three, the signed
// volume they span around the centre (pyramidal N, P, S).
// (The same arithmetic, in the same order, as OpenBabel::dot and cross.)
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

}  // namespace

// What an automorphism must keep to keep the 3D arrangement, measured once on
// the input geometry: every non-planar centre keeps its handedness, or every
// one inverts (a mirror image: enantiotopic nuclei give the same couplings in
// an achiral solvent), and the cis/trans relation across every non-aromatic
// double bond is kept. Planar or flat (2D) centres are not tested.
struct CompoundIdentity::GeometryTest {
  struct Centre {
    unsigned atom;
    std::vector<unsigned> neighbours;
    bool positive;  // sign of the handedness in the input
  };
  struct DoubleBond {
    unsigned u, v, x, y;  // x on u, y on v
    bool positive;        // sign of (x - u).(y - v) in the input
  };
  std::vector<double> xyz;
  std::vector<Centre> centres;
  std::vector<DoubleBond> bonds;

  GeometryTest(OpenBabel::OBMol& mol, bool has_3d) : xyz(coordinates(mol)) {
    if (has_3d) {
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

  bool keeps(const std::vector<unsigned>& p) const {
    int kept = 0, inverted = 0;
    for (const auto& centre : centres) {
      bool fixed = p[centre.atom] == centre.atom;
      for (unsigned x : centre.neighbours) fixed = fixed && p[x] == x;
      // A centre the permutation leaves in place keeps its sign by construction.
      const bool positive = fixed ? centre.positive : orientation(centre.atom, centre.neighbours, &p) > 0;
      (positive == centre.positive ? kept : inverted) += 1;
      if (kept > 0 && inverted > 0) return false;
    }
    for (const auto& b : bonds)
      if ((dot_of_bonds(xyz, p[b.x], p[b.u], p[b.y], p[b.v]) > 0) != b.positive) return false;
    return true;
  }
};

namespace {

// A SMILES with every tetrahedral mark inverted ('@' <-> '@@'): its mirror image.
std::string mirrored(const std::string& smiles) {
  std::string out;
  for (std::size_t i = 0; i < smiles.size(); ++i) {
    if (smiles[i] != '@') { out += smiles[i]; continue; }
    if (i + 1 < smiles.size() && smiles[i + 1] == '@') { out += '@'; ++i; }
    else out += "@@";
  }
  return out;
}

bool has_depth(const OpenBabel::OBMol& mol) {
  FOR_ATOMS_OF_MOL(atom, const_cast<OpenBabel::OBMol&>(mol))
    if (std::fabs(atom->GetZ()) > 1e-4) return true;
  return false;
}

}  // namespace

std::string inchi_of(const OpenBabel::OBMol& mol) {
  structure::LogCapture quiet;
  OpenBabel::OBMol copy(mol);
  return write_as(copy, "inchi");
}

std::string inchikey_of(const OpenBabel::OBMol& mol) {
  structure::LogCapture quiet;
  OpenBabel::OBMol copy(mol);
  return write_as(copy, "inchikey");
}

CompoundIdentity::CompoundIdentity(const OpenBabel::OBMol& mol, const std::string& source)
    : mol_(mol), source_(source) {
  structure::LogCapture quiet;
  inchi_ = write_as(mol_, "inchi");
  inchikey_ = write_as(mol_, "inchikey");
  if (inchi_.rfind("InChI=", 0) != 0 || inchikey_.size() != 27) {
    const auto errors = quiet.errors();
    throw Error(fmt::format("Open Babel could not compute an InChI{}", errors.empty() ? "" : ": " + errors.front()),
                {source}, "check the structure (valences, charges)");
  }
  smiles_ = write_as(mol_, "can", "n");

  const unsigned n = mol_.NumAtoms();
  OpenBabel::OBGraphSym symmetry(&mol_);
  symmetry.GetSymmetry(symmetry_class_);
  OpenBabel::CanonicalLabels(&mol_, symmetry_class_, canonical_rank_);
  if (canonical_rank_.size() != n || symmetry_class_.size() != n)
    throw Error("Open Babel could not rank the atoms canonically", {source});

  OpenBabel::OBIsomorphismMapper::Mappings maps;
  automorphisms_complete_ =
      OpenBabel::FindAutomorphisms(&mol_, maps, symmetry_class_, OpenBabel::OBBitVec(), kAutomorphismMemory);
  if (!automorphisms_complete_) return;
  const GeometryTest geometry(mol_, has_depth(mol_));
  automorphisms_.reserve(maps.size());
  for (const auto& map : maps) {
    std::vector<unsigned> permutation(n);
    for (unsigned i = 0; i < n; ++i) permutation[i] = i;
    for (const auto& [from, to] : map) permutation[from] = to;
    keeps_geometry_.push_back(geometry.keeps(permutation));
    automorphisms_.push_back(std::move(permutation));
  }
}

std::string CompoundIdentity::ranks_text(const std::vector<int>& atoms) const {
  std::vector<unsigned> ranks;
  for (int a : atoms) ranks.push_back(rank(a));
  std::sort(ranks.begin(), ranks.end());
  return join(ranks);
}

std::pair<CompoundIdentity::Side, CompoundIdentity::Side> CompoundIdentity::image(
    const std::vector<int>& a, const std::vector<int>& b, const std::vector<unsigned>* permutation) const {
  const auto& value = automorphisms_complete_ ? canonical_rank_ : symmetry_class_;
  auto side = [&](const std::vector<int>& atoms) {
    Side out;
    for (int atom : atoms) {
      unsigned p = static_cast<unsigned>(atom - 1);
      out.push_back(value.at(permutation ? (*permutation)[p] : p));
    }
    std::sort(out.begin(), out.end());
    return out;
  };
  Side x = side(a), y = side(b);
  if (y < x) std::swap(x, y);
  return {std::move(x), std::move(y)};
}

std::string CompoundIdentity::marked_smiles(const std::vector<int>& a, const std::vector<int>& b) const {
  structure::LogCapture quiet;
  auto with_marks = [&](unsigned mark_a, unsigned mark_b) {
    OpenBabel::OBMol copy(mol_);
    for (int atom : a) copy.GetAtom(atom)->SetAtomicNum(mark_a);
    for (int atom : b) copy.GetAtom(atom)->SetAtomicNum(mark_b);
    copy.DeleteData(OpenBabel::OBGenericDataType::StereoData);
    OpenBabel::PerceiveStereo(&copy, true);
    const std::string smiles = write_as(copy, "can", "n");
    return std::min(smiles, mirrored(smiles));
  };
  return std::min(with_marks(kMarkA, kMarkB), with_marks(kMarkB, kMarkA));
}

std::string CompoundIdentity::coupling_key(const std::vector<int>& a, const std::vector<int>& b) {
  auto cache_key = std::make_pair(a, b);
  if (auto it = cache_.find(cache_key); it != cache_.end()) return it->second;
  for (int atom : a) if (atom < 1 || atom > atom_count()) throw Error(fmt::format("atom {} is not in the structure", atom), {source_});
  for (int atom : b) if (atom < 1 || atom > atom_count()) throw Error(fmt::format("atom {} is not in the structure", atom), {source_});

  std::string key;
  if (!automorphisms_complete_) {
    const auto [x, y] = image(a, b, nullptr);
    key = "s:" + join(x) + "~" + join(y) + "/" + marked_smiles(a, b);
  } else if (a.size() == 1 && b.size() == 1) {
    // The usual case, one nucleus a side: each image is two ranks packed in
    // one integer (smaller first), so the orbit over thousands of
    // automorphisms needs no allocation per image. Same key as below.
    const auto& rank = canonical_rank_;
    const unsigned pa = static_cast<unsigned>(a[0] - 1), pb = static_cast<unsigned>(b[0] - 1);
    auto packed = [&](unsigned x, unsigned y) {
      return x <= y ? (std::uint64_t{x} << 32) | y : (std::uint64_t{y} << 32) | x;
    };
    std::vector<std::uint64_t> orbit, kept_orbit;
    orbit.reserve(automorphisms_.size());
    for (std::size_t i = 0; i < automorphisms_.size(); ++i) {
      const auto& p = automorphisms_[i];
      const std::uint64_t image = packed(rank.at(p[pa]), rank.at(p[pb]));
      orbit.push_back(image);
      if (keeps_geometry_[i]) kept_orbit.push_back(image);
    }
    if (orbit.empty()) orbit.push_back(packed(rank.at(pa), rank.at(pb)));
    for (auto* v : {&orbit, &kept_orbit}) {
      std::sort(v->begin(), v->end());
      v->erase(std::unique(v->begin(), v->end()), v->end());
    }
    key = std::to_string(orbit.front() >> 32) + "~" + std::to_string(orbit.front() & 0xffffffffu);
    if (kept_orbit.size() != orbit.size()) key += "/" + marked_smiles(a, b);
  } else {
    std::set<std::pair<Side, Side>> orbit, kept_orbit;
    for (std::size_t i = 0; i < automorphisms_.size(); ++i) {
      auto pair = image(a, b, &automorphisms_[i]);
      if (keeps_geometry_[i]) kept_orbit.insert(pair);
      orbit.insert(std::move(pair));
    }
    if (orbit.empty()) orbit.insert(image(a, b, nullptr));
    const auto& [x, y] = *orbit.begin();
    key = join(x) + "~" + join(y);
    // Geometry splits the orbit: the pair is one of several stereo-distinct ones.
    if (kept_orbit.size() != orbit.size()) key += "/" + marked_smiles(a, b);
  }
  cache_.emplace(std::move(cache_key), key);
  return key;
}

}  // namespace vicinal::library
