// The one user-facing error type. Modules throw vicinal::Error for anything the
// user can fix (bad input, unknown names, values out of range); the CLI prints
// it as one line and exits with code 2. Anything else that escapes is a bug and
// exits with code 1.
#pragma once

#include <stdexcept>
#include <string>

namespace vicinal {

// Where a problem is: a file and position, a field (column, key or option),
// or an atom. Every part is optional; describe() joins the ones that are set.
struct Location {
  Location() = default;
  Location(std::string file_, long line_ = 0, long column_ = 0)
      : file(std::move(file_)), line(line_), column(column_) {}
  // A named field (JSON key path, option, column name) in a file.
  static Location field_in(std::string file, std::string field_name) {
    Location at(std::move(file));
    at.field = std::move(field_name);
    return at;
  }

  std::string file;
  long line = 0;    // 1-based; 0 = unknown
  long column = 0;  // 1-based; 0 = unknown
  std::string field;      // a column, key or option name
  long field_number = 0;  // 1-based column of a table; 0 = not a table
  std::string atom;

  std::string describe() const;
};

class Error : public std::runtime_error {
 public:
  explicit Error(const std::string& what, Location where = {}, std::string hint = {});

  const std::string& what_happened() const { return what_; }
  const Location& where() const { return where_; }
  const std::string& hint() const { return hint_; }

  // "FILE:LINE:COL: field 'x': what happened (hint)" on one line.
  std::string one_line() const;

 private:
  std::string what_;
  Location where_;
  std::string hint_;
};

}  // namespace vicinal
