#include "spin/lineshape.h"

#include <fmt/format.h>

#include <algorithm>
#include <cctype>
#include <cmath>

#include "core/error.h"

namespace vicinal::spin {

LineShape parse_line_shape(const std::string& name) {
  std::string lower = name;
  for (char& c : lower) c = static_cast<char>(std::tolower(static_cast<unsigned char>(c)));
  if (lower == "lorentzian") return LineShape::Lorentzian;
  if (lower == "gaussian") return LineShape::Gaussian;
  throw Error(fmt::format("unknown line shape '{}'", name), Location::field_in("", "--shape"),
              "use lorentzian or gaussian");
}

Trace render_spectrum(const std::vector<Line>& lines, double observe_mhz, LineShape shape,
                      double linewidth_hz, std::size_t max_points) {
  if (!(linewidth_hz > 0) || !std::isfinite(linewidth_hz))
    throw Error(fmt::format("line width must be positive, found {} Hz", linewidth_hz),
                Location::field_in("", "--linewidth-hz"));
  Trace trace;
  if (lines.empty()) return trace;
  const auto [lo, hi] = std::minmax_element(lines.begin(), lines.end(),
                                            [](const Line& a, const Line& b) { return a.hz < b.hz; });
  const double from = lo->hz - 10 * linewidth_hz, to = hi->hz + 10 * linewidth_hz;
  const double wanted = std::ceil((to - from) / (linewidth_hz / 8)) + 1;
  const auto points = static_cast<std::size_t>(std::clamp(wanted, 2.0, static_cast<double>(max_points)));
  const double step = (to - from) / static_cast<double>(points - 1);
  const double half = linewidth_hz / 2;
  const double gauss = 4 * std::log(2.0) / (linewidth_hz * linewidth_hz);
  trace.hz.resize(points);
  trace.ppm.resize(points);
  trace.intensity.assign(points, 0.0);
  for (std::size_t k = 0; k < points; ++k) {
    trace.hz[k] = from + step * static_cast<double>(k);
    trace.ppm[k] = trace.hz[k] / observe_mhz;
  }
  // Each line is summed only where it is not negligible: Gaussians to 3 widths
  // (relative height 1e-11), Lorentzians to 300 widths (relative height 3e-6).
  const double reach = (shape == LineShape::Lorentzian ? 300 : 3) * linewidth_hz;
  for (const auto& line : lines) {
    const auto first = std::lower_bound(trace.hz.begin(), trace.hz.end(), line.hz - reach);
    const auto last = std::upper_bound(first, trace.hz.end(), line.hz + reach);
    for (auto it = first; it != last; ++it) {
      const double x = *it - line.hz;
      trace.intensity[static_cast<std::size_t>(it - trace.hz.begin())] +=
          line.intensity * (shape == LineShape::Lorentzian ? half * half / (x * x + half * half)
                                                            : std::exp(-gauss * x * x));
    }
  }
  return trace;
}

}  // namespace vicinal::spin
