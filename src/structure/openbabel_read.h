// Open Babel's format readers throw standard exceptions on some malformed
// input (its PDB reader throws std::out_of_range on a cut-off record). Every
// read of user input goes through guarded_read, so such input ends as a
// vicinal::Error (exit code 2 and a message), not as an internal error.
#pragma once

#include <functional>
#include <string>

namespace vicinal::structure {

// Runs `read` (an OBConversion::Read* call) and returns its result; a
// std::exception thrown inside becomes a vicinal::Error naming `source` and
// the format.
bool guarded_read(const std::function<bool()>& read, const std::string& source, const std::string& format_name);

}  // namespace vicinal::structure
