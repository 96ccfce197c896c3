#include "core/json_file.h"

#include <gtest/gtest.h>

#include <string>

#include "core/error_testing.h"

namespace vicinal {
namespace {

using testing::error_of;

TEST(Json, KeyGivenTwiceIsRefused) {
  EXPECT_EQ(error_of([] { parse_json(R"({"a": 1, "b": {"c": 2, "c": 3}})", "f.json"); }),
            "f.json: 'c': the key appears twice in one object (keep one of the two values)");
  // The same key in different objects is fine.
  EXPECT_NO_THROW(parse_json(R"([{"c": 1}, {"c": 2}, {"d": {"c": 3}}])", "f.json"));
}

TEST(Json, NumberBeyondDoubleNamesItsLine) {
  EXPECT_EQ(error_of([] { parse_json("{\n\"j_hz\":\n 1e400}", "f.json"); }),
            "f.json:3:2: the number 1e400 is too large");
  const std::string digits(5000, '9');
  const std::string message = error_of([&] { parse_json("[" + digits + "]", "f.json"); });
  EXPECT_LT(message.size(), 120u) << message;
}

TEST(Json, DeepNestingIsRefusedWithoutRecursion) {
  const std::string deep = std::string(100000, '[') + std::string(100000, ']');
  EXPECT_NE(error_of([&] { parse_json(deep, "f.json"); }).find("nested deeper than"), std::string::npos);
}

TEST(Json, UnknownKeysAreNamed) {
  const Json doc = parse_json(R"({"spins": [], "shift": 1})", "s.json");
  EXPECT_EQ(error_of([&] { json_require_keys(doc, {"spins", "couplings"}, "s.json", ""); }),
            "s.json: 'shift': unknown key 'shift' (known keys: spins, couplings)");
  EXPECT_EQ(error_of([&] { json_require_keys(doc, {"spins", "shift"}, "s.json", ""); }), "no error");
}

TEST(Error, OverlongMessageKeepsStartAndEnd) {
  const Error e("bad header " + std::string(10'000'000, 'x') + " end", {"f.csv", 1}, "the hint");
  const std::string line = e.one_line();
  EXPECT_LE(line.size(), 1100u);
  EXPECT_EQ(line.rfind("f.csv:1: bad header", 0), 0u);
  EXPECT_NE(line.find("(the hint)"), std::string::npos);
}

}  // namespace
}  // namespace vicinal
