#include "core/csv.h"

#include <gtest/gtest.h>

namespace vicinal {
namespace {

TEST(Csv, ReadsQuotedFieldsAndLineEndings) {
  const auto t = CsvTable::parse("a,b\r\n\"x, \"\"y\"\"\",2\n3,\"multi\nline\"\r4,5\n", "t.csv");
  ASSERT_EQ(t.rows().size(), 3u);
  EXPECT_EQ(t.rows()[0].fields[0], "x, \"y\"");
  EXPECT_EQ(t.rows()[1].fields[1], "multi\nline");
  EXPECT_EQ(t.rows()[1].line, 3);
  EXPECT_EQ(t.rows()[2].line, 5);
  EXPECT_EQ(t.rows()[2].fields[0], "4");
}

TEST(Csv, SkipsBomAndBlankLines) {
  const auto t = CsvTable::parse("\xEF\xBB\xBFname,j_hz\n\nA,1.5\n\n", "t.csv");
  EXPECT_EQ(t.header()[0], "name");
  ASSERT_EQ(t.rows().size(), 1u);
  EXPECT_EQ(t.require_column("j_hz"), 1u);
}

TEST(Csv, MalformedInputNamesThePlace) {
  auto message = [](std::string_view text) {
    try {
      CsvTable::parse(text, "bad.csv");
    } catch (const Error& e) {
      return e.one_line();
    }
    return std::string("no error");
  };
  EXPECT_NE(message("a,b\n1,2,3\n").find("bad.csv:2"), std::string::npos);
  EXPECT_NE(message("a,a\n1,2\n").find("appears twice"), std::string::npos);
  EXPECT_NE(message(std::string_view("a\n1\0", 5)).find("NUL"), std::string::npos);
  EXPECT_NE(message("a\n\"open\n").find("never closed"), std::string::npos);
  EXPECT_NE(message("a\n\xff\n").find("UTF-8"), std::string::npos);
  EXPECT_NE(message("").find("empty"), std::string::npos);
  EXPECT_NE(message("a,b\n1,2\n").find("no error"), std::string::npos);
}

TEST(Csv, ReaderGivesRowsBeforeALaterFaultAndNamesItsPlace) {
  // A reader reports a fault only when it reaches it, with the line and
  // column CsvTable::parse gives for the same text.
  const std::string text = "a,b\n1,\"x\ny\"\n\n3,t\xc3\xa9xt\n4,\"q\" z\n";
  CsvReader reader(text, "r.csv");
  EXPECT_EQ(reader.layout().header(), (std::vector<std::string>{"a", "b"}));
  EXPECT_TRUE(reader.layout().rows().empty());
  CsvRow row;
  ASSERT_TRUE(reader.next(row));
  EXPECT_EQ(row.line, 2);
  EXPECT_EQ(row.fields[1], "x\ny");
  ASSERT_TRUE(reader.next(row));  // the blank line is skipped
  EXPECT_EQ(row.line, 5);
  EXPECT_EQ(row.fields[1], "t\xc3\xa9xt");
  EXPECT_LT(reader.position(), reader.size());
  std::string from_reader, from_table;
  try {
    reader.next(row);
  } catch (const Error& e) {
    from_reader = e.one_line();
  }
  try {
    CsvTable::parse(text, "r.csv");
  } catch (const Error& e) {
    from_table = e.one_line();
  }
  EXPECT_NE(from_reader.find("r.csv:6:"), std::string::npos) << from_reader;
  EXPECT_NE(from_reader.find("after a closing quote"), std::string::npos) << from_reader;
  EXPECT_EQ(from_reader, from_table);
}

TEST(Csv, EscapeRoundTrips) {
  const std::string tricky = "semi;colon, \"quoted\"\nnewline";
  const auto t = CsvTable::parse("x\n" + csv_escape(tricky) + "\n", "t.csv");
  EXPECT_EQ(t.rows()[0].fields[0], tricky);
  EXPECT_EQ(csv_escape("plain"), "plain");
}

TEST(Csv, FieldLocationNamesColumn) {
  const auto t = CsvTable::parse("nuclei,j_hz\n1,x\n", "c.csv");
  EXPECT_EQ(t.where(t.rows()[0], 1).describe(), "c.csv:2: column 2 'j_hz'");
}

TEST(Csv, Utf8CheckNamesTheLine) {
  EXPECT_NO_THROW(require_utf8_text("plain ascii, longer than eight bytes\n\xc3\xa9t\xc3\xa9\n", "t.sdf"));
  try {
    require_utf8_text("line one is long enough\nline two \xe9 (Latin-1)\n", "t.sdf", 10);
    FAIL();
  } catch (const Error& e) {
    EXPECT_EQ(e.where().line, 11);
  }
  EXPECT_THROW(require_utf8_text(std::string("abcdefghij\0k", 12), "t.sdf"), Error);
  EXPECT_THROW(read_text_file("."), Error);  // a folder is not a file
}

}  // namespace
}  // namespace vicinal
