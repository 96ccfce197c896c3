// Axis arithmetic for plots: "nice" tick steps of 1, 2 or 5 times a power of
// ten, readable tick labels, and data ranges made safe to draw (never empty,
// never zero-width, never infinite).
#pragma once

#include <string>
#include <utility>
#include <vector>

namespace vicinal::report {

struct Ticks {
  std::vector<double> values;  // inside [low, high], ascending
  double step = 1;
};

// Tick positions in [low, high] with a 1-2-5 step chosen so that about
// `target_count` ticks fall inside the range (never fewer than two when the
// range allows it).
Ticks nice_ticks(double low, double high, int target_count);

// Fewest decimals (at most 6) that write `value` exactly: 0.5 -> 1, 0.25 -> 2, 30 -> 0.
int decimals_for(double value);

// A tick label with just enough decimals to write `step` exactly ("0.5",
// "120", "-2", "0.25"),
// written with a true minus sign; very large or small numbers in short
// scientific form.
std::string tick_label(double value, double step);

// Makes [low, high] drawable: swaps a reversed pair, widens a zero-width range
// around its value, and falls back to [0, 1] for non-finite ends.
std::pair<double, double> drawable_range(double low, double high);

}  // namespace vicinal::report
