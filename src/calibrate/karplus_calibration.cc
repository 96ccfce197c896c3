#include "calibrate/karplus_calibration.h"

#include <ceres/ceres.h>
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <limits>
#include <numbers>
#include <random>

#include "core/error.h"

namespace vicinal::calibrate {

namespace {

constexpr double kRad = std::numbers::pi / 180.0;
constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

template <typename T>
T evaluate(karplus::Form form, int order, const T* c, double theta_rad) {
  if (form == karplus::Form::ThreeTerm) {
    const double x = std::cos(theta_rad);
    return c[0] * x * x + c[1] * x + c[2];
  }
  T j = c[0];
  for (int k = 1; k <= order; ++k) j += c[2 * k - 1] * std::cos(k * theta_rad) + c[2 * k] * std::sin(k * theta_rad);
  return j;
}

// One point's residual (J - f(theta)) / sigma; linear in the coefficients, so
// automatic differentiation is exact and cheap.
struct PointResidual {
  karplus::Form form;
  int order;
  double theta_rad, j_hz, sigma_hz;
  template <typename T>
  bool operator()(T const* const* p, T* r) const {
    r[0] = (T(j_hz) - evaluate(form, order, p[0], theta_rad)) / T(sigma_hz);
    return true;
  }
};

ceres::LossFunction* make_loss(const CalibrationOptions& o) {
  switch (o.loss) {
    case Loss::Huber: return new ceres::HuberLoss(o.loss_scale);
    case Loss::Cauchy: return new ceres::CauchyLoss(o.loss_scale);
    case Loss::Squared: return nullptr;
  }
  return nullptr;
}

std::vector<double> solve(const std::vector<CalibrationPoint>& points, const CalibrationOptions& o,
                          std::vector<double> start, std::vector<double>* sd) {
  const int k = static_cast<int>(start.size());
  ceres::Problem problem;
  for (const auto& p : points) {
    auto* cost = new ceres::DynamicAutoDiffCostFunction<PointResidual>(
        new PointResidual{o.form, o.fourier_order, (p.dihedral_deg + o.offset_deg) * kRad, p.j_hz, p.sigma_hz});
    cost->AddParameterBlock(k);
    cost->SetNumResiduals(1);
    problem.AddResidualBlock(cost, make_loss(o), start.data());
  }
  ceres::Solver::Options options;
  options.linear_solver_type = ceres::DENSE_QR;
  options.max_num_iterations = 200;
  options.function_tolerance = 1e-14;
  options.gradient_tolerance = 1e-14;
  options.parameter_tolerance = 1e-12;
  options.logging_type = ceres::SILENT;
  ceres::Solver::Summary summary;
  ceres::Solve(options, &problem, &summary);
  if (sd) {
    sd->assign(k, kNaN);
    ceres::Covariance::Options copt;
    copt.algorithm_type = ceres::DENSE_SVD;
    ceres::Covariance covariance(copt);
    const std::vector<std::pair<const double*, const double*>> blocks = {{start.data(), start.data()}};
    if (covariance.Compute(blocks, &problem)) {
      std::vector<double> cov(static_cast<std::size_t>(k * k));
      covariance.GetCovarianceBlock(start.data(), start.data(), cov.data());
      for (int i = 0; i < k; ++i) (*sd)[i] = std::sqrt(std::max(0.0, cov[static_cast<std::size_t>(i * k + i)]));
    }
  }
  return start;
}

std::vector<double> zero_start(const CalibrationOptions& o) { return std::vector<double>(coefficient_names(o).size(), 0.0); }

}  // namespace

Loss parse_loss(const std::string& name) {
  if (name == "squared") return Loss::Squared;
  if (name == "huber") return Loss::Huber;
  if (name == "cauchy") return Loss::Cauchy;
  throw Error(fmt::format("unknown loss '{}'", name), Location::field_in("", "--loss"),
              "choose squared, huber or cauchy");
}

std::string loss_name(Loss loss) {
  switch (loss) {
    case Loss::Squared: return "squared";
    case Loss::Huber: return "huber";
    case Loss::Cauchy: return "cauchy";
  }
  return "?";
}

std::vector<std::string> coefficient_names(const CalibrationOptions& o) {
  if (o.form == karplus::Form::ThreeTerm) return {"A", "B", "C"};
  if (o.form != karplus::Form::Fourier)
    throw Error("calibration fits the three-term or the Fourier form", Location::field_in("", "--form"),
                "choose --form three-term or --form fourier");
  if (o.fourier_order < 1 || o.fourier_order > 6)
    throw Error("the Fourier order must lie in 1..6", Location::field_in("", "--order"));
  std::vector<std::string> names{"C0"};
  for (int k = 1; k <= o.fourier_order; ++k) names.push_back(fmt::format("C{}", k)), names.push_back(fmt::format("S{}", k));
  return names;
}

double model_j_hz(const CalibrationOptions& o, const std::vector<double>& c, double dihedral_deg) {
  return evaluate(o.form, o.fourier_order, c.data(), (dihedral_deg + o.offset_deg) * kRad);
}

FitStatistics statistics(const std::vector<CalibrationPoint>& points, int k,
                         const std::function<double(double)>& j_of_dihedral) {
  FitStatistics s;
  s.n = static_cast<int>(points.size());
  s.k = k;
  double sum2 = 0;
  for (const auto& p : points) {
    const double d = p.j_hz - j_of_dihedral(p.dihedral_deg);
    sum2 += d * d;
    s.chi2 += (d / p.sigma_hz) * (d / p.sigma_hz);
  }
  s.rmsd_hz = std::sqrt(sum2 / s.n);
  s.reduced_chi2 = s.n > k ? s.chi2 / (s.n - k) : kNaN;
  s.aic = s.chi2 + 2.0 * k;
  s.bic = s.chi2 + k * std::log(static_cast<double>(s.n));
  return s;
}

Calibration calibrate(const std::vector<CalibrationPoint>& points, const CalibrationOptions& o) {
  Calibration c;
  c.names = coefficient_names(o);
  const int k = static_cast<int>(c.names.size());
  if (static_cast<int>(points.size()) <= k)
    throw Error(fmt::format("{} points cannot determine {} coefficients with any check left", points.size(), k), {},
                "add (J, dihedral) pairs spread over the whole angle range");
  c.coefficients = solve(points, o, zero_start(o), &c.sd);
  c.stats = statistics(points, k, [&](double d) { return model_j_hz(o, c.coefficients, d); });
  return c;
}

BootstrapIntervals bootstrap(const std::vector<CalibrationPoint>& points, const CalibrationOptions& o, int samples,
                             std::uint64_t seed) {
  const auto names = coefficient_names(o);
  const std::size_t k = names.size();
  BootstrapIntervals b;
  b.samples = samples;
  b.seed = seed;
  std::mt19937_64 rng(seed);
  std::uniform_int_distribution<std::size_t> pick(0, points.size() - 1);
  const std::vector<double> start = calibrate(points, o).coefficients;
  std::vector<std::vector<double>> draws(k);
  std::vector<CalibrationPoint> resampled(points.size());
  for (int s = 0; s < samples; ++s) {
    for (auto& p : resampled) p = points[pick(rng)];
    const auto c = solve(resampled, o, start, nullptr);
    for (std::size_t i = 0; i < k; ++i) draws[i].push_back(c[i]);
  }
  for (std::size_t i = 0; i < k; ++i) {
    auto& d = draws[i];
    std::sort(d.begin(), d.end());
    // Percentiles by linear interpolation between order statistics.
    const auto quantile = [&](double q) {
      const double at = q * static_cast<double>(d.size() - 1);
      const std::size_t lo = static_cast<std::size_t>(std::floor(at));
      const std::size_t hi = std::min(lo + 1, d.size() - 1);
      return d[lo] + (at - static_cast<double>(lo)) * (d[hi] - d[lo]);
    };
    b.low.push_back(quantile(0.025));
    b.high.push_back(quantile(0.975));
    double mean = 0, var = 0;
    for (double v : d) mean += v;
    mean /= static_cast<double>(d.size());
    for (double v : d) var += (v - mean) * (v - mean);
    b.sd.push_back(d.size() > 1 ? std::sqrt(var / static_cast<double>(d.size() - 1)) : kNaN);
  }
  return b;
}

FitStatistics judge_set(const karplus::ParameterSet& set, const std::vector<CalibrationPoint>& points) {
  if (set.form == karplus::Form::Haasnoot)
    throw Error(fmt::format("set '{}' needs substituents that (J, dihedral) pairs do not carry", set.id), {},
                "compare with sets of the other forms");
  return statistics(points, 0, [&](double d) { return karplus::j_hz(set, d); });
}

}  // namespace vicinal::calibrate
