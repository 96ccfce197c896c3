#include "fit/goodness.h"

#include <fmt/format.h>

#include <cmath>

#include "fit/statistics.h"

namespace vicinal::fit {

Goodness assess_fit(const PopulationProblem& problem, const LinearFit& fit) {
  Goodness g;
  const int m = problem.couplings();
  g.chi2 = fit.chi2;
  int used = 0;
  for (int i = 0; i < fit.weights.size(); ++i) used += fit.weights(i) > 1e-9;
  g.dof = m - std::max(0, used - 1);
  if (g.dof > 0) {
    g.reduced_chi2 = g.chi2 / g.dof;
    g.p_value = chi2_survival(g.chi2, g.dof);
  }
  g.rmsd_hz = std::sqrt(fit.residual_hz.squaredNorm() / m);
  const Eigen::VectorXd s = problem.total_sigma_hz();
  std::string misses, unreachable;
  for (int r = 0; r < m; ++r) {
    if (std::abs(fit.z(r)) <= 2.0) continue;
    CouplingMisfit miss{r, fit.z(r), false};
    const double lo = problem.j_hz.row(r).minCoeff(), hi = problem.j_hz.row(r).maxCoeff();
    miss.unreachable = problem.j_obs_hz(r) < lo - 2 * s(r) || problem.j_obs_hz(r) > hi + 2 * s(r);
    g.misfits.push_back(miss);
    std::string& list = miss.unreachable ? unreachable : misses;
    list += (list.empty() ? "" : ", ") + problem.coupling_names[r];
  }
  g.acceptable = g.misfits.empty() && g.p_value >= 0.05;
  if (!unreachable.empty())
    g.verdict += fmt::format("No mixture of these conformers fits {} within 2 sigma: every conformer predicts "
                             "it too far from the measured value, so the ensemble is missing a conformation "
                             "or the assignment is wrong. ", unreachable);
  if (!misses.empty())
    g.verdict += fmt::format("The best mixture misses {} by more than 2 sigma; mixtures that fit {} miss other "
                             "couplings, so the ensemble is missing a conformation or an assignment is wrong. ",
                             misses, g.misfits.size() > 1 ? "them" : "it");
  if (g.misfits.empty() && g.dof > 0 && g.p_value < 0.05)
    g.verdict += fmt::format("Every coupling is within 2 sigma, but together they fit worse than the "
                             "uncertainties allow (chi2 = {:.3g} with {} degrees of freedom, p = {:.2g}). ",
                             g.chi2, g.dof, g.p_value);
  if (g.acceptable)
    g.verdict = fmt::format("The fitted populations reproduce every coupling within 2 sigma (RMSD {:.2f} Hz). ",
                            g.rmsd_hz);
  if (!g.verdict.empty() && g.verdict.back() == ' ') g.verdict.pop_back();
  return g;
}

}  // namespace vicinal::fit
