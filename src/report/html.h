// A small builder for self-contained HTML reports: one file, our own inline
// stylesheet (screen and print), no scripts and no network resources (a
// Content-Security-Policy says so to the browser). Every piece of text is
// escaped; only SVG figures made by vicinal itself are inserted as markup.
//
//   HtmlDocument doc("Couplings of compound 7");
//   doc.open_section("fit", "Population fit");
//   doc.paragraph("Three staggered rotamers were fitted to four couplings.");
//   doc.table(text_table, "Measured and back-calculated couplings");
//   doc.figure(figure_svg(fig), "Karplus curve with the measured values");
//   doc.caution("The fit is not unique", "Two rotamer sets explain the data equally well.");
//   doc.close_section();
//   write_file_atomically("report.html", doc.render());
#pragma once

#include <string>
#include <string_view>
#include <utility>
#include <vector>

#include "report/table.h"

namespace vicinal::report {

// Text made safe for HTML element content and quoted attribute values.
std::string html_escape(std::string_view text);

class HtmlDocument {
 public:
  explicit HtmlDocument(std::string title);

  // Optional line under the title (e.g. what was analysed and when).
  void set_subtitle(std::string text) { subtitle_ = std::move(text); }
  // Optional small print at the end (program version, data sources).
  void set_footer(std::string text) { footer_ = std::move(text); }

  // Sections nest; the heading level follows the depth (h2, h3, ...). `id`
  // becomes the anchor (made safe and unique); top-level sections are listed
  // in a table of contents when there are two or more.
  void open_section(std::string_view id, std::string_view heading);
  void close_section();

  void paragraph(std::string_view text);
  // Monospaced block kept as written, e.g. the command that produced a result.
  void preformatted(std::string_view text);
  // A boxed warning that the reader must not miss (ambiguous fit, missing data).
  void caution(std::string_view heading, std::string_view text);
  // Terms and their values, e.g. measurement conditions.
  void definitions(const std::vector<std::pair<std::string, std::string>>& terms);
  // Numeric columns are right-aligned with tabular figures. Every row must
  // have as many cells as the header (std::logic_error otherwise).
  void table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
             std::string_view caption = {});
  void table(const TextTable& table, std::string_view caption = {});
  // An SVG document (figure_svg, depiction_svg) inline, with a caption. The
  // XML declaration is dropped; an SVG carrying a script is refused
  // (std::invalid_argument), since reports never run code.
  void figure(std::string_view svg, std::string_view caption);

  // The complete document; sections still open are closed.
  std::string render() const;

 private:
  std::string unique_id(std::string_view wanted);

  std::string title_, subtitle_, footer_;
  std::string body_;
  int depth_ = 0;
  std::vector<std::string> ids_;
  std::vector<std::pair<std::string, std::string>> contents_;  // id, heading of top-level sections
};

}  // namespace vicinal::report
