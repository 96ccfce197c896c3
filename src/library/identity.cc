#include "library/identity.h"

#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/canon.h>
#include <openbabel/graphsym.h>
#include <openbabel/obconversion.h>
#include <openbabel/obiter.h>
#include <openbabel/stereo/stereo.h>
#include <openbabel/stereo/tetrahedral.h>

#include <algorithm>

#include "core/error.h"
#include "structure/openbabel_log.h"

namespace vicinal::library {

namespace {

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

}  // namespace

void reflect_stereo(OpenBabel::OBMol& mol) {
  for (auto* data : mol.GetAllData(OpenBabel::OBGenericDataType::StereoData)) {
    auto* unit = static_cast<OpenBabel::OBStereoBase*>(data);
    if (unit->GetType() != OpenBabel::OBStereo::Tetrahedral) continue;
    auto* centre = static_cast<OpenBabel::OBTetrahedralStereo*>(unit);
    auto config = centre->GetConfig();
    if (!config.specified) continue;
    config.winding = config.winding == OpenBabel::OBStereo::Clockwise ? OpenBabel::OBStereo::AntiClockwise
                                                                       : OpenBabel::OBStereo::Clockwise;
    centre->SetConfig(config);
  }
}

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

CompoundIdentity::CompoundIdentity(const OpenBabel::OBMol& mol, const std::string& source, Names names)
    : mol_(mol), source_(source) {
  structure::LogCapture quiet;
  if (names == Names::All) {
    inchi_ = write_as(mol_, "inchi");
    inchikey_ = write_as(mol_, "inchikey");
    if (inchi_.rfind("InChI=", 0) != 0 || inchikey_.size() != 27) {
      const auto errors = quiet.errors();
      throw Error(fmt::format("Open Babel could not compute an InChI{}", errors.empty() ? "" : ": " + errors.front()),
                  {source}, "check the structure (valences, charges)");
    }
    smiles_ = write_as(mol_, "can", "n");
  }

  const unsigned n = mol_.NumAtoms();
  OpenBabel::OBGraphSym symmetry(&mol_);
  symmetry.GetSymmetry(symmetry_class_);
  OpenBabel::CanonicalLabels(&mol_, symmetry_class_, canonical_rank_);
  if (canonical_rank_.size() != n || symmetry_class_.size() != n)
    throw Error("Open Babel could not rank the atoms canonically", {source});

  symmetry_ = std::make_unique<PairSymmetry>(mol_, symmetry_class_, canonical_rank_);
}

std::string CompoundIdentity::ranks_text(const std::vector<int>& atoms) const {
  std::vector<unsigned> ranks;
  for (int a : atoms) ranks.push_back(rank(a));
  std::sort(ranks.begin(), ranks.end());
  return join(ranks);
}

std::vector<unsigned> CompoundIdentity::classes_of(const std::vector<int>& atoms) const {
  std::vector<unsigned> out;
  for (int atom : atoms) out.push_back(symmetry_class_.at(static_cast<std::size_t>(atom - 1)));
  std::sort(out.begin(), out.end());
  return out;
}

std::string CompoundIdentity::marked_smiles(const std::vector<int>& a, const std::vector<int>& b) const {
  structure::LogCapture quiet;
  // The canonical SMILES of the marked molecule; where the molecule has a
  // mirror symmetry, the smaller of that and its mirror image's (enantiotopic
  // pairs are one coupling). The mirror image's stereo is reflected and the
  // molecule written again: swapping '@' and '@@' in the string gives a
  // SMILES of the mirror image, but not always its canonical one, as
  // canonical order breaks ties by stereo.
  auto with_marks = [&](unsigned mark_a, unsigned mark_b) {
    OpenBabel::OBMol copy(mol_);
    for (int atom : a) copy.GetAtom(atom)->SetAtomicNum(mark_a);
    for (int atom : b) copy.GetAtom(atom)->SetAtomicNum(mark_b);
    copy.DeleteData(OpenBabel::OBGenericDataType::StereoData);
    OpenBabel::PerceiveStereo(&copy, true);
    const std::string smiles = write_as(copy, "can", "n");
    if (!symmetry_->has_mirror()) return smiles;
    reflect_stereo(copy);
    return std::min(smiles, write_as(copy, "can", "n"));
  };
  // Two different marks (one mark on both would let Open Babel, whose
  // symmetry classes ignore hydrogens, take a marked CH3 and a marked H on
  // one carbon for equal groups and miss the stereocentre between them). The
  // pair is unordered: when the symmetry classes of the two sides tell them
  // apart, the side with the smaller classes gets mark A; else both ways round count.
  const auto class_a = classes_of(a), class_b = classes_of(b);
  if (class_a != class_b) return class_a < class_b ? with_marks(kMarkA, kMarkB) : with_marks(kMarkB, kMarkA);
  return std::min(with_marks(kMarkA, kMarkB), with_marks(kMarkB, kMarkA));
}

std::string CompoundIdentity::coupling_key(const std::vector<int>& a, const std::vector<int>& b) {
  auto cache_key = std::make_pair(a, b);
  if (auto it = cache_.find(cache_key); it != cache_.end()) return it->second;
  for (int atom : a) if (atom < 1 || atom > atom_count()) throw Error(fmt::format("atom {} is not in the structure", atom), {source_});
  for (int atom : b) if (atom < 1 || atom > atom_count()) throw Error(fmt::format("atom {} is not in the structure", atom), {source_});

  std::string key;
  if (!symmetry_->complete()) {
    // Too symmetric to list: symmetry classes name the atoms, the marked
    // SMILES tells stereo-distinct pairs apart.
    auto x = classes_of(a), y = classes_of(b);
    if (y < x) std::swap(x, y);
    key = "s:" + join(x) + "~" + join(y) + "/" + marked_smiles(a, b);
  } else {
    auto zero_based = [](const std::vector<int>& atoms) {
      std::vector<unsigned> out;
      for (int atom : atoms) out.push_back(static_cast<unsigned>(atom - 1));
      return out;
    };
    const auto orbit = symmetry_->orbit(zero_based(a), zero_based(b));
    key = join(orbit.smallest.first) + "~" + join(orbit.smallest.second);
    if (orbit.split_by_geometry) {
      // Pairs that keeping the 3D arrangement maps onto each other have one
      // marked SMILES: compute it once per such set.
      auto [it, added] = marked_by_kept_orbit_.try_emplace(orbit.smallest_kept);
      if (added) it->second = marked_smiles(a, b);
      key += "/" + it->second;
    }
  }
  cache_.emplace(std::move(cache_key), key);
  return key;
}

}  // namespace vicinal::library
