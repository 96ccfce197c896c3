// Plain-text tables for the terminal and for reports: columns aligned, numeric
// columns right-aligned, a rule under the header.
#pragma once

#include <string>
#include <vector>

namespace vicinal::report {

class TextTable {
 public:
  explicit TextTable(std::vector<std::string> header);
  void add_row(std::vector<std::string> cells);  // must have as many cells as the header
  std::string render() const;
  bool empty() const { return rows_.empty(); }

 private:
  std::vector<std::string> header_;
  std::vector<std::vector<std::string>> rows_;
};

}  // namespace vicinal::report
