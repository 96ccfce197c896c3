#include "structure/force_field_minimiser.h"

#include <ceres/ceres.h>
#include <omp.h>

#include <vector>

namespace vicinal::structure {

namespace {

class ForceFieldEnergy final : public ceres::FirstOrderFunction {
 public:
  ForceFieldEnergy(OpenBabel::OBForceField& ff, OpenBabel::OBMol& mol)
      : ff_(ff), mol_(mol), n_(3 * static_cast<int>(mol.NumAtoms())) {}

  bool Evaluate(const double* xyz, double* energy, double* gradient) const override {
    mol_.SetCoordinates(const_cast<double*>(xyz));
    ff_.SetCoordinates(mol_);
    *energy = ff_.Energy(gradient != nullptr);
    // Open Babel stores the force, minus the gradient.
    if (gradient)
      for (int i = 0; i < n_; ++i) gradient[i] = -ff_.GetGradientPtr()[i];
    return true;
  }
  int NumParameters() const override { return n_; }

 private:
  OpenBabel::OBForceField& ff_;
  OpenBabel::OBMol& mol_;
  int n_;
};

}  // namespace

double minimise_fully(OpenBabel::OBForceField& ff, OpenBabel::OBMol& mol, int max_iterations) {
  const double* start = mol.GetCoordinates();
  std::vector<double> xyz(start, start + 3 * mol.NumAtoms());
  // Stops when the largest gradient component is below 1e-10 kcal/mol/A or the
  // energy changes by less than 1e-12 of itself in a step: both mean the
  // minimum, not a slow stretch of the path to it.
  ceres::GradientProblemSolver::Options options;
  options.max_num_iterations = max_iterations;
  options.gradient_tolerance = 1e-10;
  options.function_tolerance = 1e-12;
  options.parameter_tolerance = 1e-12;
  // Modules never print: without this Ceres logs failed line searches to stderr.
  options.logging_type = ceres::SILENT;
  ceres::GradientProblemSolver::Summary summary;
  ceres::GradientProblem problem(new ForceFieldEnergy(ff, mol));
  ceres::Solve(options, problem, xyz.data(), &summary);
  mol.SetCoordinates(xyz.data());
  ff.SetCoordinates(mol);
  return ff.Energy(false);
}

void use_one_openbabel_thread() { omp_set_num_threads(1); }

}  // namespace vicinal::structure
