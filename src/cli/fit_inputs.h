// Turning the user's files into population-fit problems, shared by
// `vicinal fit`, `vicinal rotamers` and `vicinal rank`: the couplings CSV
// (with '|' alternatives for stereo-unassigned nuclei), a precomputed J matrix
// CSV, or a structure/ensemble run through the Karplus sets.
#pragma once

#include <optional>
#include <string>
#include <vector>

#include "fit/nonlinear_models.h"
#include "fit/population_problem.h"
#include "predict/coupling_list.h"
#include "predict/j_matrix.h"
#include "structure/atom_labels.h"
#include "structure/ensemble.h"

namespace vicinal::cli {

// The measured couplings: the list as read plus the sigma of every row
// (the row's sigma_hz, else `default_sigma_hz`, else an error naming the line).
struct MeasuredCouplings {
  predict::CouplingList list;
  std::vector<double> sigma_hz;
};
MeasuredCouplings read_measured_couplings(const std::string& path, std::optional<double> default_sigma_hz);

// One concrete reading of the couplings: for each row, the pair of references.
// Rows whose alternatives are the same set of atoms are assigned together as a
// permutation of that set: a row means its first-written alternative, and a
// permutation maps every row's first alternative alike. The identity comes first.
struct Assignment {
  std::string label;  // "as written", or e.g. "H-6a<->H-6b"
  std::vector<std::array<std::string, 2>> refs;
};
std::vector<Assignment> enumerate_assignments(const predict::CouplingList& list);

// `vicinal fit --matrix`: a CSV with one row per conformer and a column per
// coupling named after the couplings' nuclei ("H-2,H-3", "H-2/H-3" or either
// followed by " j_hz", as `vicinal predict --csv` writes); optional `title`
// column for conformer names. rms_hz: from `set` (row or --set), else --rms-hz.
fit::PopulationProblem problem_from_matrix(const std::string& matrix_csv, const MeasuredCouplings& measured,
                                           const std::string& set_choice, std::optional<double> rms_hz);

// A structure (topology and labels) with its conformers.
struct LoadedEnsemble {
  structure::Ensemble ensemble;
  structure::AtomLabels labels;
  std::string source;
};
LoadedEnsemble load_ensemble(const std::string& ensemble_path, const std::string& structure_path,
                             const std::string& labels_csv, std::vector<std::string>* notes);

// The couplings of one assignment over an ensemble: specs, J matrix and the problem.
struct EnsembleProblem {
  std::vector<predict::CouplingSpec> specs;
  predict::JMatrix matrix;
  fit::PopulationProblem problem;
};
EnsembleProblem problem_from_ensemble(const LoadedEnsemble& in, const MeasuredCouplings& measured,
                                      const Assignment& assignment, const std::string& set_choice, int threads);

// Geometry and curve for the nonlinear models: each coupling's dihedral in
// each conformer, torsions grouped by the central bond of the path.
fit::StateGeometry state_geometry(const EnsembleProblem& p);
fit::CouplingCurve coupling_curve(const EnsembleProblem& p);

}  // namespace vicinal::cli
