// RFC 4180 CSV with a required header row. Quoted fields may hold commas,
// doubled quotes and line breaks; LF, CRLF and CR line endings are accepted;
// a UTF-8 byte-order mark is skipped. Anything else malformed (NUL bytes,
// invalid UTF-8, an unterminated quote, a row with the wrong number of fields,
// a duplicated or empty header name) is a vicinal::Error naming file, line and
// column.
#pragma once

#include <cstddef>
#include <optional>
#include <string>
#include <string_view>
#include <vector>

#include "core/error.h"

namespace vicinal {

struct CsvRow {
  long line = 0;  // line on which the record starts, 1-based
  std::vector<std::string> fields;
};

class CsvTable {
 public:
  // `source` names the input in error messages (a path or "<stdin>").
  static CsvTable parse(std::string_view text, const std::string& source);
  static CsvTable read_file(const std::string& path);

  const std::string& source() const { return source_; }
  const std::vector<std::string>& header() const { return header_; }
  const std::vector<CsvRow>& rows() const { return rows_; }

  // Index of a header name (exact match after trimming), if present.
  std::optional<std::size_t> column(std::string_view name) const;
  // Like column(), but a missing column is an error naming the file.
  std::size_t require_column(std::string_view name) const;
  // Location of one field, for error messages.
  Location where(const CsvRow& row, std::size_t column) const;

 private:
  std::string source_;
  std::vector<std::string> header_;
  std::vector<CsvRow> rows_;
};

// Quote a field for writing when it needs it.
std::string csv_escape(std::string_view field);

// Reads a whole file into memory; errors name the path (also when it is a folder).
std::string read_text_file(const std::string& path);

// vicinal::Error naming `source` and the line (counted from `first_line`) of the
// first NUL byte or byte sequence that is not UTF-8.
void require_utf8_text(std::string_view text, const std::string& source, long first_line = 1);

}  // namespace vicinal
