#include "report/heatmap.h"

#include <cairo.h>
#include <fmt/format.h>

#include <algorithm>
#include <cmath>

#include "core/error.h"
#include "report/axis_ticks.h"
#include "report/drawing_output.h"
#include "report/plot_text.h"

namespace vicinal::report {

namespace {

struct Rgb {
  double r, g, b;
};

// Anchor colours of the viridis scale (van der Walt and Smith, matplotlib
// 1.5, 2015; values from memory, rounded), interpolated linearly: ordered in
// lightness and readable by colour-blind viewers.
constexpr Rgb kScale[] = {{0.267, 0.005, 0.329}, {0.283, 0.141, 0.458}, {0.254, 0.265, 0.530},
                          {0.207, 0.372, 0.553}, {0.164, 0.471, 0.558}, {0.128, 0.567, 0.551},
                          {0.135, 0.659, 0.518}, {0.267, 0.749, 0.441}, {0.478, 0.821, 0.318},
                          {0.741, 0.873, 0.150}, {0.993, 0.906, 0.144}};

Rgb colour_at(double t) {
  constexpr int n = sizeof(kScale) / sizeof(kScale[0]);
  t = std::clamp(t, 0.0, 1.0) * (n - 1);
  const int i = std::min(static_cast<int>(t), n - 2);
  const double f = t - i;
  return {kScale[i].r + f * (kScale[i + 1].r - kScale[i].r), kScale[i].g + f * (kScale[i + 1].g - kScale[i].g),
          kScale[i].b + f * (kScale[i + 1].b - kScale[i].b)};
}

void validate(const HeatMap& m) {
  if (m.x.size() < 2 || m.y.size() < 2 || m.value.size() != m.x.size() * m.y.size())
    throw Error(fmt::format("heat map grid is {} x {} with {} values", m.x.size(), m.y.size(), m.value.size()), {},
                "internal: the grid and its values must agree");
}

void draw(cairo_t* cr, PlotText& text, const HeatMap& m) {
  const double W = m.width_pt, H = m.height_pt;
  cairo_set_source_rgb(cr, 1, 1, 1);
  cairo_paint(cr);
  const double pad = 10, bar_width = 14;
  text.font(13, true);
  cairo_set_source_rgb(cr, 0.13, 0.13, 0.13);
  text.draw(m.title, W / 2, pad, 0.5, VAlign::Top);
  const auto foot = m.footnote.empty() ? std::vector<std::string>{} : text.wrap(m.footnote, W - 2 * pad);
  const double foot_height = static_cast<double>(foot.size()) * 8 * 1.3;
  const double left = 62, right = W - 90, top = pad + 28, bottom = H - 46 - foot_height;

  const double dx = (m.x.back() - m.x.front()) / static_cast<double>(m.x.size() - 1);
  const double dy = (m.y.back() - m.y.front()) / static_cast<double>(m.y.size() - 1);
  const double x0 = m.x.front() - dx / 2, x1 = m.x.back() + dx / 2;
  const double y0 = m.y.front() - dy / 2, y1 = m.y.back() + dy / 2;
  const auto px = [&](double x) { return left + (x - x0) / (x1 - x0) * (right - left); };
  const auto py = [&](double y) { return bottom - (y - y0) / (y1 - y0) * (bottom - top); };

  double lo = INFINITY, hi = -INFINITY;
  for (double v : m.value)
    if (std::isfinite(v)) lo = std::min(lo, v), hi = std::max(hi, v);
  if (!std::isfinite(lo)) lo = 0, hi = 1;
  const auto shade = [&](double v) {
    if (m.log_scale) return std::log10(v - lo + 1) / std::max(std::log10(hi - lo + 1), 1e-12);
    return (v - lo) / std::max(hi - lo, 1e-12);
  };

  const std::size_t nx = m.x.size();
  for (std::size_t iy = 0; iy < m.y.size(); ++iy)
    for (std::size_t ix = 0; ix < nx; ++ix) {
      const double v = m.value[iy * nx + ix];
      if (std::isfinite(v)) {
        const Rgb c = colour_at(shade(v));
        cairo_set_source_rgb(cr, c.r, c.g, c.b);
      } else {
        cairo_set_source_rgb(cr, 0.75, 0.75, 0.75);
      }
      // Slight overlap hides hairline seams between cells in some viewers.
      cairo_rectangle(cr, px(m.x[ix] - dx / 2), py(m.y[iy] + dy / 2), px(m.x[ix] + dx / 2) - px(m.x[ix] - dx / 2) + 0.3,
                      py(m.y[iy] - dy / 2) - py(m.y[iy] + dy / 2) + 0.3);
      cairo_fill(cr);
    }

  // Level outlines: a white edge wherever neighbouring cells fall on
  // different sides of a level.
  cairo_set_source_rgba(cr, 1, 1, 1, 0.9);
  cairo_set_line_width(cr, 1.2);
  for (double level : m.outlines)
    for (std::size_t iy = 0; iy < m.y.size(); ++iy)
      for (std::size_t ix = 0; ix < nx; ++ix) {
        const bool inside = m.value[iy * nx + ix] <= level;
        if (ix + 1 < nx && inside != (m.value[iy * nx + ix + 1] <= level)) {
          const double xe = px(m.x[ix] + dx / 2);
          cairo_move_to(cr, xe, py(m.y[iy] - dy / 2));
          cairo_line_to(cr, xe, py(m.y[iy] + dy / 2));
        }
        if (iy + 1 < m.y.size() && inside != (m.value[(iy + 1) * nx + ix] <= level)) {
          const double ye = py(m.y[iy] + dy / 2);
          cairo_move_to(cr, px(m.x[ix] - dx / 2), ye);
          cairo_line_to(cr, px(m.x[ix] + dx / 2), ye);
        }
      }
  cairo_stroke(cr);

  for (const auto& p : m.points) {
    cairo_set_source_rgb(cr, 1, 1, 1);
    cairo_arc(cr, px(p.x), py(p.y), 5, 0, 2 * M_PI);
    cairo_fill_preserve(cr);
    cairo_set_source_rgb(cr, 0.8, 0.1, 0.1);
    cairo_set_line_width(cr, 2);
    cairo_stroke(cr);
    if (!p.label.empty()) {
      text.font(9, true);
      cairo_set_source_rgb(cr, 1, 1, 1);
      text.draw(p.label, px(p.x) + 8, py(p.y) - 6, 0, VAlign::Baseline);
    }
  }

  // Frame, ticks and labels.
  cairo_set_source_rgb(cr, 0.27, 0.27, 0.27);
  cairo_set_line_width(cr, 1);
  cairo_rectangle(cr, left, top, right - left, bottom - top);
  cairo_stroke(cr);
  text.font(9);
  const Ticks tx = nice_ticks(x0, x1, 7), ty = nice_ticks(y0, y1, 7);
  for (double v : tx.values) {
    cairo_move_to(cr, px(v), bottom);
    cairo_line_to(cr, px(v), bottom + 4);
    text.draw(tick_label(v, tx.step), px(v), bottom + 6, 0.5, VAlign::Top);
  }
  for (double v : ty.values) {
    cairo_move_to(cr, left - 4, py(v));
    cairo_line_to(cr, left, py(v));
    text.draw(tick_label(v, ty.step), left - 6, py(v), 1.0, VAlign::Middle);
  }
  cairo_stroke(cr);
  text.font(11);
  text.draw(m.x_label, (left + right) / 2, bottom + 22, 0.5, VAlign::Top);
  text.draw(m.y_label, left - 44, (top + bottom) / 2, 0.5, VAlign::Middle, -90);

  // Colour bar with its own ticks in data units.
  const double bx = right + 16;
  const int steps = 100;
  for (int i = 0; i < steps; ++i) {
    const Rgb c = colour_at((i + 0.5) / steps);
    cairo_set_source_rgb(cr, c.r, c.g, c.b);
    const double ya = bottom - (bottom - top) * i / steps, yb = bottom - (bottom - top) * (i + 1) / steps;
    cairo_rectangle(cr, bx, yb, bar_width, ya - yb + 0.3);
    cairo_fill(cr);
  }
  cairo_set_source_rgb(cr, 0.27, 0.27, 0.27);
  cairo_rectangle(cr, bx, top, bar_width, bottom - top);
  cairo_stroke(cr);
  text.font(8.5);
  const Ticks tv = nice_ticks(lo, hi, 5);
  for (double v : tv.values) {
    const double yv = bottom - shade(v) * (bottom - top);
    cairo_move_to(cr, bx + bar_width, yv);
    cairo_line_to(cr, bx + bar_width + 3, yv);
    cairo_stroke(cr);
    text.draw(tick_label(v, tv.step), bx + bar_width + 5, yv, 0, VAlign::Middle);
  }
  text.font(10);
  text.draw(m.value_label, bx + bar_width / 2, top - 6, 0.5, VAlign::Baseline);

  text.font(8);
  cairo_set_source_rgb(cr, 0.33, 0.33, 0.33);
  for (std::size_t i = 0; i < foot.size(); ++i)
    text.draw(foot[i], pad, H - pad - foot_height + static_cast<double>(i) * 8 * 1.3, 0, VAlign::Top);
}

// The heat map as a drawing for report/drawing_output; PNG at two pixels per
// point, so that single cells stay sharp.
Drawing drawing_of(const HeatMap& m) {
  return {m.title, "the heat map", m.width_pt, m.height_pt, 2.0,
          [&m](cairo_t* cr, PlotText& text) { draw(cr, text, m); }};
}

}  // namespace

std::string heatmap_svg(const HeatMap& m) {
  validate(m);
  return drawing_svg(drawing_of(m));
}

void save_heatmap(const HeatMap& m, const std::filesystem::path& path) {
  validate(m);
  save_drawing(drawing_of(m), path);
}

}  // namespace vicinal::report
