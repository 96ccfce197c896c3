#include "report/table.h"

#include <algorithm>
#include <stdexcept>

namespace vicinal::report {

namespace {

// Display width: UTF-8 continuation bytes take no column.
std::size_t width(const std::string& s) {
  return static_cast<std::size_t>(
      std::count_if(s.begin(), s.end(), [](char c) { return (static_cast<unsigned char>(c) & 0xC0) != 0x80; }));
}

}  // namespace

bool is_numeric_cell(const std::string& s) {
  if (s.empty()) return true;  // blank cells do not decide alignment
  return s.find_first_not_of("0123456789+-.eE%() ,[]") == std::string::npos &&
         s.find_first_of("0123456789") != std::string::npos;
}

std::vector<bool> numeric_columns(const std::vector<std::string>& header,
                                  const std::vector<std::vector<std::string>>& rows) {
  std::vector<bool> numeric(header.size(), !rows.empty());
  for (const auto& row : rows)
    for (std::size_t c = 0; c < header.size() && c < row.size(); ++c)
      if (!is_numeric_cell(row[c])) numeric[c] = false;
  return numeric;
}

TextTable::TextTable(std::vector<std::string> header) : header_(std::move(header)) {}

void TextTable::add_row(std::vector<std::string> cells) {
  if (cells.size() != header_.size()) throw std::logic_error("TextTable row has the wrong number of cells");
  rows_.push_back(std::move(cells));
}

std::string TextTable::render() const {
  const std::size_t n = header_.size();
  std::vector<std::size_t> widths(n);
  const std::vector<bool> right = numeric_columns(header_, rows_);
  for (std::size_t c = 0; c < n; ++c) {
    widths[c] = width(header_[c]);
    for (const auto& row : rows_) widths[c] = std::max(widths[c], width(row[c]));
  }
  auto line = [&](const std::vector<std::string>& cells) {
    std::string out;
    for (std::size_t c = 0; c < n; ++c) {
      const std::string pad(widths[c] - width(cells[c]), ' ');
      if (c > 0) out += "  ";
      out += right[c] ? pad + cells[c] : cells[c] + (c + 1 < n ? pad : "");
    }
    return out + "\n";
  };
  std::string out = line(header_);
  std::size_t total = 0;
  for (auto w : widths) total += w;
  out += std::string(total + 2 * (n - 1), '-') + "\n";
  for (const auto& row : rows_) out += line(row);
  return out;
}

}  // namespace vicinal::report
