// Figures drawn through cairo: one code path for SVG, PDF and PNG (chosen by
// the file extension), and SVG text for inline use in the HTML report.
// Plots always carry axes with ticks and labels; a legend appears when more
// than one labelled item is drawn; `footnote` carries citations.
#pragma once

#include <filesystem>
#include <optional>
#include <string>
#include <utility>
#include <vector>

namespace vicinal::report {

struct Series {
  enum class Style { Line, Points, Sticks, Bars };
  std::string label;           // legend text; empty = not in the legend
  std::vector<double> x, y;
  Style style = Style::Line;
  std::vector<double> error_low, error_high;  // optional: absolute y of error-bar ends
  int color = -1;              // palette index; -1 = next in turn
  bool dashed = false;
};

// A shaded span across the plot: vertical = an x range (e.g. allowed angles),
// horizontal = a y range (e.g. the measured J +- tolerance).
struct Band {
  bool vertical = true;
  double from = 0, to = 0;
  std::string label;
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
  double width_pt = 560, height_pt = 360;
};

// Writes .svg, .pdf or .png (other extensions are a vicinal::Error), atomically.
void save_figure(const Figure& figure, const std::filesystem::path& path);
// The figure as an SVG document, for embedding in HTML.
std::string figure_svg(const Figure& figure);

}  // namespace vicinal::report
