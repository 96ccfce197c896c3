// JSON input with errors that name the file, line and column, and a depth
// limit so hostile nesting cannot exhaust the stack.
#pragma once

#include <nlohmann/json.hpp>
#include <initializer_list>
#include <string>
#include <string_view>

#include "core/error.h"

namespace vicinal {

using Json = nlohmann::json;

Json parse_json(std::string_view text, const std::string& source);
Json read_json_file(const std::string& path);

// Typed access to object members with errors naming the file and key path.
// `context` is the key path shown to the user, e.g. "spins[2].isotope".
const Json& json_member(const Json& object, const std::string& key, const std::string& source,
                        const std::string& context);
double json_number(const Json& value, const std::string& source, const std::string& context);
std::string json_string(const Json& value, const std::string& source, const std::string& context);

// Refuses a key of `object` that is not in `allowed`, naming it (so that a
// misspelt key is not silently ignored). `context` is the object's key path.
void json_require_keys(const Json& object, std::initializer_list<std::string_view> allowed, const std::string& source,
                       const std::string& context);

}  // namespace vicinal
