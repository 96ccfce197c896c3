// A continuous spectrum from a line list: each line drawn as a Lorentzian or
// Gaussian of the given full width at half height, its peak height equal to
// the line's intensity (so an isolated line keeps its stick height).
#pragma once

#include <string>
#include <vector>

#include "spin/simulate.h"

namespace vicinal::spin {

enum class LineShape { Lorentzian, Gaussian };

// "lorentzian" or "gaussian" (case-insensitive); anything else is a vicinal::Error.
LineShape parse_line_shape(const std::string& name);

struct Trace {
  std::vector<double> hz, ppm, intensity;  // ascending hz
};

// Samples the sum of line shapes from 10 widths below the lowest line to 10
// above the highest, with at least 8 points per width (at most `max_points`).
// A width that is not positive is a vicinal::Error.
Trace render_spectrum(const std::vector<Line>& lines, double observe_mhz, LineShape shape,
                      double linewidth_hz, std::size_t max_points = 200000);

}  // namespace vicinal::spin
