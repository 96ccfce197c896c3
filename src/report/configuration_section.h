// The report page of a relative-configuration analysis of two adjacent
// stereocentres, from the document that `vicinal configuration --report DIR`
// saves (format "vicinal-configuration"): the six staggered arrangements with
// their predicted couplings beside the measured ones, every candidate (single
// rotamers and pairs in exchange) with its score, and two figures of our own
// design: how far each coupling lies from each arrangement's prediction (in
// units of its combined uncertainty), and the candidates' scores against the
// "equally good" margin.
//
// The document: the members of `vicinal --json configuration` (verdict,
// statement, poor_fit, rules, rules_source, x3, measured [{name, j_hz,
// sigma_hz}], arrangements [{name, short_name, configuration, couplings
// [{name, j_hz, tolerance_hz, category, basis, dihedral_deg}]}], candidates
// [{name, configuration, members, fraction_first, score, ranked_score,
// j_pred_hz []}], equally_good_margin) plus format, version, title, program,
// command_line, created.
#pragma once

#include "core/json_file.h"
#include "report/result_page.h"

namespace vicinal::report {

inline constexpr const char* kConfigurationFormat = "vicinal-configuration";

ResultPage configuration_page(const Json& doc);

}  // namespace vicinal::report
