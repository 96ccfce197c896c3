#include "predict/coupling_list.h"

#include <gtest/gtest.h>

#include "core/error_testing.h"

namespace vicinal::predict {
namespace {

using vicinal::testing::error_of;

TEST(CouplingList, ParsesRowsAlternativesAndExtraColumns) {
  const auto t = CsvTable::parse(
      "nuclei,j_hz,sigma_hz,set,compound,note\n"
      "\"H-2,H-3\",9.8,0.2,,cpd-1,axial\n"
      "\"13,14|15\",,,hh-karplus-1959,cpd-1,\n",
      "c.csv");
  const CouplingList list = parse_coupling_list(t);
  ASSERT_EQ(list.rows.size(), 2u);
  EXPECT_EQ(list.rows[0].nuclei[0], std::vector<std::string>{"H-2"});
  EXPECT_DOUBLE_EQ(*list.rows[0].j_hz, 9.8);
  EXPECT_DOUBLE_EQ(*list.rows[0].sigma_hz, 0.2);
  EXPECT_EQ(list.rows[0].note, "axial");
  EXPECT_FALSE(list.rows[1].j_hz.has_value());
  EXPECT_TRUE(list.rows[1].has_alternatives());
  EXPECT_EQ(list.rows[1].assignments().size(), 2u);
  EXPECT_EQ(list.rows[1].assignments()[1], (std::array<std::string, 2>{"13", "15"}));
  EXPECT_EQ(list.rows[1].nuclei_text(), "13,14|15");
  EXPECT_EQ(list.rows[1].set, "hh-karplus-1959");
  EXPECT_EQ(list.extra_columns, std::vector<std::string>{"compound"});
  EXPECT_EQ(list.rows[1].extra[0], (std::pair<std::string, std::string>{"compound", "cpd-1"}));
  EXPECT_EQ(list.rows[1].line, 3);
}

TEST(CouplingList, ErrorsNameLineAndColumn) {
  const auto parse = [](const std::string& text, bool require_j = false) {
    return error_of([&] { parse_coupling_list(CsvTable::parse(text, "c.csv"), require_j); });
  };
  EXPECT_NE(parse("j_hz\n1\n").find("nuclei"), std::string::npos);
  EXPECT_NE(parse("nuclei,j_hz\n\"1,2\",x\n").find("c.csv:2: column 2"), std::string::npos);
  EXPECT_NE(parse("nuclei,j_hz\n\"1,2\",1\n\"1,2,3\",1\n").find("c.csv:3: column 1"), std::string::npos);
  EXPECT_NE(parse("nuclei,j_hz\n\"1,2\",1\n\"1,|2\",1\n").find("empty atom reference"), std::string::npos);
  EXPECT_NE(parse("nuclei,j_hz,sigma_hz\n\"1,2\",1,-0.1\n").find("c.csv:2: column 3"), std::string::npos);
  EXPECT_NE(parse("nuclei\n\"1,2\"\n", true).find("j_hz"), std::string::npos);
  EXPECT_NE(parse("nuclei,j_hz\n\"1,2\",\n", true).find("c.csv:2: column 2"), std::string::npos);
  EXPECT_NE(parse("nuclei,j_hz\n").find("no couplings"), std::string::npos);
}

}  // namespace
}  // namespace vicinal::predict
