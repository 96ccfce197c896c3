#include "report/result_report.h"

#include <fmt/format.h>

#include "report/calibration_section.h"
#include "report/configuration_section.h"
#include "report/pucker_section.h"
#include "report/result_page.h"
#include "report/self_consistent_section.h"

namespace vicinal::report {

namespace {

struct Kind {
  const char* format;
  const char* document_name;
  ResultPage (*page)(const Json&);
};

constexpr Kind kKinds[] = {{kPuckerFitFormat, "pucker.json", pucker_page},
                           {kConfigurationFormat, "configuration.json", configuration_page},
                           {kCalibrationFormat, "calibration.json", calibration_page},
                           {kSelfConsistentFormat, "self-consistent.json", self_consistent_page}};

const Kind* kind_of(const Json& doc) {
  if (!doc.is_object()) return nullptr;
  const std::string format = json_string_or_empty(doc, "format");
  for (const auto& k : kKinds)
    if (format == k.format) return &k;
  return nullptr;
}

}  // namespace

bool is_result_document(const Json& doc) { return kind_of(doc) != nullptr; }

std::string result_document_name(const Json& doc) {
  const Kind* k = kind_of(doc);
  return k ? k->document_name : "result.json";
}

std::vector<std::string> write_result_report(const Json& doc, const std::string& source, const ReportPaths& paths) {
  const Kind* kind = kind_of(doc);
  if (!kind)
    throw Error("not a vicinal result document", Location::field_in(source, "format"),
                "give a document that `pucker fit`, `configuration` or `karplus calibrate` saved with --report");
  if (doc.value("version", 0) != kResultVersion)
    throw Error(fmt::format("{} version {} is not one this program reads", kind->format, doc.value("version", 0)),
                Location::field_in(source, "version"), fmt::format("this program reads version {}", kResultVersion));
  try {
    return write_result_page(kind->page(doc), doc, kind->document_name, paths);
  } catch (const Json::exception& e) {
    std::string text = e.what();
    if (const auto close = text.find("] "); close != std::string::npos) text = text.substr(close + 2);
    throw Error("the document has an unexpected value: " + text, Location(source),
                "give the document as the command saved it, unedited");
  }
}

}  // namespace vicinal::report
