#include "calibrate/self_consistent.h"

#include <ceres/ceres.h>
#include <fmt/format.h>

#include <cmath>
#include <map>
#include <numbers>

#include "core/error.h"

namespace vicinal::calibrate {

namespace {

constexpr double kRad = std::numbers::pi / 180.0;

// (J - A cos^2 t - B cos t - C) / sigma with t = angle + offset; both the
// coefficients and the angle are parameters.
struct SharedAngleResidual {
  double offset_rad, j_hz, sigma_hz;
  template <typename T>
  bool operator()(const T* c, const T* angle_deg, T* r) const {
    const T x = cos(angle_deg[0] * kRad + offset_rad);
    r[0] = (T(j_hz) - (c[0] * x * x + c[1] * x + c[2])) / T(sigma_hz);
    return true;
  }
};

double three_term(const std::vector<double>& c, double theta_deg) {
  const double x = std::cos(theta_deg * kRad);
  return c[0] * x * x + c[1] * x + c[2];
}

double wrap(double deg) {
  double d = std::fmod(deg, 360.0);
  if (d <= -180) d += 360;
  if (d > 180) d -= 360;
  return d;
}

}  // namespace

SelfConsistentFit fit_self_consistent(const std::vector<SiteCoupling>& rows, const karplus::SetCatalog& catalog,
                                      Loss loss, double loss_scale) {
  SelfConsistentFit f;
  std::map<std::string, int> type_index, site_index;
  std::vector<int> row_type, row_site;
  for (const auto& r : rows) {
    if (!type_index.count(r.type)) {
      const karplus::ParameterSet* set = nullptr;
      try {
        set = &catalog.find(r.type);
      } catch (const Error& e) {
        throw Error(e.what_happened(), Location::field_in("", "type"),
                    e.hint() + fmt::format(" (line {})", r.line));
      }
      if (set->form != karplus::Form::ThreeTerm)
        throw Error(fmt::format("type '{}' is a {} set; the self-consistent fit needs three-term sets", set->id,
                                karplus::form_name(set->form)),
                    {"", r.line});
      if (!f.types.empty() && set->angle_name != f.types.front().angle_name)
        throw Error(fmt::format("type '{}' measures {} but '{}' measures {}", set->id, set->angle_name,
                                f.types.front().id, f.types.front().angle_name),
                    {"", r.line}, "every type must share the same angle at a site");
      type_index[r.type] = static_cast<int>(f.types.size());
      f.types.push_back(*set);
      f.coefficients.push_back(set->coefficients);
    }
    if (!site_index.count(r.site)) {
      site_index[r.site] = static_cast<int>(f.sites.size());
      f.sites.push_back(r.site);
      f.angle_deg.push_back(NAN);
    }
    row_type.push_back(type_index[r.type]);
    row_site.push_back(site_index[r.site]);
    if (r.has_start) f.angle_deg[site_index[r.site]] = r.start_deg;
  }
  f.n = static_cast<int>(rows.size());
  f.k = 3 * static_cast<int>(f.types.size()) + static_cast<int>(f.sites.size());
  if (f.types.size() < 2)
    throw Error("the self-consistent fit needs at least two coupling types", {},
                "with one type, calibrate against known angles instead (--points)");
  if (f.n <= f.k)
    throw Error(fmt::format("{} couplings cannot determine {} parameters ({} types x 3 coefficients + {} angles)", f.n,
                            f.k, f.types.size(), f.sites.size()),
                {}, "measure more coupling types per site or more sites");

  // Each site's share of chi^2 at a trial angle under the current coefficients.
  const auto site_chi2 = [&](std::size_t s, double a) {
    double chi2 = 0;
    for (std::size_t i = 0; i < rows.size(); ++i) {
      if (row_site[i] != static_cast<int>(s)) continue;
      const auto& t = f.types[row_type[i]];
      const double d = (rows[i].j_hz - three_term(f.coefficients[row_type[i]], a + t.offset_deg)) / rows[i].sigma_hz;
      chi2 += d * d;
    }
    return chi2;
  };
  // The best angle of one site on a 2-degree grid, kept only if it beats `current`.
  const auto grid_angle = [&](std::size_t s, double current) {
    double best = std::isfinite(current) ? site_chi2(s, current) : INFINITY, best_angle = current;
    for (double a = -180; a < 180; a += 2)
      if (const double c = site_chi2(s, a); c < best) best = c, best_angle = a;
    return best_angle;
  };
  for (std::size_t s = 0; s < f.sites.size(); ++s) f.angle_deg[s] = grid_angle(s, f.angle_deg[s]);
  f.start_angle_deg = f.angle_deg;

  // Joint fit, then a fresh grid search per site under the new coefficients
  // (an angle can sit on the wrong branch of a curve while the coefficients are
  // still far off), then the joint fit again: alternating a few rounds moves
  // such sites to their own branch.
  for (int round = 0; round < 3; ++round) {
    if (round > 0)
      for (std::size_t s = 0; s < f.sites.size(); ++s) f.angle_deg[s] = grid_angle(s, f.angle_deg[s]);
    ceres::Problem problem;
    for (std::size_t i = 0; i < rows.size(); ++i) {
      const auto& t = f.types[row_type[i]];
      auto* cost = new ceres::AutoDiffCostFunction<SharedAngleResidual, 1, 3, 1>(
          new SharedAngleResidual{t.offset_deg * kRad, rows[i].j_hz, rows[i].sigma_hz});
      ceres::LossFunction* l = loss == Loss::Huber    ? static_cast<ceres::LossFunction*>(new ceres::HuberLoss(loss_scale))
                               : loss == Loss::Cauchy ? new ceres::CauchyLoss(loss_scale)
                                                      : nullptr;
      problem.AddResidualBlock(cost, l, f.coefficients[row_type[i]].data(), &f.angle_deg[row_site[i]]);
    }
    ceres::Solver::Options options;
    options.max_num_iterations = 500;
    options.function_tolerance = 1e-12;
    options.logging_type = ceres::SILENT;
    ceres::Solver::Summary summary;
    ceres::Solve(options, &problem, &summary);
  }

  for (auto& a : f.angle_deg) a = wrap(a);
  f.type_n.assign(f.types.size(), 0);
  std::vector<double> sum2(f.types.size(), 0.0);
  for (std::size_t i = 0; i < rows.size(); ++i) {
    const int t = row_type[i];
    const double d = rows[i].j_hz - three_term(f.coefficients[t], f.angle_deg[row_site[i]] + f.types[t].offset_deg);
    sum2[t] += d * d;
    f.chi2 += (d / rows[i].sigma_hz) * (d / rows[i].sigma_hz);
    ++f.type_n[t];
  }
  for (std::size_t t = 0; t < f.types.size(); ++t) f.type_rmsd_hz.push_back(std::sqrt(sum2[t] / f.type_n[t]));
  return f;
}

}  // namespace vicinal::calibrate
