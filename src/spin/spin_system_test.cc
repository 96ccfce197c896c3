#include "spin/spin_system.h"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include "core/error.h"

namespace vicinal::spin {
namespace {

const char* kGood = R"({"field_mhz": 400, "observe": "1H",
  "spins": [{"label": "A", "isotope": "1H", "shift_ppm": 3.95, "count": 1},
            {"label": "M", "isotope": "2H", "count": 2}],
  "couplings": [{"between": ["A", "M"], "j_hz": 1.1}]})";

std::string error_of(const std::string& text) {
  try {
    spin_system_from_json(parse_json(text, "system.json"), "system.json");
  } catch (const Error& e) {
    return e.one_line();
  }
  return "no error";
}

TEST(SpinSystem, ReadsGroupsAndCouplings) {
  const auto s = spin_system_from_json(parse_json(kGood, "system.json"), "system.json");
  EXPECT_EQ(s.observe.isotope, "1H");
  ASSERT_EQ(s.groups.size(), 2u);
  EXPECT_EQ(s.groups[1].nucleus.spin, 1.0);
  EXPECT_EQ(s.groups[1].count, 2);
  EXPECT_DOUBLE_EQ(s.coupling_hz(1, 0), 1.1);
  EXPECT_DOUBLE_EQ(s.observe_mhz(), 400);
}

TEST(SpinSystem, ErrorsNameFileAndKeyPath) {
  std::string text = kGood;
  text.replace(text.find(R"(["A", "M"])"), 10, R"(["A", "X"])");
  EXPECT_EQ(error_of(text),
            "system.json: 'couplings[0].between': unknown label 'X' (labels defined under 'spins': A, M)");
  text = kGood;
  text.replace(text.find(R"("2H")"), 4, R"("2Q")");
  EXPECT_THAT(error_of(text), testing::HasSubstr("system.json: 'spins[1].isotope': unknown isotope"));
  text = kGood;
  text.replace(text.find(R"("count": 2)"), 10, R"("count": 1.5)");
  EXPECT_THAT(error_of(text), testing::HasSubstr("'spins[1].count'"));
  text = kGood;
  text.replace(text.find(R"("shift_ppm": 3.95, )"), 18, "");
  EXPECT_THAT(error_of(text), testing::HasSubstr("'spins[0].shift_ppm': missing key"));
  text = kGood;
  text.replace(text.find(R"("label": "M")"), 12, R"("label": "A")");
  EXPECT_THAT(error_of(text), testing::HasSubstr("used twice"));
  text = kGood;
  text.replace(text.find("400"), 3, "-1");
  EXPECT_THAT(error_of(text), testing::HasSubstr("'field_mhz'"));
  text = kGood;
  text.replace(text.find(R"("observe": "1H")"), 15, R"("observe": "13C")");
  EXPECT_THAT(error_of(text), testing::HasSubstr("no spin of the observed isotope 13C"));
  EXPECT_THAT(error_of("[1]"), testing::HasSubstr("must be a JSON object"));
}

}  // namespace
}  // namespace vicinal::spin
