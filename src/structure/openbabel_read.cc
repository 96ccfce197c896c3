#include "structure/openbabel_read.h"

#include <fmt/format.h>

#include <exception>

#include "core/error.h"

namespace vicinal::structure {

bool guarded_read(const std::function<bool()>& read, const std::string& source, const std::string& format_name) {
  try {
    return read();
  } catch (const Error&) {
    throw;
  } catch (const std::exception& e) {
    throw Error(fmt::format("Open Babel could not read the {} input: {}", format_name, e.what()), Location(source),
                "the file may be damaged or not in the format its extension says");
  }
}

}  // namespace vicinal::structure
