#include "report/plot.h"

#include <cairo.h>
#include <gtest/gtest.h>

#include <cmath>
#include <fstream>
#include <limits>
#include <regex>
#include <set>

#include "core/error.h"

namespace vicinal::report {
namespace {

namespace fs = std::filesystem;

constexpr double kNaN = std::numeric_limits<double>::quiet_NaN();

class PlotFiles : public ::testing::Test {
 protected:
  void SetUp() override {
    folder_ = fs::path(::testing::TempDir()) /
              ("plot_test_" + std::string(::testing::UnitTest::GetInstance()->current_test_info()->name()));
    fs::remove_all(folder_);
    fs::create_directories(folder_);
  }
  void TearDown() override { if (!HasFailure()) fs::remove_all(folder_); }
  std::vector<std::string> files() const {
    std::vector<std::string> names;
    for (const auto& entry : fs::directory_iterator(folder_)) names.push_back(entry.path().filename().string());
    return names;
  }
  fs::path folder_;
};

// A decoded PNG, read back through cairo.
struct Image {
  int width = 0, height = 0;
  std::vector<std::uint32_t> argb;
  struct Rgb {
    int r, g, b;
  };
  Rgb at(int x, int y) const {
    const std::uint32_t p = argb[static_cast<std::size_t>(y) * width + x];
    return {static_cast<int>((p >> 16) & 0xFF), static_cast<int>((p >> 8) & 0xFF), static_cast<int>(p & 0xFF)};
  }
};

Image read_png(const fs::path& path) {
  cairo_surface_t* s = cairo_image_surface_create_from_png(path.c_str());
  EXPECT_EQ(cairo_surface_status(s), CAIRO_STATUS_SUCCESS) << path;
  Image image;
  if (cairo_surface_status(s) == CAIRO_STATUS_SUCCESS) {
    cairo_surface_flush(s);
    image.width = cairo_image_surface_get_width(s);
    image.height = cairo_image_surface_get_height(s);
    const int stride = cairo_image_surface_get_stride(s);
    const unsigned char* data = cairo_image_surface_get_data(s);
    for (int y = 0; y < image.height; ++y)
      for (int x = 0; x < image.width; ++x)
        image.argb.push_back(*reinterpret_cast<const std::uint32_t*>(data + y * stride + 4 * x));
  }
  cairo_surface_destroy(s);
  return image;
}

// The first palette colour is Okabe-Ito blue, #0072B2; anti-aliased edges
// blend it with white, which keeps blue well above red and green.
bool is_first_colour(Image::Rgb c) { return c.b - c.r > 50 && c.b - c.g > 15; }

Image render(const Figure& figure, const fs::path& folder, const std::string& name = "figure.png") {
  save_figure(figure, folder / name);
  return read_png(folder / name);
}

Figure unit_square() {
  Figure f;
  f.x_range = std::make_pair(0.0, 10.0);
  f.y_range = std::make_pair(0.0, 10.0);
  return f;
}

Series line_at(double y, std::vector<double> xs = {0, 2, 4, 6, 8, 10}) {
  Series s;
  s.x = xs;
  s.y.assign(xs.size(), y);
  return s;
}

// Rows (or columns) holding pixels of the first palette colour.
std::set<int> rows_with_first_colour(const Image& image) {
  std::set<int> rows;
  for (int y = 0; y < image.height; ++y)
    for (int x = 0; x < image.width; ++x)
      if (is_first_colour(image.at(x, y))) rows.insert(y);
  return rows;
}
std::set<int> columns_with_first_colour(const Image& image) {
  std::set<int> columns;
  for (int y = 0; y < image.height; ++y)
    for (int x = 0; x < image.width; ++x)
      if (is_first_colour(image.at(x, y))) columns.insert(x);
  return columns;
}

// Runs of consecutive integers: {3,4,5,9,10} -> {{3,5},{9,10}}.
std::vector<std::pair<int, int>> runs(const std::set<int>& values) {
  std::vector<std::pair<int, int>> out;
  for (int v : values) {
    if (!out.empty() && out.back().second + 1 == v)
      out.back().second = v;
    else
      out.push_back({v, v});
  }
  return out;
}

std::string read_text(const fs::path& path) {
  std::ifstream in(path, std::ios::binary);
  return {std::istreambuf_iterator<char>(in), {}};
}

std::vector<std::string> svg_texts(const std::string& svg) {
  std::vector<std::string> out;
  const std::regex text_element("<text[^>]*>([^<]*)</text>");
  for (auto it = std::sregex_iterator(svg.begin(), svg.end(), text_element); it != std::sregex_iterator(); ++it)
    out.push_back((*it)[1]);
  return out;
}

bool contains(const std::vector<std::string>& v, const std::string& s) {
  return std::find(v.begin(), v.end(), s) != v.end();
}

TEST(FigureSvg, CarriesTitleAxisLabelsAndTicksAsText) {
  Figure f = unit_square();
  f.title = "Coupling against angle";
  f.x_label = "dihedral (deg)";
  f.y_label = "J (Hz)";
  f.series = {line_at(5)};
  const std::string svg = figure_svg(f);
  EXPECT_EQ(svg.rfind("<?xml", 0), 0u);
  EXPECT_NE(svg.find("<title>Coupling against angle</title>"), std::string::npos);
  const auto texts = svg_texts(svg);
  EXPECT_TRUE(contains(texts, "Coupling against angle"));
  EXPECT_TRUE(contains(texts, "dihedral (deg)"));
  EXPECT_TRUE(contains(texts, "J (Hz)"));
  EXPECT_TRUE(contains(texts, "0"));
  EXPECT_TRUE(contains(texts, "10"));
  // The y label is turned to run up the axis.
  EXPECT_NE(svg.find("rotate(-90.00"), std::string::npos);
}

TEST(FigureSvg, EscapesTextAndKeepsGlyphReferencesResolvable) {
  Figure f = unit_square();
  f.title = "a < b & \"c\" <script>alert(1)</script>";
  f.series = {line_at(5)};
  const std::string svg = figure_svg(f);
  EXPECT_EQ(svg.find("<script"), std::string::npos);
  EXPECT_NE(svg.find("a &lt; b &amp; &quot;c&quot; &lt;script&gt;"), std::string::npos);
  // Every internal reference points at an id defined in the same document.
  std::set<std::string> ids;
  const std::regex id("id=\"([^\"]+)\""), ref("(?:href=\"#|url\\(#)([^\")]+)");
  for (auto it = std::sregex_iterator(svg.begin(), svg.end(), id); it != std::sregex_iterator(); ++it)
    ids.insert((*it)[1]);
  int references = 0;
  for (auto it = std::sregex_iterator(svg.begin(), svg.end(), ref); it != std::sregex_iterator(); ++it, ++references)
    EXPECT_TRUE(ids.count((*it)[1])) << (*it)[1];
  EXPECT_GT(references, 0);
}

TEST(FigureSvg, DifferentFiguresGetDifferentIdsSoTheyCanShareAPage) {
  Figure a = unit_square(), b = unit_square();
  a.title = "first";
  b.title = "second";
  const std::regex first_id("id=\"([^\"]+)\"");
  std::smatch ma, mb;
  const std::string sa = figure_svg(a), sb = figure_svg(b);
  ASSERT_TRUE(std::regex_search(sa, ma, first_id));
  ASSERT_TRUE(std::regex_search(sb, mb, first_id));
  EXPECT_NE(ma[1], mb[1]);
  EXPECT_TRUE(sa == figure_svg(a)) << "the same figure gives the same document";
}

TEST(FigureSvg, LegendOnlyWithMoreThanOneLabelledSeries) {
  Figure f = unit_square();
  Series one = line_at(2), two = line_at(6);
  one.label = "measured";
  two.label = "predicted";
  f.series = {one};
  EXPECT_FALSE(contains(svg_texts(figure_svg(f)), "measured"));
  f.series = {one, two};
  const auto texts = svg_texts(figure_svg(f));
  EXPECT_TRUE(contains(texts, "measured"));
  EXPECT_TRUE(contains(texts, "predicted"));
}

TEST(FigureSvg, WrapsALongFootnoteWithinTheWidth) {
  Figure f = unit_square();
  f.width_pt = 300;
  f.footnote =
      "Source: an invented citation long enough to need several lines, with a very long identifier "
      "doi:10.0000/an-identifier-that-is-far-too-long-to-fit-on-one-line-of-a-narrow-figure-at-all";
  const std::string svg = figure_svg(f);
  const std::regex footnote_line("<text x=\"10.00\" y=\"[0-9.]+\" font-size=\"8.00\" textLength=\"([0-9.]+)\"");
  int lines = 0;
  for (auto it = std::sregex_iterator(svg.begin(), svg.end(), footnote_line); it != std::sregex_iterator();
       ++it, ++lines)
    EXPECT_LE(std::stod((*it)[1]), 280.0);
  EXPECT_GE(lines, 3);
  const auto texts = svg_texts(svg);
  EXPECT_TRUE(contains(texts, "Source: an invented citation long enough to need") ||
              std::any_of(texts.begin(), texts.end(), [](const std::string& t) { return t.rfind("Source:", 0) == 0; }));
}

TEST(FigureSvg, SlantsCrowdedCategoryLabels) {
  Figure f;
  f.width_pt = 300;
  for (int i = 1; i <= 8; ++i) {
    f.x_ticks.push_back(i);
    f.x_tick_labels.push_back("configuration " + std::to_string(i));
  }
  Series bars;
  bars.style = Series::Style::Bars;
  bars.x = f.x_ticks;
  bars.y = {1, 2, 3, 4, 5, 6, 7, 8};
  f.series = {bars};
  const std::string svg = figure_svg(f);
  EXPECT_TRUE(contains(svg_texts(svg), "configuration 8"));
  EXPECT_NE(svg.find("rotate(-45.00"), std::string::npos);
  f.width_pt = 2000;  // room enough: labels stay level
  EXPECT_EQ(figure_svg(f).find("rotate(-45.00"), std::string::npos);
}

TEST_F(PlotFiles, PngHasTheRequestedSizeAndIsNotBlank) {
  Figure f = unit_square();
  f.width_pt = 400;
  f.height_pt = 250;
  f.series = {line_at(5)};
  Image image = render(f, folder_);
  EXPECT_EQ(image.width, 400);
  EXPECT_EQ(image.height, 250);
  int dark = 0;
  for (int y = 0; y < image.height; ++y)
    for (int x = 0; x < image.width; ++x)
      if (image.at(x, y).r < 128) ++dark;
  EXPECT_GT(dark, 500);

  f.png_scale = 2;
  image = render(f, folder_, "sharp.png");
  EXPECT_EQ(image.width, 800);
  EXPECT_EQ(image.height, 500);
}

TEST_F(PlotFiles, HorizontalLineColoursOneRowAcrossTheFrame) {
  Figure f = unit_square();
  f.series = {line_at(5)};
  const auto low = rows_with_first_colour(render(f, folder_, "low.png"));
  ASSERT_FALSE(low.empty());
  EXPECT_LE(*low.rbegin() - *low.begin(), 4) << "a level line is a few pixels thick";
  const auto columns = columns_with_first_colour(render(f, folder_, "low.png"));
  EXPECT_EQ(runs(columns).size(), 1u);
  EXPECT_GT(static_cast<int>(columns.size()), 400) << "the line spans the plot width";

  f.series = {line_at(8)};
  const auto high = rows_with_first_colour(render(f, folder_, "high.png"));
  ASSERT_FALSE(high.empty());
  EXPECT_LT(*high.rbegin(), *low.begin()) << "larger y is drawn higher up";
}

TEST_F(PlotFiles, NanBreaksALineInsteadOfCrashing) {
  Figure f = unit_square();
  Series s = line_at(5, {0, 1, 2, 3, 4, 5, 6, 7, 8, 9, 10});
  s.y[5] = kNaN;
  f.series = {s};
  const auto columns = columns_with_first_colour(render(f, folder_));
  EXPECT_EQ(runs(columns).size(), 2u) << "the gap at x = 4..6 stays empty";
}

// Columns, along the middle row, tinted by a band of palette colour 2 (#009E73).
std::vector<std::pair<int, int>> tinted_runs(const Image& image) {
  std::set<int> tinted;
  for (int x = 0; x < image.width; ++x) {
    const auto c = image.at(x, image.height / 2);
    if (c.g - c.r > 15) tinted.insert(x);
  }
  return runs(tinted);
}

TEST_F(PlotFiles, VerticalBandTintsItsXRangeAndFollowsReverseX) {
  Figure f = unit_square();
  f.bands = {{true, 2, 4, "", 2}};
  auto one = tinted_runs(render(f, folder_));
  ASSERT_EQ(one.size(), 1u);
  const int band_width = one[0].second - one[0].first + 1;

  f.bands.push_back({true, 6, 8, "", 2});
  auto two = tinted_runs(render(f, folder_));
  ASSERT_EQ(two.size(), 2u);
  EXPECT_EQ(two[0], one[0]);
  EXPECT_NEAR(two[1].second - two[1].first + 1, band_width, 2) << "equal spans, equal widths";
  const double unit = (two[1].first - two[0].first) / 4.0;  // pixels per x unit
  EXPECT_NEAR(band_width, 2 * unit, 2);

  f.reverse_x = true;
  f.bands.pop_back();  // x = 2..4 alone now lies where 6..8 was drawn
  auto reversed = tinted_runs(render(f, folder_));
  ASSERT_EQ(reversed.size(), 1u);
  EXPECT_NEAR(reversed[0].first, two[1].first, 2) << "x = 2..4 moves to the right side";
}

TEST_F(PlotFiles, SticksAndBarsDrawOneShapePerValue) {
  Figure f = unit_square();
  Series sticks;
  sticks.style = Series::Style::Sticks;
  sticks.x = {2, 5, 7};
  sticks.y = {3, 9, kNaN};
  f.series = {sticks};
  EXPECT_EQ(runs(columns_with_first_colour(render(f, folder_, "sticks.png"))).size(), 2u);

  Figure bars;
  Series b;
  b.style = Series::Style::Bars;
  b.y = {0.5, 0.3, 0.2};  // x left out: bars stand at 1, 2, 3
  b.error_low = {0.4, 0.2, 0.1};
  b.error_high = {0.6, 0.4, 0.3};
  bars.series = {b};
  bars.x_ticks = {1, 2, 3};
  bars.x_tick_labels = {"gg", "gt", "tg"};
  const Image image = render(bars, folder_, "bars.png");
  EXPECT_EQ(runs(columns_with_first_colour(image)).size(), 3u);
  const auto texts = svg_texts(figure_svg(bars));
  EXPECT_TRUE(contains(texts, "gg") && contains(texts, "gt") && contains(texts, "tg"));
}

TEST_F(PlotFiles, PdfIsAPdfAndLeavesNoTemporaryFiles) {
  Figure f = unit_square();
  f.title = "populations";
  f.series = {line_at(3)};
  save_figure(f, folder_ / "figure.pdf");
  const std::string pdf = read_text(folder_ / "figure.pdf");
  EXPECT_EQ(pdf.substr(0, 5), "%PDF-");
  EXPECT_NE(pdf.find("/ToUnicode"), std::string::npos) << "embedded text maps back to characters: selectable";
  EXPECT_NE(pdf.find("/Title (populations)"), std::string::npos);
  save_figure(f, folder_ / "figure.SVG");
  EXPECT_TRUE(read_text(folder_ / "figure.SVG") == figure_svg(f));
  EXPECT_EQ(files().size(), 2u);
}

TEST_F(PlotFiles, BadExtensionOrMissingFolderIsAnErrorAndLeavesNothing) {
  Figure f = unit_square();
  f.series = {line_at(3)};
  EXPECT_THROW(save_figure(f, folder_ / "figure.jpg"), Error);
  EXPECT_THROW(save_figure(f, folder_ / "figure"), Error);
  EXPECT_THROW(save_figure(f, folder_ / "missing" / "figure.png"), Error);
  EXPECT_THROW(save_figure(f, folder_ / "missing" / "figure.svg"), Error);
  EXPECT_TRUE(files().empty());
}

TEST_F(PlotFiles, AwkwardDataNeverCrashes) {
  const double inf = std::numeric_limits<double>::infinity();
  std::vector<Figure> figures(8);
  figures[0].series = {Series{}};                                       // empty series
  figures[1].series = {line_at(kNaN)};                                   // nothing finite
  figures[2].series = {line_at(4, {3})};                                 // one point: zero-width ranges
  figures[3].series = {Series{"", {1, 2, 3}, {1}, Series::Style::Points, {}, {}, -1, false}};  // ragged
  figures[4].bands = {{true, -inf, inf, "everything"}, {false, kNaN, 1, "half"}};
  figures[5].x_range = std::make_pair(kNaN, inf);
  figures[5].y_range = std::make_pair(3.0, 3.0);
  figures[5].series = {line_at(1e300, {0, 1e300})};
  figures[6].title = std::string("bad \xff\xfe utf-8 \x01");
  figures[6].width_pt = 1;
  figures[6].height_pt = 1;
  figures[7].width_pt = kNaN;
  figures[7].height_pt = inf;
  figures[7].png_scale = kNaN;
  for (std::size_t i = 0; i < figures.size(); ++i) {
    SCOPED_TRACE(i);
    const Image image = render(figures[i], folder_);
    EXPECT_GT(image.width, 0);
    EXPECT_NO_THROW(figure_svg(figures[i]));
  }
}

}  // namespace
}  // namespace vicinal::report
