// The report page of one result document that a command saves with
// --report (a pucker fit, a configuration analysis, a Karplus calibration):
// the figures (plots or heat maps), the tables and the HTML, written as the
// analysis report writes its own: the HTML self-contained with inline SVG,
// each figure also as .svg, .pdf and .png, each table as CSV, and a copy of
// the document. The section files (pucker_section.h, ...) build the page;
// result_report.h picks the section by the document's format.
#pragma once

#include <filesystem>
#include <optional>
#include <string>
#include <vector>

#include "core/json_file.h"
#include "report/analysis_report.h"
#include "report/heatmap.h"
#include "report/html.h"
#include "report/plot.h"

namespace vicinal::report {

struct PageFigure {
  std::string name;     // file stem, e.g. "chi2-map"
  std::string caption;  // for the HTML page
  std::optional<Figure> plot{};
  std::optional<HeatMap> heat{};

  std::string svg() const;
  void save(const std::filesystem::path& path) const;  // .svg, .pdf or .png
};

struct PageTable {
  std::string file, caption;  // file: e.g. "parameters.csv"
  std::vector<std::string> header;
  std::vector<std::vector<std::string>> rows;

  std::string csv() const;
};

struct ResultPage {
  std::vector<PageFigure> figures;
  std::vector<PageTable> tables;
  std::string html;

  // The HTML helpers the section files share: the table (which is also kept
  // for the CSV files) and the figure of that name (when it exists).
  void add_table(HtmlDocument& html, PageTable table);
  void add_figure(HtmlDocument& html, const std::string& name) const;
};

// The page's frame: an HtmlDocument titled from the document's `title`, with
// `program` and `created` under it; and the closing section that shows the
// command that made the result and how to rebuild the page.
HtmlDocument result_document(const Json& doc);
void add_provenance(HtmlDocument& html, const Json& doc, const std::string& document_name);

// Writes the page as ReportPaths says (figures and tables optional); the
// document is copied to tables_dir/<copy_name>. Atomic files; returns the
// paths written, the HTML last.
std::vector<std::string> write_result_page(const ResultPage& page, const Json& doc, const std::string& copy_name,
                                           const ReportPaths& paths);

// Forgiving readers for the optional members of a result document: NaN, ""
// or an empty array when absent or null.
double json_number_or_nan(const Json& j, const char* key);
std::string json_string_or_empty(const Json& j, const char* key);
const Json& json_array_or_empty(const Json& j, const char* key);
std::vector<double> json_numbers(const Json& j, const char* key);

// "1.23" with `digits` decimals, "-" when not finite.
std::string fixed_or_dash(double v, int digits);

// "H1'-H2'" -> "H1-H2": safe in a file name.
std::string file_slug(const std::string& text);

}  // namespace vicinal::report
