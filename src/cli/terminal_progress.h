// Progress on a terminal: one line on stderr, redrawn at most ten times a
// second, erased when the work finishes. Bytes are shown in kB or MB
// ("importing: 12.5 of 83.0 MB (15%)").
#pragma once

#include <chrono>
#include <ostream>
#include <string>

#include "core/progress.h"

namespace vicinal::cli {

class TerminalProgress final : public Progress {
 public:
  explicit TerminalProgress(std::ostream& out) : out_(out) {}
  using Progress::start;
  void start(std::string_view task, std::size_t total, Unit unit) override;
  void advance(std::size_t done) override;
  void finish() override;

 private:
  std::ostream& out_;
  std::string task_;
  std::size_t total_ = 0;
  Unit unit_ = Unit::Items;
  std::chrono::steady_clock::time_point last_draw_{};
};

}  // namespace vicinal::cli
