// The report page of a self-consistent Karplus calibration (several coupling
// types sharing one unknown angle per site; Schmidt et al., J. Biomol. NMR 14,
// 1, 1999), from the document that `vicinal karplus calibrate --sites ...
// --report DIR` saves (format "vicinal-self-consistent"): the fitted
// coefficients of each type beside those of the set that started it, the
// fitted site angles, and per type the measured couplings at the fitted
// angles with the fitted and the starting curve.
//
// The document: the members of `vicinal --json karplus calibrate --sites`
// (input, n, k, chi2, types [{type, n, coefficients [A, B, C],
// start_coefficients, rmsd_hz}], sites [{site, angle_deg, start_deg}]) plus
// format, version, title, program, command_line, created, angle_name and
// curves [{type, coupling, dihedral_deg [], fitted_hz [], start_hz [],
// points [{site, angle_deg, j_hz, sigma_hz}]}].
#pragma once

#include "core/json_file.h"
#include "report/result_page.h"

namespace vicinal::report {

inline constexpr const char* kSelfConsistentFormat = "vicinal-self-consistent";

ResultPage self_consistent_page(const Json& doc);

}  // namespace vicinal::report
