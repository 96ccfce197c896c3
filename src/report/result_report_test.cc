#include "report/result_report.h"

#include <gmock/gmock.h>
#include <gtest/gtest.h>

#include <filesystem>

#include "core/error_testing.h"
#include "report/configuration_section.h"

namespace vicinal::report {
namespace {

using ::testing::HasSubstr;
using vicinal::testing::error_of;

// A small configuration document: two arrangements, one coupling, one candidate.
Json small_configuration() {
  return {{"format", kConfigurationFormat},
          {"version", kResultVersion},
          {"title", "test"},
          {"program", "vicinal"},
          {"command_line", "vicinal configuration"},
          {"created", "2026-12-02T00:00:00Z"},
          {"verdict", "clear"},
          {"statement", "The couplings support erythro, H2 anti H3."},
          {"x3", "carbon"},
          {"equally_good_margin", 2.0},
          {"pair_penalty", 2.0},
          {"measured", {{{"name", "H2-H3"}, {"j_hz", 9.5}, {"sigma_hz", 0.3}}}},
          {"arrangements",
           {{{"name", "erythro, H2 anti H3"},
             {"short_name", "E-H3"},
             {"configuration", "erythro"},
             {"couplings", {{{"name", "H2-H3"}, {"j_hz", 9.8}, {"tolerance_hz", 1.0}, {"category", "large"}}}}},
            {{"name", "erythro, H2 anti X3"},
             {"short_name", "E-X3"},
             {"configuration", "erythro"},
             {"couplings", {{{"name", "H2-H3"}, {"j_hz", 2.5}, {"tolerance_hz", 1.0}, {"category", "small"}}}}}}},
          {"candidates",
           {{{"name", "erythro, H2 anti H3"},
             {"configuration", "erythro"},
             {"members", {0}},
             {"fraction_first", 1.0},
             {"score", 0.08},
             {"ranked_score", 0.08}}}}};
}

class ResultReport : public ::testing::Test {
 protected:
  void SetUp() override {
    dir_ = std::filesystem::temp_directory_path() /
           ("vicinal-result-report-" + std::to_string(::testing::UnitTest::GetInstance()->random_seed()) + "-" +
            ::testing::UnitTest::GetInstance()->current_test_info()->name());
    std::filesystem::remove_all(dir_);
  }
  void TearDown() override { std::filesystem::remove_all(dir_); }
  std::filesystem::path dir_;
};

TEST_F(ResultReport, RendersTheConfigurationPage) {
  const Json doc = small_configuration();
  ASSERT_TRUE(is_result_document(doc));
  EXPECT_EQ(result_document_name(doc), "configuration.json");
  const auto files = write_result_report(
      doc, "c.json", {.html = dir_ / "report.html", .figures_dir = dir_ / "figures", .tables_dir = dir_ / "tables"});
  // 2 figures x 3 formats, 3 tables, the document copy, the page.
  EXPECT_EQ(files.size(), 2u * 3 + 3 + 1 + 1);
  EXPECT_TRUE(std::filesystem::exists(dir_ / "figures" / "deviations.pdf"));
  EXPECT_TRUE(std::filesystem::exists(dir_ / "tables" / "candidates.csv"));
}

TEST_F(ResultReport, RefusesWhatItCannotRead) {
  Json doc = small_configuration();
  EXPECT_FALSE(is_result_document(Json::array()));
  doc["format"] = "vicinal-analysis";
  EXPECT_FALSE(is_result_document(doc));
  EXPECT_THAT(error_of([&] { write_result_report(doc, "x.json", {.html = dir_ / "r.html"}); }),
              HasSubstr("not a vicinal result document"));
  doc = small_configuration();
  doc["version"] = 2;
  EXPECT_THAT(error_of([&] { write_result_report(doc, "x.json", {.html = dir_ / "r.html"}); }), HasSubstr("version 2"));
  doc = small_configuration();
  doc.erase("arrangements");
  EXPECT_THAT(error_of([&] { write_result_report(doc, "x.json", {.html = dir_ / "r.html"}); }), HasSubstr("x.json"));
  EXPECT_FALSE(std::filesystem::exists(dir_ / "r.html"));
}

}  // namespace
}  // namespace vicinal::report
