#include "spin/simulate.h"

#include <fmt/format.h>

#include <Eigen/Dense>
#include <algorithm>
#include <cmath>
#include <atomic>
#include <map>
#include <numeric>
#include <thread>

#include "core/error.h"

namespace vicinal::spin {

namespace {

// Spin quantum numbers are handled as twice their value so that they stay integers.

// How many product states of `count` spins of spin I (= twice_i / 2) have each
// total twice-M, indexed by (twice_M + count * twice_i) / 2.
std::vector<double> m_distribution(int count, int twice_i) {
  std::vector<double> dist{1.0};
  for (int n = 0; n < count; ++n) {
    std::vector<double> next(dist.size() + twice_i, 0.0);
    for (std::size_t k = 0; k < dist.size(); ++k)
      for (int step = 0; step <= twice_i; ++step) next[k + step] += dist[k];
    dist = std::move(next);
  }
  return dist;
}

struct Composite {
  int twice_s;
  double multiplicity;  // how many times this total spin occurs in the group
};

// Total-spin components of `count` equivalent spins: the number of
// multiplets with spin S is N(M = S) - N(M = S + 1).
std::vector<Composite> composite_spins(int count, int twice_i) {
  const auto dist = m_distribution(count, twice_i);
  const int twice_max = count * twice_i;
  std::vector<Composite> out;
  for (int twice_s = twice_max; twice_s >= 0; twice_s -= 2) {
    const auto at = [&](int twice_m) -> double {
      const int k = (twice_m + twice_max) / 2;
      return k >= 0 && k < static_cast<int>(dist.size()) ? dist[k] : 0.0;
    };
    const double d = at(twice_s) - at(twice_s + 2);
    if (d > 0.5) out.push_back({twice_s, d});
  }
  return out;
}

// <m+1|S+|m> for spin S, with twice-values.
double raise_factor(int twice_s, int twice_m) {
  const double s = twice_s / 2.0, m = twice_m / 2.0;
  return std::sqrt(s * (s + 1) - m * (m + 1));
}

struct RawLine {
  double hz, intensity;
};

// Exact spectrum of the observed groups for one set of composite spins.
// nu_hz: frequency of each group; j_hz: couplings between groups.
class CompositeProblem {
 public:
  CompositeProblem(std::vector<int> twice_s, const std::vector<double>& nu_hz,
                   const Eigen::MatrixXd& j_hz, double weight, std::size_t max_block)
      : twice_s_(std::move(twice_s)), nu_(nu_hz), j_(j_hz), weight_(weight) {
    const std::size_t groups = twice_s_.size();
    radix_.resize(groups);
    std::size_t total = 1;
    for (std::size_t g = 0; g < groups; ++g) {
      radix_[g] = total;
      total *= static_cast<std::size_t>(twice_s_[g] + 1);
    }
    int twice_max = 0;
    for (int s : twice_s_) twice_max += s;
    blocks_.assign(static_cast<std::size_t>(twice_max) + 1, {});
    position_.assign(total, 0);
    for (std::size_t state = 0; state < total; ++state) {
      const std::size_t b = (twice_total_m(state) + twice_max) / 2;
      position_[state] = blocks_[b].size();
      blocks_[b].push_back(state);
    }
    for (const auto& b : blocks_) largest_ = std::max(largest_, b.size());
    if (largest_ > max_block)
      throw Error(fmt::format("the spin system is too large: its largest Fz block has {} states "
                              "(limit {}, about 12 independent spin-1/2 nuclei)",
                              largest_, max_block),
                  {}, "use 'count' for magnetically equivalent nuclei or split the system into parts "
                      "that are not coupled");
  }

  std::size_t largest_block() const { return largest_; }

  // Diagonalises every block (the largest first, spread over `threads`), then
  // collects the F- transitions between neighbouring blocks.
  void add_lines(std::vector<RawLine>& out, int threads) const {
    const std::size_t n = blocks_.size();
    std::vector<Eigen::VectorXd> energy(n);
    std::vector<Eigen::MatrixXd> vectors(n);
    std::vector<std::size_t> order(n);
    std::iota(order.begin(), order.end(), 0);
    std::sort(order.begin(), order.end(),
              [&](std::size_t a, std::size_t b) { return blocks_[a].size() > blocks_[b].size(); });
    std::atomic<std::size_t> next{0};
    const auto work = [&] {
      for (std::size_t k; (k = next++) < n;) {
        const std::size_t b = order[k];
        Eigen::SelfAdjointEigenSolver<Eigen::MatrixXd> solver(block_hamiltonian(b));
        energy[b] = solver.eigenvalues();
        vectors[b] = solver.eigenvectors();
      }
    };
    std::vector<std::thread> pool;
    const std::size_t helpers = std::min<std::size_t>(static_cast<std::size_t>(std::max(threads, 1)), n) - 1;
    for (std::size_t t = 0; t < helpers; ++t) pool.emplace_back(work);
    work();
    for (auto& t : pool) t.join();
    for (std::size_t b = 1; b < n; ++b) add_transitions(b, energy[b], vectors[b], energy[b - 1], vectors[b - 1], out);
  }

 private:
  int twice_m(std::size_t state, std::size_t g) const {
    const int index = static_cast<int>((state / radix_[g]) % static_cast<std::size_t>(twice_s_[g] + 1));
    return twice_s_[g] - 2 * index;  // index 0 is m = +S
  }
  int twice_total_m(std::size_t state) const {
    int sum = 0;
    for (std::size_t g = 0; g < twice_s_.size(); ++g) sum += twice_m(state, g);
    return sum;
  }

  Eigen::MatrixXd block_hamiltonian(std::size_t b) const {
    const auto& states = blocks_[b];
    const std::size_t n = states.size(), groups = twice_s_.size();
    Eigen::MatrixXd h = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(n), static_cast<Eigen::Index>(n));
    std::vector<int> m(groups);
    for (std::size_t col = 0; col < n; ++col) {
      const std::size_t state = states[col];
      for (std::size_t g = 0; g < groups; ++g) m[g] = twice_m(state, g);
      double diagonal = 0;
      for (std::size_t g = 0; g < groups; ++g) {
        diagonal += nu_[g] * m[g] / 2.0;
        for (std::size_t k = g + 1; k < groups; ++k) diagonal += j_(g, k) * m[g] * m[k] / 4.0;
      }
      h(col, col) = diagonal;
      // Flip-flop terms J/2 (S+_g S-_k + S-_g S+_k): fill the lower triangle only.
      for (std::size_t g = 0; g < groups; ++g) {
        if (m[g] == twice_s_[g]) continue;  // S+ on g would vanish
        for (std::size_t k = 0; k < groups; ++k) {
          if (k == g || j_(g, k) == 0 || m[k] == -twice_s_[k]) continue;
          // state' has m_g + 1, m_k - 1; index 0 is +S, so the digit of g drops by one.
          const std::size_t target = state - radix_[g] + radix_[k];
          const std::size_t row = position_[target];
          if (row <= col) continue;
          h(row, col) = 0.5 * j_(g, k) * raise_factor(twice_s_[g], m[g]) * raise_factor(twice_s_[k], m[k] - 2);
        }
      }
    }
    return h;
  }

  // Transitions from block `upper` (total M) to block upper - 1 under F-.
  void add_transitions(std::size_t upper, const Eigen::VectorXd& e_upper, const Eigen::MatrixXd& v_upper,
                       const Eigen::VectorXd& e_lower, const Eigen::MatrixXd& v_lower,
                       std::vector<RawLine>& out) const {
    const auto& states = blocks_[upper];
    // w = F- V_upper, built from the sparse action of F- on each basis state.
    Eigen::MatrixXd w = Eigen::MatrixXd::Zero(v_lower.rows(), v_upper.cols());
    for (std::size_t col = 0; col < states.size(); ++col) {
      const std::size_t state = states[col];
      for (std::size_t g = 0; g < twice_s_.size(); ++g) {
        const int m = twice_m(state, g);
        if (m == -twice_s_[g]) continue;
        const double factor = raise_factor(twice_s_[g], m - 2);  // <m-1|S-|m> = <m|S+|m-1>
        w.row(static_cast<Eigen::Index>(position_[state + radix_[g]])) +=
            factor * v_upper.row(static_cast<Eigen::Index>(col));
      }
    }
    const Eigen::MatrixXd amplitude = v_lower.transpose() * w;
    for (Eigen::Index i = 0; i < amplitude.cols(); ++i)
      for (Eigen::Index f = 0; f < amplitude.rows(); ++f) {
        const double a = amplitude(f, i);
        if (a * a > 1e-12) out.push_back({e_upper(i) - e_lower(f), weight_ * a * a});
      }
  }

  std::vector<int> twice_s_;
  std::vector<double> nu_;
  Eigen::MatrixXd j_;
  double weight_;
  std::vector<std::size_t> radix_;
  std::vector<std::vector<std::size_t>> blocks_;  // states of each block, by (2M + max) / 2
  std::vector<std::size_t> position_;             // index of each state inside its block
  std::size_t largest_ = 0;
};

int twice_spin(const Nucleus& n) { return static_cast<int>(std::lround(2 * n.spin)); }

}  // namespace

std::vector<Line> merge_lines(std::vector<Line> lines, double tolerance_hz) {
  std::sort(lines.begin(), lines.end(), [](const Line& a, const Line& b) { return a.hz < b.hz; });
  std::vector<Line> merged;
  for (const auto& line : lines) {
    if (!merged.empty() && line.hz - merged.back().hz <= tolerance_hz) {
      Line& m = merged.back();
      const double total = m.intensity + line.intensity;
      if (total > 0) {
        m.hz = (m.hz * m.intensity + line.hz * line.intensity) / total;
        m.ppm = (m.ppm * m.intensity + line.ppm * line.intensity) / total;
      }
      m.intensity = total;
    } else {
      merged.push_back(line);
    }
  }
  return merged;
}

Simulation simulate(const SpinSystem& system, const SimulationOptions& options) {
  check_spin_system(system, "spin system");
  const auto& table = NuclearTable::shipped();
  std::vector<std::string> decoupled;
  for (const auto& name : options.decouple) {
    const Nucleus& n = table.find(name);
    if (n.isotope == system.observe.isotope)
      throw Error(fmt::format("cannot decouple the observed isotope {}", n.isotope),
                  Location::field_in("", "--decouple"));
    decoupled.push_back(n.isotope);
  }
  const auto is_decoupled = [&](const SpinGroup& g) {
    return std::find(decoupled.begin(), decoupled.end(), g.nucleus.isotope) != decoupled.end();
  };

  const int threads = options.threads > 0 ? options.threads
                                          : static_cast<int>(std::max(1u, std::thread::hardware_concurrency()));
  Simulation result;
  result.observe_mhz = system.observe_mhz();

  std::vector<std::size_t> observed, hetero;
  for (std::size_t i = 0; i < system.groups.size(); ++i) {
    const auto& g = system.groups[i];
    if (system.is_observed(g)) {
      observed.push_back(i);
    } else if (!is_decoupled(g) && twice_spin(g.nucleus) > 0) {
      bool coupled = false;
      for (std::size_t k = 0; k < system.groups.size(); ++k)
        if (system.is_observed(system.groups[k]) && system.coupling_hz(i, k) != 0) coupled = true;
      if (coupled) hetero.push_back(i);
    }
  }

  const std::size_t n_obs = observed.size();
  std::vector<double> nu(n_obs);
  Eigen::MatrixXd j = Eigen::MatrixXd::Zero(static_cast<Eigen::Index>(n_obs), static_cast<Eigen::Index>(n_obs));
  for (std::size_t a = 0; a < n_obs; ++a) {
    nu[a] = system.groups[observed[a]].shift_ppm * result.observe_mhz;
    for (std::size_t b = 0; b < n_obs; ++b)
      if (a != b) j(a, b) = system.coupling_hz(observed[a], observed[b]);
  }

  // Heteronuclear combinations: distinct frequency offsets of the observed
  // groups, each with the number of heteronuclear states that produce it.
  std::map<std::vector<double>, double> offsets{{std::vector<double>(n_obs, 0.0), 1.0}};
  for (std::size_t h : hetero) {
    const auto& g = system.groups[h];
    const int twice_i = twice_spin(g.nucleus);
    const auto dist = m_distribution(g.count, twice_i);
    const int twice_max = g.count * twice_i;
    std::map<std::vector<double>, double> next;
    for (const auto& [offset, weight] : offsets)
      for (std::size_t k = 0; k < dist.size(); ++k) {
        const double m = (2.0 * static_cast<double>(k) - twice_max) / 2.0;
        auto shifted = offset;
        for (std::size_t a = 0; a < n_obs; ++a) shifted[a] += system.coupling_hz(observed[a], h) * m;
        next[shifted] += weight * dist[k];
      }
    offsets = std::move(next);
    if (offsets.size() > 100000)
      throw Error("too many heteronuclear spin states to combine",
                  {}, "decouple an isotope with --decouple or reduce the heteronuclear groups");
  }
  result.heteronuclear_states = offsets.size();

  // Composite spins of each observed group; every combination is one problem.
  std::vector<std::vector<Composite>> composites;
  for (std::size_t a : observed)
    composites.push_back(composite_spins(system.groups[a].count, twice_spin(system.groups[a].nucleus)));

  std::vector<RawLine> raw;
  std::vector<std::size_t> choice(n_obs, 0);
  while (true) {
    std::vector<int> twice_s(n_obs);
    double weight = 1;
    for (std::size_t a = 0; a < n_obs; ++a) {
      twice_s[a] = composites[a][choice[a]].twice_s;
      weight *= composites[a][choice[a]].multiplicity;
    }
    // Groups whose composite spin is 0 give no lines and no couplings: drop them.
    std::vector<std::size_t> active;
    for (std::size_t a = 0; a < n_obs; ++a)
      if (twice_s[a] > 0) active.push_back(a);
    if (!active.empty()) {
      std::vector<int> s_active;
      Eigen::MatrixXd j_active(static_cast<Eigen::Index>(active.size()), static_cast<Eigen::Index>(active.size()));
      for (std::size_t x = 0; x < active.size(); ++x) {
        s_active.push_back(twice_s[active[x]]);
        for (std::size_t y = 0; y < active.size(); ++y) j_active(x, y) = j(active[x], active[y]);
      }
      for (const auto& [offset, hetero_weight] : offsets) {
        std::vector<double> nu_active;
        for (std::size_t a : active) nu_active.push_back(nu[a] + offset[a]);
        CompositeProblem problem(s_active, nu_active, j_active, weight * hetero_weight, options.max_block_states);
        result.largest_block = std::max(result.largest_block, problem.largest_block());
        problem.add_lines(raw, threads);
      }
    }
    std::size_t a = 0;
    for (; a < n_obs; ++a) {
      if (++choice[a] < composites[a].size()) break;
      choice[a] = 0;
    }
    if (a == n_obs) break;
  }

  double total = 0;
  for (const auto& l : raw) total += l.intensity;
  double nuclei = 0;
  for (std::size_t a : observed) nuclei += system.groups[a].count;
  std::vector<Line> lines;
  lines.reserve(raw.size());
  for (const auto& l : raw)
    lines.push_back({l.hz, l.hz / result.observe_mhz, total > 0 ? l.intensity * nuclei / total : 0.0});
  lines = merge_lines(std::move(lines), options.merge_tolerance_hz);
  double strongest = 0;
  for (const auto& l : lines) strongest = std::max(strongest, l.intensity);
  std::erase_if(lines, [&](const Line& l) { return l.intensity < options.min_relative_intensity * strongest; });
  result.lines = std::move(lines);
  return result;
}

}  // namespace vicinal::spin
