#include "core/csv.h"

#include <fmt/format.h>

#include <algorithm>
#include <cstdint>
#include <cstring>
#include <filesystem>
#include <fstream>
#include <sstream>

#include "core/parse.h"

namespace vicinal {

namespace {

// Checks one UTF-8 sequence starting at text[i]; returns its length or 0.
std::size_t utf8_length(std::string_view text, std::size_t i) {
  const auto b = static_cast<unsigned char>(text[i]);
  std::size_t n = b < 0x80 ? 1 : (b >> 5) == 0x6 ? 2 : (b >> 4) == 0xE ? 3 : (b >> 3) == 0x1E ? 4 : 0;
  if (n == 0 || i + n > text.size()) return 0;
  for (std::size_t k = 1; k < n; ++k)
    if ((static_cast<unsigned char>(text[i + k]) >> 6) != 0x2) return 0;
  return n;
}

}  // namespace

CsvReader::CsvReader(std::string text, const std::string& source) : text_(std::move(text)) {
  layout_.source_ = source;
  if (std::string_view(text_).substr(0, 3) == "\xEF\xBB\xBF") at_ = 3;
  long header_line = 1;
  std::vector<std::string> header;
  do {
    if (!next_record(header, header_line)) throw Error("the file is empty; a header row is required", {source});
  } while (header.size() == 1 && header[0].empty());
  for (std::size_t c = 0; c < header.size(); ++c) {
    if (header[c].empty()) throw Error(fmt::format("header column {} has no name", c + 1), {source, header_line, 0});
    for (std::size_t d = 0; d < c; ++d)
      if (header[d] == header[c])
        throw Error(fmt::format("column '{}' appears twice in the header", header[c]), {source, header_line, 0});
  }
  layout_.header_ = std::move(header);
}

CsvReader CsvReader::open_file(const std::string& path) { return CsvReader(read_text_file(path), path); }

bool CsvReader::next(CsvRow& row) {
  do {
    if (!next_record(row.fields, row.line)) return false;
  } while (row.fields.size() == 1 && row.fields[0].empty());
  if (row.fields.size() != layout_.header_.size())
    throw Error(fmt::format("this row has {} fields but the header has {}", row.fields.size(),
                            layout_.header_.size()),
                {layout_.source_, row.line, 0});
  return true;
}

bool CsvReader::next_record(std::vector<std::string>& fields, long& record_line) {
  const std::string_view text = text_;
  const std::string& source = layout_.source_;
  if (at_ >= text.size()) return false;
  fields.clear();
  std::string field;
  bool in_quotes = false, field_was_quoted = false;
  long quote_line = 0, quote_column = 0;
  record_line = line_;
  auto end_field = [&] {
    fields.push_back(field_was_quoted ? field : std::string(trim(field)));
    field.clear();
    field_was_quoted = false;
  };
  // Plain ASCII text of a field (no quote, separator, line end or NUL) is
  // copied a run at a time rather than a character at a time.
  auto plain = [&](char ch) {
    const auto byte = static_cast<unsigned char>(ch);
    return byte >= 1 && byte < 0x80 && ch != '"' && ch != '\n' && ch != '\r' && (in_quotes || ch != ',');
  };
  std::size_t i = at_;
  while (i < text.size()) {
    if (in_quotes || !field_was_quoted) {
      std::size_t end = i;
      while (end < text.size() && plain(text[end])) ++end;
      if (end > i) {
        field.append(text.substr(i, end - i));
        column_ += static_cast<long>(end - i);
        i = end;
        continue;
      }
    }
    const char c = text[i];
    if (c == '\0')
      throw Error("the file contains a NUL byte; is it a binary file or UTF-16 text?", {source, line_, column_},
                  "save it as UTF-8 CSV");
    const std::size_t n = utf8_length(text, i);
    if (n == 0) throw Error("the file is not valid UTF-8 text", {source, line_, column_}, "save it as UTF-8 CSV");
    if (in_quotes) {
      if (c == '"') {
        if (i + 1 < text.size() && text[i + 1] == '"') {
          field += '"';
          i += 2;
          column_ += 2;
          continue;
        }
        in_quotes = false;
      } else {
        field.append(text.substr(i, n));
        if (c == '\n' || (c == '\r' && !(i + 1 < text.size() && text[i + 1] == '\n'))) {
          ++line_;
          column_ = 0;
        }
      }
      i += n;
      column_ += 1;
      continue;
    }
    if (c == '"') {
      if (!trim(field).empty())
        throw Error("a quote inside an unquoted field", {source, line_, column_},
                    "quote the whole field and double the inner quotes");
      field.clear();
      in_quotes = field_was_quoted = true;
      quote_line = line_;
      quote_column = column_;
    } else if (c == ',') {
      end_field();
    } else if (c == '\n' || c == '\r') {
      if (c == '\r' && i + 1 < text.size() && text[i + 1] == '\n') ++i;
      end_field();
      ++line_;
      column_ = 1;
      at_ = i + 1;
      return true;
    } else if (field_was_quoted) {
      if (c != ' ' && c != '\t')
        throw Error("text after a closing quote", {source, line_, column_},
                    "a quoted field must end at the next comma or line end");
    } else {
      field.append(text.substr(i, n));
    }
    i += n;
    column_ += 1;
  }
  if (in_quotes) throw Error("a quoted field is never closed", {source, quote_line, quote_column});
  end_field();
  at_ = text.size();
  return true;
}

CsvTable CsvTable::all_rows(CsvReader reader) {
  CsvTable table = reader.layout();
  CsvRow row;
  while (reader.next(row)) table.rows_.push_back(std::move(row));
  return table;
}

CsvTable CsvTable::parse(std::string_view text, const std::string& source) {
  return all_rows(CsvReader(std::string(text), source));
}

void require_utf8_text(std::string_view text, const std::string& source, long first_line) {
  // Lines are counted only when a fault is found; ASCII without NUL is skipped
  // eight bytes at a time, so big structure files cost little.
  const auto fault = [&](std::size_t at, const char* what) {
    const long line = first_line + static_cast<long>(std::count(text.begin(), text.begin() + static_cast<long>(at), '\n'));
    throw Error(what, {source, line}, "save it as UTF-8 text");
  };
  constexpr std::uint64_t kHigh = 0x8080808080808080ull, kLow = 0x0101010101010101ull;
  for (std::size_t i = 0; i < text.size();) {
    if (i + 8 <= text.size()) {
      std::uint64_t word;
      std::memcpy(&word, text.data() + i, 8);
      if (((word | ((word - kLow) & ~word)) & kHigh) == 0) {  // no high bit, no zero byte
        i += 8;
        continue;
      }
    }
    if (text[i] == '\0') fault(i, "the file contains a NUL byte; is it a binary file or UTF-16 text?");
    const std::size_t n = utf8_length(text, i);
    if (n == 0) fault(i, "the file is not valid UTF-8 text");
    i += n;
  }
}

std::string read_text_file(const std::string& path) {
  std::error_code ec;
  if (std::filesystem::is_directory(path, ec)) throw Error("is a folder, not a file", {path});
  std::ifstream in(path, std::ios::binary);
  if (!in) throw Error("cannot open the file for reading", {path}, "check the path and permissions");
  std::ostringstream buffer;
  buffer << in.rdbuf();
  if (in.bad()) throw Error("reading the file failed", {path});
  return buffer.str();
}

CsvTable CsvTable::read_file(const std::string& path) { return all_rows(CsvReader::open_file(path)); }

std::optional<std::size_t> CsvTable::column(std::string_view name) const {
  for (std::size_t c = 0; c < header_.size(); ++c)
    if (header_[c] == name) return c;
  return std::nullopt;
}

std::size_t CsvTable::require_column(std::string_view name) const {
  if (auto c = column(name)) return *c;
  throw Error(fmt::format("the header has no '{}' column", name), {source_, 1, 0},
              fmt::format("columns found: {}", fmt::join(header_, ", ")));
}

Location CsvTable::where(const CsvRow& row, std::size_t column) const {
  Location at{source_, row.line};
  at.field_number = static_cast<long>(column + 1);
  if (column < header_.size()) at.field = header_[column];
  return at;
}

std::string csv_escape(std::string_view field) {
  if (field.find_first_of(",\"\r\n") == std::string_view::npos && trim(field).size() == field.size())
    return std::string(field);
  std::string out = "\"";
  for (char c : field) {
    if (c == '"') out += '"';
    out += c;
  }
  return out + "\"";
}

}  // namespace vicinal
