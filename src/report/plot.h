// Figures drawn through cairo: one code path for SVG, PDF and PNG (chosen by
// the file extension), and SVG text for inline use in the HTML report.
// Plots always carry axes with ticks and labels; a legend appears when more
// than one series is labelled (band labels sit on their bands); `footnote`
// carries citations, wrapped to the width.
//
//   Figure fig;
//   fig.title = "Karplus curve";
//   fig.x_label = "dihedral angle (deg)";
//   fig.y_label = "3J(H,H) (Hz)";
//   fig.x_range = {{0.0, 180.0}};
//   fig.x_ticks = {0, 30, 60, 90, 120, 150, 180};
//   fig.series.push_back({.label = "curve", .x = angles, .y = j_hz});
//   fig.bands.push_back({.vertical = false, .from = 6.8, .to = 7.6, .label = "measured"});
//   fig.footnote = "Source: ...";
//   save_figure(fig, "curve.png");          // or .svg / .pdf
//   html.figure(figure_svg(fig), "caption");
//
// Forgiving with data: NaN or infinite points are skipped (a line breaks
// there), x and y of unequal length are cut to the shorter, an empty x means
// 1, 2, 3, ..., a single value or empty data still gives drawable axes.
// Colours are the Okabe-Ito colour-blind-safe set; markers of Points series
// also change shape with the colour. Text is DejaVu Sans.
#pragma once

#include <filesystem>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace vicinal::report {

struct Series {
  enum class Style { Line, Points, Sticks, Bars };
  std::string label{};         // legend text; empty = not in the legend
  std::vector<double> x{}, y{};
  Style style = Style::Line;
  std::vector<double> error_low{}, error_high{};  // optional: absolute y of error-bar ends (same length as y)
  int color = -1;              // palette index; -1 = next in turn
  bool dashed = false;         // Line and Sticks
};
// Several Bars series stand side by side at each x. (The {} initialisers
// let callers write designated initialisers without warnings.)

// A shaded span across the plot: vertical = an x range (e.g. allowed angles),
// horizontal = a y range (e.g. the measured J +- tolerance).
struct Band {
  bool vertical = true;
  double from = 0, to = 0;     // either end may be +-infinity: the band reaches the frame
  std::string label{};         // drawn inside the band, where it hides the least data
  int color = -1;
};

struct Figure {
  std::string title, x_label, y_label, footnote;
  std::optional<std::pair<double, double>> x_range, y_range;  // automatic when empty
  std::vector<double> x_ticks;                 // explicit tick positions (optional)
  std::vector<std::string> x_tick_labels;      // names for x_ticks (bar charts)
  bool reverse_x = false;                      // chemical-shift axes run right to left
  std::vector<Series> series;
  std::vector<Band> bands;
  double width_pt = 560, height_pt = 360;     // kept within 60..4000
  double png_scale = 1;                        // PNG pixels per point (2 for sharp screens; 0.25..4)
};

// Writes .svg, .pdf or .png (other extensions are a vicinal::Error), atomically.
void save_figure(const Figure& figure, const std::filesystem::path& path);
// The figure as an SVG document, for embedding in HTML. Its ids are unique to
// the figure's content, and its words are also present as transparent <text>
// (selectable, searchable) over cairo's glyph outlines.
std::string figure_svg(const Figure& figure);

}  // namespace vicinal::report
