// Conformer generation with Open Babel: 3D build, MMFF94 minimisation, ring
// flips (each flexible ring's torsions inverted), a rotor search from every
// ring shape, duplicate removal by heavy-atom RMSD after alignment, and
// MMFF94 energies with Boltzmann weights at a temperature.
#pragma once

#include <openbabel/mol.h>

#include <span>
#include <string>
#include <vector>

#include "core/progress.h"
#include "structure/ensemble.h"

namespace vicinal::structure {

struct ConformerOptions {
  double temperature_k = 298.15;
  int max_conformers = 30;
  // Two conformers are one when their heavy-atom RMSD (after superposition) is
  // below rmsd_angstrom AND every chain and ring torsion agrees within torsion_deg. The
  // torsion test keeps mirror-image gauche forms and OH rotamers apart, which
  // RMSD alone would merge.
  double rmsd_angstrom = 0.5;
  double torsion_deg = 30.0;
  double energy_window_kcal_mol = 10.0;  // drop conformers this far above the minimum
  int minimise_iterations = 2000;  // per full minimisation (L-BFGS); most converge in a few hundred
  Progress* progress = nullptr;
};

struct ConformerReport {
  int rotors = 0;
  int flexible_rings = 0;  // non-aromatic rings of 4 to 8 atoms
  int ring_starts = 0;     // distinct ring shapes the search started from (1 without flexible rings)
  int ring_shapes = 0;     // distinct ring shapes among the kept conformers (0 without flexible rings)
  int searched = 0;       // conformers produced by the search before filtering
  int duplicates = 0;     // dropped as duplicates (RMSD and torsions)
  int above_window = 0;   // dropped by the energy window
  std::string method;     // which search was used and why
};

// `mol` must have 3D coordinates and explicit hydrogens (molecule_from_smiles
// with build_3d, or read_molecule of a 3D file). Frames are sorted by energy,
// with energies and Boltzmann weights filled in.
Ensemble generate_conformers(const OpenBabel::OBMol& mol, const ConformerOptions& options,
                             ConformerReport* report = nullptr);

// Heavy-atom RMSD (Angstrom) between two frames of the same topology after
// optimal superposition (Kabsch).
double heavy_atom_rmsd(const OpenBabel::OBMol& topology, std::span<const double> a, std::span<const double> b);

}  // namespace vicinal::structure
