// Distribution functions the fits need: chi-square tail probabilities and
// quantiles (for tolerances and goodness of fit) and the normal quantile.
#pragma once

namespace vicinal::fit {

// Regularized upper incomplete gamma Q(a, x) = Gamma(a, x) / Gamma(a).
double gamma_q(double a, double x);
// P(X > x) for X ~ chi-square with `dof` degrees of freedom.
double chi2_survival(double x, double dof);
// x with P(X <= x) = p for X ~ chi-square(dof); 0 < p < 1.
double chi2_quantile(double p, double dof);
// z with Phi(z) = p; 0 < p < 1.
double normal_quantile(double p);

}  // namespace vicinal::fit
