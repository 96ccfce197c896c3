#include "cli/terminal_progress.h"

#include <fmt/format.h>

namespace vicinal::cli {

namespace {

// "12.5 of 83.0 MB": bytes in kB below 1 MB, else in MB; items as counts.
std::string amounts(std::size_t done, std::size_t total, Progress::Unit unit) {
  if (unit == Progress::Unit::Items)
    return total > 0 ? fmt::format("{} of {}", done, total) : std::to_string(done);
  const bool mega = total >= 1'000'000;
  const double scale = mega ? 1e6 : 1e3;
  const std::string whole = total > 0 ? fmt::format(" of {:.1f}", static_cast<double>(total) / scale) : "";
  return fmt::format("{:.1f}{} {}", static_cast<double>(done) / scale, whole, mega ? "MB" : "kB");
}

}  // namespace

void TerminalProgress::start(std::string_view task, std::size_t total, Unit unit) {
  task_ = task;
  total_ = total;
  unit_ = unit;
  last_draw_ = {};
  advance(0);
}

void TerminalProgress::advance(std::size_t done) {
  const auto now = std::chrono::steady_clock::now();
  if (now - last_draw_ < std::chrono::milliseconds(100) && done < total_) return;
  last_draw_ = now;
  if (total_ > 0)
    out_ << fmt::format("\r{}: {} ({:.0f}%)   ", task_, amounts(done, total_, unit_), 100.0 * done / total_);
  else
    out_ << fmt::format("\r{}: {}   ", task_, amounts(done, total_, unit_));
  out_.flush();
}

void TerminalProgress::finish() { out_ << "\r\033[K" << std::flush; }

}  // namespace vicinal::cli
