// The solver settings every Ceres problem in fit/ uses: small dense problems,
// solved to tight tolerances so that convergence means the optimum.
#pragma once

#include <ceres/ceres.h>

namespace vicinal::fit {

inline ceres::Solver::Options tight_solver_options() {
  ceres::Solver::Options options;
  options.linear_solver_type = ceres::DENSE_QR;
  options.max_num_iterations = 500;
  options.function_tolerance = 1e-12;
  options.gradient_tolerance = 1e-12;
  options.parameter_tolerance = 1e-12;
  return options;
}

}  // namespace vicinal::fit
