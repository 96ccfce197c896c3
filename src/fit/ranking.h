// Ranking candidate configurations (diastereomers, regio-isomers) by how well
// their conformer ensembles reproduce the measured couplings.
//
// Misfit = -2 log likelihood up to a constant shared by all candidates (same
// couplings, same s): sum_r rho(z_r^2), z_r = (J_obs - J_pred) / s_r, with
// rho(q) = q for Gaussian errors or rho(q) = (nu + 1) ln(1 + q / nu) for
// Student-t errors (heavy tails: one outlying coupling cannot decide alone).
//
// Free populations can make a wrong candidate fit by loading a high-energy
// conformer. When energies are known, populations are therefore tied to them:
// each conformer's energy may be off by eps_i ~ N(0, sigma_E), the populations
// are the Boltzmann weights of E_i + eps_i (a Gaussian prior on log-weights with
// sd sigma_E / RT), and the score is the posterior mode
//   score = min_eps [ misfit(w(eps)) + sum_i (eps_i / sigma_E)^2 ].
// Relative probabilities assume equal prior odds: p_c ~ exp(-score_c / 2).
#pragma once

#include <Eigen/Dense>
#include <string>
#include <vector>

#include "fit/population_problem.h"

namespace vicinal::fit {

enum class ErrorModel { Gaussian, StudentT };

struct RankOptions {
  ErrorModel error_model = ErrorModel::Gaussian;
  double student_nu = 4;               // degrees of freedom of the Student-t model
  double temperature_k = 298.15;
  double energy_sigma_kcal_mol = 1.0;  // uncertainty of each conformer energy (force-field level)
};

struct Candidate {
  std::string name;
  PopulationProblem problem;
  std::vector<double> energy_kcal_mol;  // empty, or one per conformer
};

struct CandidateScore {
  std::string name;
  Eigen::VectorXd free_weights;        // best populations with no tie to energies
  double free_misfit = 0;
  bool has_energies = false;
  Eigen::VectorXd boltzmann_weights;   // from the energies as given
  double boltzmann_misfit = 0;
  Eigen::VectorXd weights;             // populations behind the score
  double misfit = 0;                   // misfit at `weights`
  double prior_penalty = 0;            // sum (eps / sigma_E)^2 at `weights` (0 without energies)
  double score = 0;                    // misfit + prior_penalty
  Eigen::VectorXd contributions;       // rho(z_r^2) per coupling at `weights`
  double probability = 0;
};

struct Ranking {
  std::vector<CandidateScore> candidates;  // best first
  bool energies_used = false;
  bool energies_decided = false;           // the energy prior, not the couplings, separated the top two
  std::string confidence;                  // "strong", "moderate" or "weak"
  std::string verdict;
};

// misfit term for one standardized residual.
double misfit_term(double z, const RankOptions& options);

Ranking rank_candidates(const std::vector<Candidate>& candidates, const RankOptions& options = {});

}  // namespace vicinal::fit
