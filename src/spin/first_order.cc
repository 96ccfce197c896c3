#include "spin/first_order.h"

#include <fmt/format.h>

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>
#include <numeric>
#include <tuple>

#include "core/error.h"

namespace vicinal::spin {

namespace {

double binomial(int n, int k) {
  double r = 1;
  for (int i = 1; i <= k; ++i) r = r * (n - k + i) / i;
  return r;
}

// One line of a splitting tree: its weight (binomial product) and how far
// each coupling group moves it, in units of that group's J.
struct Component {
  double offset_hz = 0;     // from the lowest line
  double weight = 1;
  std::vector<double> arm;  // u_g - n_g / 2 for each group
};

std::vector<Component> tree_components(const std::vector<CouplingGroup>& groups) {
  std::vector<Component> out{{0, 1, {}}};
  for (const auto& g : groups) {
    std::vector<Component> next;
    for (const auto& c : out)
      for (int up = 0; up <= g.partners; ++up) {
        Component d = c;
        d.offset_hz += g.j_hz * up;
        d.weight *= binomial(g.partners, up);
        d.arm.push_back(up - g.partners / 2.0);
        next.push_back(std::move(d));
      }
    out = std::move(next);
  }
  std::sort(out.begin(), out.end(), [](const Component& a, const Component& b) { return a.offset_hz < b.offset_hz; });
  return out;
}

class TreeSearch {
 public:
  TreeSearch(std::vector<double> hz, std::vector<double> intensity, const FirstOrderOptions& o)
      : hz_(std::move(hz)), intensity_(std::move(intensity)), o_(o) {
    for (double p : hz_) offsets_.push_back(p - hz_.front());
    span_ = offsets_.back();
  }

  std::vector<TreeFit> run() {
    std::vector<std::size_t> chosen;
    std::vector<double> sums{0.0};
    descend(offsets_.size() - 1, chosen, sums, 0.0);
    return std::move(found_);
  }
  bool truncated() const { return nodes_ > kMaxNodes; }

 private:
  static constexpr long kMaxNodes = 2'000'000;

  // Is `offset` one of the peak offsets (within the search tolerance)?
  bool is_peak_offset(double offset) const {
    const double slack = 2 * o_.tolerance_hz;
    auto it = std::lower_bound(offsets_.begin(), offsets_.end(), offset - slack);
    return it != offsets_.end() && *it <= offset + slack;
  }

  // Chooses couplings in non-increasing order among the peak offsets; every
  // partial sum of the chosen couplings must itself be a peak offset.
  void descend(std::size_t max_index, std::vector<std::size_t>& chosen, std::vector<double>& sums, double total) {
    if (++nodes_ > kMaxNodes) return;
    const double slack = 2 * o_.tolerance_hz;
    if (!chosen.empty() && std::abs(total - span_) <= slack) evaluate(chosen);
    if (static_cast<int>(chosen.size()) >= o_.max_couplings) return;
    for (std::size_t i = max_index; i >= 1; --i) {
      const double j = offsets_[i];
      if (total + j > span_ + slack) continue;
      const std::size_t before = sums.size();
      bool ok = true;
      for (std::size_t k = 0; k < before && ok; ++k) ok = is_peak_offset(sums[k] + j);
      if (ok) {
        for (std::size_t k = 0; k < before; ++k) sums.push_back(sums[k] + j);
        chosen.push_back(i);
        descend(i, chosen, sums, total + j);
        chosen.pop_back();
        sums.resize(before);
      }
    }
  }

  void evaluate(const std::vector<std::size_t>& chosen) {
    std::vector<CouplingGroup> groups;
    for (std::size_t k = 0; k < chosen.size(); ++k) {
      if (k > 0 && chosen[k] == chosen[k - 1])
        ++groups.back().partners;
      else
        groups.push_back({offsets_[chosen[k]], 1});
    }
    auto components = tree_components(groups);
    // Lines of the tree closer than the tolerance are one observed peak.
    std::vector<std::size_t> peak_of(components.size());
    std::size_t peak = 0;
    for (std::size_t c = 1; c < components.size(); ++c) {
      if (components[c].offset_hz - components[c - 1].offset_hz > o_.tolerance_hz) ++peak;
      peak_of[c] = peak;
    }
    if (peak + 1 != hz_.size()) return;

    // Least squares for the centre and one J per group, each tree line
    // weighted by its multiplicity and pulled to the peak it falls in.
    const auto rows = static_cast<Eigen::Index>(components.size());
    const auto cols = static_cast<Eigen::Index>(groups.size() + 1);
    Eigen::MatrixXd a(rows, cols);
    Eigen::VectorXd b(rows);
    for (Eigen::Index r = 0; r < rows; ++r) {
      const auto& c = components[static_cast<std::size_t>(r)];
      const double w = std::sqrt(c.weight);
      a(r, 0) = w;
      for (std::size_t g = 0; g < groups.size(); ++g) a(r, static_cast<Eigen::Index>(g + 1)) = w * c.arm[g];
      b(r) = w * hz_[peak_of[static_cast<std::size_t>(r)]];
    }
    const Eigen::VectorXd x = a.colPivHouseholderQr().solve(b);
    TreeFit fit;
    fit.center_hz = x(0);
    for (std::size_t g = 0; g < groups.size(); ++g) {
      fit.groups.push_back({x(static_cast<Eigen::Index>(g + 1)), groups[g].partners});
      if (!(fit.groups.back().j_hz > 0)) return;
    }
    std::vector<double> position(hz_.size(), 0.0), weight(hz_.size(), 0.0);
    std::vector<int> lines(hz_.size(), 0);
    for (std::size_t c = 0; c < components.size(); ++c) {
      double at = fit.center_hz;
      for (std::size_t g = 0; g < groups.size(); ++g) at += fit.groups[g].j_hz * components[c].arm[g];
      position[peak_of[c]] += components[c].weight * at;
      weight[peak_of[c]] += components[c].weight;
      lines[peak_of[c]] += static_cast<int>(std::lround(components[c].weight));
    }
    double sum_sq = 0;
    for (std::size_t p = 0; p < hz_.size(); ++p) {
      const double predicted = position[p] / weight[p];
      const double deviation = std::abs(hz_[p] - predicted);
      if (deviation > o_.tolerance_hz) return;
      fit.max_deviation_hz = std::max(fit.max_deviation_hz, deviation);
      sum_sq += deviation * deviation;
      fit.peaks.push_back({predicted, lines[p]});
    }
    fit.residual_hz = std::sqrt(sum_sq / static_cast<double>(hz_.size()));

    if (!intensity_.empty()) {
      const double observed_total = std::accumulate(intensity_.begin(), intensity_.end(), 0.0);
      const double lines_total = std::accumulate(weight.begin(), weight.end(), 0.0);
      double misfit = 0;
      for (std::size_t p = 0; p < hz_.size(); ++p) {
        const double observed = intensity_[p] / observed_total * lines_total;
        misfit += std::pow((observed - weight[p]) / weight[p], 2);
      }
      fit.intensity_error = std::sqrt(misfit / static_cast<double>(hz_.size()));
    }
    std::stable_sort(fit.groups.begin(), fit.groups.end(),
                     [](const CouplingGroup& p, const CouplingGroup& q) { return p.j_hz > q.j_hz; });
    found_.push_back(std::move(fit));
  }

  std::vector<double> hz_, intensity_, offsets_;
  double span_ = 0;
  FirstOrderOptions o_;
  std::vector<TreeFit> found_;
  long nodes_ = 0;
};

}  // namespace

std::string multiplicity_letter(int partners) {
  static const char* names[] = {"s", "d", "t", "q", "quint", "sext", "sept", "oct"};
  if (partners >= 0 && partners < 8) return names[partners];
  return fmt::format("m{}", partners);
}

int TreeFit::coupling_count() const {
  int n = 0;
  for (const auto& g : groups) n += g.partners;
  return n;
}

std::vector<double> TreeFit::couplings_hz() const {
  std::vector<double> out;
  for (const auto& g : groups) out.push_back(g.j_hz);
  return out;
}

std::string TreeFit::multiplicity() const {
  if (groups.empty()) return "s";
  std::string out;
  for (const auto& g : groups) out += multiplicity_letter(g.partners);
  return out;
}

std::string TreeFit::notation() const {
  if (groups.empty()) return "s";
  std::string js;
  for (const auto& g : groups) js += fmt::format("{}{:.1f}", js.empty() ? "" : ", ", g.j_hz);
  return fmt::format("{}, J = {} Hz", multiplicity(), js);
}

FirstOrderResult analyse_first_order(const PeakList& input, const FirstOrderOptions& o) {
  if (!(o.tolerance_hz > 0)) throw Error("the tolerance must be positive", Location::field_in("", "--tolerance-hz"));
  if (!(o.intensity_tolerance > 0))
    throw Error("the intensity tolerance must be positive", Location::field_in("", "--intensity-tolerance"));
  if (input.hz.size() < 2)
    throw Error(input.hz.empty() ? "no peaks given" : "one peak is a singlet: there are no couplings to read",
                {}, "give every resolved line of the multiplet");
  if (input.hz.size() > 128)
    throw Error(fmt::format("{} peaks are more than a first-order analysis handles (128)", input.hz.size()));
  if (!input.intensity.empty() && input.intensity.size() != input.hz.size())
    throw Error("give an intensity for every peak or for none");
  std::vector<std::size_t> order(input.hz.size());
  std::iota(order.begin(), order.end(), 0);
  for (std::size_t i = 0; i < input.hz.size(); ++i) {
    if (!std::isfinite(input.hz[i])) throw Error(fmt::format("peak {} is not a finite position", i + 1));
    if (!input.intensity.empty() && !(input.intensity[i] > 0 && std::isfinite(input.intensity[i])))
      throw Error(fmt::format("peak {} has intensity {}; intensities must be positive", i + 1, input.intensity[i]));
  }
  std::sort(order.begin(), order.end(), [&](std::size_t a, std::size_t b) { return input.hz[a] < input.hz[b]; });
  std::vector<double> hz, intensity;
  for (std::size_t i : order) {
    hz.push_back(input.hz[i]);
    if (!input.intensity.empty()) intensity.push_back(input.intensity[i]);
  }
  for (std::size_t i = 1; i < hz.size(); ++i)
    if (hz[i] - hz[i - 1] <= o.tolerance_hz)
      throw Error(fmt::format("peaks at {:.3f} and {:.3f} Hz are closer than the tolerance ({} Hz)", hz[i - 1],
                              hz[i], o.tolerance_hz),
                  {}, "list each resolved line once, or lower --tolerance-hz");

  TreeSearch search(hz, intensity, o);
  auto trees = search.run();
  if (trees.empty())
    throw Error(fmt::format("no first-order splitting tree reproduces the {} peaks within {} Hz", hz.size(),
                            o.tolerance_hz),
                {}, "check for missing or extra lines, widen --tolerance-hz, or give partner shifts if the "
                    "multiplet is second order");

  const bool with_intensity = !intensity.empty();
  const auto consistent = [&](const TreeFit& t) {
    return !with_intensity || t.intensity_error <= o.intensity_tolerance;
  };
  const auto score = [&](const TreeFit& t) {
    double s = std::pow(t.residual_hz / o.tolerance_hz, 2);
    if (with_intensity) s += std::pow(t.intensity_error / o.intensity_tolerance, 2);
    return s;
  };
  // Consistent trees first, then the simplest (fewest couplings), then the closest.
  std::stable_sort(trees.begin(), trees.end(), [&](const TreeFit& a, const TreeFit& b) {
    return std::make_tuple(!consistent(a), a.coupling_count(), score(a)) <
           std::make_tuple(!consistent(b), b.coupling_count(), score(b));
  });
  FirstOrderResult result;
  result.search_truncated = search.truncated();
  result.ambiguous = trees.size() > 1 && consistent(trees[0]) && consistent(trees[1]);
  if (trees.size() > o.max_results) trees.resize(o.max_results);
  result.trees = std::move(trees);
  return result;
}

}  // namespace vicinal::spin
