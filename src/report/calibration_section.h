// The report page of a Karplus calibration, from the document that
// `vicinal karplus calibrate --report DIR` saves (format
// "vicinal-calibration"): the fitted coefficients with their covariance
// standard deviations and bootstrap intervals, the published sets judged on
// the same points (RMSD, reduced chi^2, AIC, BIC), the (J, dihedral) points
// with the fitted and the published curves, and the residuals of the fit.
//
// The document: the members of `vicinal --json karplus calibrate` (input,
// form, offset_deg, loss, n, coefficients [{name, value, sd, bootstrap_low,
// bootstrap_high}], statistics {chi2, rmsd_hz, reduced_chi2, aic, bic, k},
// bootstrap {samples, seed}, comparison [{set, rmsd_hz, reduced_chi2, aic,
// bic, citation}], written) plus format, version, title, program,
// command_line, created, data [{j_hz, sigma_hz, dihedral_deg, fitted_hz}],
// angle_name, coupling and curves [{label, fitted, dihedral_deg [], j_hz []}].
#pragma once

#include "core/json_file.h"
#include "report/result_page.h"

namespace vicinal::report {

inline constexpr const char* kCalibrationFormat = "vicinal-calibration";

ResultPage calibration_page(const Json& doc);

}  // namespace vicinal::report
