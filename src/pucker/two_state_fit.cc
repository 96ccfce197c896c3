#include "pucker/two_state_fit.h"

#include <ceres/ceres.h>
#include <fmt/format.h>

#include <cmath>
#include <limits>
#include <random>

#include "core/error.h"

namespace vicinal::pucker {

namespace {

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

// Residuals (J_obs - J_calc) / sigma. The parameter blocks are the five
// scalars in Parameter order, with nu_max,S left out when tied to nu_max,N.
class RingResiduals {
 public:
  RingResiduals(const RingCouplings& model, const std::vector<MeasuredRingCoupling>& measured, bool tied)
      : model_(model), measured_(measured), tied_(tied) {}

  bool operator()(double const* const* p, double* residuals) const {
    const double pn = p[0][0], an = p[1][0], ps = p[2][0];
    const double as = tied_ ? an : p[3][0];
    const double x = p[tied_ ? 3 : 4][0];
    for (std::size_t i = 0; i < measured_.size(); ++i) {
      const auto& m = measured_[i];
      const double j = (1 - x) * model_.j_hz(m.coupling, pn, an) + x * model_.j_hz(m.coupling, ps, as);
      residuals[i] = (m.j_hz - j) / m.sigma_hz;
    }
    return true;
  }

 private:
  const RingCouplings& model_;
  const std::vector<MeasuredRingCoupling>& measured_;
  bool tied_;
};

std::vector<int> block_parameters(bool tied) {
  if (tied) return {kPhaseN, kAmplitudeN, kPhaseS, kFractionS};
  return {kPhaseN, kAmplitudeN, kPhaseS, kAmplitudeS, kFractionS};
}

struct Solved {
  std::array<double, kParameterCount> value;
  double chi2;
  bool covariance_ok = false;
  std::array<double, kParameterCount> sd;
};

// One local Ceres solve from `start`; `fixed` parameters keep their start value.
Solved solve(const RingCouplings& model, const std::vector<MeasuredRingCoupling>& measured,
             std::array<double, kParameterCount> start, const std::array<bool, kParameterCount>& fixed,
             bool tied, bool want_covariance) {
  Solved s;
  s.value = start;
  s.sd.fill(kNaN);
  if (tied) s.value[kAmplitudeS] = s.value[kAmplitudeN];
  const auto blocks = block_parameters(tied);
  auto* cost = new ceres::DynamicNumericDiffCostFunction<RingResiduals, ceres::CENTRAL>(
      new RingResiduals(model, measured, tied));
  std::vector<double*> pointers;
  for (int b : blocks) {
    cost->AddParameterBlock(1);
    pointers.push_back(&s.value[b]);
  }
  cost->SetNumResiduals(static_cast<int>(measured.size()));
  ceres::Problem problem;
  problem.AddResidualBlock(cost, nullptr, pointers);
  std::vector<const double*> free_blocks;
  for (std::size_t k = 0; k < blocks.size(); ++k) {
    const int b = blocks[k];
    if (fixed[b]) {
      problem.SetParameterBlockConstant(pointers[k]);
      continue;
    }
    const auto bounds = parameter_bounds(b);
    s.value[b] = std::clamp(s.value[b], bounds[0], bounds[1]);
    problem.SetParameterLowerBound(pointers[k], 0, bounds[0]);
    problem.SetParameterUpperBound(pointers[k], 0, bounds[1]);
    free_blocks.push_back(pointers[k]);
  }
  ceres::Solver::Options options;
  options.max_num_iterations = 200;
  options.function_tolerance = 1e-12;
  options.parameter_tolerance = 1e-10;
  options.logging_type = ceres::SILENT;
  ceres::Solver::Summary summary;
  ceres::Solve(options, &problem, &summary);
  s.chi2 = 2.0 * summary.final_cost;
  if (tied) s.value[kAmplitudeS] = s.value[kAmplitudeN];

  if (want_covariance && !free_blocks.empty()) {
    ceres::Covariance::Options copt;
    copt.algorithm_type = ceres::DENSE_SVD;
    ceres::Covariance covariance(copt);
    std::vector<std::pair<const double*, const double*>> pairs;
    for (const double* b : free_blocks) pairs.emplace_back(b, b);
    if (covariance.Compute(pairs, &problem)) {
      s.covariance_ok = true;
      for (std::size_t k = 0; k < blocks.size(); ++k) {
        if (fixed[blocks[k]]) continue;
        double var = kNaN;
        covariance.GetCovarianceBlock(pointers[k], pointers[k], &var);
        s.sd[blocks[k]] = var >= 0 ? std::sqrt(var) : kNaN;
      }
      if (tied) s.sd[kAmplitudeS] = s.sd[kAmplitudeN];
    }
  }
  return s;
}

}  // namespace

std::string parameter_name(int p) {
  static const char* names[] = {"P_N", "nu_max_N", "P_S", "nu_max_S", "x_S"};
  return names[p];
}

std::array<double, 2> parameter_bounds(int p) {
  switch (p) {
    case kPhaseN: return {-90.0, 90.0};
    case kPhaseS: return {90.0, 270.0};
    case kFractionS: return {0.0, 1.0};
    default: return {15.0, 55.0};
  }
}

int free_parameter_count(const TwoStateOptions& o) {
  int n = 0;
  for (int p = 0; p < kParameterCount; ++p)
    if (!o.fixed[p] && !(o.tie_amplitudes && p == kAmplitudeS)) ++n;
  return n;
}

TwoStateFit fit_two_state(const RingCouplings& model, const std::vector<MeasuredRingCoupling>& measured,
                          const TwoStateOptions& options) {
  const int free = free_parameter_count(options);
  if (static_cast<int>(measured.size()) < free)
    throw Error(fmt::format("{} couplings cannot determine {} free parameters", measured.size(), free), {},
                "hold more parameters fixed (--fix), e.g. --fix amplitudes,pn");
  auto fixed = options.fixed;
  if (options.tie_amplitudes) fixed[kAmplitudeS] = fixed[kAmplitudeN];

  // The chi^2 surface has several minima (the Karplus curve is not monotonic):
  // start from a small grid around the given values and keep the best.
  Solved best;
  best.chi2 = std::numeric_limits<double>::infinity();
  for (double dn : {0.0, -45.0, 45.0})
    for (double ds : {0.0, -45.0, 45.0})
      for (double x : {options.start[kFractionS], 0.15, 0.85}) {
        auto start = options.start;
        if (!fixed[kPhaseN]) start[kPhaseN] += dn;
        if (!fixed[kPhaseS]) start[kPhaseS] += ds;
        if (!fixed[kFractionS]) start[kFractionS] = x;
        const Solved s = solve(model, measured, start, fixed, options.tie_amplitudes, false);
        if (s.chi2 < best.chi2 - 1e-12) best = s;
      }
  best = solve(model, measured, best.value, fixed, options.tie_amplitudes, true);

  TwoStateFit fit;
  fit.value = best.value;
  fit.sd = best.sd;
  fit.fixed = fixed;
  fit.tied_amplitudes = options.tie_amplitudes;
  fit.covariance_ok = best.covariance_ok;
  fit.chi2 = best.chi2;
  fit.n = static_cast<int>(measured.size());
  fit.free_parameters = free;
  for (int p = 0; p < kParameterCount; ++p) {
    const auto b = parameter_bounds(p);
    fit.at_bound[p] = !fixed[p] && (std::fabs(fit.value[p] - b[0]) < 1e-6 || std::fabs(fit.value[p] - b[1]) < 1e-6);
  }
  for (const auto& m : measured) {
    const double jn = model.j_hz(m.coupling, fit.value[kPhaseN], fit.value[kAmplitudeN]);
    const double js = model.j_hz(m.coupling, fit.value[kPhaseS], fit.value[kAmplitudeS]);
    fit.j_north_hz.push_back(jn);
    fit.j_south_hz.push_back(js);
    fit.j_calc_hz.push_back((1 - fit.value[kFractionS]) * jn + fit.value[kFractionS] * js);
  }
  return fit;
}

std::array<double, kParameterCount> monte_carlo_sd(const RingCouplings& model,
                                                   const std::vector<MeasuredRingCoupling>& measured,
                                                   const TwoStateOptions& options, const TwoStateFit& best,
                                                   int samples, std::uint64_t seed) {
  std::mt19937_64 rng(seed);
  std::normal_distribution<double> normal(0.0, 1.0);
  std::array<double, kParameterCount> sum{}, sum2{};
  for (int s = 0; s < samples; ++s) {
    auto perturbed = measured;
    for (auto& m : perturbed) m.j_hz += m.sigma_hz * normal(rng);
    const Solved r = solve(model, perturbed, best.value, best.fixed, options.tie_amplitudes, false);
    for (int p = 0; p < kParameterCount; ++p) {
      sum[p] += r.value[p];
      sum2[p] += r.value[p] * r.value[p];
    }
  }
  std::array<double, kParameterCount> sd;
  for (int p = 0; p < kParameterCount; ++p) {
    if (best.fixed[p] || samples < 2) {
      sd[p] = kNaN;
      continue;
    }
    const double mean = sum[p] / samples;
    sd[p] = std::sqrt(std::max(0.0, (sum2[p] - samples * mean * mean) / (samples - 1)));
  }
  return sd;
}

Chi2Map chi2_map(const RingCouplings& model, const std::vector<MeasuredRingCoupling>& measured,
                 const TwoStateOptions& options, const TwoStateFit& best, double step_deg) {
  Chi2Map map;
  const auto bn = parameter_bounds(kPhaseN), bs = parameter_bounds(kPhaseS);
  for (double p = bn[0]; p <= bn[1] + 1e-9; p += step_deg) map.phase_n_deg.push_back(p);
  for (double p = bs[0]; p <= bs[1] + 1e-9; p += step_deg) map.phase_s_deg.push_back(p);
  auto fixed = best.fixed;
  fixed[kPhaseN] = fixed[kPhaseS] = true;
  const bool anything_free = [&] {
    for (int p = 0; p < kParameterCount; ++p)
      if (!fixed[p]) return true;
    return false;
  }();
  for (double ps : map.phase_s_deg)
    for (double pn : map.phase_n_deg) {
      auto start = best.value;
      start[kPhaseN] = pn;
      start[kPhaseS] = ps;
      double chi2 = 0;
      if (anything_free) {
        chi2 = solve(model, measured, start, fixed, options.tie_amplitudes, false).chi2;
      } else {
        for (const auto& m : measured) {
          const double x = start[kFractionS];
          const double j = (1 - x) * model.j_hz(m.coupling, pn, start[kAmplitudeN]) +
                           x * model.j_hz(m.coupling, ps, start[kAmplitudeS]);
          chi2 += std::pow((m.j_hz - j) / m.sigma_hz, 2);
        }
      }
      map.chi2.push_back(chi2);
    }
  return map;
}

}  // namespace vicinal::pucker
