// Plain-text tables for the terminal and for reports: columns aligned, numeric
// columns right-aligned, a rule under the header.
#pragma once

#include <string>
#include <vector>

namespace vicinal::report {

// True for cells that read as numbers ("7.5", "-0.3 (0.2)", "[1, 4]", "95%")
// and for blank cells, which do not decide a column's alignment.
bool is_numeric_cell(const std::string& cell);

// Per column: right-align it? True when there are rows and every non-blank
// cell of the column reads as a number.
std::vector<bool> numeric_columns(const std::vector<std::string>& header,
                                  const std::vector<std::vector<std::string>>& rows);

class TextTable {
 public:
  explicit TextTable(std::vector<std::string> header);
  void add_row(std::vector<std::string> cells);  // must have as many cells as the header
  std::string render() const;
  bool empty() const { return rows_.empty(); }
  const std::vector<std::string>& header() const { return header_; }
  const std::vector<std::vector<std::string>>& rows() const { return rows_; }

 private:
  std::vector<std::string> header_;
  std::vector<std::vector<std::string>> rows_;
};

}  // namespace vicinal::report
