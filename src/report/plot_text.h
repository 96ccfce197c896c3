// Text on plots: measured, wrapped and drawn with cairo's toy text API in
// DejaVu Sans, and recorded so that SVG output can carry the same words as
// real <text> (cairo writes glyph outlines, which cannot be selected or searched).
#pragma once

#include <cairo.h>

#include <string>
#include <vector>

namespace vicinal::report {

enum class VAlign { Baseline, Top, Middle };

// One drawn string: baseline start point in points, rotation in degrees.
struct TextItem {
  std::string text;
  double x = 0, y = 0, size = 10, width = 0, angle_deg = 0;
  bool bold = false;
};

class PlotText {
 public:
  // `layer` may be null (PDF and PNG keep their text in the surface itself).
  PlotText(cairo_t* cr, std::vector<TextItem>* layer) : cr_(cr), layer_(layer) {}

  void font(double size_pt, bool bold = false);
  double width(const std::string& text);
  // Draws `text` with its anchor at (x, y): h_anchor 0 = start, 0.5 = centre,
  // 1 = end, measured along the text direction; angle_deg turns it about the anchor.
  void draw(const std::string& text, double x, double y, double h_anchor, VAlign v, double angle_deg = 0);
  // Greedy word wrap to `max_width`; '\n' starts a new line and a word longer
  // than a line (a DOI, a URL) is broken between characters.
  std::vector<std::string> wrap(const std::string& text, double max_width);

 private:
  cairo_t* cr_;
  std::vector<TextItem>* layer_;
  double size_ = 10;
  bool bold_ = false;
};

// `text` with invalid UTF-8 bytes replaced by '?' and control characters by
// spaces: cairo refuses such strings and would stop drawing altogether.
std::string valid_utf8(const std::string& text);

// Completes an SVG written by cairo: its ids get a prefix unique to the
// content (so several figures can live in one HTML page), the title becomes
// <title>, and the recorded text is laid over the glyphs as transparent,
// selectable <text>.
std::string finish_svg(const std::string& svg, const std::string& title, const std::vector<TextItem>& layer);

}  // namespace vicinal::report
