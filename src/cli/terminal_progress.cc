#include "cli/terminal_progress.h"

#include <fmt/format.h>

namespace vicinal::cli {

void TerminalProgress::start(std::string_view task, std::size_t total) {
  task_ = task;
  total_ = total;
  last_draw_ = {};
  advance(0);
}

void TerminalProgress::advance(std::size_t done) {
  const auto now = std::chrono::steady_clock::now();
  if (now - last_draw_ < std::chrono::milliseconds(100) && done < total_) return;
  last_draw_ = now;
  if (total_ > 0)
    out_ << fmt::format("\r{}: {}/{} ({:.0f}%)   ", task_, done, total_, 100.0 * done / total_);
  else
    out_ << fmt::format("\r{}: {}   ", task_, done);
  out_.flush();
}

void TerminalProgress::finish() { out_ << "\r\033[K" << std::flush; }

}  // namespace vicinal::cli
