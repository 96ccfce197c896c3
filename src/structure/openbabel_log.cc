#include "structure/openbabel_log.h"

#include <openbabel/oberror.h>

#include <mutex>
#include <ostream>

namespace vicinal::structure {

namespace {

// A stream without a buffer: every write is dropped.
std::ostream& null_stream() {
  static std::ostream sink(nullptr);
  return sink;
}

std::vector<std::string> tidy(const std::vector<std::string>& raw) {
  std::vector<std::string> out;
  for (const auto& message : raw) {
    std::string line;
    for (char c : message) line += (c == '\n' || c == '\r') ? ' ' : c;
    // Open Babel prefixes messages with banners of '=' and "#"; keep the words.
    const auto first = line.find_first_not_of(" =#*");
    const auto last = line.find_last_not_of(" =#*");
    if (first == std::string::npos) continue;
    // Messages quote the input line; a damaged file can make that megabytes long.
    constexpr std::size_t kLongest = 300;
    std::string words = line.substr(first, last - first + 1);
    if (words.size() > kLongest) words = words.substr(0, kLongest) + "...";
    out.push_back(std::move(words));
  }
  return out;
}

}  // namespace

LogCapture::LogCapture() {
  static std::once_flag once;
  std::call_once(once, [] {
    OpenBabel::obErrorLog.SetOutputLevel(OpenBabel::obError);
    OpenBabel::obErrorLog.SetOutputStream(&null_stream());
  });
  OpenBabel::obErrorLog.StartLogging();
  OpenBabel::obErrorLog.ClearLog();
}

std::vector<std::string> LogCapture::errors() const {
  return tidy(OpenBabel::obErrorLog.GetMessagesOfLevel(OpenBabel::obError));
}

std::vector<std::string> LogCapture::warnings() const {
  return tidy(OpenBabel::obErrorLog.GetMessagesOfLevel(OpenBabel::obWarning));
}

}  // namespace vicinal::structure
