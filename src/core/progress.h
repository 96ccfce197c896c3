// Progress of long work. Modules report through this interface and never
// print; the CLI supplies a terminal implementation (stderr, only on a
// terminal, silent with --quiet or --json).
#pragma once

#include <cstddef>
#include <string_view>

namespace vicinal {

class Progress {
 public:
  // What advance() counts: items of work, or bytes of a file read.
  enum class Unit { Items, Bytes };

  virtual ~Progress() = default;
  virtual void start(std::string_view task, std::size_t total, Unit unit) = 0;
  void start(std::string_view task, std::size_t total) { start(task, total, Unit::Items); }
  virtual void advance(std::size_t done) = 0;  // absolute count of finished units
  virtual void finish() = 0;
};

// Does nothing; the default for library callers and tests.
class NoProgress final : public Progress {
 public:
  using Progress::start;
  void start(std::string_view, std::size_t, Unit) override {}
  void advance(std::size_t) override {}
  void finish() override {}
};

}  // namespace vicinal
