// Loading parameter-set files: every shipped set, and malformed files that
// must fail with the file and the key named.
#include <gtest/gtest.h>

#include <filesystem>
#include <fstream>
#include <map>
#include <unistd.h>

#include "core/error.h"
#include "karplus/karplus.h"

namespace vicinal::karplus {
namespace {

namespace fs = std::filesystem;

TEST(SetCatalog, EveryShippedSetLoadsWithCitation) {
  const auto& all = SetCatalog::shipped().all();
  EXPECT_GE(all.size(), 30u);
  for (const auto& s : all) {
    EXPECT_FALSE(s.citation.empty()) << s.id;
    EXPECT_FALSE(s.short_citation.empty()) << s.id;
    EXPECT_EQ(s.coefficients.size(), s.coefficient_names.size()) << s.id;
    const auto r = j_range(s);
    EXPECT_LT(r.min_hz, r.max_hz) << s.id;
    EXPECT_EQ(fs::path(s.file).stem().string(), s.id) << "file name should be the id";
  }
}

TEST(SetCatalog, ShippedCoverage) {
  const auto& c = SetCatalog::shipped();
  for (const char* id : {"hh-karplus-1959", "hh-karplus-1963", "hh-haasnoot-1980-general", "hn-ha-pardi-1984",
                         "hn-ha-vuister-bax-1993", "hn-ha-wang-bax-1996", "hn-ha-hu-bax-1997", "hn-ha-schmidt-1999",
                         "hn-ha-vogeli-2007", "ch-wasylishen-schaefer-1972", "ch-coch-tvaroska-1989",
                         "hp-lankhorst-1984", "cp-lankhorst-1984", "ha-hb-perez-2001-ch2"})
    EXPECT_NO_THROW(c.find(id)) << id;
  const auto& hb = c.find("hn-ha-hu-bax-1997");
  EXPECT_EQ(hb.form, Form::ThreeTerm);
  EXPECT_DOUBLE_EQ(hb.offset_deg, -60);
  EXPECT_EQ(hb.short_citation, "Hu & Bax 1997");
  EXPECT_EQ(hb.nuclei[0], "1H");
  EXPECT_EQ(c.find("hh-haasnoot-1980-three-substituents").substituent_count, 3);
}

TEST(SetCatalog, UnknownIdSuggestsCloseOnes) {
  try {
    SetCatalog::shipped().find("hn-ha-hu-bax-1998");
    FAIL() << "no error";
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("unknown Karplus set 'hn-ha-hu-bax-1998'"), std::string::npos);
    EXPECT_NE(e.hint().find("hn-ha-hu-bax-1997"), std::string::npos) << e.hint();
  }
  try {
    SetCatalog::shipped().find("haasnoot");
    FAIL() << "no error";
  } catch (const Error& e) {
    EXPECT_NE(e.hint().find("hh-haasnoot-1980-general"), std::string::npos) << e.hint();
  }
}

class BadFiles : public ::testing::Test {
 protected:
  void SetUp() override {
    dir_ = fs::temp_directory_path() / ("karplus_sets_" + std::to_string(::getpid()));
    fs::create_directories(dir_);
  }
  void TearDown() override { fs::remove_all(dir_); }

  // A valid three-term set with one key replaced (or removed when value is empty).
  std::string write(const std::string& name, const std::string& key, const std::string& value) {
    std::map<std::string, std::string> fields = {
        {"id", R"("test-set")"},
        {"title", R"("a test")"},
        {"nuclei", R"(["1H", "1H"])"},
        {"coupling", R"x("3J(H,H)")x"},
        {"pattern_smarts", R"("[#1:1][#6:2][#6:3][#1:4]")"},
        {"angle_name", R"("H-C-C-H")"},
        {"offset_deg", "0"},
        {"form", R"("three-term")"},
        {"coefficients", R"({"A": 10, "B": -1, "C": 2})"},
        {"rms_hz", "0.5"},
        {"citation", R"({"authors": "A. Author, B. Author", "year": 2001, "journal": "J. Test", "volume": "1", "first_page": "1"})"}};
    if (value.empty())
      fields.erase(key);
    else
      fields[key] = value;
    std::string text = "{";
    for (const auto& [k, v] : fields) text += (text.size() > 1 ? ",\n\"" : "\n\"") + k + "\": " + v;
    text += "\n}\n";
    const fs::path path = dir_ / name;
    std::ofstream(path) << text;
    return path.string();
  }

  void expect_error(const std::string& path, const std::string& key) {
    try {
      SetCatalog::load_file(path);
      FAIL() << "no error for " << path;
    } catch (const Error& e) {
      const std::string text = e.what();
      EXPECT_NE(text.find(path), std::string::npos) << text;
      EXPECT_NE(text.find(key), std::string::npos) << text;
    }
  }

  fs::path dir_;
};

TEST_F(BadFiles, ValidFileLoads) {
  const auto s = SetCatalog::load_file(write("ok.json", "id", R"("test-set")"));
  EXPECT_EQ(s.short_citation, "Author & Author 2001");
  EXPECT_DOUBLE_EQ(j_hz(s, 0), 11.0);
}

TEST_F(BadFiles, EachMistakeNamesFileAndKey) {
  expect_error(write("a.json", "coefficients", R"({"A": 10, "B": -1})"), "C");
  expect_error(write("b.json", "coefficients", R"({"A": 10, "B": -1, "C": 2, "D": 1})"), "coefficients.D");
  expect_error(write("c.json", "form", R"("cubic")"), "form");
  expect_error(write("d.json", "rms_hz", R"("0.5")"), "rms_hz");
  expect_error(write("e.json", "rms_hz", "-1"), "rms_hz");
  expect_error(write("f.json", "pattern_smarts", R"("[#1][#6][#6][#1]")"), "pattern_smarts");
  expect_error(write("g.json", "citation", R"({"authors": "X", "journal": "J", "volume": "1", "first_page": "1"})"),
               "year");
  expect_error(write("h.json", "nuclei", R"(["1H"])"), "nuclei");
  expect_error(write("i.json", "offset_deg", ""), "offset_deg");
  expect_error(write("j.json", "id", R"("Has Spaces")"), "id");
  expect_error(write("k.json", "substituent_count", "2"), "substituent_count");
  // An unknown top-level key (a typo) is an error, not ignored.
  expect_error(write("l.json", "rms_Hz", "0.5"), "rms_Hz");
  const fs::path broken = dir_ / "m.json";
  std::ofstream(broken) << "{\"id\": \"x\",";
  expect_error(broken.string(), "malformed JSON");
}

TEST_F(BadFiles, DuplicateIdsInOneFolder) {
  write("one.json", "id", R"("same-id")");
  write("two.json", "id", R"("same-id")");
  try {
    SetCatalog::load_directory(dir_.string());
    FAIL() << "no error";
  } catch (const Error& e) {
    EXPECT_NE(std::string(e.what()).find("defined twice"), std::string::npos) << e.what();
  }
}

}  // namespace
}  // namespace vicinal::karplus
