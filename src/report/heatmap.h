// A heat map of a function on a regular grid (chi^2 over two parameters,
// say), drawn through cairo like the other figures: SVG, PDF or PNG by the
// file extension, written atomically. Cells are coloured on a perceptually
// ordered scale with a colour bar; optional contour-like marks and labelled
// points (the minimum) are drawn on top.
#pragma once

#include <filesystem>
#include <string>
#include <vector>

namespace vicinal::report {

struct HeatPoint {
  double x = 0, y = 0;
  std::string label;
};

struct HeatMap {
  std::string title, x_label, y_label, value_label, footnote;
  std::vector<double> x, y;     // cell centres, ascending, evenly spaced
  std::vector<double> value;    // value[iy * x.size() + ix]; non-finite cells are drawn grey
  bool log_scale = false;       // colour by log10(value - min + 1): chi^2 spans decades
  std::vector<double> outlines; // draw the cell edges where the value crosses each level
  std::vector<HeatPoint> points;
  double width_pt = 560, height_pt = 460;
};

// vicinal::Error for an unknown extension, a grid whose sizes disagree, or
// fewer than two cells along an axis.
void save_heatmap(const HeatMap& map, const std::filesystem::path& path);
std::string heatmap_svg(const HeatMap& map);

}  // namespace vicinal::report
