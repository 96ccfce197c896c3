#include "report/table.h"

#include <gtest/gtest.h>

#include <sstream>
#include <stdexcept>

namespace vicinal::report {
namespace {

std::vector<std::string> lines_of(const std::string& text) {
  std::vector<std::string> lines;
  std::istringstream in(text);
  for (std::string line; std::getline(in, line);) lines.push_back(line);
  return lines;
}

TEST(TextTable, RightAlignsNumbersAndLeftAlignsText) {
  TextTable table({"label", "J (Hz)"});
  table.add_row({"H1-H2", "7.5"});
  table.add_row({"H2-H3a", "10.25"});
  const auto lines = lines_of(table.render());
  ASSERT_EQ(lines.size(), 4u);
  EXPECT_EQ(lines[0], "label   J (Hz)");
  EXPECT_EQ(lines[1], "--------------");
  EXPECT_EQ(lines[2], "H1-H2      7.5");
  EXPECT_EQ(lines[3], "H2-H3a   10.25");
}

TEST(TextTable, CountsUtf8CharactersNotBytes) {
  TextTable table({"shift", "nucleus"});
  table.add_row({"δ 3.90", "¹H"});
  table.add_row({"δ 101.2", "¹³C"});
  const auto lines = lines_of(table.render());
  ASSERT_EQ(lines.size(), 4u);
  // Every row of a column starts at the same character position.
  EXPECT_EQ(lines[2], "δ 3.90   ¹H");
  EXPECT_EQ(lines[3], "δ 101.2  ¹³C");
  EXPECT_EQ(lines[1], std::string(16, '-'));  // 7 + 2 + 7 columns
}

TEST(TextTable, BlankCellsDoNotTurnANumberColumnToText) {
  TextTable table({"n", "value"});
  table.add_row({"1", ""});
  table.add_row({"10", "2.5"});
  const auto lines = lines_of(table.render());
  EXPECT_EQ(lines[2], " 1       ");
  EXPECT_EQ(lines[3], "10    2.5");
}

TEST(TextTable, RejectsARowWithTheWrongNumberOfCells) {
  TextTable table({"a", "b"});
  EXPECT_THROW(table.add_row({"1"}), std::logic_error);
  EXPECT_THROW(table.add_row({"1", "2", "3"}), std::logic_error);
  EXPECT_TRUE(table.empty());
}

TEST(TextTable, HeaderOnlyTableRendersHeaderAndRule) {
  TextTable table({"name", "count"});
  EXPECT_EQ(table.render(), "name  count\n-----------\n");
}

}  // namespace
}  // namespace vicinal::report
