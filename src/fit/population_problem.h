// A population fit problem: measured couplings and, for each conformer (or
// state), the coupling it predicts. The fit weighs each coupling by
// s = sqrt(sigma_hz^2 + rms_hz^2): the measurement uncertainty and the Karplus
// set's own RMS error added in quadrature.
#pragma once

#include <Eigen/Dense>
#include <string>
#include <vector>

namespace vicinal::fit {

struct PopulationProblem {
  Eigen::MatrixXd j_hz;          // couplings x conformers: predicted J of coupling r in conformer i
  Eigen::VectorXd j_obs_hz;      // measured J, one per coupling
  Eigen::VectorXd sigma_hz;      // measurement uncertainty, one per coupling
  Eigen::VectorXd rms_hz;        // the Karplus set's RMS error, one per coupling (0 if none)
  std::vector<std::string> coupling_names;   // one per coupling, for messages and reports
  std::vector<std::string> conformer_names;  // one per conformer

  int couplings() const { return static_cast<int>(j_obs_hz.size()); }
  int conformers() const { return static_cast<int>(j_hz.cols()); }

  // Checks sizes, finiteness and that every coupling has s > 0; fills missing
  // names. vicinal::Error names the coupling or conformer at fault.
  void validate() const;
  // s = sqrt(sigma^2 + rms^2) per coupling.
  Eigen::VectorXd total_sigma_hz() const;
  // Columns c_i = (J_i - J_obs) / s: chi^2(w) = |C w|^2 whenever sum w = 1,
  // which turns the fit into the nearest point to the origin in the convex
  // hull of these columns.
  Eigen::MatrixXd centred_columns() const;
};

// Names "conformer 1".. and "coupling 1".. where none were given.
void fill_default_names(PopulationProblem& problem);

}  // namespace vicinal::fit
