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

class CsvReader;

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
  friend class CsvReader;
  static CsvTable all_rows(CsvReader reader);
  std::string source_;
  std::vector<std::string> header_;
  std::vector<CsvRow> rows_;
};

// Reads CSV text one record at a time, so that a large file is never held as
// rows; the same rules and messages as CsvTable::parse (which uses it). A
// fault is reported when the reading reaches it.
class CsvReader {
 public:
  // Reads and checks the header.
  CsvReader(std::string text, const std::string& source);
  static CsvReader open_file(const std::string& path);

  // The header and source, without rows: for column lookups and locations.
  const CsvTable& layout() const { return layout_; }
  // The next non-blank record; false at the end of the text.
  bool next(CsvRow& row);
  // How far the reading has come, in bytes of the text.
  std::size_t position() const { return at_; }
  std::size_t size() const { return text_.size(); }

 private:
  // The next record's fields, blank ones included; false at the end.
  bool next_record(std::vector<std::string>& fields, long& record_line);

  std::string text_;
  CsvTable layout_;
  std::size_t at_ = 0;
  long line_ = 1, column_ = 1;
};

// Quote a field for writing when it needs it.
std::string csv_escape(std::string_view field);

// Reads a whole file into memory; errors name the path (also when it is a folder).
std::string read_text_file(const std::string& path);

// vicinal::Error naming `source` and the line (counted from `first_line`) of the
// first NUL byte or byte sequence that is not UTF-8.
void require_utf8_text(std::string_view text, const std::string& source, long first_line = 1);

}  // namespace vicinal
