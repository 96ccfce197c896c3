// --report DIR for the commands whose result has a report page of its own
// (pucker fit, configuration, karplus calibrate): the result document, with
// the envelope every report reads (format, version, title, program,
// command_line, created), goes to DIR/<name>.json, the page to
// DIR/report.html, its figures to DIR/figures/ and its tables to DIR/tables/.
// `vicinal report DIR/<name>.json` rebuilds the page later.
#pragma once

#include <string>

#include "cli/command.h"

namespace vicinal::cli {

// Returns the path of the HTML page; notes what was written.
std::string save_result_report(Json doc, const std::string& format, const std::string& title, const std::string& dir,
                               const Globals& g);

}  // namespace vicinal::cli
