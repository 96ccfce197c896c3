#include "core/json_file.h"

#include <fmt/format.h>

#include <cmath>

#include "core/csv.h"

namespace vicinal {

namespace {

constexpr int kMaxDepth = 64;

// Line and column of a byte offset, for parse errors.
Location locate(std::string_view text, std::size_t offset, const std::string& source) {
  long line = 1, column = 1;
  for (std::size_t i = 0; i < offset && i < text.size(); ++i) {
    if (text[i] == '\n') {
      ++line;
      column = 1;
    } else {
      ++column;
    }
  }
  return {source, line, column};
}

}  // namespace

Json parse_json(std::string_view text, const std::string& source) {
  // The callback sees every nesting step, so over-deep input is refused before
  // the parser recurses further.
  const Json::parser_callback_t limit = [&](int depth, Json::parse_event_t event, Json&) {
    const bool opens = event == Json::parse_event_t::object_start ||
                       event == Json::parse_event_t::array_start;
    if (opens && depth >= kMaxDepth)
      throw Error(fmt::format("JSON nested deeper than {} levels", kMaxDepth), {source});
    return true;
  };
  try {
    return Json::parse(text.begin(), text.end(), limit);
  } catch (const Json::parse_error& e) {
    std::string message = e.what();
    if (auto p = message.find("parse error"); p != std::string::npos) message = message.substr(p);
    throw Error("malformed JSON: " + message, locate(text, e.byte > 0 ? e.byte - 1 : 0, source));
  }
}

Json read_json_file(const std::string& path) { return parse_json(read_text_file(path), path); }

const Json& json_member(const Json& object, const std::string& key, const std::string& source,
                        const std::string& context) {
  if (!object.is_object()) throw Error(fmt::format("'{}' must be a JSON object", context), {source});
  const auto it = object.find(key);
  if (it == object.end())
    throw Error(fmt::format("missing key '{}'", key),
                Location::field_in(source, context.empty() ? key : context + "." + key));
  return *it;
}

double json_number(const Json& value, const std::string& source, const std::string& context) {
  if (!value.is_number())
    throw Error(fmt::format("expected a number, found {}", value.dump()), Location::field_in(source, context));
  const double v = value.get<double>();
  if (!std::isfinite(v)) throw Error("expected a finite number", Location::field_in(source, context));
  return v;
}

std::string json_string(const Json& value, const std::string& source, const std::string& context) {
  if (!value.is_string())
    throw Error(fmt::format("expected a string, found {}", value.dump()), Location::field_in(source, context));
  return value.get<std::string>();
}

}  // namespace vicinal
