#include "core/data_dir.h"

#include <cstdlib>

#include "core/error.h"

namespace vicinal {

std::filesystem::path data_dir() {
  if (const char* env = std::getenv("VICINAL_DATA_DIR"); env && *env) return env;
  return VICINAL_SOURCE_DIR;
}

std::filesystem::path data_file(const std::string& relative) {
  const auto path = data_dir() / relative;
  if (!std::filesystem::exists(path))
    throw Error("shipped data file not found", {path.string()},
                "set VICINAL_DATA_DIR to the folder that holds db/ and schema/");
  return path;
}

}  // namespace vicinal
