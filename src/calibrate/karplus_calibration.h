// Fitting the coefficients of a Karplus form to (J, dihedral) pairs with
// Ceres: three-term A cos^2 t + B cos t + C or a Fourier series of a chosen
// order, t = dihedral + offset (offset fixed), residuals (J - f) / sigma under
// a plain, Huber or Cauchy loss. Bootstrap intervals resample the points with
// replacement (std::mt19937_64, seeded) and refit.
#pragma once

#include <cstdint>
#include <functional>
#include <string>
#include <vector>

#include "calibrate/calibration_points.h"
#include "karplus/karplus.h"

namespace vicinal::calibrate {

enum class Loss { Squared, Huber, Cauchy };
Loss parse_loss(const std::string& name);  // "squared", "huber", "cauchy"; vicinal::Error otherwise
std::string loss_name(Loss loss);

struct CalibrationOptions {
  karplus::Form form = karplus::Form::ThreeTerm;  // ThreeTerm or Fourier
  int fourier_order = 2;
  double offset_deg = 0;
  Loss loss = Loss::Squared;
  double loss_scale = 2.0;  // in units of sigma: residuals beyond it are down-weighted
};

// Names of the coefficients the form fits, in ParameterSet order.
std::vector<std::string> coefficient_names(const CalibrationOptions& options);

// The model itself, for any coefficient vector (used for fitting and tests).
double model_j_hz(const CalibrationOptions& options, const std::vector<double>& coefficients, double dihedral_deg);

struct FitStatistics {
  int n = 0, k = 0;            // points, fitted parameters
  double chi2 = 0;             // sum ((J - f) / sigma)^2, whatever the loss
  double rmsd_hz = 0;          // sqrt(mean (J - f)^2)
  double reduced_chi2 = 0;     // chi2 / (n - k); NaN when n == k
  double aic = 0, bic = 0;     // chi2 + 2k, chi2 + k ln n (Gaussian errors of known sigma, up to a constant)
};

FitStatistics statistics(const std::vector<CalibrationPoint>& points, int k,
                         const std::function<double(double)>& j_of_dihedral);

struct Calibration {
  std::vector<std::string> names;
  std::vector<double> coefficients;
  std::vector<double> sd;  // from the Ceres covariance (scaled by nothing); NaN when unavailable
  FitStatistics stats;
};

// vicinal::Error when there are not more points than coefficients.
Calibration calibrate(const std::vector<CalibrationPoint>& points, const CalibrationOptions& options);

struct BootstrapIntervals {
  int samples = 0;
  std::uint64_t seed = 0;
  std::vector<double> low, high, sd;  // 2.5 and 97.5 percentiles, standard deviation
};
BootstrapIntervals bootstrap(const std::vector<CalibrationPoint>& points, const CalibrationOptions& options,
                             int samples, std::uint64_t seed);

// A published set judged on the same points: nothing is fitted, so k = 0.
// vicinal::Error for Haasnoot sets (they need substituents the points lack).
FitStatistics judge_set(const karplus::ParameterSet& set, const std::vector<CalibrationPoint>& points);

}  // namespace vicinal::calibrate
