#include "report/analysis_report.h"

#include <gmock/gmock.h>
#include <gtest/gtest.h>
#include <openbabel/mol.h>
#include <openbabel/obconversion.h>

#include <filesystem>
#include <fstream>
#include <sstream>

#include "core/error.h"

namespace vicinal::report {
namespace {

using ::testing::HasSubstr;
using ::testing::Not;

std::string molfile_of(const std::string& smiles) {
  OpenBabel::OBConversion conv;
  conv.SetInAndOutFormats("smi", "mol");
  OpenBabel::OBMol mol;
  conv.ReadString(&mol, smiles);
  mol.AddHydrogens();
  return conv.WriteString(&mol);
}

// A small but complete analysis: ethane-1,2-diol-like, one coupling, two candidates.
Json small_analysis() {
  Json candidate = {{"name", "anti"},
                    {"origin", "2 conformers"},
                    {"assignment", "as written"},
                    {"couplings", {{{"name", "H-1/H-2"}, {"predicted_hz", 9.0}, {"contribution", 0.1}}}},
                    {"conformers",
                     {{{"name", "c1"}, {"boltzmann", 0.7}, {"population", 0.8}, {"free_population", 0.9},
                       {"ci95", {0.7, 1.0}}, {"range", {0.6, 1.0}}, {"dihedral_deg", {178.0}}, {"j_hz", {9.8}}},
                      {{"name", "c2"}, {"boltzmann", 0.3}, {"population", 0.2}, {"free_population", 0.1},
                       {"ci95", {0.0, 0.3}}, {"range", {0.0, 0.4}}, {"dihedral_deg", {60.0}}, {"j_hz", {2.5}}}}},
                    {"side_chain", Json::array()},
                    {"chi2_free", 0.1},
                    {"score", 0.3},
                    {"probability", 0.9}};
  Json other = candidate;
  other["name"] = "syn";
  other["couplings"][0]["predicted_hz"] = 3.0;
  other["couplings"][0]["contribution"] = 40.0;
  other["probability"] = 0.1;
  return {{"format", kAnalysisFormat},
          {"version", kAnalysisVersion},
          {"title", "Test analysis"},
          {"program", "vicinal test"},
          {"command_line", "vicinal demo --out x"},
          {"compound", {{"name", "diol"}, {"molfile", molfile_of("OCCO")}, {"depict_labels", {{"C-1", 2}, {"H-1", 5}}}}},
          {"conditions", {{"solvent", "D2O"}, {"temperature_k", 298}, {"field_mhz", 400}}},
          {"couplings",
           {{{"nuclei", "H-1,H-2"}, {"j_hz", 9.1}, {"sigma_hz", 0.2}, {"set", "hh-test"}, {"tolerance_hz", 1.0},
             {"allowed_deg", {{{"from", 150.0}, {"to", 180.0}, {"best", 170.0}}}},
             {"curve", {{"of", "anti"}, {"atoms", "H-1-C-1-C-2-H-2"}, {"dihedral_deg", {-180, 0, 180}}, {"j_hz", {10, 9, 10}}}}}}},
          {"sets", {{{"id", "hh-test"}, {"form", "three-term"}, {"coefficients", {{"A", 7.8}}}, {"citation", "A. Author 1999"}}}},
          {"candidates", {candidate, other}},
          {"ranking", {{"verdict", "anti fits better."}, {"favoured", "anti"}, {"confidence", "strong"}}},
          {"multiplet",
           {{"proton", "H-1"}, {"field_mhz", 400}, {"notation", "d, J = 9.1 Hz"},
            {"peaks", {{{"hz", 1000.0}, {"ppm", 2.5}, {"intensity", 1.0}}, {{"hz", 1009.1}, {"ppm", 2.52275}, {"intensity", 1.0}}}},
            {"tree_lines", {{{"hz", 1000.0}, {"intensity", 0.5}}, {{"hz", 1009.1}, {"intensity", 0.5}}}}}}};
}

TEST(AnalysisReport, AcceptsACompleteDocument) { EXPECT_NO_THROW(check_analysis(small_analysis(), "a.json")); }

TEST(AnalysisReport, NamesTheFirstMissingMember) {
  Json doc = small_analysis();
  doc.erase("compound");
  try {
    check_analysis(doc, "a.json");
    FAIL() << "a document without a compound was accepted";
  } catch (const Error& e) {
    EXPECT_THAT(e.one_line(), HasSubstr("compound"));
    EXPECT_THAT(e.one_line(), HasSubstr("a.json"));
  }
  doc = small_analysis();
  doc["couplings"][0]["j_hz"] = "9.1";
  EXPECT_THROW(check_analysis(doc, "a.json"), Error);
  doc = small_analysis();
  doc["format"] = "something else";
  EXPECT_THROW(check_analysis(doc, "a.json"), Error);
  doc = small_analysis();
  doc["version"] = 99;
  EXPECT_THROW(check_analysis(doc, "a.json"), Error);
  doc = small_analysis();
  doc["candidates"][1]["couplings"] = Json::array();  // must match the measured couplings
  EXPECT_THROW(check_analysis(doc, "a.json"), Error);
}

TEST(AnalysisReport, MakesOneFigurePerCouplingAndOneForEachOtherPart) {
  const auto figures = analysis_figures(small_analysis());
  std::vector<std::string> names;
  for (const auto& f : figures) names.push_back(f.name);
  EXPECT_THAT(names, ::testing::ElementsAre("karplus-1-H-1-H-2", "couplings", "contributions", "populations-anti",
                                            "populations-syn", "multiplet"));
  // The Karplus figure carries the measured band and the allowed interval.
  const Figure& k = figures[0].figure;
  ASSERT_EQ(k.bands.size(), 2u);
  EXPECT_FALSE(k.bands[0].vertical);
  EXPECT_DOUBLE_EQ(k.bands[0].from, 9.1 - 1.0);
  EXPECT_TRUE(k.bands[1].vertical);
  EXPECT_DOUBLE_EQ(k.bands[1].from, 150.0);
  // The fitted multiplet is drawn on the ppm axis, right to left.
  EXPECT_TRUE(figures.back().figure.reverse_x);
}

TEST(AnalysisReport, PageHasEverySectionAndNoScript) {
  const Json doc = small_analysis();
  const std::string html = analysis_html(doc, analysis_figures(doc));
  for (const char* heading : {"Summary", "Compound", "Measured couplings", "Allowed dihedral angles",
                              "Candidate configurations", "Conformer populations", "Multiplet of H-1",
                              "Karplus parameter sets", "How this report was made", "Confirm independently"})
    EXPECT_THAT(html, HasSubstr(heading));
  EXPECT_THAT(html, HasSubstr("vicinal demo --out x"));
  EXPECT_THAT(html, HasSubstr("A. Author 1999"));
  EXPECT_THAT(html, HasSubstr("150 to 180"));
  EXPECT_THAT(html, HasSubstr("<svg"));
  EXPECT_THAT(html, Not(HasSubstr("<script")));
}

TEST(AnalysisReport, TablesAreCsvOfTheNumbersShown) {
  const auto tables = analysis_tables(small_analysis());
  std::map<std::string, std::string> by_name(tables.begin(), tables.end());
  ASSERT_TRUE(by_name.count("ranking.csv"));
  EXPECT_THAT(by_name["ranking.csv"], HasSubstr("candidate,conformers,chi2 free"));
  EXPECT_THAT(by_name["ranking.csv"], HasSubstr("anti,2,0.10,-,-,0.30,0.900"));
  EXPECT_THAT(by_name["couplings-observed-calculated.csv"], HasSubstr("H-1,H-2"));
  EXPECT_THAT(by_name["populations-anti.csv"], HasSubstr("c1,-,70%,80%,90%,70-100%,60-100%"));
}

TEST(AnalysisReport, WritesEverythingOrNothing) {
  const auto dir = std::filesystem::temp_directory_path() / "vicinal_analysis_report_test";
  std::filesystem::remove_all(dir);
  const auto written = write_analysis_report(small_analysis(), "a.json",
                                             {.html = dir / "r.html", .figures_dir = dir / "fig", .tables_dir = dir / "tab"});
  EXPECT_TRUE(std::filesystem::exists(dir / "r.html"));
  for (const char* ext : {".svg", ".pdf", ".png"}) EXPECT_TRUE(std::filesystem::exists(dir / "fig" / (std::string("multiplet") + ext)));
  EXPECT_TRUE(std::filesystem::exists(dir / "tab" / "analysis.json"));
  EXPECT_EQ(written.size(), 6u * 3 + analysis_tables(small_analysis()).size() + 2);

  Json bad = small_analysis();
  bad["candidates"][0]["conformers"][0]["dihedral_deg"] = "x";  // passes the check, fails in rendering
  EXPECT_THROW(write_analysis_report(bad, "bad.json", {.html = dir / "bad.html"}), Error);
  EXPECT_FALSE(std::filesystem::exists(dir / "bad.html"));
  std::filesystem::remove_all(dir);
}

}  // namespace
}  // namespace vicinal::report
