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

OpenBabel::vector3 pos(const OpenBabel::OBMol& mol, unsigned zero_based) {
  return const_cast<OpenBabel::OBMol&>(mol).GetAtom(static_cast<int>(zero_based) + 1)->GetVector();
}

// Orientation of a centre (0-based atoms): with four or more neighbours, the
// signed volume of the tetrahedron of the first four, which does not depend on
// where the centre sits or on distorted angles, and changes sign exactly with
// the parity of a permutation of those neighbours; with three, the signed
// volume they span around the centre (pyramidal N, P, S).
double handedness(const OpenBabel::OBMol& mol, unsigned c, const std::vector<unsigned>& n) {
  const auto o = n.size() >= 4 ? pos(mol, n[3]) : pos(mol, c);
  return OpenBabel::dot(pos(mol, n[0]) - o, OpenBabel::cross(pos(mol, n[1]) - o, pos(mol, n[2]) - o));
}

// Does the automorphism keep the 3D arrangement? Every non-planar centre must
// keep its handedness, or every one must invert (a mirror image: enantiotopic
// nuclei give the same couplings in an achiral solvent), and the cis/trans
// relation across every non-aromatic double bond must be kept. Planar or flat
// (2D) centres are not tested.
bool keeps_geometry(OpenBabel::OBMol& mol, const std::vector<unsigned>& p, bool has_3d) {
  int kept = 0, inverted = 0;
  if (has_3d) {
    FOR_ATOMS_OF_MOL(atom, mol) {
      std::vector<unsigned> n;
      FOR_NBORS_OF_ATOM(nb, &*atom) n.push_back(nb->GetIdx() - 1);
      if (n.size() < 3) continue;
      const unsigned c = atom->GetIdx() - 1;
      const double before = handedness(mol, c, n);
      // Below ~0.1 A^3 the centre is planar (sp2) and has no handedness.
      if (std::fabs(before) < 0.1) continue;
      std::vector<unsigned> mapped;
      for (unsigned x : n) mapped.push_back(p[x]);
      const double after = handedness(mol, p[c], mapped);
      ((before > 0) == (after > 0) ? kept : inverted) += 1;
    }
  }
  if (kept > 0 && inverted > 0) return false;
  FOR_BONDS_OF_MOL(bond, mol) {
    if (bond->GetBondOrder() != 2 || bond->IsAromatic()) continue;
    const unsigned u = bond->GetBeginAtomIdx() - 1, v = bond->GetEndAtomIdx() - 1;
    FOR_NBORS_OF_ATOM(x, bond->GetBeginAtom()) {
      if (x->GetIdx() - 1 == v) continue;
      FOR_NBORS_OF_ATOM(y, bond->GetEndAtom()) {
        if (y->GetIdx() - 1 == u) continue;
        const unsigned xi = x->GetIdx() - 1, yi = y->GetIdx() - 1;
        const double before = OpenBabel::dot(pos(mol, xi) - pos(mol, u), pos(mol, yi) - pos(mol, v));
        const double after = OpenBabel::dot(pos(mol, p[xi]) - pos(mol, p[u]), pos(mol, p[yi]) - pos(mol, p[v]));
        if (std::fabs(before) > 1e-3 && (before > 0) != (after > 0)) return false;
      }
    }
  }
  return true;
}

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
  const bool depth = has_depth(mol_);
  for (const auto& map : maps) {
    std::vector<unsigned> permutation(n);
    for (unsigned i = 0; i < n; ++i) permutation[i] = i;
    for (const auto& [from, to] : map) permutation[from] = to;
    keeps_geometry_.push_back(keeps_geometry(mol_, permutation, depth));
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
