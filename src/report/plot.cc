#include "report/plot.h"

#include <cairo.h>
#include <fmt/format.h>

#include <algorithm>
#include <array>
#include <cmath>
#include <limits>
#include <numbers>
#include <optional>

#include "core/error.h"
#include "report/axis_ticks.h"
#include "report/drawing_output.h"
#include "report/plot_text.h"

namespace vicinal::report {

namespace {

struct Rgb {
  double r, g, b;
};

constexpr Rgb hex(unsigned v) {
  return {((v >> 16) & 0xFF) / 255.0, ((v >> 8) & 0xFF) / 255.0, (v & 0xFF) / 255.0};
}

// Colour-blind-safe colours: the eight of Okabe and Ito, reordered so that the
// first few are the most distinct on white paper and the pale yellow comes last.
// Source: Okabe M, Ito K, 2008, "Color Universal Design (CUD): how to make
// figures and presentations that are friendly to colorblind people", jfly.uni-koeln.de.
constexpr std::array<Rgb, 8> kPalette = {hex(0x0072B2), hex(0xD55E00), hex(0x009E73), hex(0xCC79A7),
                                         hex(0xE69F00), hex(0x56B4E9), hex(0x000000), hex(0xF0E442)};
// Bands are pale tints; their own order starts with colours that stay light.
constexpr std::array<int, 5> kBandOrder = {5, 4, 2, 3, 1};

constexpr Rgb kInk = hex(0x222222), kAxis = hex(0x444444), kGrid = hex(0xE4E4E4);

constexpr double kPad = 10, kTickLength = 4;
constexpr double kTitleSize = 13, kAxisLabelSize = 11, kTickSize = 9, kLegendSize = 9.5,
                 kFootnoteSize = 8, kBandLabelSize = 8.5;

void set_colour(cairo_t* cr, Rgb c, double alpha = 1) { cairo_set_source_rgba(cr, c.r, c.g, c.b, alpha); }

int palette_index(int requested) {
  return ((requested % static_cast<int>(kPalette.size())) + static_cast<int>(kPalette.size())) %
         static_cast<int>(kPalette.size());
}

// One series ready to draw: x filled in (1..n when absent), length agreed,
// colour and bar placement decided.
struct Prepared {
  const Series* series;
  std::vector<double> x, y;
  bool has_errors = false;
  int colour = 0;
  double bar_offset = 0, bar_width = 0;  // data units
};

std::vector<Prepared> prepare(const Figure& figure) {
  std::vector<Prepared> out;
  int next_colour = 0;
  std::vector<double> bar_x;
  for (const auto& s : figure.series) {
    Prepared p{&s, s.x, s.y};
    if (p.x.empty())
      for (std::size_t i = 0; i < p.y.size(); ++i) p.x.push_back(static_cast<double>(i + 1));
    const std::size_t n = std::min(p.x.size(), p.y.size());
    p.x.resize(n);
    p.y.resize(n);
    p.has_errors = s.error_low.size() == n && s.error_high.size() == n && n > 0;
    p.colour = s.color >= 0 ? palette_index(s.color) : palette_index(next_colour++);
    if (s.style == Series::Style::Bars)
      for (double v : p.x)
        if (std::isfinite(v)) bar_x.push_back(v);
    out.push_back(std::move(p));
  }
  // Bars of several series stand side by side in one slot per x position.
  std::sort(bar_x.begin(), bar_x.end());
  double slot = 1;
  bool found = false;
  for (std::size_t i = 1; i < bar_x.size(); ++i) {
    const double gap = bar_x[i] - bar_x[i - 1];
    if (gap > 1e-12 && (!found || gap < slot)) slot = gap, found = true;
  }
  const auto bar_series = std::count_if(out.begin(), out.end(), [](const Prepared& p) {
    return p.series->style == Series::Style::Bars;
  });
  const double group = 0.8 * slot;
  int j = 0;
  for (auto& p : out) {
    if (p.series->style != Series::Style::Bars) continue;
    p.bar_width = group / static_cast<double>(bar_series);
    p.bar_offset = -group / 2 + (j++ + 0.5) * p.bar_width;
  }
  return out;
}

struct Extent {
  double low = std::numeric_limits<double>::infinity(), high = -std::numeric_limits<double>::infinity();
  void add(double v) {
    if (!std::isfinite(v)) return;
    low = std::min(low, v);
    high = std::max(high, v);
  }
  bool empty() const { return low > high; }
};

std::pair<double, double> x_range(const Figure& figure, const std::vector<Prepared>& series) {
  if (figure.x_range) return drawable_range(figure.x_range->first, figure.x_range->second);
  Extent e;
  bool only_lines = true;
  for (const auto& p : series) {
    const bool bars = p.series->style == Series::Style::Bars;
    only_lines = only_lines && (p.series->style == Series::Style::Line || bars);
    for (std::size_t i = 0; i < p.x.size(); ++i) {
      if (!std::isfinite(p.y[i])) continue;
      e.add(bars ? p.x[i] + p.bar_offset - p.bar_width / 2 - 0.1 * p.bar_width : p.x[i]);
      e.add(bars ? p.x[i] + p.bar_offset + p.bar_width / 2 + 0.1 * p.bar_width : p.x[i]);
    }
  }
  for (const auto& b : figure.bands)
    if (b.vertical) e.add(b.from), e.add(b.to);
  for (double t : figure.x_ticks) e.add(t);
  if (e.empty()) return {0, 1};
  auto [low, high] = drawable_range(e.low, e.high);
  if (!only_lines) {  // markers and sticks at the ends stay clear of the frame
    const double pad = 0.03 * (high - low);
    low -= pad, high += pad;
  }
  return {low, high};
}

std::pair<double, double> y_range(const Figure& figure, const std::vector<Prepared>& series) {
  if (figure.y_range) return drawable_range(figure.y_range->first, figure.y_range->second);
  Extent e;
  bool baseline = false;
  for (const auto& p : series) {
    const auto style = p.series->style;
    if (style == Series::Style::Bars || style == Series::Style::Sticks) baseline = true;
    for (std::size_t i = 0; i < p.y.size(); ++i) {
      if (!std::isfinite(p.x[i])) continue;
      e.add(p.y[i]);
      if (p.has_errors) e.add(p.series->error_low[i]), e.add(p.series->error_high[i]);
    }
  }
  for (const auto& b : figure.bands)
    if (!b.vertical) e.add(b.from), e.add(b.to);
  if (baseline) e.add(0);
  if (e.empty()) return {0, 1};
  auto [low, high] = drawable_range(e.low, e.high);
  const double pad = 0.05 * (high - low);
  // Bars and sticks stand on zero: no padding below (or above) the baseline.
  if (!(baseline && low == 0)) low -= pad;
  if (!(baseline && high == 0)) high += pad;
  return {low, high};
}

// Maps data to page coordinates inside the plot frame.
struct Frame {
  double left = 0, top = 0, width = 1, height = 1;
  double x_low = 0, x_high = 1, y_low = 0, y_high = 1;
  bool reverse_x = false;
  double px(double x) const {
    const double t = (x - x_low) / (x_high - x_low);
    return left + (reverse_x ? 1 - t : t) * width;
  }
  double py(double y) const { return top + (1 - (y - y_low) / (y_high - y_low)) * height; }
  // Page position clamped a little outside the frame, so that huge values or
  // infinite band ends never overflow cairo's fixed-point coordinates.
  double px_clamped(double x) const { return std::clamp(px(x), left - 10, left + width + 10); }
  double py_clamped(double y) const { return std::clamp(py(y), top - 10, top + height + 10); }
  bool inside(double x, double y) const {
    return x >= left && x <= left + width && y >= top && y <= top + height;
  }
  void clip(cairo_t* cr) const {
    cairo_rectangle(cr, left, top, width, height);
    cairo_clip(cr);
  }
};

struct XAxisLabels {
  std::vector<double> positions;
  std::vector<std::string> labels;
  bool slanted = false;  // labels turned 45 degrees because they would overlap
  double widest = 0;
};

bool labels_overlap(PlotText& text, const Frame& frame, const XAxisLabels& axis) {
  for (std::size_t i = 1; i < axis.positions.size(); ++i) {
    const double gap = std::abs(frame.px(axis.positions[i]) - frame.px(axis.positions[i - 1]));
    const double need = (text.width(axis.labels[i]) + text.width(axis.labels[i - 1])) / 2 + 8;
    if (gap < need) return true;
  }
  return false;
}

XAxisLabels x_axis_labels(const Figure& figure, PlotText& text, const Frame& frame) {
  XAxisLabels axis;
  text.font(kTickSize);
  if (!figure.x_ticks.empty()) {
    // Unnamed explicit ticks all get the decimals the finest of them needs.
    int decimals = 0;
    for (double t : figure.x_ticks) decimals = std::max(decimals, decimals_for(t));
    const double step = std::pow(10.0, -decimals);
    for (std::size_t i = 0; i < figure.x_ticks.size(); ++i) {
      const double t = figure.x_ticks[i];
      if (!std::isfinite(t) || t < frame.x_low - 1e-9 || t > frame.x_high + 1e-9) continue;
      axis.positions.push_back(t);
      axis.labels.push_back(i < figure.x_tick_labels.size() ? figure.x_tick_labels[i] : tick_label(t, step));
    }
    axis.slanted = labels_overlap(text, frame, axis);
  } else {
    // Fewer ticks until the labels fit side by side.
    for (int target = std::clamp(static_cast<int>(frame.width / 70), 3, 10); target >= 2; --target) {
      const Ticks ticks = nice_ticks(frame.x_low, frame.x_high, target);
      axis.positions = ticks.values;
      axis.labels.clear();
      for (double v : ticks.values) axis.labels.push_back(tick_label(v, ticks.step));
      if (!labels_overlap(text, frame, axis)) break;
    }
  }
  for (const auto& l : axis.labels) axis.widest = std::max(axis.widest, text.width(l));
  return axis;
}

void draw_marker(cairo_t* cr, int shape, double x, double y) {
  constexpr double r = 3.2;
  switch (shape % 4) {
    case 0: cairo_arc(cr, x, y, r, 0, 2 * std::numbers::pi); break;
    case 1: cairo_rectangle(cr, x - r * 0.9, y - r * 0.9, 1.8 * r, 1.8 * r); break;
    case 2:
      cairo_move_to(cr, x, y - 1.2 * r);
      cairo_line_to(cr, x + 1.1 * r, y + 0.75 * r);
      cairo_line_to(cr, x - 1.1 * r, y + 0.75 * r);
      cairo_close_path(cr);
      break;
    default:
      cairo_move_to(cr, x, y - 1.25 * r);
      cairo_line_to(cr, x + 1.1 * r, y);
      cairo_line_to(cr, x, y + 1.25 * r);
      cairo_line_to(cr, x - 1.1 * r, y);
      cairo_close_path(cr);
  }
  cairo_fill(cr);
}

void set_line(cairo_t* cr, double width, bool dashed) {
  cairo_set_line_width(cr, width);
  cairo_set_line_cap(cr, dashed ? CAIRO_LINE_CAP_BUTT : CAIRO_LINE_CAP_ROUND);
  cairo_set_line_join(cr, CAIRO_LINE_JOIN_ROUND);
  const double dash[] = {6, 4};
  cairo_set_dash(cr, dash, dashed ? 2 : 0, 0);
}

double bar_centre(const Prepared& p, std::size_t i) { return p.x[i] + p.bar_offset; }

// Page points covered by data, so the legend can go where it hides least.
std::vector<std::pair<double, double>> covered_points(const std::vector<Prepared>& series, const Frame& f) {
  std::vector<std::pair<double, double>> out;
  auto segment = [&](double x0, double y0, double x1, double y1) {
    const int steps = std::clamp(static_cast<int>(std::hypot(x1 - x0, y1 - y0) / 3), 1, 400);
    for (int k = 0; k <= steps; ++k) out.emplace_back(x0 + (x1 - x0) * k / steps, y0 + (y1 - y0) * k / steps);
  };
  for (const auto& p : series) {
    for (std::size_t i = 0; i < p.x.size(); ++i) {
      if (!std::isfinite(p.x[i]) || !std::isfinite(p.y[i])) continue;
      const double x = f.px_clamped(p.x[i]), y = f.py_clamped(p.y[i]);
      switch (p.series->style) {
        case Series::Style::Line:
          if (i + 1 < p.x.size() && std::isfinite(p.x[i + 1]) && std::isfinite(p.y[i + 1]))
            segment(x, y, f.px_clamped(p.x[i + 1]), f.py_clamped(p.y[i + 1]));
          break;
        case Series::Style::Points: out.emplace_back(x, y); break;
        case Series::Style::Sticks: segment(x, f.py_clamped(0), x, y); break;
        case Series::Style::Bars: {
          const double x0 = f.px_clamped(bar_centre(p, i) - p.bar_width / 2);
          const double x1 = f.px_clamped(bar_centre(p, i) + p.bar_width / 2);
          for (double bx = std::min(x0, x1); bx <= std::max(x0, x1); bx += 3) segment(bx, f.py_clamped(0), bx, y);
          break;
        }
      }
    }
  }
  return out;
}

std::size_t hidden_points(const std::vector<std::pair<double, double>>& covered, double x, double y, double w,
                          double h) {
  return static_cast<std::size_t>(std::count_if(covered.begin(), covered.end(), [&](auto pt) {
    return pt.first >= x - 3 && pt.first <= x + w + 3 && pt.second >= y - 3 && pt.second <= y + h + 3;
  }));
}

// A band's rectangle on the page, or nothing when its ends are not numbers.
std::optional<std::array<double, 4>> band_box(const Band& band, const Frame& f) {
  double x0, x1, y0, y1;
  if (band.vertical) {
    x0 = f.px_clamped(band.from), x1 = f.px_clamped(band.to), y0 = f.top, y1 = f.top + f.height;
  } else {
    x0 = f.left, x1 = f.left + f.width, y0 = f.py_clamped(band.from), y1 = f.py_clamped(band.to);
  }
  if (std::isnan(x0) || std::isnan(x1) || std::isnan(y0) || std::isnan(y1)) return std::nullopt;
  if (x0 > x1) std::swap(x0, x1);
  if (y0 > y1) std::swap(y0, y1);
  // A band narrower than a hairline still shows as a line.
  if (x1 - x0 < 1) x0 -= 0.5, x1 += 0.5;
  if (y1 - y0 < 1) y0 -= 0.5, y1 += 0.5;
  return std::array<double, 4>{x0, x1, y0, y1};
}

// Bands lie under the data.
void draw_band_fills(cairo_t* cr, const Figure& figure, const Frame& f) {
  int next = 0;
  cairo_save(cr);
  f.clip(cr);
  for (const auto& band : figure.bands) {
    const int colour = band.color >= 0 ? palette_index(band.color) : kBandOrder[next++ % kBandOrder.size()];
    const auto box = band_box(band, f);
    if (!box) continue;
    const auto [x0, x1, y0, y1] = *box;
    set_colour(cr, kPalette[colour], 0.18);
    cairo_rectangle(cr, x0, y0, x1 - x0, y1 - y0);
    cairo_fill(cr);
  }
  cairo_restore(cr);
}

// Band labels go over the data, on a pale backing, inside the band at
// whichever end hides less data.
void draw_band_labels(cairo_t* cr, PlotText& text, const Figure& figure, const Frame& f,
                      const std::vector<std::pair<double, double>>& covered) {
  std::vector<std::array<double, 3>> placed;  // x0, x1, row of vertical band labels
  text.font(kBandLabelSize);
  const double h = kBandLabelSize;
  auto backed = [&](const std::string& label, double x, double y, double anchor, VAlign v) {
    const double w = text.width(label);
    const double top = v == VAlign::Top ? y : v == VAlign::Middle ? y - 0.5 * h : y - 0.8 * h;
    cairo_set_source_rgba(cr, 1, 1, 1, 0.75);
    cairo_rectangle(cr, x - anchor * w - 2, top - 1.5, w + 4, h + 2);
    cairo_fill(cr);
    set_colour(cr, kInk);
    text.draw(label, x, y, anchor, v);
  };
  for (const auto& band : figure.bands) {
    const auto box = band_box(band, f);
    if (band.label.empty() || !box) continue;
    const auto [x0, x1, y0, y1] = *box;
    const double w = text.width(band.label);
    if (band.vertical) {
      const double centre = std::clamp((std::max(x0, f.left) + std::min(x1, f.left + f.width)) / 2,
                                       f.left + w / 2 + 2, f.left + f.width - w / 2 - 2);
      const bool top = hidden_points(covered, centre - w / 2, f.top + 3, w, h) <=
                       hidden_points(covered, centre - w / 2, f.top + f.height - 3 - h, w, h);
      int row = 0;  // move a row inwards while the label would overlap one already placed
      for (bool clash = true; clash;) {
        clash = false;
        for (const auto& p : placed)
          if (p[2] == (top ? row : -1 - row) && centre - w / 2 - 4 < p[1] && centre + w / 2 + 4 > p[0])
            clash = true, ++row;
      }
      placed.push_back({centre - w / 2, centre + w / 2, static_cast<double>(top ? row : -1 - row)});
      const double step = row * h * 1.35;
      if (top)
        backed(band.label, centre, f.top + 3 + step, 0.5, VAlign::Top);
      else
        backed(band.label, centre, f.top + f.height - 4 - step, 0.5, VAlign::Baseline);
    } else {
      const double middle = std::clamp((y0 + y1) / 2, f.top + h, f.top + f.height - h);
      const bool right = hidden_points(covered, f.left + f.width - 4 - w, middle - h / 2, w, h) <=
                         hidden_points(covered, f.left + 4, middle - h / 2, w, h);
      backed(band.label, right ? f.left + f.width - 4 : f.left + 4, middle, right ? 1.0 : 0.0, VAlign::Middle);
    }
  }
}

void draw_grid_and_frame(cairo_t* cr, PlotText& text, const Frame& f, const Ticks& y_ticks,
                         const XAxisLabels& x_axis) {
  set_line(cr, 0.6, false);
  set_colour(cr, kGrid);
  for (double v : y_ticks.values) {
    const double y = std::round(f.py(v)) + 0.5;
    cairo_move_to(cr, f.left, y), cairo_line_to(cr, f.left + f.width, y);
  }
  for (double v : x_axis.positions) {
    const double x = std::round(f.px(v)) + 0.5;
    cairo_move_to(cr, x, f.top), cairo_line_to(cr, x, f.top + f.height);
  }
  cairo_stroke(cr);

  set_colour(cr, kAxis);
  set_line(cr, 0.9, false);
  cairo_rectangle(cr, f.left, f.top, f.width, f.height);
  for (double v : y_ticks.values) {
    const double y = std::round(f.py(v)) + 0.5;
    cairo_move_to(cr, f.left, y), cairo_line_to(cr, f.left - kTickLength, y);
  }
  for (double v : x_axis.positions) {
    const double x = std::round(f.px(v)) + 0.5;
    cairo_move_to(cr, x, f.top + f.height), cairo_line_to(cr, x, f.top + f.height + kTickLength);
  }
  cairo_stroke(cr);

  set_colour(cr, kInk);
  text.font(kTickSize);
  for (double v : y_ticks.values)
    text.draw(tick_label(v, y_ticks.step), f.left - kTickLength - 3, f.py(v), 1.0, VAlign::Middle);
  for (std::size_t i = 0; i < x_axis.positions.size(); ++i) {
    const double x = f.px(x_axis.positions[i]), y = f.top + f.height + kTickLength + 3;
    if (x_axis.slanted)
      text.draw(x_axis.labels[i], x + 2, y, 1.0, VAlign::Top, -45);
    else
      text.draw(x_axis.labels[i], x, y, 0.5, VAlign::Top);
  }
}

void draw_error_bars(cairo_t* cr, const Prepared& p, const Frame& f) {
  const bool bars = p.series->style == Series::Style::Bars;
  set_colour(cr, bars ? kInk : kPalette[p.colour]);
  set_line(cr, 1.0, false);
  const double cap = bars ? std::min(8.0, 0.4 * std::abs(f.px(p.bar_width) - f.px(0))) : 5.0;
  for (std::size_t i = 0; i < p.x.size(); ++i) {
    const double low = p.series->error_low[i], high = p.series->error_high[i];
    const double xv = bars ? bar_centre(p, i) : p.x[i];
    if (!std::isfinite(xv) || !std::isfinite(low) || !std::isfinite(high)) continue;
    const double x = f.px_clamped(xv), y0 = f.py_clamped(low), y1 = f.py_clamped(high);
    cairo_move_to(cr, x, y0), cairo_line_to(cr, x, y1);
    cairo_move_to(cr, x - cap / 2, y0), cairo_line_to(cr, x + cap / 2, y0);
    cairo_move_to(cr, x - cap / 2, y1), cairo_line_to(cr, x + cap / 2, y1);
  }
  cairo_stroke(cr);
}

void draw_series(cairo_t* cr, const Prepared& p, const Frame& f) {
  const Rgb colour = kPalette[p.colour];
  set_colour(cr, colour);
  auto finite = [&](std::size_t i) { return std::isfinite(p.x[i]) && std::isfinite(p.y[i]); };
  switch (p.series->style) {
    case Series::Style::Line: {
      set_line(cr, 1.8, p.series->dashed);
      bool pen_down = false;  // a missing value breaks the line
      for (std::size_t i = 0; i < p.x.size(); ++i) {
        if (!finite(i)) {
          pen_down = false;
          continue;
        }
        const double x = f.px_clamped(p.x[i]), y = f.py_clamped(p.y[i]);
        pen_down ? cairo_line_to(cr, x, y) : cairo_move_to(cr, x, y);
        pen_down = true;
      }
      cairo_stroke(cr);
      break;
    }
    case Series::Style::Points:
      for (std::size_t i = 0; i < p.x.size(); ++i)
        if (finite(i)) draw_marker(cr, p.colour, f.px_clamped(p.x[i]), f.py_clamped(p.y[i]));
      break;
    case Series::Style::Sticks:
      set_line(cr, 1.4, p.series->dashed);
      for (std::size_t i = 0; i < p.x.size(); ++i) {
        if (!finite(i)) continue;
        const double x = f.px_clamped(p.x[i]);
        cairo_move_to(cr, x, f.py_clamped(0)), cairo_line_to(cr, x, f.py_clamped(p.y[i]));
      }
      cairo_stroke(cr);
      break;
    case Series::Style::Bars:
      for (std::size_t i = 0; i < p.x.size(); ++i) {
        if (!finite(i)) continue;
        const double x0 = f.px_clamped(bar_centre(p, i) - p.bar_width / 2);
        const double x1 = f.px_clamped(bar_centre(p, i) + p.bar_width / 2);
        const double y0 = f.py_clamped(0), y1 = f.py_clamped(p.y[i]);
        cairo_rectangle(cr, std::min(x0, x1), std::min(y0, y1), std::abs(x1 - x0), std::abs(y1 - y0));
      }
      cairo_fill(cr);
      break;
  }
  if (p.has_errors) draw_error_bars(cr, p, f);
}

void draw_legend(cairo_t* cr, PlotText& text, const std::vector<Prepared>& series, const Frame& f,
                 const std::vector<std::pair<double, double>>& covered) {
  std::vector<const Prepared*> items;
  for (const auto& p : series)
    if (!p.series->label.empty()) items.push_back(&p);
  if (items.size() < 2) return;

  text.font(kLegendSize);
  constexpr double swatch = 20, gap = 5, inset = 6, row = kLegendSize * 1.45;
  double widest = 0;
  for (auto* p : items) widest = std::max(widest, text.width(p->series->label));
  const double w = inset + swatch + gap + widest + inset;
  const double h = inset + row * static_cast<double>(items.size()) + inset - (row - kLegendSize) ;
  constexpr double margin = 6;
  const std::array<std::pair<double, double>, 4> corners = {{
      {f.left + f.width - margin - w, f.top + margin},
      {f.left + margin, f.top + margin},
      {f.left + f.width - margin - w, f.top + f.height - margin - h},
      {f.left + margin, f.top + f.height - margin - h},
  }};
  std::size_t best_hidden = std::numeric_limits<std::size_t>::max();
  std::pair<double, double> at = corners[0];
  for (const auto& c : corners) {
    const auto hidden = hidden_points(covered, c.first, c.second, w, h);
    if (hidden < best_hidden) best_hidden = hidden, at = c;
  }

  cairo_rectangle(cr, at.first, at.second, w, h);
  cairo_set_source_rgba(cr, 1, 1, 1, 0.88);
  cairo_fill_preserve(cr);
  set_colour(cr, hex(0xBBBBBB));
  set_line(cr, 0.6, false);
  cairo_stroke(cr);
  for (std::size_t k = 0; k < items.size(); ++k) {
    const Prepared& p = *items[k];
    const double x = at.first + inset, y = at.second + inset + row * static_cast<double>(k) + kLegendSize / 2;
    set_colour(cr, kPalette[p.colour]);
    switch (p.series->style) {
      case Series::Style::Line:
      case Series::Style::Sticks:
        set_line(cr, p.series->style == Series::Style::Line ? 1.8 : 1.4, p.series->dashed);
        cairo_move_to(cr, x, y), cairo_line_to(cr, x + swatch, y);
        cairo_stroke(cr);
        break;
      case Series::Style::Points: draw_marker(cr, p.colour, x + swatch / 2, y); break;
      case Series::Style::Bars:
        cairo_rectangle(cr, x + swatch / 2 - 5, y - 4, 10, 8);
        cairo_fill(cr);
        break;
    }
    set_colour(cr, kInk);
    text.draw(p.series->label, x + swatch + gap, y, 0.0, VAlign::Middle);
  }
}

// Page size in points: at least big enough for axes, at most what cairo's
// image surfaces accept; nonsense sizes fall back to the default.
std::pair<double, double> page_size(const Figure& figure) {
  auto sane = [](double v, double fallback) { return std::isfinite(v) ? std::clamp(v, 60.0, 4000.0) : fallback; };
  return {sane(figure.width_pt, 560), sane(figure.height_pt, 360)};
}

// The whole figure onto a cairo context whose units are points.
void draw(cairo_t* cr, PlotText& text, const Figure& figure) {
  const auto [W, H] = page_size(figure);
  cairo_set_source_rgb(cr, 1, 1, 1);
  cairo_paint(cr);

  const auto series = prepare(figure);
  Frame f;
  f.reverse_x = figure.reverse_x;
  std::tie(f.x_low, f.x_high) = x_range(figure, series);
  std::tie(f.y_low, f.y_high) = y_range(figure, series);

  const double text_width = W - 2 * kPad;
  text.font(kTitleSize, true);
  const auto title_lines = text.wrap(figure.title, text_width);
  text.font(kFootnoteSize);
  const auto footnote_lines = text.wrap(figure.footnote, text_width);

  f.top = kPad + (title_lines.empty() ? 4 : title_lines.size() * kTitleSize * 1.25 + 6);
  const double footnote_height =
      footnote_lines.empty() ? 0 : 8 + static_cast<double>(footnote_lines.size()) * kFootnoteSize * 1.3;
  const double x_label_height = figure.x_label.empty() ? 0 : 6 + kAxisLabelSize * 1.2;
  double bottom = kTickLength + 3 + kTickSize * 1.25 + x_label_height + footnote_height + kPad;

  const int y_target = std::clamp(static_cast<int>((H - f.top - bottom) / 45), 3, 9);
  const Ticks y_ticks = nice_ticks(f.y_low, f.y_high, y_target);
  text.font(kTickSize);
  double y_label_width = 0;
  for (double v : y_ticks.values) y_label_width = std::max(y_label_width, text.width(tick_label(v, y_ticks.step)));
  f.left = kPad + (figure.y_label.empty() ? 0 : kAxisLabelSize * 1.2 + 6) + y_label_width + 3 + kTickLength;
  double right = 16;
  f.width = std::max(W - f.left - right, 20.0);
  auto x_axis = x_axis_labels(figure, text, f);
  if (!x_axis.slanted && !x_axis.labels.empty()) {
    // The last label may stick out past the frame: leave room for half of it.
    const double overhang = text.width(figure.reverse_x ? x_axis.labels.front() : x_axis.labels.back()) / 2;
    if (overhang + 4 > right) {
      right = overhang + 4;
      f.width = std::max(W - f.left - right, 20.0);
      x_axis = x_axis_labels(figure, text, f);
    }
  }
  if (x_axis.slanted) bottom += x_axis.widest * std::numbers::sqrt2 / 2;
  f.height = std::max(H - f.top - bottom, 20.0);

  const auto covered = covered_points(series, f);
  draw_band_fills(cr, figure, f);
  draw_grid_and_frame(cr, text, f, y_ticks, x_axis);
  cairo_save(cr);
  f.clip(cr);
  for (const auto& p : series) draw_series(cr, p, f);
  cairo_restore(cr);
  draw_band_labels(cr, text, figure, f, covered);
  draw_legend(cr, text, series, f, covered);

  set_colour(cr, kInk);
  text.font(kAxisLabelSize);
  const double below_ticks = f.top + f.height + kTickLength + 3 + kTickSize * 1.25 +
                             (x_axis.slanted ? x_axis.widest * std::numbers::sqrt2 / 2 : 0);
  if (!figure.x_label.empty()) text.draw(figure.x_label, f.left + f.width / 2, below_ticks + 6, 0.5, VAlign::Top);
  if (!figure.y_label.empty())
    text.draw(figure.y_label, kPad, f.top + f.height / 2, 0.5, VAlign::Top, -90);
  text.font(kTitleSize, true);
  for (std::size_t i = 0; i < title_lines.size(); ++i)
    text.draw(title_lines[i], W / 2, kPad + static_cast<double>(i) * kTitleSize * 1.25, 0.5, VAlign::Top);
  text.font(kFootnoteSize);
  set_colour(cr, hex(0x555555));
  const double footnote_top = H - kPad - static_cast<double>(footnote_lines.size()) * kFootnoteSize * 1.3;
  for (std::size_t i = 0; i < footnote_lines.size(); ++i)
    text.draw(footnote_lines[i], kPad, footnote_top + static_cast<double>(i) * kFootnoteSize * 1.3, 0.0,
              VAlign::Top);
}

// The figure as a drawing for report/drawing_output.
Drawing drawing_of(const Figure& figure) {
  const auto [w, h] = page_size(figure);
  const double png_scale = std::isfinite(figure.png_scale) ? std::clamp(figure.png_scale, 0.25, 4.0) : 1.0;
  return {figure.title, "the figure", w, h, png_scale,
          [&figure](cairo_t* cr, PlotText& text) { draw(cr, text, figure); }};
}

}  // namespace

std::string figure_svg(const Figure& figure) { return drawing_svg(drawing_of(figure)); }

void save_figure(const Figure& figure, const std::filesystem::path& path) { save_drawing(drawing_of(figure), path); }

}  // namespace vicinal::report
