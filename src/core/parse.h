// Strict number parsing for user input: the whole field must be a finite
// number, or vicinal::Error names the place and the offending text.
#pragma once

#include <string_view>

#include "core/error.h"

namespace vicinal {

double parse_double(std::string_view text, const Location& where);
long parse_long(std::string_view text, const Location& where);

// The largest |J| (or uncertainty of J) accepted from any table, the bound the
// library's schema also holds: measured couplings between the nuclei vicinal
// handles stay far below it, so a larger value (a 40-digit number, say) is a
// damaged file or a typo, never data. Common practice, no source.
inline constexpr double kMaxCouplingHz = 1000;
// parse_double, then |value| <= kMaxCouplingHz.
double parse_coupling_hz(std::string_view text, const Location& where);

// Leading and trailing spaces and tabs removed.
std::string_view trim(std::string_view text);

}  // namespace vicinal
