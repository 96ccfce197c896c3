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
  return text;
}

}  // namespace vicinal
