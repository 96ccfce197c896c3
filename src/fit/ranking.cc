#include "fit/ranking.h"

#include <ceres/ceres.h>
#include <ceres/normal_prior.h>
#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "core/error.h"
#include "fit/ceres_options.h"
#include "fit/linear_fit.h"

namespace vicinal::fit {

namespace {

constexpr double kGasConstantKcalPerMolK = 8.314462618e-3 / 4.184;  // CODATA 2018 R in kcal/(mol K)
// Free-fit misfits closer than this (one chi-square unit, a likelihood ratio
// of e^0.5) do not single out a candidate.
constexpr double kFreeMisfitMargin = 1.0;

// rho(s) = (nu + 1) ln(1 + s / nu) on the squared residual s; Ceres halves it
// like every cost, so 2 x cost = misfit.
class StudentTLoss final : public ceres::LossFunction {
 public:
  explicit StudentTLoss(double nu) : nu_(nu) {}
  void Evaluate(double s, double rho[3]) const override {
    rho[0] = (nu_ + 1) * std::log1p(s / nu_);
    rho[1] = (nu_ + 1) / (nu_ + s);
    rho[2] = -(nu_ + 1) / ((nu_ + s) * (nu_ + s));
  }

 private:
  double nu_;
};

ceres::LossFunction* loss_for(const RankOptions& o) {
  return o.error_model == ErrorModel::StudentT ? new StudentTLoss(o.student_nu) : nullptr;
}

// z of one coupling when the populations are Boltzmann weights of the energies
// shifted by eps: w = softmax(-(E + eps) / RT). Analytic derivative:
// dz/deps_k = w_k (J_rk - pred_r) / (RT s_r).
class SoftmaxCouplingResidual final : public ceres::CostFunction {
 public:
  SoftmaxCouplingResidual(Eigen::VectorXd j_row, double j_obs, double s, Eigen::VectorXd energy, double rt)
      : j_(std::move(j_row)), obs_(j_obs), s_(s), e_(std::move(energy)), rt_(rt) {
    set_num_residuals(1);
    mutable_parameter_block_sizes()->push_back(static_cast<int>(j_.size()));
  }
  bool Evaluate(double const* const* p, double* residual, double** jacobian) const override {
    const int n = static_cast<int>(j_.size());
    const Eigen::VectorXd w = weights(e_, Eigen::Map<const Eigen::VectorXd>(p[0], n), rt_);
    const double pred = w.dot(j_);
    residual[0] = (obs_ - pred) / s_;
    if (jacobian && jacobian[0])
      for (int k = 0; k < n; ++k) jacobian[0][k] = w(k) * (j_(k) - pred) / (rt_ * s_);
    return true;
  }
  static Eigen::VectorXd weights(const Eigen::VectorXd& e, const Eigen::VectorXd& eps, double rt) {
    Eigen::VectorXd a = -(e + eps) / rt;
    a.array() -= a.maxCoeff();
    Eigen::VectorXd w = a.array().exp();
    return w / w.sum();
  }

 private:
  Eigen::VectorXd j_;
  double obs_, s_;
  Eigen::VectorXd e_;
  double rt_;
};

// z of one coupling with populations u_k^2 on the unit sphere (free fit under a loss).
struct SphereCouplingResidual {
  Eigen::VectorXd j_row;
  double j_obs, s;
  bool operator()(double const* const* p, double* residual) const {
    double pred = 0;
    for (int k = 0; k < j_row.size(); ++k) pred += p[0][k] * p[0][k] * j_row(k);
    residual[0] = (j_obs - pred) / s;
    return true;
  }
};

void run_ceres(ceres::Problem& problem, const std::string& what) {
  const ceres::Solver::Options options = tight_solver_options();
  ceres::Solver::Summary summary;
  ceres::Solve(options, &problem, &summary);
  if (summary.termination_type != ceres::CONVERGENCE)
    throw Error(fmt::format("the fit of {} did not converge: {}", what, summary.message));
}

double misfit_of(const PopulationProblem& p, const Eigen::VectorXd& w, const RankOptions& o,
                 Eigen::VectorXd* contributions = nullptr) {
  const Eigen::VectorXd z = (p.j_obs_hz - p.j_hz * w).cwiseQuotient(p.total_sigma_hz());
  Eigen::VectorXd c(z.size());
  for (int r = 0; r < z.size(); ++r) c(r) = misfit_term(z(r), o);
  if (contributions) *contributions = c;
  return c.sum();
}

Eigen::VectorXd free_weights(const Candidate& c, const RankOptions& o) {
  const LinearFit exact = fit_linear(c.problem);
  if (o.error_model == ErrorModel::Gaussian || c.problem.conformers() == 1) return exact.weights;
  const int n = c.problem.conformers();
  std::vector<double> u(n);
  for (int k = 0; k < n; ++k) u[k] = std::sqrt(std::max(exact.weights(k), 1e-4));
  const Eigen::VectorXd s = c.problem.total_sigma_hz();
  ceres::Problem problem;
  for (int r = 0; r < c.problem.couplings(); ++r) {
    auto* cost = new ceres::DynamicNumericDiffCostFunction<SphereCouplingResidual>(
        new SphereCouplingResidual{c.problem.j_hz.row(r).transpose(), c.problem.j_obs_hz(r), s(r)});
    cost->AddParameterBlock(n);
    cost->SetNumResiduals(1);
    problem.AddResidualBlock(cost, loss_for(o), u.data());
  }
  problem.SetManifold(u.data(), new ceres::SphereManifold<ceres::DYNAMIC>(n));
  run_ceres(problem, c.name + " (free populations, Student-t errors)");
  Eigen::VectorXd w(n);
  for (int k = 0; k < n; ++k) w(k) = u[k] * u[k];
  w /= w.sum();
  // The exact Gaussian optimum is a valid point too; keep whichever is better.
  return misfit_of(c.problem, w, o) <= misfit_of(c.problem, exact.weights, o) ? w : exact.weights;
}

void energy_tied_fit(const Candidate& c, const RankOptions& o, CandidateScore& out) {
  const int n = c.problem.conformers();
  const double rt = kGasConstantKcalPerMolK * o.temperature_k;
  const Eigen::VectorXd e = Eigen::Map<const Eigen::VectorXd>(c.energy_kcal_mol.data(), n);
  out.boltzmann_weights = SoftmaxCouplingResidual::weights(e, Eigen::VectorXd::Zero(n), rt);
  out.boltzmann_misfit = misfit_of(c.problem, out.boltzmann_weights, o);
  if (n == 1) {
    out.weights = out.boltzmann_weights;
    return;
  }
  // The score is not convex in eps (a conformer's pull on the misfit fades
  // as its weight goes to zero), so start from the energies as given, from
  // the shifts that reproduce the free-fit populations, and from halfway.
  Eigen::VectorXd to_free(n);
  for (int i = 0; i < n; ++i) to_free(i) = -rt * std::log(std::max(out.free_weights(i), 1e-8)) - e(i);
  to_free.array() -= to_free.mean();
  const Eigen::VectorXd s = c.problem.total_sigma_hz();
  const Eigen::MatrixXd a = Eigen::MatrixXd::Identity(n, n) / o.energy_sigma_kcal_mol;
  double best = INFINITY;
  Eigen::VectorXd shift;
  for (double fraction : {0.0, 0.5, 1.0}) {
    std::vector<double> eps(n);
    for (int i = 0; i < n; ++i) eps[i] = fraction * to_free(i);
    ceres::Problem problem;
    for (int r = 0; r < c.problem.couplings(); ++r)
      problem.AddResidualBlock(
          new SoftmaxCouplingResidual(c.problem.j_hz.row(r).transpose(), c.problem.j_obs_hz(r), s(r), e, rt),
          loss_for(o), eps.data());
    problem.AddResidualBlock(new ceres::NormalPrior(a, Eigen::VectorXd::Zero(n)), nullptr, eps.data());
    run_ceres(problem, c.name + " (populations tied to energies)");
    const Eigen::VectorXd candidate = Eigen::Map<const Eigen::VectorXd>(eps.data(), n);
    const double score = misfit_of(c.problem, SoftmaxCouplingResidual::weights(e, candidate, rt), o) +
                         (candidate / o.energy_sigma_kcal_mol).squaredNorm();
    if (score < best) {
      best = score;
      shift = candidate;
    }
  }
  out.weights = SoftmaxCouplingResidual::weights(e, shift, rt);
  out.prior_penalty = (shift / o.energy_sigma_kcal_mol).squaredNorm();
}

}  // namespace

double misfit_term(double z, const RankOptions& o) {
  const double q = z * z;
  return o.error_model == ErrorModel::StudentT ? (o.student_nu + 1) * std::log1p(q / o.student_nu) : q;
}

Ranking rank_candidates(const std::vector<Candidate>& candidates, const RankOptions& o) {
  if (candidates.size() < 2) throw Error("ranking needs at least two candidates", {}, "give --candidate twice or more");
  if (o.temperature_k <= 0) throw Error("the temperature must be above 0 K", Location::field_in("", "--temperature"));
  if (o.energy_sigma_kcal_mol <= 0)
    throw Error("the energy uncertainty must be positive", Location::field_in("", "--energy-sigma"));
  if (o.error_model == ErrorModel::StudentT && o.student_nu <= 0)
    throw Error("the Student-t degrees of freedom must be positive", Location::field_in("", "--student-nu"));
  Ranking ranking;
  ranking.energies_used = std::all_of(candidates.begin(), candidates.end(), [](const Candidate& c) {
    return !c.energy_kcal_mol.empty();
  });
  for (const auto& c : candidates) {
    c.problem.validate();
    if (!c.energy_kcal_mol.empty() && static_cast<int>(c.energy_kcal_mol.size()) != c.problem.conformers())
      throw std::logic_error("rank_candidates: energies do not match the conformers");
    if (c.problem.couplings() != candidates.front().problem.couplings())
      throw std::logic_error("rank_candidates: candidates must share the couplings");
    CandidateScore s;
    s.name = c.name;
    s.free_weights = free_weights(c, o);
    s.free_misfit = misfit_of(c.problem, s.free_weights, o);
    s.has_energies = !c.energy_kcal_mol.empty();
    if (ranking.energies_used) {
      energy_tied_fit(c, o, s);
    } else {
      if (s.has_energies) {
        const double rt = kGasConstantKcalPerMolK * o.temperature_k;
        const Eigen::VectorXd e = Eigen::Map<const Eigen::VectorXd>(c.energy_kcal_mol.data(), c.problem.conformers());
        s.boltzmann_weights = SoftmaxCouplingResidual::weights(e, Eigen::VectorXd::Zero(e.size()), rt);
        s.boltzmann_misfit = misfit_of(c.problem, s.boltzmann_weights, o);
      }
      s.weights = s.free_weights;
    }
    s.misfit = misfit_of(c.problem, s.weights, o, &s.contributions);
    s.score = s.misfit + s.prior_penalty;
    ranking.candidates.push_back(std::move(s));
  }

  auto& list = ranking.candidates;
  std::stable_sort(list.begin(), list.end(), [](const auto& a, const auto& b) { return a.score < b.score; });
  double total = 0;
  for (auto& c : list) total += std::exp(-(c.score - list[0].score) / 2);
  for (auto& c : list) c.probability = std::exp(-(c.score - list[0].score) / 2) / total;

  const auto& best = list[0];
  const auto& second = list[1];
  const double p = best.probability;
  ranking.confidence = p >= 0.95 ? "strong" : p >= 0.75 ? "moderate" : "weak";
  const double d_misfit = second.misfit - best.misfit, d_prior = second.prior_penalty - best.prior_penalty;
  // The candidate that fits the couplings best with free populations is named
  // only when it is not the winner and fits clearly better than the winner
  // (by more than kFreeMisfitMargin); when several fit freely (misfit ~0)
  // there is no free-population winner to speak of.
  const auto free_best = std::min_element(list.begin(), list.end(), [](const auto& a, const auto& b) {
    return a.free_misfit < b.free_misfit;
  });
  const std::string by_free =
      free_best->name != best.name && best.free_misfit - free_best->free_misfit > kFreeMisfitMargin ? free_best->name
                                                                                                      : "";
  ranking.energies_decided = ranking.energies_used && (d_prior > d_misfit || !by_free.empty());

  ranking.verdict = fmt::format("{} fits best (probability {:.2f} among the candidates given, equal prior odds; {} "
                                "evidence, score {:.3g} vs {:.3g} for {}).",
                                best.name, p, ranking.confidence, best.score, second.score, second.name);
  if (ranking.energies_used && ranking.energies_decided && !by_free.empty())
    ranking.verdict += fmt::format(" The conformer energies rather than the couplings decided: with free populations "
                                   "{} fits the couplings best, and the energy prior separates the top two by {:.3g} "
                                   "against {:.3g} from the couplings.",
                                   by_free, d_prior, d_misfit);
  else if (ranking.energies_used && ranking.energies_decided)
    ranking.verdict += fmt::format(" The conformer energies rather than the couplings decided: with free populations "
                                   "no candidate fits the couplings clearly better than {}, and the energy prior "
                                   "separates the top two by {:.3g} against {:.3g} from the couplings.",
                                   best.name, d_prior, d_misfit);
  else if (ranking.energies_used)
    ranking.verdict += " The couplings, not the energies, separate the top two.";
  else
    ranking.verdict += " No conformer energies were used: free populations can let a wrong candidate fit by "
                       "loading a high-energy conformer.";
  if (ranking.confidence == "weak") ranking.verdict += " The couplings do not clearly decide between these candidates.";
  ranking.verdict += " An assignment based on couplings is model-based: confirm it independently (NOE, crystal "
                     "structure, synthesis).";
  return ranking;
}

}  // namespace vicinal::fit
