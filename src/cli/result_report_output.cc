#include "cli/result_report_output.h"

#include <fmt/format.h>

#include <filesystem>

#include "calibrate/set_file.h"
#include "core/atomic_file.h"
#include "report/result_report.h"

namespace vicinal::cli {

std::string save_result_report(Json doc, const std::string& format, const std::string& title, const std::string& dir,
                               const Globals& g) {
  doc["format"] = format;
  doc["version"] = report::kResultVersion;
  doc["title"] = title;
  doc["program"] = "vicinal " VICINAL_VERSION;
  doc["command_line"] = g.command_line;
  doc["created"] = calibrate::utc_now();
  const std::filesystem::path folder(dir);
  const auto html = folder / "report.html";
  // The page is built (and every figure drawn) before the document is saved,
  // so a document that cannot be rendered is never left behind.
  const auto files =
      report::write_result_report(doc, (folder / report::result_document_name(doc)).string(),
                                  {.html = html, .figures_dir = folder / "figures", .tables_dir = folder / "tables"});
  write_file_atomically(folder / report::result_document_name(doc), doc.dump(2) + "\n");
  g.note(fmt::format("report written to {} ({} files, document {})", html.string(), files.size() + 1,
                     (folder / report::result_document_name(doc)).string()));
  return html.string();
}

}  // namespace vicinal::cli
