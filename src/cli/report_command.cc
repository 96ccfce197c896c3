// vicinal report ANALYSIS.json   the HTML report (with figures and tables) of a saved analysis
#include <fmt/format.h>

#include <filesystem>

#include "cli/command.h"
#include "core/json_file.h"
#include "report/analysis_report.h"
#include "report/result_report.h"

namespace vicinal::cli {

namespace {

struct Options {
  std::string analysis, out, figures, tables;
  bool no_files = false;
};

void run_report(const Options& o, const Globals& g) {
  const Json doc = read_json_file(o.analysis);
  const std::filesystem::path html = o.out.empty() ? std::filesystem::path(o.analysis).parent_path() / "report.html"
                                                   : std::filesystem::path(o.out);
  const auto folder = html.parent_path();
  report::ReportPaths paths{.html = html};
  if (!o.no_files) {
    paths.figures_dir = o.figures.empty() ? folder / "figures" : std::filesystem::path(o.figures);
    paths.tables_dir = o.tables.empty() ? folder / "tables" : std::filesystem::path(o.tables);
  }
  const auto files = report::is_result_document(doc) ? report::write_result_report(doc, o.analysis, paths)
                                                     : report::write_analysis_report(doc, o.analysis, paths);
  if (g.json) {
    g.print_json({{"report", html.string()}, {"files", files}});
    return;
  }
  g.print(fmt::format("Report: {}\n{} figure and table files beside it{}\n", html.string(), files.size() - 1,
                      o.no_files ? "" : fmt::format(" ({}, {})", paths.figures_dir.string(), paths.tables_dir.string())));
}

void setup(CLI::App& root, Globals& g) {
  auto o = std::make_shared<Options>();
  auto* c = root.add_subcommand("report", "Build the HTML report of a saved analysis (figures and tables too)");
  c->add_option("analysis", o->analysis, "analysis.json as `vicinal demo` saves it, or the document that "
                 "`pucker fit`, `configuration` or `karplus calibrate` saved with --report")->required();
  c->add_option("--out", o->out, "HTML file to write (default: report.html beside the analysis)");
  c->add_option("--figures", o->figures, "Folder for the figures as SVG, PDF and PNG (default: figures/ beside --out)");
  c->add_option("--tables", o->tables, "Folder for every table as CSV (default: tables/ beside --out)");
  c->add_flag("--no-files", o->no_files, "Write only the HTML file");
  c->footer(
      "Example: vicinal report vicinal-demo/analysis.json --out review.html\n"
      "The page is one self-contained file (figures inline as SVG, no scripts, nothing fetched), readable\n"
      "on screen and printable: the compound as labelled, the measured couplings with their conditions, a\n"
      "Karplus plot per coupling with the angles it allows, observed vs back-calculated couplings, the\n"
      "ranking with per-coupling contributions, populations with their ranges, the multiplet, the Karplus\n"
      "sets with full citations and the command that made the analysis.\n"
      "Also renders the documents of `pucker fit --report DIR` (DIR/pucker.json), `configuration --report DIR`\n"
      "(DIR/configuration.json) and `karplus calibrate --report DIR` (DIR/calibration.json, or with --sites\n"
      "DIR/self-consistent.json).");
  c->callback([o, &g] { run_report(*o, g); });
}

const bool registered = register_command(94, setup);

}  // namespace

}  // namespace vicinal::cli
