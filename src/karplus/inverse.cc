// Inverse map J -> dihedral intervals. Between two neighbouring extrema the
// curve is monotonic, so on each such segment the set {t : |J(t) - j| <= tol}
// is one interval (possibly empty) whose ends are found by bisection, and
// J(t) = j has at most one root there. Working segment by segment means a
// band that only touches an extremum, or a root at an extremum (tangential
// touch), is still found: the extremum itself is a segment end.
#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "core/error.h"
#include "karplus/curve.h"
#include "karplus/karplus.h"

namespace vicinal::karplus {

namespace {

// A computed J within this of the measured value counts as equal (J at a
// refined extremum is exact to ~1e-12 Hz, see range.cc).
constexpr double kEqualHz = 1e-9;

double wrap_deg(double a) { return a - 360.0 * std::floor((a + 180.0) / 360.0); }

// Solves f(t) = level for an increasing f on [a, b] with f(a) <= level <= f(b).
template <class F>
double bisect(const F& f, double a, double b, double level) {
  for (int i = 0; i < 200 && b - a > 1e-11; ++i) {
    const double m = (a + b) / 2;
    (f(m) < level ? a : b) = m;
  }
  return (a + b) / 2;
}

struct Span {
  double from, to;  // unwrapped degrees
};

void check_inputs(const ParameterSet& set, double j, double sigma, double k) {
  if (!std::isfinite(j)) throw Error("the coupling must be a finite number of Hz", {}, "give J in Hz, e.g. 7.4");
  if (!std::isfinite(sigma) || sigma < 0)
    throw Error(fmt::format("the uncertainty must be a finite number >= 0 Hz, not {}", sigma));
  if (!std::isfinite(k) || k <= 0)
    throw Error(fmt::format("the coverage factor k must be a finite number > 0, not {}", k), {},
                "k = 2 covers about 95 % of a normal error");
  if (!std::isfinite(set.rms_hz) || set.rms_hz < 0)
    throw Error(fmt::format("set '{}' has an invalid rms_hz", set.id), {set.file});
}

}  // namespace

AngleSolution allowed_dihedrals(const ParameterSet& set, double j, double sigma, double k,
                                std::span<const Substituent> substituents) {
  check_inputs(set, j, sigma, k);
  const detail::Curve curve = detail::compile(set, substituents);
  AngleSolution sol;
  sol.j_hz = j;
  sol.sigma_hz = sigma;
  sol.k = k;
  sol.tolerance_hz = k * std::hypot(sigma, set.rms_hz);
  sol.range = j_range(set, substituents);
  const double tol = sol.tolerance_hz, lo = j - tol - kEqualHz, hi = j + tol + kEqualHz;
  const auto& r = sol.range;
  if (lo > r.max_hz || hi < r.min_hz) {
    const bool above = lo > r.max_hz;
    throw Error(fmt::format("J = {:g} Hz is outside the curve of set '{}': it reaches {:.2f} to {:.2f} Hz; the nearest "
                            "attainable J is {:.2f} Hz at {} = {:.1f} deg (tolerance +-{:.2f} Hz)",
                            j, set.id, r.min_hz, r.max_hz, above ? r.max_hz : r.min_hz, set.angle_name,
                            above ? r.max_at_deg : r.min_at_deg, tol),
                {}, "check the value and the set; a larger uncertainty widens the tolerance");
  }

  // Segment ends: the extrema, once around the circle starting at the first.
  const auto ext = detail::extrema(curve);
  std::vector<double> ends;
  for (const auto& e : ext) ends.push_back(e.at_deg);
  if (ends.empty()) ends.push_back(-180.0);  // flat curve: one segment, the whole turn
  const double start = ends.front();
  ends.push_back(start + 360.0);

  std::vector<Span> spans;
  std::vector<double> roots;
  for (std::size_t s = 0; s + 1 < ends.size(); ++s) {
    const double a = ends[s], b = ends[s + 1];
    const double ja = curve.at_deg(a), jb = curve.at_deg(b);
    const double sign = jb >= ja ? 1.0 : -1.0;  // work on the increasing function sign * J
    const auto f = [&](double t) { return sign * curve.at_deg(t); };
    const double fa = sign * ja, fb = sign * jb;
    const double low = sign > 0 ? lo : -hi, high = sign > 0 ? hi : -lo, level = sign * j;
    if (fb >= low && fa <= high) {
      const double from = fa >= low ? a : bisect(f, a, b, low);
      const double to = fb <= high ? b : bisect(f, a, b, high);
      if (!spans.empty() && from <= spans.back().to + 1e-9)
        spans.back().to = std::max(spans.back().to, to);
      else
        spans.push_back({from, to});
    }
    if (ext.empty()) continue;  // a flat curve equals J everywhere or nowhere: no isolated roots
    if (std::abs(ja - j) <= kEqualHz) roots.push_back(a);
    if (std::abs(jb - j) <= kEqualHz) roots.push_back(b);
    if (fa < level - kEqualHz && fb > level + kEqualHz) roots.push_back(bisect(f, a, b, level));
  }
  // The first and last spans meet at the starting extremum: one interval.
  if (spans.size() > 1 && spans.front().from <= start + 1e-9 && spans.back().to >= start + 360.0 - 1e-9) {
    spans.back().to = spans.front().to + 360.0;
    spans.erase(spans.begin());
  }

  for (double& t : roots) t = wrap_deg(t);
  std::sort(roots.begin(), roots.end());
  for (double t : roots)
    if (sol.exact_deg.empty() || t - sol.exact_deg.back() > 1e-6) sol.exact_deg.push_back(t);
  if (sol.exact_deg.size() > 1 && sol.exact_deg.front() + 360.0 - sol.exact_deg.back() <= 1e-6)
    sol.exact_deg.pop_back();

  // Where J comes closest to the measured value inside [from, to]: an exact
  // root if there is one, else an end or an extremum inside.
  const auto best_in = [&](double from, double to) {
    std::vector<double> candidates{from, to};
    for (double t : sol.exact_deg) candidates.push_back(t);
    for (const auto& e : ext) candidates.push_back(e.at_deg);
    double best = from, best_miss = INFINITY;
    for (double t : candidates) {
      if (t < from - 1e-9 || t > to + 1e-9) continue;
      const double miss = std::abs(curve.at_deg(t) - j);
      if (miss < best_miss) best = t, best_miss = miss;
    }
    return best;
  };
  const auto add = [&](double from, double to, bool wraps) {
    from = std::clamp(from, -180.0, 180.0);
    to = std::clamp(to, -180.0, 180.0);
    sol.intervals.push_back({from, to, best_in(from, to), wraps});
  };
  for (const Span& sp : spans) {
    if (sp.to - sp.from >= 360.0 - 1e-9) {
      add(-180.0, 180.0, false);
      continue;
    }
    const double from = wrap_deg(sp.from), to = from + (sp.to - sp.from);
    if (to <= 180.0) {
      add(from, to, false);
    } else {
      add(from, 180.0, true);
      add(-180.0, to - 360.0, true);
    }
  }
  std::sort(sol.intervals.begin(), sol.intervals.end(),
            [](const AngleInterval& a, const AngleInterval& b) { return a.from_deg < b.from_deg; });
  return sol;
}

}  // namespace vicinal::karplus
