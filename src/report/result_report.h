// Reports of the result documents that `pucker fit`, `configuration` and
// `karplus calibrate` save with --report: the document's format picks the
// section file that draws it (pucker_section.h, configuration_section.h,
// calibration_section.h, self_consistent_section.h). `vicinal report`
// renders these and the analysis document of `vicinal demo` alike.
#pragma once

#include <string>
#include <vector>

#include "core/json_file.h"
#include "report/analysis_report.h"

namespace vicinal::report {

inline constexpr int kResultVersion = 1;

// True when `doc` is an object whose "format" names one of the result documents.
bool is_result_document(const Json& doc);

// The file name the command gives its document ("pucker.json", ...).
std::string result_document_name(const Json& doc);

// Checks format and version, then writes the page, its figures and tables as
// `paths` says. vicinal::Error naming `source` for a document it cannot read.
std::vector<std::string> write_result_report(const Json& doc, const std::string& source, const ReportPaths& paths);

}  // namespace vicinal::report
