#include "structure/conformer_search.h"

#include <Eigen/Dense>
#include <fmt/format.h>
#include <openbabel/atom.h>
#include <openbabel/forcefield.h>
#include <openbabel/bond.h>
#include <openbabel/obiter.h>
#include <openbabel/rotor.h>

#include <algorithm>
#include <numeric>

#include "core/error.h"
#include "structure/openbabel_log.h"
#include "structure/rotamers.h"

namespace vicinal::structure {

namespace {

// Up to this many rotatable bonds every combination of their torsion values is
// tried; beyond it a weighted random search samples them.
constexpr int kSystematicRotorLimit = 5;
// Short minimisation inside the rotor search; every kept candidate is then
// minimised fully (options.minimise_steps).
constexpr int kSearchGeometrySteps = 50;

OpenBabel::OBForceField& mmff94_for(OpenBabel::OBMol& mol) {
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
  OpenBabel::OBForceField& ff = mmff94_for(mol);
  ff.ConjugateGradients(options.minimise_steps, 1e-6);
  ff.GetCoordinates(mol);

  OpenBabel::OBRotorList rotors;
  rotors.Setup(mol);
  rep.rotors = static_cast<int>(rotors.Size());
  if (rep.rotors == 0) {
    rep.method = "no rotatable bonds: one MMFF94-minimised structure";
  } else if (rep.rotors <= kSystematicRotorLimit) {
    rep.method = fmt::format("systematic rotor search over {} rotatable bond{} (every torsion combination)", rep.rotors,
                             rep.rotors == 1 ? "" : "s");
    progress.start("rotor search", 1);
    ff.SystematicRotorSearch(kSearchGeometrySteps);
    ff.GetConformers(mol);
  } else {
    const int samples = std::max(100, 10 * options.max_conformers);
    rep.method = fmt::format("weighted random rotor search over {} rotatable bonds ({} samples)", rep.rotors, samples);
    progress.start("rotor search", 1);
    ff.WeightedRotorSearch(samples, kSearchGeometrySteps);
    ff.GetConformers(mol);
  }

  // Candidate coordinates: every conformer the search left in the molecule.
  const int n = static_cast<int>(mol.NumAtoms());
  std::vector<std::vector<double>> candidates;
  for (int c = 0; c < std::max(1, mol.NumConformers()); ++c) {
    if (mol.NumConformers() > 0) mol.SetConformer(c);
    candidates.push_back(coordinates_of(mol));
  }
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
    OpenBabel::OBForceField& f = mmff94_for(work);
    f.ConjugateGradients(options.minimise_steps, 1e-6);
    f.GetCoordinates(work);
    minimised.push_back({coordinates_of(work), f.Energy(false)});
    progress.advance(c + 1);
  }
  progress.finish();
  // MMFF94 energies in Open Babel are in kcal/mol.
  std::sort(minimised.begin(), minimised.end(), [](const Conformer& a, const Conformer& b) { return a.energy < b.energy; });

  const auto heavy = heavy_atom_indices(mol);
  OpenBabel::OBMol probe(input);
  const auto torsions = chain_torsions(probe);
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
  return out;
}

}  // namespace vicinal::structure
