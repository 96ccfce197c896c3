// The report of one analysis run: measured couplings, allowed dihedral angles,
// candidate ranking, populations and a multiplet, rendered from the analysis
// document (JSON, format "vicinal-analysis") that the run saves. Rendering
// needs nothing but that document, so a saved analysis gives back the same
// report, figures and tables at any later time.
//
//   const Json doc = read_json_file("demo/analysis.json");
//   write_analysis_report(doc, "demo/analysis.json",
//                         {.html = "demo/report.html", .figures_dir = "demo/figures", .tables_dir = "demo/tables"});
//
// The document (check_analysis says what is required; the rest is optional):
//   format "vicinal-analysis", version 1, title, program, command_line,
//   compound {name, smiles, inchikey, molfile (the labels' numbering),
//             depict_labels {label: atom}},
//   conditions {solvent, temperature_k, field_mhz, measured_by, source, ...},
//   couplings [{nuclei, j_hz, sigma_hz, note, set, tolerance_hz,
//               allowed_deg [{from, to, best}], exact_deg, curve {of, atoms,
//               dihedral_deg [], j_hz []}}],
//   sets [{id, form, coefficients {name: value}, rms_hz, citation, table, doi}],
//   candidates [{name, origin, assignment, chi2_free, chi2_boltzmann,
//                prior_penalty, score, probability, summary [],
//                couplings [{predicted_hz, contribution}] (one per coupling),
//                conformers [{name, energy_kcal_mol, boltzmann, population,
//                             free_population, ci95, range, dihedral_deg [],
//                             j_hz [], key_dihedral_deg, side_chain}],
//                side_chain [{rotamer, boltzmann, population, free_population}]}],
//   ranking {verdict, confidence, favoured, error_model, energies_used, ...},
//   multiplet {proton, field_mhz, notation, center_ppm, residual_hz,
//              peaks [{hz, ppm, intensity, fitted_hz}], tree_lines [{hz, intensity}]}.
// cli/scenario_analysis.cc writes it; analysis_report_test.cc holds a small example.
#pragma once

#include <filesystem>
#include <string>
#include <utility>
#include <vector>

#include "core/json_file.h"
#include "report/plot.h"

namespace vicinal::report {

inline constexpr const char* kAnalysisFormat = "vicinal-analysis";
inline constexpr int kAnalysisVersion = 1;

// Format, version and the members every report needs; vicinal::Error naming
// the source and the first key that is missing or of the wrong kind.
void check_analysis(const Json& doc, const std::string& source);

struct NamedFigure {
  std::string name;     // file stem, e.g. "karplus-1-H-2-H-3"
  std::string caption;  // for the HTML report
  Figure figure;
};

// Every figure of the report, in report order.
std::vector<NamedFigure> analysis_figures(const Json& doc);

// The tables of the report as CSV files: file name -> content.
std::vector<std::pair<std::string, std::string>> analysis_tables(const Json& doc);

// The self-contained HTML page (inline SVG figures, inline CSS, no script).
std::string analysis_html(const Json& doc, const std::vector<NamedFigure>& figures);

struct ReportPaths {
  std::filesystem::path html{};         // required
  std::filesystem::path figures_dir{};  // empty = no figure files
  std::filesystem::path tables_dir{};   // empty = no CSV tables
};

// Checks the document, then writes the HTML, each figure as .svg, .pdf and
// .png, the CSV tables and a copy of the document (tables_dir/analysis.json).
// Every file is written atomically. Returns the paths written.
std::vector<std::string> write_analysis_report(const Json& doc, const std::string& source, const ReportPaths& paths);

}  // namespace vicinal::report
