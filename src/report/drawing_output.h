// Writing a cairo drawing as SVG, PDF or PNG, chosen by the file's extension
// and written atomically: the one output path of every kind of figure (plots,
// heat maps), so that formats, metadata and error messages agree.
#pragma once

#include <cairo.h>

#include <filesystem>
#include <functional>
#include <string>

#include "report/plot_text.h"

namespace vicinal::report {

struct Drawing {
  std::string title;       // the SVG <title> and the PDF's metadata
  const char* what = "";   // names the drawing in errors: "the figure", "the heat map"
  double width_pt = 0, height_pt = 0;
  double png_scale = 1;    // PNG pixels per point
  // Draws the whole picture on a context whose units are points.
  std::function<void(cairo_t*, PlotText&)> draw;
};

// The drawing as SVG text, its labels as real text (finish_svg).
std::string drawing_svg(const Drawing& drawing);

// vicinal::Error for an extension other than .svg, .pdf or .png, or when
// cairo cannot write the file; nothing is left under `path` then.
void save_drawing(const Drawing& drawing, const std::filesystem::path& path);

}  // namespace vicinal::report
