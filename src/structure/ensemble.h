// A conformer ensemble: one topology (the first frame, an OBMol) and the
// coordinates of every frame in one contiguous array, with optional energies
// and weights. SDF data fields of our naming carry the energy and weight.
#pragma once

#include <openbabel/mol.h>

#include <cstddef>
#include <span>
#include <string>
#include <vector>

#include "structure/molecule_io.h"

namespace vicinal::structure {

inline constexpr const char* kSdfEnergyField = "vicinal_energy_kcal_mol";
inline constexpr const char* kSdfWeightField = "vicinal_weight";
// Boltzmann constant in kcal/mol/K (CODATA 2018: k_B N_A = 8.314462618 J/mol/K / 4184 J/kcal).
inline constexpr double kBoltzmannKcalPerMolK = 8.314462618e-3 / 4.184;

struct Ensemble {
  OpenBabel::OBMol topology;          // first frame; its coordinates equal frame 0
  std::vector<double> xyz;            // frame-major: frame f, atom i (0-based) at 3*(f*atoms + i)
  std::vector<double> energy_kcal_mol;  // empty, or one per frame
  std::vector<double> weight;         // empty, or one per frame (as given, not normalised)
  std::vector<std::string> titles;    // empty, or one per frame
  std::string source;                 // file the ensemble came from (for messages)

  int atom_count() const { return static_cast<int>(topology.NumAtoms()); }
  std::size_t frame_count() const;
  std::span<const double> frame(std::size_t f) const;
  // Appends one frame's coordinates (3 * atom_count values).
  void add_frame(std::span<const double> coords);
};

// An ensemble of one frame: the molecule's own coordinates.
Ensemble single_frame(const OpenBabel::OBMol& mol, const std::string& source = "");

// Coordinates of a molecule as a flat array (atom-major x,y,z).
std::vector<double> coordinates_of(const OpenBabel::OBMol& mol);

// Every frame of a multi-conformer SDF, multi-model PDB or multi-frame XYZ.
// Frames after the first must have the same atom count and elements; the first
// frame that differs is named. Hydrogens are added only when the first frame
// has none at all, and then to every frame alike (noted in `notes`).
Ensemble read_ensemble(const std::string& path, ReadNotes* notes = nullptr);

// exp(-(E_i - E_min) / kT), normalised. vicinal::Error for T <= 0.
std::vector<double> boltzmann_weights(std::span<const double> energy_kcal_mol, double temperature_k);

// Normalised weights: Boltzmann weights from energies at `temperature_k`, else
// the given weights, else uniform (energies win so that a temperature can be
// chosen for files that carry both, as `conformers generate` writes them). `basis` says which ("weights", "energies",
// "uniform").
std::vector<double> frame_weights(const Ensemble& ensemble, double temperature_k, std::string* basis = nullptr);

// Multi-conformer SDF with energy and weight data fields, written atomically.
void write_ensemble_sdf(const Ensemble& ensemble, const std::string& path);

}  // namespace vicinal::structure
