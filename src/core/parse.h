// Strict number parsing for user input: the whole field must be a finite
// number, or vicinal::Error names the place and the offending text.
#pragma once

#include <string_view>

#include "core/error.h"

namespace vicinal {

double parse_double(std::string_view text, const Location& where);
long parse_long(std::string_view text, const Location& where);

// Leading and trailing spaces and tabs removed.
std::string_view trim(std::string_view text);

}  // namespace vicinal
