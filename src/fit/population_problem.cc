#include "fit/population_problem.h"

#include <fmt/format.h>

#include <cmath>

#include "core/error.h"

namespace vicinal::fit {

void fill_default_names(PopulationProblem& p) {
  if (p.coupling_names.empty())
    for (int r = 0; r < p.couplings(); ++r) p.coupling_names.push_back(fmt::format("coupling {}", r + 1));
  if (p.conformer_names.empty())
    for (int i = 0; i < p.conformers(); ++i) p.conformer_names.push_back(fmt::format("conformer {}", i + 1));
}

void PopulationProblem::validate() const {
  const int m = couplings();
  if (m == 0)
    throw Error("no measured couplings to fit", {}, "give at least one coupling with a j_hz value");
  if (conformers() == 0)
    throw Error("the ensemble has no conformers", {}, "give an ensemble with at least one conformer");
  if (j_hz.rows() != m || sigma_hz.size() != m || rms_hz.size() != m)
    throw std::logic_error("PopulationProblem: inconsistent sizes");
  auto name = [&](int r) { return r < static_cast<int>(coupling_names.size()) ? coupling_names[r] : fmt::format("coupling {}", r + 1); };
  for (int r = 0; r < m; ++r) {
    if (!std::isfinite(j_obs_hz(r)) || !std::isfinite(sigma_hz(r)) || !std::isfinite(rms_hz(r)))
      throw Error(fmt::format("coupling {} has a value that is not a finite number", name(r)));
    if (sigma_hz(r) < 0 || rms_hz(r) < 0)
      throw Error(fmt::format("coupling {} has a negative uncertainty", name(r)));
    if (sigma_hz(r) == 0 && rms_hz(r) == 0)
      throw Error(fmt::format("coupling {} has zero uncertainty (sigma_hz = 0 and no Karplus RMS error)", name(r)),
                  {}, "give sigma_hz > 0 for every coupling: a fit weighs each coupling by its uncertainty");
    for (int i = 0; i < conformers(); ++i)
      if (!std::isfinite(j_hz(r, i)))
        throw Error(fmt::format("predicted J of coupling {} in conformer {} is not a finite number", name(r), i + 1));
  }
}

Eigen::VectorXd PopulationProblem::total_sigma_hz() const {
  return (sigma_hz.array().square() + rms_hz.array().square()).sqrt().matrix();
}

Eigen::MatrixXd PopulationProblem::centred_columns() const {
  const Eigen::VectorXd s = total_sigma_hz();
  Eigen::MatrixXd c = j_hz;
  c.colwise() -= j_obs_hz;
  return s.cwiseInverse().asDiagonal() * c;
}

}  // namespace vicinal::fit
