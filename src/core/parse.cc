#include "core/parse.h"

#include <charconv>
#include <cmath>
#include <fast_float/fast_float.h>
#include <fmt/format.h>

namespace vicinal {

std::string_view trim(std::string_view text) {
  const auto first = text.find_first_not_of(" \t");
  if (first == std::string_view::npos) return {};
  const auto last = text.find_last_not_of(" \t");
  return text.substr(first, last - first + 1);
}

static std::string shown(std::string_view text) {
  // Long or binary fields are shortened so the message stays one readable line.
  std::string out;
  for (char c : text.substr(0, 40)) out += (static_cast<unsigned char>(c) < 0x20) ? '?' : c;
  if (text.size() > 40) out += "...";
  return out;
}

double parse_double(std::string_view text, const Location& where) {
  const std::string_view t = trim(text);
  if (t.empty()) throw Error("expected a number, found an empty field", where);
  const char* begin = t.data();
  if (*begin == '+') ++begin;  // fast_float follows from_chars and rejects a leading '+'
  double value = 0;
  const auto result = fast_float::from_chars(begin, t.data() + t.size(), value);
  if (result.ec != std::errc() || result.ptr != t.data() + t.size())
    throw Error(fmt::format("'{}' is not a number", shown(t)), where);
  if (!std::isfinite(value))
    throw Error(fmt::format("'{}' is not a finite number", shown(t)), where);
  return value;
}

double parse_coupling_hz(std::string_view text, const Location& where) {
  const double value = parse_double(text, where);
  if (std::fabs(value) > kMaxCouplingHz)
    throw Error(fmt::format("{:g} Hz is outside -{:g}..{:g} Hz", value, kMaxCouplingHz, kMaxCouplingHz), where,
                "give the coupling in Hz");
  return value;
}

long parse_long(std::string_view text, const Location& where) {
  const std::string_view t = trim(text);
  if (t.empty()) throw Error("expected an integer, found an empty field", where);
  const char* begin = t.data();
  if (*begin == '+') ++begin;
  long value = 0;
  const auto result = std::from_chars(begin, t.data() + t.size(), value);
  if (result.ec == std::errc::result_out_of_range)
    throw Error(fmt::format("'{}' is out of range for an integer", shown(t)), where);
  if (result.ec != std::errc() || result.ptr != t.data() + t.size())
    throw Error(fmt::format("'{}' is not an integer", shown(t)), where);
  return value;
}

}  // namespace vicinal
