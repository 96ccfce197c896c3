#include "report/html.h"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <stdexcept>

namespace vicinal::report {

namespace {

// Plain, readable, printable. System fonts only: nothing is fetched.
constexpr const char* kStyle = R"css(
:root { --ink: #1d1d1f; --muted: #5b5b60; --rule: #d5d5da; --tint: #f4f5f7; --accent: #0b5f99;
        --caution: #a35a00; --caution-tint: #fff6e8; }
* { box-sizing: border-box; }
html { font-size: 16px; }
body { margin: 0 auto; max-width: 58rem; padding: 2rem 1.5rem 3rem; color: var(--ink); background: #fff;
       font-family: "DejaVu Sans", "Segoe UI", system-ui, sans-serif; line-height: 1.5; }
header { border-bottom: 2px solid var(--ink); margin-bottom: 1.5rem; padding-bottom: 0.5rem; }
h1 { font-size: 1.7rem; margin: 0 0 0.25rem; line-height: 1.2; }
.subtitle { color: var(--muted); margin: 0; }
h2 { font-size: 1.3rem; margin: 2.2rem 0 0.6rem; padding-bottom: 0.2rem; border-bottom: 1px solid var(--rule); }
h3 { font-size: 1.1rem; margin: 1.6rem 0 0.5rem; }
h4, h5, h6 { font-size: 1rem; margin: 1.2rem 0 0.4rem; }
p { margin: 0.6rem 0; }
a { color: var(--accent); }
nav.contents { background: var(--tint); padding: 0.6rem 1rem; border-radius: 4px; }
nav.contents h2 { font-size: 1rem; margin: 0 0 0.3rem; border: 0; padding: 0; }
nav.contents ol { margin: 0; padding-left: 1.4rem; }
pre { background: var(--tint); padding: 0.6rem 0.8rem; overflow-x: auto; border-radius: 4px;
      font-family: "DejaVu Sans Mono", ui-monospace, monospace; font-size: 0.85rem; white-space: pre-wrap; }
table { border-collapse: collapse; margin: 0.8rem 0 1.2rem; font-size: 0.92rem; }
caption { caption-side: top; text-align: left; font-weight: bold; padding-bottom: 0.3rem; }
th, td { padding: 0.25rem 0.7rem; text-align: left; vertical-align: top; }
thead th { border-bottom: 2px solid var(--ink); }
tbody tr { border-bottom: 1px solid var(--rule); }
tbody tr:nth-child(even) { background: var(--tint); }
.num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
figure { margin: 1rem 0 1.5rem; }
figure svg { display: block; max-width: 100%; height: auto; }
figcaption { color: var(--muted); font-size: 0.9rem; margin-top: 0.3rem; }
.caution { border-left: 4px solid var(--caution); background: var(--caution-tint); padding: 0.6rem 1rem;
           margin: 1rem 0; border-radius: 0 4px 4px 0; }
.caution strong { color: var(--caution); display: block; margin-bottom: 0.2rem; }
dl.conditions { display: grid; grid-template-columns: max-content 1fr; gap: 0.2rem 1.2rem; margin: 0.8rem 0; }
dl.conditions dt { font-weight: bold; }
dl.conditions dd { margin: 0; }
footer { margin-top: 3rem; padding-top: 0.5rem; border-top: 1px solid var(--rule); color: var(--muted);
         font-size: 0.85rem; }
@media print {
  @page { margin: 18mm 15mm; }
  html { font-size: 10.5pt; }
  body { max-width: none; padding: 0; }
  nav.contents { display: none; }
  a { color: inherit; text-decoration: none; }
  h2, h3 { break-after: avoid; }
  figure, table, .caution, pre, dl { break-inside: avoid; }
  tbody tr:nth-child(even) { background: none; }
}
)css";

std::string lower(std::string_view text) {
  std::string out(text);
  std::transform(out.begin(), out.end(), out.begin(), [](unsigned char c) { return std::tolower(c); });
  return out;
}

}  // namespace

std::string html_escape(std::string_view text) {
  std::string out;
  out.reserve(text.size());
  for (char c : text) {
    switch (c) {
      case '&': out += "&amp;"; break;
      case '<': out += "&lt;"; break;
      case '>': out += "&gt;"; break;
      case '"': out += "&quot;"; break;
      case '\'': out += "&#39;"; break;
      default: out += c;
    }
  }
  return out;
}

HtmlDocument::HtmlDocument(std::string title) : title_(std::move(title)) {}

std::string HtmlDocument::unique_id(std::string_view wanted) {
  // Anchors keep letters, digits, '-' and '_'; anything else becomes '-'.
  std::string id;
  for (char c : lower(wanted)) id += (std::isalnum(static_cast<unsigned char>(c)) || c == '_') ? c : '-';
  if (id.empty() || !std::isalpha(static_cast<unsigned char>(id[0]))) id = "s-" + id;
  std::string candidate = id;
  for (int n = 2; std::find(ids_.begin(), ids_.end(), candidate) != ids_.end(); ++n)
    candidate = fmt::format("{}-{}", id, n);
  ids_.push_back(candidate);
  return candidate;
}

void HtmlDocument::open_section(std::string_view id, std::string_view heading) {
  const std::string anchor = unique_id(id);
  const int level = std::min(depth_ + 2, 6);
  if (depth_ == 0) contents_.emplace_back(anchor, std::string(heading));
  body_ += fmt::format("<section id=\"{}\">\n<h{}>{}</h{}>\n", anchor, level, html_escape(heading), level);
  ++depth_;
}

void HtmlDocument::close_section() {
  if (depth_ == 0) throw std::logic_error("close_section without an open section");
  --depth_;
  body_ += "</section>\n";
}

void HtmlDocument::paragraph(std::string_view text) { body_ += "<p>" + html_escape(text) + "</p>\n"; }

void HtmlDocument::preformatted(std::string_view text) { body_ += "<pre>" + html_escape(text) + "</pre>\n"; }

void HtmlDocument::caution(std::string_view heading, std::string_view text) {
  body_ += fmt::format("<div class=\"caution\" role=\"note\"><strong>{}</strong>{}</div>\n", html_escape(heading),
                       html_escape(text));
}

void HtmlDocument::definitions(const std::vector<std::pair<std::string, std::string>>& terms) {
  if (terms.empty()) return;
  body_ += "<dl class=\"conditions\">\n";
  for (const auto& [term, value] : terms)
    body_ += fmt::format("<dt>{}</dt><dd>{}</dd>\n", html_escape(term), html_escape(value));
  body_ += "</dl>\n";
}

void HtmlDocument::table(const std::vector<std::string>& header, const std::vector<std::vector<std::string>>& rows,
                         std::string_view caption) {
  for (const auto& row : rows)
    if (row.size() != header.size()) throw std::logic_error("HTML table row has the wrong number of cells");
  const std::vector<bool> numeric = numeric_columns(header, rows);
  auto cls = [&](std::size_t c) { return numeric[c] ? " class=\"num\"" : ""; };
  body_ += "<table>\n";
  if (!caption.empty()) body_ += "<caption>" + html_escape(caption) + "</caption>\n";
  body_ += "<thead><tr>";
  for (std::size_t c = 0; c < header.size(); ++c)
    body_ += fmt::format("<th scope=\"col\"{}>{}</th>", cls(c), html_escape(header[c]));
  body_ += "</tr></thead>\n<tbody>\n";
  for (const auto& row : rows) {
    body_ += "<tr>";
    for (std::size_t c = 0; c < row.size(); ++c) body_ += fmt::format("<td{}>{}</td>", cls(c), html_escape(row[c]));
    body_ += "</tr>\n";
  }
  body_ += "</tbody>\n</table>\n";
}

void HtmlDocument::table(const TextTable& table, std::string_view caption) {
  this->table(table.header(), table.rows(), caption);
}

void HtmlDocument::figure(std::string_view svg, std::string_view caption) {
  if (lower(svg).find("<script") != std::string::npos)
    throw std::invalid_argument("an SVG with a script cannot go into a report");
  // The XML declaration belongs to stand-alone files only.
  if (svg.substr(0, 5) == "<?xml") {
    const auto end = svg.find("?>");
    svg = end == std::string_view::npos ? std::string_view{} : svg.substr(end + 2);
  }
  while (!svg.empty() && std::isspace(static_cast<unsigned char>(svg.front()))) svg.remove_prefix(1);
  body_ += "<figure>\n";
  body_ += svg;
  if (!svg.empty() && svg.back() != '\n') body_ += '\n';
  if (!caption.empty()) body_ += "<figcaption>" + html_escape(caption) + "</figcaption>\n";
  body_ += "</figure>\n";
}

std::string HtmlDocument::render() const {
  std::string out = "<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n";
  out += "<meta name=\"viewport\" content=\"width=device-width, initial-scale=1\">\n";
  // The report must never load or run anything: say so to the browser too.
  out += "<meta http-equiv=\"Content-Security-Policy\" "
         "content=\"default-src 'none'; style-src 'unsafe-inline'; img-src data:\">\n";
  out += "<meta name=\"generator\" content=\"vicinal\">\n";
  out += "<title>" + html_escape(title_) + "</title>\n<style>" + kStyle + "</style>\n</head>\n<body>\n";
  out += "<header>\n<h1>" + html_escape(title_) + "</h1>\n";
  if (!subtitle_.empty()) out += "<p class=\"subtitle\">" + html_escape(subtitle_) + "</p>\n";
  out += "</header>\n";
  if (contents_.size() >= 2) {
    out += "<nav class=\"contents\" aria-label=\"Contents\">\n<h2>Contents</h2>\n<ol>\n";
    for (const auto& [id, heading] : contents_)
      out += fmt::format("<li><a href=\"#{}\">{}</a></li>\n", id, html_escape(heading));
    out += "</ol>\n</nav>\n";
  }
  out += "<main>\n" + body_;
  for (int d = depth_; d > 0; --d) out += "</section>\n";
  out += "</main>\n";
  if (!footer_.empty()) out += "<footer>" + html_escape(footer_) + "</footer>\n";
  out += "</body>\n</html>\n";
  return out;
}

}  // namespace vicinal::report
