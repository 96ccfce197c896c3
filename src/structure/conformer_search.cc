#include "structure/conformer_search.h"

#include <Eigen/Dense>
#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/forcefield.h>
#include <openbabel/bond.h>
#include <openbabel/obiter.h>
#include <openbabel/ring.h>
#include <openbabel/rotor.h>

#include <algorithm>
#include <numeric>

#include "core/error.h"
#include "structure/force_field_minimiser.h"
#include "structure/openbabel_log.h"
#include "structure/rotamers.h"

namespace vicinal::structure {

namespace {

// Up to this many rotatable bonds every combination of their torsion values is
// tried; beyond it a weighted random search samples them.
constexpr int kSystematicRotorLimit = 5;
// Short minimisation inside the rotor search and under ring-flip restraints;
// every candidate is then minimised fully (options.minimise_iterations).
constexpr int kSearchGeometrySteps = 50;
// Ring flips are tried for every subset of at most this many flexible rings
// (2^n - 1 flipped starting structures).
constexpr int kFlippedRingLimit = 3;
// Flexible rings: non-aromatic, 4 to 8 atoms (smaller rings have one shape,
// larger ones need more than a flip).
constexpr unsigned kSmallestFlexibleRing = 4, kLargestFlexibleRing = 8;

OpenBabel::OBForceField& mmff94_for(OpenBabel::OBMol& mol) {
  use_one_openbabel_thread();
  OpenBabel::OBForceField* ff = OpenBabel::OBForceField::FindForceField("MMFF94");
  if (!ff) throw Error("the MMFF94 force field is not available in this Open Babel installation");
  ff->SetLogLevel(OBFF_LOGLVL_NONE);
  if (!ff->Setup(mol))
    throw Error("MMFF94 has no parameters for this molecule", {},
                "MMFF94 covers common organic elements (H, C, N, O, F, Si, P, S, Cl, Br, I); give conformers from elsewhere");
  return *ff;
}

Eigen::Matrix3Xd heavy_atoms(const std::vector<int>& heavy, std::span<const double> xyz) {
  Eigen::Matrix3Xd m(3, heavy.size());
  for (std::size_t i = 0; i < heavy.size(); ++i)
    for (int k = 0; k < 3; ++k) m(k, i) = xyz[3 * (heavy[i] - 1) + k];
  return m;
}

double rmsd_after_superposition(const std::vector<int>& heavy, std::span<const double> a, std::span<const double> b) {
  Eigen::Matrix3Xd p = heavy_atoms(heavy, a), q = heavy_atoms(heavy, b);
  p.colwise() -= p.rowwise().mean();
  q.colwise() -= q.rowwise().mean();
  // Kabsch: the rotation R minimising |R p - q| from the SVD of the covariance.
  const Eigen::Matrix3d h = p * q.transpose();
  Eigen::JacobiSVD<Eigen::Matrix3d> svd(h, Eigen::ComputeFullU | Eigen::ComputeFullV);
  Eigen::Matrix3d d = Eigen::Matrix3d::Identity();
  d(2, 2) = (svd.matrixV() * svd.matrixU().transpose()).determinant() < 0 ? -1 : 1;
  const Eigen::Matrix3d r = svd.matrixV() * d * svd.matrixU().transpose();
  return std::sqrt((r * p - q).colwise().squaredNorm().sum() / static_cast<double>(heavy.size()));
}

std::vector<int> heavy_atom_indices(OpenBabel::OBMol& mol) {
  std::vector<int> heavy;
  for (auto it = mol.BeginAtoms(); it != mol.EndAtoms(); ++it)
    if ((*it)->GetAtomicNum() != 1) heavy.push_back(static_cast<int>((*it)->GetIdx()));
  return heavy;
}

// Chain torsions for the duplicate test: every acyclic single bond whose ends
// both have another neighbour, except those turning a group of identical
// terminal atoms (CH3, CF3), whose rotamers are the same conformer.
std::vector<std::array<int, 4>> chain_torsions(OpenBabel::OBMol& mol) {
  const auto symmetric_top = [&](OpenBabel::OBAtom* end, OpenBabel::OBAtom* partner) {
    int count = 0, element = -1;
    bool same = true;
    FOR_NBORS_OF_ATOM(n, end) {
      if (&*n == partner) continue;
      if (n->GetExplicitDegree() != 1) return false;  // not a terminal atom
      if (element >= 0 && static_cast<int>(n->GetAtomicNum()) != element) same = false;
      element = n->GetAtomicNum();
      ++count;
    }
    return same && count == 3;
  };
  std::vector<std::array<int, 4>> out;
  for (auto it = mol.BeginBonds(); it != mol.EndBonds(); ++it) {
    OpenBabel::OBBond* b = *it;
    if (b->IsInRing() || b->GetBondOrder() != 1) continue;
    OpenBabel::OBAtom* x = b->GetBeginAtom();
    OpenBabel::OBAtom* y = b->GetEndAtom();
    if (x->GetExplicitDegree() < 2 || y->GetExplicitDegree() < 2) continue;
    if (symmetric_top(x, y) || symmetric_top(y, x)) continue;
    out.push_back(rotamer_reference(mol, RotamerSpec{static_cast<int>(x->GetIdx()), static_cast<int>(y->GetIdx())}));
  }
  return out;
}

double largest_torsion_difference_deg(OpenBabel::OBMol& mol, const std::vector<std::array<int, 4>>& torsions,
                                      std::span<const double> a, std::span<const double> b) {
  double worst = 0;
  const auto torsion = [&](std::span<const double> xyz, const std::array<int, 4>& t) {
    mol.SetCoordinates(const_cast<double*>(xyz.data()));
    return mol.GetTorsion(t[0], t[1], t[2], t[3]);
  };
  for (const auto& t : torsions) {
    double d = std::fmod(std::abs(torsion(a, t) - torsion(b, t)), 360.0);
    worst = std::max(worst, std::min(d, 360.0 - d));
  }
  return worst;
}


// The torsions of each flexible ring: four consecutive ring atoms, all the way
// round. A ring's shape (chair, the other chair, envelope) is fixed by them.
std::vector<std::vector<std::array<int, 4>>> flexible_ring_torsions(OpenBabel::OBMol& mol) {
  std::vector<std::vector<std::array<int, 4>>> out;
  for (OpenBabel::OBRing* ring : mol.GetSSSR()) {
    const std::vector<int>& path = ring->_path;  // atom indices in ring order
    if (ring->IsAromatic() || path.size() < kSmallestFlexibleRing || path.size() > kLargestFlexibleRing) continue;
    std::vector<std::array<int, 4>> torsions;
    const std::size_t m = path.size();
    for (std::size_t i = 0; i < m; ++i)
      torsions.push_back({path[i], path[(i + 1) % m], path[(i + 2) % m], path[(i + 3) % m]});
    out.push_back(std::move(torsions));
  }
  return out;
}

// Sign of the volume spanned by the first three neighbours of every atom with
// four neighbours: a change means an atom was inverted (stereo lost).
std::vector<int> tetrahedral_signs(OpenBabel::OBMol& mol) {
  std::vector<int> signs;
  for (auto it = mol.BeginAtoms(); it != mol.EndAtoms(); ++it) {
    OpenBabel::OBAtom* a = *it;
    if (a->GetExplicitDegree() != 4) continue;
    std::vector<OpenBabel::vector3> v;
    FOR_NBORS_OF_ATOM(n, a) v.push_back(n->GetVector() - a->GetVector());
    signs.push_back(OpenBabel::dot(v[0], OpenBabel::cross(v[1], v[2])) > 0 ? 1 : -1);
  }
  return signs;
}

// Starting structures with the flexible rings in other shapes: for each subset
// of rings, every ring torsion of those rings is driven to minus its value
// (a chair becomes the other chair, an envelope its mirror pucker) under
// torsion restraints, then the restraints are released and the structure
// minimised. Results that invert an atom or fall back to a shape already
// found are dropped. The first start is `mol` itself.
std::vector<std::vector<double>> ring_starting_structures(
    OpenBabel::OBMol& mol, const std::vector<std::vector<std::array<int, 4>>>& rings, const ConformerOptions& options,
    double torsion_deg) {
  std::vector<std::vector<double>> starts{coordinates_of(mol)};
  const std::vector<int> signs = tetrahedral_signs(mol);
  const int n_rings = std::min<int>(static_cast<int>(rings.size()), kFlippedRingLimit);
  std::vector<std::array<int, 4>> all_ring_torsions;
  for (const auto& r : rings) all_ring_torsions.insert(all_ring_torsions.end(), r.begin(), r.end());
  for (int mask = 1; mask < (1 << n_rings); ++mask) {
    OpenBabel::OBMol work(mol);
    OpenBabel::OBFFConstraints restraints;
    for (int r = 0; r < n_rings; ++r)
      if (mask & (1 << r))
        for (const auto& t : rings[r]) restraints.AddTorsionConstraint(t[0], t[1], t[2], t[3], -work.GetTorsion(t[0], t[1], t[2], t[3]));
    OpenBabel::OBForceField& ff = mmff94_for(work);
    ff.Setup(work, restraints);
    ff.ConjugateGradients(options.minimise_iterations, 1e-6);
    ff.GetCoordinates(work);  // Setup below restarts from the molecule's coordinates
    OpenBabel::OBFFConstraints none;
    ff.Setup(work, none);
    minimise_fully(ff, work, options.minimise_iterations);
    if (tetrahedral_signs(work) != signs) continue;
    const std::vector<double> xyz = coordinates_of(work);
    const bool seen = std::any_of(starts.begin(), starts.end(), [&](const std::vector<double>& s) {
      return largest_torsion_difference_deg(work, all_ring_torsions, xyz, s) < torsion_deg;
    });
    if (!seen) starts.push_back(xyz);
  }
  return starts;
}

// Number of distinct ring shapes among the frames (ring torsions within
// torsion_deg count as one shape).
int distinct_ring_shapes(OpenBabel::OBMol& mol, const std::vector<std::array<int, 4>>& ring_torsions,
                         const Ensemble& ensemble, double torsion_deg) {
  std::vector<std::size_t> shapes;
  for (std::size_t f = 0; f < ensemble.frame_count(); ++f)
    if (std::none_of(shapes.begin(), shapes.end(), [&](std::size_t g) {
          return largest_torsion_difference_deg(mol, ring_torsions, ensemble.frame(f), ensemble.frame(g)) < torsion_deg;
        }))
      shapes.push_back(f);
  return static_cast<int>(shapes.size());
}

}  // namespace

double heavy_atom_rmsd(const OpenBabel::OBMol& topology, std::span<const double> a, std::span<const double> b) {
  const auto heavy = heavy_atom_indices(const_cast<OpenBabel::OBMol&>(topology));
  if (heavy.empty()) return 0;
  return rmsd_after_superposition(heavy, a, b);
}

Ensemble generate_conformers(const OpenBabel::OBMol& input, const ConformerOptions& options, ConformerReport* report) {
  if (options.max_conformers < 1) throw Error("--max must be at least 1", Location::field_in("", "--max"));
  if (!(options.rmsd_angstrom >= 0)) throw Error("--rmsd must not be negative", Location::field_in("", "--rmsd"));
  NoProgress quiet;
  Progress& progress = options.progress ? *options.progress : quiet;
  ConformerReport local;
  ConformerReport& rep = report ? *report : local;
  LogCapture log;

  OpenBabel::OBMol mol(input);
  minimise_fully(mmff94_for(mol), mol, options.minimise_iterations);

  // Ring shapes first: every starting structure then gets the rotor search.
  const auto rings = flexible_ring_torsions(mol);
  const auto starts = ring_starting_structures(mol, rings, options, options.torsion_deg);
  rep.flexible_rings = static_cast<int>(rings.size());
  rep.ring_starts = static_cast<int>(starts.size());

  OpenBabel::OBRotorList rotors;
  rotors.Setup(mol);
  rep.rotors = static_cast<int>(rotors.Size());
  if (rep.rotors == 0) {
    rep.method = "no rotatable bonds: MMFF94-minimised structure";
  } else if (rep.rotors <= kSystematicRotorLimit) {
    rep.method = fmt::format("systematic rotor search over {} rotatable bond{} (every torsion combination)", rep.rotors,
                             rep.rotors == 1 ? "" : "s");
  } else {
    rep.method = fmt::format("weighted random rotor search over {} rotatable bonds ({} samples)", rep.rotors,
                             std::max(100, 10 * options.max_conformers));
  }
  if (!rings.empty())
    rep.method += fmt::format(" from {} ring starting structure{} ({} flexible ring{}, each flipped by inverting "
                              "its ring torsions)",
                              starts.size(), starts.size() == 1 ? "" : "s", rings.size(), rings.size() == 1 ? "" : "s");

  // Candidate coordinates: every conformer the search left, for every start.
  const int n = static_cast<int>(mol.NumAtoms());
  std::vector<std::vector<double>> candidates;
  progress.start("rotor search", starts.size());
  for (std::size_t s = 0; s < starts.size(); ++s) {
    OpenBabel::OBMol start(input);
    start.SetCoordinates(const_cast<double*>(starts[s].data()));
    if (rep.rotors > 0) {
      OpenBabel::OBForceField& f = mmff94_for(start);
      if (rep.rotors <= kSystematicRotorLimit)
        f.SystematicRotorSearch(kSearchGeometrySteps);
      else
        f.WeightedRotorSearch(std::max(100, 10 * options.max_conformers), kSearchGeometrySteps);
      f.GetConformers(start);
    }
    for (int c = 0; c < std::max(1, start.NumConformers()); ++c) {
      if (start.NumConformers() > 0) start.SetConformer(c);
      candidates.push_back(coordinates_of(start));
    }
    progress.advance(s + 1);
  }
  progress.finish();
  rep.searched = static_cast<int>(candidates.size());

  // Full minimisation of each candidate, then energies.
  struct Conformer {
    std::vector<double> xyz;
    double energy;
  };
  std::vector<Conformer> minimised;
  progress.start("MMFF94 minimisation", candidates.size());
  OpenBabel::OBMol work(input);
  for (std::size_t c = 0; c < candidates.size(); ++c) {
    work.SetCoordinates(candidates[c].data());
    const double energy = minimise_fully(mmff94_for(work), work, options.minimise_iterations);
    minimised.push_back({coordinates_of(work), energy});
    progress.advance(c + 1);
  }
  progress.finish();
  // MMFF94 energies in Open Babel are in kcal/mol.
  std::sort(minimised.begin(), minimised.end(), [](const Conformer& a, const Conformer& b) { return a.energy < b.energy; });

  const auto heavy = heavy_atom_indices(mol);
  OpenBabel::OBMol probe(input);
  // Chain torsions and ring torsions together: two ring shapes with the same
  // side chains are different conformers.
  auto torsions = chain_torsions(probe);
  std::vector<std::array<int, 4>> ring_torsions;
  for (const auto& r : rings) ring_torsions.insert(ring_torsions.end(), r.begin(), r.end());
  torsions.insert(torsions.end(), ring_torsions.begin(), ring_torsions.end());
  Ensemble out;
  out.topology = input;
  out.source = "conformer search";
  const double e_min = minimised.front().energy;
  for (const auto& c : minimised) {
    if (c.energy - e_min > options.energy_window_kcal_mol) {
      ++rep.above_window;
      continue;
    }
    bool duplicate = false;
    for (std::size_t f = 0; f < out.frame_count() && !duplicate; ++f)
      duplicate = (heavy.empty() || rmsd_after_superposition(heavy, c.xyz, out.frame(f)) < options.rmsd_angstrom) &&
                  largest_torsion_difference_deg(probe, torsions, c.xyz, out.frame(f)) < options.torsion_deg;
    if (duplicate) {
      ++rep.duplicates;
      continue;
    }
    if (static_cast<int>(out.frame_count()) == options.max_conformers) break;
    out.add_frame(c.xyz);
    out.energy_kcal_mol.push_back(c.energy);
  }
  if (n > 0) out.topology.SetCoordinates(out.xyz.data());
  out.weight = boltzmann_weights(out.energy_kcal_mol, options.temperature_k);
  for (std::size_t f = 0; f < out.frame_count(); ++f) out.titles.push_back(fmt::format("conformer {}", f + 1));
  rep.ring_shapes = ring_torsions.empty() ? 0 : distinct_ring_shapes(probe, ring_torsions, out, options.torsion_deg);
  return out;
}

}  // namespace vicinal::structure
