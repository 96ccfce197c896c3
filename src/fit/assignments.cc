#include "fit/assignments.h"

#include <fmt/format.h>

#include <cmath>

#include "core/error.h"

namespace vicinal::fit {

AssignmentComparison compare_assignments(const std::vector<AssignmentOption>& options) {
  if (options.empty()) throw std::logic_error("compare_assignments: no options");
  AssignmentComparison c;
  for (const auto& o : options) c.scores.push_back({o.label, fit_linear(o.problem)});
  for (std::size_t a = 1; a < c.scores.size(); ++a)
    if (c.scores[a].fit.chi2 < c.scores[c.best].fit.chi2) c.best = static_cast<int>(a);
  const double best = c.scores[c.best].fit.chi2;
  double total = 0;
  for (auto& s : c.scores) {
    s.delta_chi2 = s.fit.chi2 - best;
    s.likelihood_ratio = std::exp(std::min(700.0, s.delta_chi2 / 2));
    total += std::exp(-s.delta_chi2 / 2);
  }
  for (auto& s : c.scores) s.probability = std::exp(-s.delta_chi2 / 2) / total;
  if (c.scores.size() == 1) return c;
  double runner_up = INFINITY;
  for (std::size_t a = 0; a < c.scores.size(); ++a)
    if (static_cast<int>(a) != c.best) runner_up = std::min(runner_up, c.scores[a].delta_chi2);
  const auto& b = c.scores[c.best];
  c.verdict = fmt::format("The data prefer the assignment {} (chi2 {:.3g}; next best {:.3g} higher, likelihood ratio "
                          "{:.3g}, probability {:.2f} with equal priors).",
                          b.label, b.fit.chi2, runner_up, std::exp(std::min(700.0, runner_up / 2)), b.probability);
  if (runner_up < 2)
    c.verdict += " The difference is small (delta chi2 < 2): the couplings do not decide the assignment.";
  return c;
}

}  // namespace vicinal::fit
