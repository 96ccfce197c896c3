// Open Babel writes warnings to stderr through its global obErrorLog. Modules
// must not print, so the log is redirected into memory; a LogCapture collects
// the messages one operation produced, for ReadNotes or a vicinal::Error.
#pragma once

#include <string>
#include <vector>

namespace vicinal::structure {

class LogCapture {
 public:
  LogCapture();  // silences the global log and clears it
  // Error- and warning-level messages since construction, one line each.
  std::vector<std::string> errors() const;
  std::vector<std::string> warnings() const;
};

}  // namespace vicinal::structure
