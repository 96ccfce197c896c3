// Couplings over an ensemble: for each coupling (a resolved 3J path with its
// Karplus set and substituents) and each conformer, the dihedral and J; and the
// weighted ensemble average. Computed over frames in parallel.
#pragma once

#include <openbabel/mol.h>

#include <array>
#include <optional>
#include <span>
#include <string>
#include <vector>

#include "core/progress.h"
#include "karplus/karplus.h"
#include "predict/coupling_list.h"
#include "structure/atom_labels.h"
#include "structure/ensemble.h"
#include "structure/substituents.h"

namespace vicinal::predict {

// One coupling ready to evaluate.
struct CouplingSpec {
  std::array<int, 2> nuclei{};   // 1-based
  std::array<int, 4> bond_path{};  // the bonded path from the first nucleus to the second, 1-based
  std::array<int, 4> path{};     // the dihedral's four atoms, 1-based, in the set's pattern order
                                 // (equal to bond_path up to direction for H-C-C-H; the backbone
                                 // angle phi for protein sets)
  std::string name;              // e.g. "H-2/H-3" (labels where known)
  const karplus::ParameterSet* set = nullptr;
  std::string set_reason;        // why this set was chosen (for --explain and notes)
  std::vector<structure::SubstituentDetail> substituents;  // Haasnoot sets only
  std::vector<karplus::Substituent> karplus_substituents;
  std::optional<double> j_obs_hz, sigma_hz;
  long line = 0;                 // CSV line it came from (0 = pattern match)
};

// "auto" or a set id. For "auto": Haasnoot sets for H-C-C-H paths (the set
// whose substituent count matches the fragment's), otherwise the set whose
// nuclei and pattern match the path.
inline constexpr const char* kAutoSet = "auto";

// Resolves one pair of references (labels or indices) into a CouplingSpec:
// finds the 3J path, chooses the set (row set, else `set_choice`), matches the
// path to the set's pattern (orienting it as the pattern's atom maps 1-4) and
// computes substituents. Errors name the references and, via `where`, the CSV line.
CouplingSpec resolve_coupling(const OpenBabel::OBMol& mol, const structure::AtomLabels& labels,
                              const std::array<std::string, 2>& refs, const std::string& set_choice,
                              const Location& where = {});

// Every row of a couplings list; rows with '|' alternatives are rejected with a
// message (use resolve_coupling per assignment for them).
std::vector<CouplingSpec> resolve_couplings(const OpenBabel::OBMol& mol, const structure::AtomLabels& labels,
                                            const CouplingList& list, const std::string& set_choice);

// Every match of the set's pattern in the molecule (one spec per distinct
// coupled pair). With "auto": every H-C-C-H with its Haasnoot set.
// Pairs that cannot be evaluated (several bonded paths, e.g. in four-membered
// rings) are skipped and described in `skipped`.
std::vector<CouplingSpec> couplings_from_pattern(const OpenBabel::OBMol& mol, const structure::AtomLabels& labels,
                                                 const std::string& set_choice,
                                                 std::vector<std::string>* skipped = nullptr);

// Conformer x coupling matrices, frame-major: value (f, k) at f * couplings + k.
struct JMatrix {
  std::size_t frames = 0, couplings = 0;
  std::vector<double> dihedral_deg;
  std::vector<double> j_hz;
  double dihedral(std::size_t f, std::size_t k) const { return dihedral_deg[f * couplings + k]; }
  double j(std::size_t f, std::size_t k) const { return j_hz[f * couplings + k]; }
  // Weighted average of each coupling (weights normalised, one per frame).
  std::vector<double> average_j_hz(std::span<const double> weights) const;
};

// Dihedral in degrees, (-180, 180], of four 1-based atoms in one frame.
double dihedral_deg(std::span<const double> xyz, const std::array<int, 4>& atoms);

// J matrix over all frames of the ensemble using `threads` workers.
JMatrix compute_j_matrix(const std::vector<CouplingSpec>& specs, const structure::Ensemble& ensemble,
                         int threads = 1, Progress* progress = nullptr);

// Same numbers for coordinates given directly (frames x atoms x 3).
JMatrix compute_j_matrix(const std::vector<CouplingSpec>& specs, std::span<const double> xyz, int atom_count,
                         int threads = 1, Progress* progress = nullptr);

// Constant-memory ensemble average over a long same-topology PDB/XYZ
// trajectory (uniform weights), read with the fast frame reader in batches.
struct StreamedAverage {
  std::size_t frames = 0;
  std::vector<double> mean_j_hz, mean_dihedral_cos, mean_dihedral_sin;
};
StreamedAverage stream_average(const std::vector<CouplingSpec>& specs, const OpenBabel::OBMol& topology,
                               const std::string& trajectory, int threads = 1, Progress* progress = nullptr);

}  // namespace vicinal::predict
