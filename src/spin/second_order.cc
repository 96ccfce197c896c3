#include "spin/second_order.h"

#include <ceres/ceres.h>
#include <fmt/format.h>

#include <algorithm>
#include <cmath>
#include <numeric>

#include "core/error.h"

namespace vicinal::spin {

namespace {

// Peaks matched to the nearest simulated line of the observed multiplet.
struct Match {
  std::vector<double> position_misfit_hz;
  std::vector<double> intensity_misfit;  // relative, empty without intensities
};

Match match_peaks(const MultipletModel& model, const PeakList& peaks) {
  const auto lines = simulate(model_system(model)).lines;
  const auto [lo, hi] = std::minmax_element(peaks.hz.begin(), peaks.hz.end());
  const double margin = 0.5 * (*hi - *lo) + 1.0;
  // Strong lines near the observed peaks; very weak combination lines are
  // not what anyone picks as a peak.
  std::vector<Line> near;
  double strongest = 0;
  for (const auto& l : lines)
    if (l.hz >= *lo - margin && l.hz <= *hi + margin) {
      near.push_back(l);
      strongest = std::max(strongest, l.intensity);
    }
  std::erase_if(near, [&](const Line& l) { return l.intensity < 0.02 * strongest; });
  Match m;
  if (near.empty()) {
    m.position_misfit_hz.assign(peaks.hz.size(), 1e3);
    if (!peaks.intensity.empty()) m.intensity_misfit.assign(peaks.hz.size(), 1.0);
    return m;
  }
  std::vector<double> matched_intensity;
  for (double p : peaks.hz) {
    const auto best = std::min_element(near.begin(), near.end(), [&](const Line& a, const Line& b) {
      return std::abs(a.hz - p) < std::abs(b.hz - p);
    });
    m.position_misfit_hz.push_back(p - best->hz);
    matched_intensity.push_back(best->intensity);
  }
  if (!peaks.intensity.empty()) {
    double observed_total = 0, simulated_total = 0;
    for (std::size_t i = 0; i < peaks.hz.size(); ++i) {
      observed_total += peaks.intensity[i];
      simulated_total += matched_intensity[i];
    }
    for (std::size_t i = 0; i < peaks.hz.size(); ++i) {
      const double sim = matched_intensity[i] / simulated_total;
      m.intensity_misfit.push_back((peaks.intensity[i] / observed_total - sim) / sim);
    }
  }
  return m;
}

double rms(const std::vector<double>& v) {
  double s = 0;
  for (double x : v) s += x * x;
  return v.empty() ? 0 : std::sqrt(s / static_cast<double>(v.size()));
}

// Parameters: centre, one J per group, then (optionally) partner shifts.
struct PeakMisfit {
  MultipletModel base;
  const PeakList* peaks;
  bool fit_partners;
  double intensity_scale;  // Hz per unit of relative intensity misfit

  MultipletModel model(const double* p) const {
    MultipletModel m = base;
    m.center_hz = p[0];
    for (std::size_t g = 0; g < m.groups.size(); ++g) {
      m.groups[g].j_hz = p[1 + g];
      if (fit_partners) m.partner_hz[g] = p[1 + m.groups.size() + g];
    }
    return m;
  }

  bool operator()(double const* const* parameters, double* residuals) const {
    const Match m = match_peaks(model(parameters[0]), *peaks);
    std::size_t r = 0;
    for (double d : m.position_misfit_hz) residuals[r++] = d;
    for (double d : m.intensity_misfit) residuals[r++] = d * intensity_scale;
    return true;
  }
};

}  // namespace

SpinSystem model_system(const MultipletModel& model) {
  if (model.partner_hz.size() != model.groups.size())
    throw Error(fmt::format("{} partner shifts given for {} couplings", model.partner_hz.size(), model.groups.size()),
                Location::field_in("", "--partner"), "give one partner shift per coupling, largest J first");
  const auto& table = NuclearTable::shipped();
  SpinSystem s;
  s.field_mhz = model.field_mhz;
  s.observe = table.find("1H");
  s.groups.push_back({"X", s.observe, model.center_hz / model.field_mhz, 1});
  for (std::size_t g = 0; g < model.groups.size(); ++g) {
    s.groups.push_back({fmt::format("P{}", g + 1), s.observe, model.partner_hz[g] / model.field_mhz,
                        model.groups[g].partners});
    s.couplings.push_back({0, g + 1, model.groups[g].j_hz});
  }
  check_spin_system(s, "multiplet model");
  return s;
}

double model_residual_hz(const MultipletModel& model, const PeakList& peaks) {
  return rms(match_peaks(model, peaks).position_misfit_hz);
}

SecondOrderFit fit_second_order(const MultipletModel& start, const PeakList& peaks, bool fit_partner_shifts,
                                double tolerance_hz, double intensity_tolerance) {
  model_system(start);  // checks the model before fitting
  if (peaks.hz.size() < 2) throw Error("a fit needs at least two peaks");
  const std::size_t groups = start.groups.size();
  std::vector<double> p{start.center_hz};
  for (const auto& g : start.groups) p.push_back(g.j_hz);
  if (fit_partner_shifts) p.insert(p.end(), start.partner_hz.begin(), start.partner_hz.end());
  const std::size_t residuals = peaks.hz.size() * (peaks.intensity.empty() ? 1 : 2);
  if (p.size() > residuals)
    throw Error(fmt::format("{} parameters cannot be fitted to {} peaks", p.size(), peaks.hz.size()), {},
                "give intensities, or fix the partner shifts");

  auto* misfit = new PeakMisfit{start, &peaks, fit_partner_shifts, tolerance_hz / intensity_tolerance};
  auto* cost = new ceres::DynamicNumericDiffCostFunction<PeakMisfit, ceres::CENTRAL>(misfit);
  cost->AddParameterBlock(static_cast<int>(p.size()));
  cost->SetNumResiduals(static_cast<int>(residuals));
  ceres::Problem problem;
  problem.AddResidualBlock(cost, nullptr, p.data());
  for (std::size_t g = 0; g < groups; ++g) problem.SetParameterLowerBound(p.data(), static_cast<int>(1 + g), 0.0);

  ceres::Solver::Options options;
  options.max_num_iterations = 100;
  options.linear_solver_type = ceres::DENSE_QR;
  options.logging_type = ceres::SILENT;
  ceres::Solver::Summary summary;
  ceres::Solve(options, &problem, &summary);

  // Report the groups largest J first, each partner shift staying with its coupling.
  const MultipletModel unsorted = misfit->model(p.data());
  std::vector<std::size_t> order(groups);
  std::iota(order.begin(), order.end(), 0);
  std::stable_sort(order.begin(), order.end(),
                   [&](std::size_t a, std::size_t b) { return unsorted.groups[a].j_hz > unsorted.groups[b].j_hz; });
  SecondOrderFit fit;
  fit.model = unsorted;
  for (std::size_t g = 0; g < groups; ++g) {
    fit.model.groups[g] = unsorted.groups[order[g]];
    fit.model.partner_hz[g] = unsorted.partner_hz[order[g]];
  }
  const Match m = match_peaks(fit.model, peaks);
  fit.residual_hz = rms(m.position_misfit_hz);
  if (!m.intensity_misfit.empty()) fit.intensity_error = rms(m.intensity_misfit);
  fit.converged = summary.termination_type == ceres::CONVERGENCE;
  fit.iterations = static_cast<int>(summary.iterations.size());
  return fit;
}

}  // namespace vicinal::spin
