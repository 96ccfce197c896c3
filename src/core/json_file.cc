#include "core/json_file.h"

#include <fmt/format.h>
#include <fmt/ranges.h>

#include <algorithm>
#include <cmath>
#include <set>
#include <vector>

#include "core/csv.h"

namespace vicinal {

namespace {

constexpr int kMaxDepth = 64;

// Text from the input shortened so that an error stays one readable line.
std::string shown(std::string_view text, std::size_t limit = 40) {
  return text.size() <= limit ? std::string(text) : std::string(text.substr(0, limit)) + "...";
}

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
  // the parser recurses further. It also sees every key: a key given twice in
  // one object is refused, as the parser would silently keep the last value.
  std::vector<std::set<std::string>> keys;  // one set per open object
  const Json::parser_callback_t check = [&](int depth, Json::parse_event_t event, Json& parsed) {
    const bool opens = event == Json::parse_event_t::object_start ||
                       event == Json::parse_event_t::array_start;
    if (opens && depth >= kMaxDepth)
      throw Error(fmt::format("JSON nested deeper than {} levels", kMaxDepth), {source});
    if (event == Json::parse_event_t::object_start) keys.emplace_back();
    if (event == Json::parse_event_t::object_end && !keys.empty()) keys.pop_back();
    if (event == Json::parse_event_t::key && !keys.empty() && !keys.back().insert(parsed.get<std::string>()).second)
      throw Error("the key appears twice in one object", Location::field_in(source, shown(parsed.get<std::string>())),
                  "keep one of the two values");
    return true;
  };
  try {
    return Json::parse(text.begin(), text.end(), check);
  } catch (const Json::parse_error& e) {
    std::string message = e.what();
    if (auto p = message.find("parse error"); p != std::string::npos) message = message.substr(p);
    throw Error("malformed JSON: " + shown(message, 300), locate(text, e.byte > 0 ? e.byte - 1 : 0, source));
  } catch (const Json::out_of_range& e) {
    // A number beyond the range of a double (1e400): nlohmann names the text
    // of the number but not its place, so the place is found from the text.
    std::string message = e.what();
    const auto quote = message.find('\'');
    const std::string number =
        quote == std::string::npos ? std::string() : message.substr(quote + 1, message.rfind('\'') - quote - 1);
    const auto at = number.empty() ? std::string_view::npos : text.find(number);
    throw Error(fmt::format("the number {} is too large", shown(number)),
                at == std::string_view::npos ? Location(source) : locate(text, at, source));
  }
}

void json_require_keys(const Json& object, std::initializer_list<std::string_view> allowed, const std::string& source,
                       const std::string& context) {
  if (!object.is_object()) return;
  for (const auto& item : object.items())
    if (std::find(allowed.begin(), allowed.end(), item.key()) == allowed.end())
      throw Error(fmt::format("unknown key '{}'", shown(item.key())),
                  Location::field_in(source, context.empty() ? shown(item.key()) : context + "." + shown(item.key())),
                  fmt::format("known keys: {}", fmt::join(allowed, ", ")));
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
