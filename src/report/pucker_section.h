// The report page of a two-state pseudorotation fit, from the document that
// `vicinal pucker fit --report DIR` saves (format "vicinal-pucker-fit"): the
// fitted P_N, P_S, amplitudes and mole fraction with their uncertainties, the
// measured and back-calculated ring couplings, the chi^2 map over (P_N, P_S),
// and each coupling across the pseudorotation cycle with the two fitted phases
// marked. The document holds everything drawn (the map grid, the curves), so
// the page needs nothing else.
//
// The document: the members of `vicinal --json pucker fit` (ring, parameters
// {name: {value, sd, status, nearest_envelope}}, couplings [{name, j_hz,
// sigma_hz, j_north_hz, j_south_hz, j_calc_hz, set}], chi2, n,
// degrees_of_freedom, reduced_chi2, constraints, uncertainty_from) plus
// format, version, title, program, command_line, created, ring_title,
// relations_source, map {phase_n_deg [], phase_s_deg [], chi2 [], note} and
// cycle {phase_deg [], couplings [{name, j_hz []}]}.
#pragma once

#include "core/json_file.h"
#include "report/result_page.h"

namespace vicinal::report {

inline constexpr const char* kPuckerFitFormat = "vicinal-pucker-fit";

ResultPage pucker_page(const Json& doc);

// The chi^2 map of the document as a heat map (also what `pucker fit --map` writes).
HeatMap pucker_chi2_heatmap(const Json& doc);

}  // namespace vicinal::report
