#include "core/error.h"

#include <fmt/format.h>

namespace vicinal {

std::string Location::describe() const {
  std::string out;
  if (!file.empty()) {
    out = file;
    if (line > 0) out += fmt::format(":{}", line);
    if (line > 0 && column > 0) out += fmt::format(":{}", column);
  } else if (line > 0) {
    out = fmt::format("line {}", line);
    if (column > 0) out += fmt::format(", column {}", column);
  }
  if (field_number > 0 || !field.empty()) {
    out += out.empty() ? "" : ": ";
    if (field_number > 0) out += fmt::format("column {}", field_number);
    if (field_number > 0 && !field.empty()) out += " ";
    if (!field.empty()) out += fmt::format("'{}'", field);
  }
  if (!atom.empty()) out += fmt::format("{}atom {}", out.empty() ? "" : ": ", atom);
  return out;
}

static std::string compose(const std::string& what, const Location& where, const std::string& hint) {
  std::string place = where.describe();
  std::string out = place.empty() ? what : place + ": " + what;
  if (!hint.empty()) out += " (" + hint + ")";
  return out;
}

Error::Error(const std::string& what, Location where, std::string hint)
    : std::runtime_error(compose(what, where, hint)),
      what_(what),
      where_(std::move(where)),
      hint_(std::move(hint)) {}

std::string Error::one_line() const {
  std::string text = std::runtime_error::what();
  for (char& c : text)
    if (c == '\n' || c == '\r') c = ' ';
  // Input echoed in a message (a 10 MB header, say) must not flood the terminal:
  // keep the start (place and problem) and the end (the hint).
  constexpr std::size_t kKeep = 1000, kTail = 300;
  if (text.size() > kKeep) {
    // Cut at UTF-8 character starts, so the line stays valid text.
    auto start_of_char = [&](std::size_t i) {
      while (i > 0 && (static_cast<unsigned char>(text[i]) & 0xC0) == 0x80) --i;
      return i;
    };
    text = text.substr(0, start_of_char(kKeep - kTail)) + " [...] " + text.substr(start_of_char(text.size() - kTail));
  }
  return text;
}

}  // namespace vicinal
