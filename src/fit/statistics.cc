#include "fit/statistics.h"

#include <cmath>
#include <stdexcept>

namespace vicinal::fit {

namespace {

// Series for P(a, x), good for x < a + 1.
double gamma_p_series(double a, double x) {
  double term = 1.0 / a, sum = term;
  for (int n = 1; n < 1000; ++n) {
    term *= x / (a + n);
    sum += term;
    if (std::abs(term) < std::abs(sum) * 1e-16) break;
  }
  return sum * std::exp(-x + a * std::log(x) - std::lgamma(a));
}

// Continued fraction for Q(a, x) (modified Lentz), good for x >= a + 1.
double gamma_q_fraction(double a, double x) {
  const double tiny = 1e-300;
  double b = x + 1 - a, c = 1 / tiny, d = 1 / b, h = d;
  for (int i = 1; i < 1000; ++i) {
    const double an = -i * (i - a);
    b += 2;
    d = an * d + b;
    if (std::abs(d) < tiny) d = tiny;
    c = b + an / c;
    if (std::abs(c) < tiny) c = tiny;
    d = 1 / d;
    const double delta = d * c;
    h *= delta;
    if (std::abs(delta - 1) < 1e-16) break;
  }
  return std::exp(-x + a * std::log(x) - std::lgamma(a)) * h;
}

}  // namespace

double gamma_q(double a, double x) {
  if (a <= 0 || x < 0) throw std::invalid_argument("gamma_q: a > 0 and x >= 0 required");
  if (x == 0) return 1.0;
  return x < a + 1 ? 1.0 - gamma_p_series(a, x) : gamma_q_fraction(a, x);
}

double chi2_survival(double x, double dof) { return x <= 0 ? 1.0 : gamma_q(dof / 2, x / 2); }

double chi2_quantile(double p, double dof) {
  if (!(p > 0 && p < 1) || dof <= 0) throw std::invalid_argument("chi2_quantile: 0 < p < 1, dof > 0");
  double lo = 0, hi = dof + 10;
  while (1 - chi2_survival(hi, dof) < p) hi *= 2;
  for (int i = 0; i < 200 && hi - lo > 1e-14 * hi; ++i) {
    const double mid = 0.5 * (lo + hi);
    (1 - chi2_survival(mid, dof) < p ? lo : hi) = mid;
  }
  return 0.5 * (lo + hi);
}

double normal_quantile(double p) {
  if (!(p > 0 && p < 1)) throw std::invalid_argument("normal_quantile: 0 < p < 1");
  // Bisection on Phi(z) = erfc(-z / sqrt 2) / 2, which is exact to rounding.
  double lo = -40, hi = 40;
  for (int i = 0; i < 200; ++i) {
    const double mid = 0.5 * (lo + hi);
    (0.5 * std::erfc(-mid / std::sqrt(2.0)) < p ? lo : hi) = mid;
  }
  return 0.5 * (lo + hi);
}

}  // namespace vicinal::fit
