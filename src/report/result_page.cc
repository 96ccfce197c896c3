#include "report/result_page.h"

#include <fmt/format.h>

#include <cctype>
#include <cmath>
#include <limits>

#include "core/atomic_file.h"
#include "core/csv.h"

namespace vicinal::report {

std::string PageFigure::svg() const { return plot ? figure_svg(*plot) : heatmap_svg(*heat); }

void PageFigure::save(const std::filesystem::path& path) const {
  if (plot) {
    Figure f = *plot;
    if (path.extension() == ".png") f.png_scale = 2;
    save_figure(f, path);
  } else {
    save_heatmap(*heat, path);
  }
}

std::string PageTable::csv() const {
  std::string out;
  auto line = [&](const std::vector<std::string>& cells) {
    for (std::size_t i = 0; i < cells.size(); ++i) {
      if (i) out += ',';
      out += csv_escape(cells[i]);
    }
    out += "\n";
  };
  line(header);
  for (const auto& r : rows) line(r);
  return out;
}

void ResultPage::add_table(HtmlDocument& html, PageTable table) {
  html.table(table.header, table.rows, table.caption);
  tables.push_back(std::move(table));
}

void ResultPage::add_figure(HtmlDocument& html, const std::string& name) const {
  for (const auto& f : figures)
    if (f.name == name) return html.figure(f.svg(), f.caption);
}

HtmlDocument result_document(const Json& doc) {
  HtmlDocument html(json_string_or_empty(doc, "title"));
  std::string subtitle = json_string_or_empty(doc, "program");
  if (const auto created = json_string_or_empty(doc, "created"); !created.empty()) subtitle += " · " + created;
  html.set_subtitle(subtitle);
  html.set_footer(
      fmt::format("{} · made with {}", json_string_or_empty(doc, "title"), json_string_or_empty(doc, "program")));
  return html;
}

void add_provenance(HtmlDocument& html, const Json& doc, const std::string& document_name) {
  html.open_section("provenance", "How this report was made");
  html.definitions({{"program", json_string_or_empty(doc, "program")}, {"made", json_string_or_empty(doc, "created")}});
  html.preformatted(json_string_or_empty(doc, "command_line"));
  html.paragraph(
      fmt::format("Rebuild this page, its figures (SVG, PDF, PNG) and its tables (CSV) from the saved "
                  "document with `vicinal report {} --out report.html`.",
                  document_name));
  html.close_section();
}

std::vector<std::string> write_result_page(const ResultPage& page, const Json& doc, const std::string& copy_name,
                                           const ReportPaths& paths) {
  std::vector<std::string> written;
  if (!paths.figures_dir.empty()) {
    create_output_folder(paths.figures_dir);
    for (const auto& f : page.figures)
      for (const char* ext : {".svg", ".pdf", ".png"}) {
        const auto path = paths.figures_dir / (f.name + ext);
        f.save(path);
        written.push_back(path.string());
      }
  }
  if (!paths.tables_dir.empty()) {
    create_output_folder(paths.tables_dir);
    for (const auto& t : page.tables) {
      write_file_atomically(paths.tables_dir / t.file, t.csv());
      written.push_back((paths.tables_dir / t.file).string());
    }
    write_file_atomically(paths.tables_dir / copy_name, doc.dump(2) + "\n");
    written.push_back((paths.tables_dir / copy_name).string());
  }
  if (!paths.html.parent_path().empty()) create_output_folder(paths.html.parent_path());
  write_file_atomically(paths.html, page.html);
  written.push_back(paths.html.string());
  return written;
}

double json_number_or_nan(const Json& j, const char* key) {
  const auto it = j.find(key);
  return it != j.end() && it->is_number() ? it->get<double>() : std::numeric_limits<double>::quiet_NaN();
}

std::string json_string_or_empty(const Json& j, const char* key) {
  const auto it = j.find(key);
  return it != j.end() && it->is_string() ? it->get<std::string>() : std::string();
}

const Json& json_array_or_empty(const Json& j, const char* key) {
  static const Json empty = Json::array();
  const auto it = j.find(key);
  return it != j.end() && it->is_array() ? *it : empty;
}

std::vector<double> json_numbers(const Json& j, const char* key) {
  std::vector<double> out;
  for (const auto& v : json_array_or_empty(j, key))
    out.push_back(v.is_number() ? v.get<double>() : std::numeric_limits<double>::quiet_NaN());
  return out;
}

std::string fixed_or_dash(double v, int digits) { return std::isfinite(v) ? fmt::format("{:.{}f}", v, digits) : "-"; }

std::string file_slug(const std::string& text) {
  std::string out;
  for (char c : text) {
    if (std::isalnum(static_cast<unsigned char>(c)))
      out += c;
    else if (!out.empty() && out.back() != '-')
      out += '-';
  }
  while (!out.empty() && out.back() == '-') out.pop_back();
  return out;
}

}  // namespace vicinal::report
