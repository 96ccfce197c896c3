// Full minimisation in an Open Babel force field. Open Babel's own conjugate
// gradients stop on a small energy change per step and crawl along soft modes
// (methyl and hydroxyl rotation): mirror-image conformers of butane came out
// up to 0.24 kcal/mol apart. L-BFGS (Ceres) on the force field's analytic
// gradient converges to the minimum, so equal structures get equal energies.
#pragma once

#include <openbabel/forcefield.h>
#include <openbabel/mol.h>

namespace vicinal::structure {

// Minimises `mol` in `ff`, which must be set up for `mol` (OBForceField::Setup),
// to a gradient tolerance; writes the coordinates back to `mol` and returns the
// energy in the force field's unit (kcal/mol for MMFF94 and UFF).
double minimise_fully(OpenBabel::OBForceField& ff, OpenBabel::OBMol& mol, int max_iterations);

// Open Babel runs parts of its force-field code as OpenMP parallel regions
// whose idle threads spin-wait: on a busy two-core machine that made 3D builds
// 30 times slower (bench/README.md). Every entry point that drives a force
// field calls this first; vicinal parallelises its own loops.
void use_one_openbabel_thread();

}  // namespace vicinal::structure
