// Progress on a terminal: one line on stderr, redrawn at most ten times a
// second, erased when the work finishes.
#pragma once

#include <chrono>
#include <ostream>
#include <string>

#include "core/progress.h"

namespace vicinal::cli {

class TerminalProgress final : public Progress {
 public:
  explicit TerminalProgress(std::ostream& out) : out_(out) {}
  void start(std::string_view task, std::size_t total) override;
  void advance(std::size_t done) override;
  void finish() override;

 private:
  std::ostream& out_;
  std::string task_;
  std::size_t total_ = 0;
  std::chrono::steady_clock::time_point last_draw_{};
};

}  // namespace vicinal::cli
