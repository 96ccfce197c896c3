#include "core/parse.h"

#include <gtest/gtest.h>

namespace vicinal {
namespace {

TEST(Parse, AcceptsPlainNumbers) {
  EXPECT_DOUBLE_EQ(parse_double(" 7.4 ", {}), 7.4);
  EXPECT_DOUBLE_EQ(parse_double("+1e-3", {}), 1e-3);
  EXPECT_DOUBLE_EQ(parse_double("-12", {}), -12.0);
  EXPECT_EQ(parse_long("42", {}), 42);
}

TEST(Parse, RejectsWhatIsNotAFiniteNumber) {
  for (const char* bad : {"", "abc", "7.4Hz", "nan", "inf", "1e400", "1,5", "--1"})
    EXPECT_THROW(parse_double(bad, {"f.csv", 3}), Error) << bad;
  EXPECT_THROW(parse_long("1.5", {}), Error);
  EXPECT_THROW(parse_long("99999999999999999999999", {}), Error);
}

TEST(Parse, ErrorNamesTheField) {
  try {
    Location at("f.csv", 3);
    at.field = "j_hz";
    parse_double("x", at);
    FAIL();
  } catch (const Error& e) {
    EXPECT_EQ(e.one_line(), "f.csv:3: 'j_hz': 'x' is not a number");
  }
}

TEST(Parse, CouplingBeyondThousandHertzIsRefused) {
  EXPECT_DOUBLE_EQ(parse_coupling_hz("-999.5", {}), -999.5);
  EXPECT_THROW(parse_coupling_hz("1234567890123456789012345678901234567890", {"f.csv", 2}), Error);
  EXPECT_THROW(parse_coupling_hz("1000.01", {}), Error);
}

}  // namespace
}  // namespace vicinal
