#include "report/axis_ticks.h"

#include <fmt/format.h>

#include <algorithm>
#include <cmath>

namespace vicinal::report {

namespace {

double nice_step(double raw) {
  const double magnitude = std::pow(10.0, std::floor(std::log10(raw)));
  const double normalized = raw / magnitude;
  if (normalized <= 1.0) return magnitude;
  if (normalized <= 2.0) return 2 * magnitude;
  if (normalized <= 5.0) return 5 * magnitude;
  return 10 * magnitude;
}

}  // namespace

std::pair<double, double> drawable_range(double low, double high) {
  if (!std::isfinite(low) || !std::isfinite(high)) return {0.0, 1.0};
  if (low > high) std::swap(low, high);
  if (high - low <= 1e-12 * std::max(1.0, std::abs(low))) {
    // One value only: show a span around it that keeps its magnitude readable.
    const double half = low == 0 ? 1.0 : 0.1 * std::abs(low);
    return {low - half, high + half};
  }
  return {low, high};
}

Ticks nice_ticks(double low, double high, int target_count) {
  std::tie(low, high) = drawable_range(low, high);
  target_count = std::max(target_count, 2);
  Ticks ticks;
  ticks.step = nice_step((high - low) / target_count);
  // Accept ticks a hair outside the range so rounding never drops an end tick.
  const double slack = 1e-9 * ticks.step;
  for (double k = std::ceil((low - slack) / ticks.step); k * ticks.step <= high + slack; k += 1) {
    double value = k * ticks.step;
    if (std::abs(value) < slack) value = 0;  // no "-0"
    ticks.values.push_back(value);
  }
  if (ticks.values.size() < 2 && target_count < 50) return nice_ticks(low, high, target_count * 2);
  return ticks;
}

int decimals_for(double value) {
  value = std::abs(value);
  if (!std::isfinite(value)) return 0;
  int decimals = 0;
  for (double scaled = value; decimals < 6; scaled *= 10, ++decimals)
    if (std::abs(scaled - std::round(scaled)) <= 1e-6 * std::max(1.0, scaled)) break;
  return decimals;
}

std::string tick_label(double value, double step) {
  std::string text;
  const double largest = std::max(std::abs(value), std::abs(step));
  step = std::abs(step);
  if (step < 1e-4 || largest >= 1e7) {
    text = fmt::format("{:.3g}", value);
  } else {
    text = fmt::format("{:.{}f}", value, decimals_for(step));
  }
  if (text.find_first_not_of("-0.") == std::string::npos) text = text.substr(text[0] == '-');
  if (!text.empty() && text[0] == '-') text = "\u2212" + text.substr(1);
  return text;
}

}  // namespace vicinal::report
