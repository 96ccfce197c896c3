#include "report/html.h"

#include <gtest/gtest.h>

#include <regex>
#include <stdexcept>

#include "report/markup_nesting.h"
#include "report/plot.h"

namespace vicinal::report {
namespace {

int count(const std::string& text, const std::string& what) {
  int n = 0;
  for (auto at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) ++n;
  return n;
}

TEST(HtmlEscape, MakesMarkupInert) {
  EXPECT_EQ(html_escape("a < b && \"c\" 'd' >"), "a &lt; b &amp;&amp; &quot;c&quot; &#39;d&#39; &gt;");
  EXPECT_EQ(html_escape("δ 3.90 ppm"), "δ 3.90 ppm");
}

TEST(HtmlDocument, UserTextNeverBecomesMarkup) {
  const std::string evil = "<script>alert('x')</script><img src=x onerror=alert(1)> & \"q\"";
  HtmlDocument doc(evil);
  doc.set_subtitle(evil);
  doc.set_footer(evil);
  doc.open_section(evil, evil);
  doc.paragraph(evil);
  doc.preformatted(evil);
  doc.caution(evil, evil);
  doc.definitions({{evil, evil}});
  doc.table({evil}, {{evil}}, evil);
  doc.close_section();
  const std::string html = doc.render();
  EXPECT_EQ(html.find("<script"), std::string::npos);
  EXPECT_EQ(html.find("<img"), std::string::npos);
  EXPECT_EQ(html.find("alert('x')"), std::string::npos) << "quotes are escaped too";
  EXPECT_GE(count(html, "&lt;script&gt;alert(&#39;x&#39;)&lt;/script&gt;"), 10);
  EXPECT_EQ(markup_nesting_problem(html), "");
  // The section anchor keeps only safe characters.
  std::smatch id;
  ASSERT_TRUE(std::regex_search(html, id, std::regex("<section id=\"([^\"]*)\"")));
  EXPECT_TRUE(std::regex_match(id[1].str(), std::regex("[a-z][a-z0-9_-]*"))) << id[1];
}

TEST(HtmlDocument, IsSelfContainedAndScriptFree) {
  HtmlDocument doc("Couplings");
  doc.paragraph("text");
  const std::string html = doc.render();
  EXPECT_EQ(html.rfind("<!DOCTYPE html>", 0), 0u);
  EXPECT_NE(html.find("<meta charset=\"utf-8\">"), std::string::npos);
  EXPECT_NE(html.find("Content-Security-Policy"), std::string::npos);
  EXPECT_NE(html.find("@media print"), std::string::npos);
  EXPECT_EQ(html.find("<script"), std::string::npos);
  EXPECT_EQ(html.find("<link"), std::string::npos);
  EXPECT_EQ(html.find("http://"), std::string::npos);
  EXPECT_EQ(html.find("https://"), std::string::npos);
  EXPECT_EQ(html.find("@import"), std::string::npos);
  EXPECT_EQ(html.find("url("), std::string::npos);
}

TEST(HtmlDocument, SectionsNestWithUniqueIdsAndAContentsList) {
  HtmlDocument doc("Report");
  doc.open_section("fit", "Population fit");
  doc.open_section("fit", "Details");  // same id asked twice
  doc.paragraph("inner");
  doc.close_section();
  doc.close_section();
  doc.open_section("Karplus sets!", "Karplus sets");
  // left open: render closes it
  const std::string html = doc.render();
  EXPECT_NE(html.find("<section id=\"fit\">\n<h2>Population fit</h2>"), std::string::npos);
  EXPECT_NE(html.find("<section id=\"fit-2\">\n<h3>Details</h3>"), std::string::npos);
  EXPECT_NE(html.find("<section id=\"karplus-sets-\">"), std::string::npos);
  EXPECT_NE(html.find("<a href=\"#fit\">Population fit</a>"), std::string::npos);
  EXPECT_NE(html.find("<a href=\"#karplus-sets-\">Karplus sets</a>"), std::string::npos);
  EXPECT_EQ(html.find("#fit-2"), std::string::npos) << "only top-level sections are listed";
  EXPECT_EQ(count(html, "<section"), count(html, "</section>"));
  EXPECT_EQ(markup_nesting_problem(html), "");
  EXPECT_THROW(HtmlDocument("x").close_section(), std::logic_error);
}

TEST(HtmlDocument, OneSectionNeedsNoContentsList) {
  HtmlDocument doc("Report");
  doc.open_section("only", "Only");
  EXPECT_EQ(doc.render().find("class=\"contents\""), std::string::npos);
}

TEST(HtmlDocument, TablesRightAlignNumericColumns) {
  TextTable couplings({"pair", "J (Hz)", "sigma (Hz)"});
  couplings.add_row({"H2-H3", "7.5", "0.2"});
  couplings.add_row({"H3-H4a", "10.25", ""});
  HtmlDocument doc("Report");
  doc.table(couplings, "Measured couplings");
  const std::string html = doc.render();
  EXPECT_NE(html.find("<caption>Measured couplings</caption>"), std::string::npos);
  EXPECT_NE(html.find("<th scope=\"col\">pair</th><th scope=\"col\" class=\"num\">J (Hz)</th>"),
            std::string::npos);
  EXPECT_NE(html.find("<tr><td>H2-H3</td><td class=\"num\">7.5</td><td class=\"num\">0.2</td></tr>"),
            std::string::npos);
  EXPECT_NE(html.find("<td class=\"num\"></td>"), std::string::npos);
  EXPECT_EQ(markup_nesting_problem(html), "");
  EXPECT_THROW(doc.table({"a", "b"}, {{"1"}}), std::logic_error);
}

TEST(HtmlDocument, DefinitionsAndCaution) {
  HtmlDocument doc("Report");
  doc.definitions({{"solvent", "D2O"}, {"temperature", "298 K"}});
  doc.definitions({});  // nothing to list: no empty <dl>
  doc.caution("Fit not unique", "Two sets explain the data.");
  const std::string html = doc.render();
  EXPECT_NE(html.find("<dt>solvent</dt><dd>D2O</dd>\n<dt>temperature</dt><dd>298 K</dd>"), std::string::npos);
  EXPECT_EQ(count(html, "<dl"), 1);
  EXPECT_NE(html.find("<div class=\"caution\" role=\"note\"><strong>Fit not unique</strong>"), std::string::npos);
}

TEST(HtmlDocument, FiguresAreInlineSvgWithCaptions) {
  Figure fig;
  fig.title = "A & B";
  Series line;
  line.x = {0, 1};
  line.y = {0, 1};
  fig.series = {line};
  HtmlDocument doc("Report");
  doc.figure(figure_svg(fig), "Curve <fitted>");
  doc.figure(figure_svg(fig), "");
  const std::string html = doc.render();
  EXPECT_EQ(html.find("<?xml"), std::string::npos);
  EXPECT_EQ(count(html, "<figure>\n<svg"), 2);
  EXPECT_EQ(count(html, "<figcaption>"), 1);
  EXPECT_NE(html.find("<figcaption>Curve &lt;fitted&gt;</figcaption>"), std::string::npos);
  EXPECT_NE(html.find("<title>A &amp; B</title>"), std::string::npos);
  EXPECT_EQ(markup_nesting_problem(html), "");
  EXPECT_THROW(doc.figure("<svg><script>alert(1)</script></svg>", "bad"), std::invalid_argument);
  EXPECT_THROW(doc.figure("<svg><SCRIPT>alert(1)</SCRIPT></svg>", "bad"), std::invalid_argument);
}

}  // namespace
}  // namespace vicinal::report
