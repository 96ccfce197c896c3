// Two-state (North/South) pseudorotation fit: the measured ring couplings are
// modelled as the population-weighted mean of an N conformer (phase P_N,
// amplitude nu_max,N) and an S conformer (P_S, nu_max,S) in fast exchange,
//   J_calc = (1 - x_S) J(P_N, nu_N) + x_S J(P_S, nu_S),
// and chi^2 = sum ((J_obs - J_calc) / sigma)^2 is minimised with Ceres. Any
// parameter may be held fixed, and the two amplitudes may be tied to one,
// because three to five couplings rarely determine all five parameters.
#pragma once

#include <array>
#include <cstdint>
#include <string>
#include <vector>

#include "pucker/ring_couplings_csv.h"
#include "pucker/ring_model.h"

namespace vicinal::pucker {

enum Parameter { kPhaseN = 0, kAmplitudeN, kPhaseS, kAmplitudeS, kFractionS, kParameterCount };

std::string parameter_name(int p);  // "P_N", "nu_max_N", ...

struct TwoStateOptions {
  // Starting values, and the values of the parameters held fixed.
  std::array<double, kParameterCount> start = {9.0, 36.0, 162.0, 36.0, 0.5};
  std::array<bool, kParameterCount> fixed = {false, true, false, true, false};
  bool tie_amplitudes = false;  // one amplitude for both states (nu_max,S = nu_max,N)
};

// Search bounds: the North and South halves of the pseudorotation cycle
// (P_N in [-90, 90], P_S in [90, 270]; common practice), amplitudes
// [15, 55] degrees, x_S in [0, 1].
std::array<double, 2> parameter_bounds(int p);

struct TwoStateFit {
  std::array<double, kParameterCount> value{};
  std::array<double, kParameterCount> sd{};  // NaN when fixed or unavailable
  std::array<bool, kParameterCount> fixed{};
  bool tied_amplitudes = false;
  bool covariance_ok = false;  // sd from the Ceres covariance at the minimum
  std::array<bool, kParameterCount> at_bound{};
  double chi2 = 0;
  int n = 0, free_parameters = 0;
  std::vector<double> j_north_hz, j_south_hz, j_calc_hz;  // per measured coupling
};

int free_parameter_count(const TwoStateOptions& options);

// vicinal::Error when there are fewer couplings than free parameters.
TwoStateFit fit_two_state(const RingCouplings& model, const std::vector<MeasuredRingCoupling>& measured,
                          const TwoStateOptions& options);

// Monte Carlo uncertainties: the measured values are perturbed by normal noise
// of their sigma (std::mt19937_64 with `seed`), refitted `samples` times from
// the best fit, and the standard deviation of each parameter is returned.
std::array<double, kParameterCount> monte_carlo_sd(const RingCouplings& model,
                                                   const std::vector<MeasuredRingCoupling>& measured,
                                                   const TwoStateOptions& options, const TwoStateFit& best,
                                                   int samples, std::uint64_t seed);

// chi^2 over a grid of (P_N, P_S) with every other free parameter refitted at
// each point: how well the minimum is defined. chi2[iy * x.size() + ix].
struct Chi2Map {
  std::vector<double> phase_n_deg, phase_s_deg, chi2;
};
Chi2Map chi2_map(const RingCouplings& model, const std::vector<MeasuredRingCoupling>& measured,
                 const TwoStateOptions& options, const TwoStateFit& best, double step_deg);

}  // namespace vicinal::pucker
