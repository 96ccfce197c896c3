#include "structure/ensemble.h"

#include <gtest/gtest.h>

#include "core/error_testing.h"
#include "core/error.h"
#include "structure/test_files.h"

namespace vicinal::structure {
namespace {

using vicinal::testing::error_of;

// Boltzmann weights against a hand calculation: RT = 8.314462618 J/(mol K) x
// 298.15 K / 4184 J/kcal = 0.592485 kcal/mol; w_i = exp(-E_i/RT) / sum, for
// E = 0, 0.5, 1.0 kcal/mol: 1, 0.430026, 0.184927 -> 0.619213, 0.266279, 0.114508.
// Source: Boltzmann distribution (common practice, no source), computed by hand.
TEST(Ensemble, BoltzmannWeightsMatchAHandCalculation) {
  const std::vector<double> e{10.0, 10.5, 11.0};  // only differences matter
  const auto w = boltzmann_weights(e, 298.15);
  ASSERT_EQ(w.size(), 3u);
  EXPECT_NEAR(w[0], 0.619213, 2e-6);
  EXPECT_NEAR(w[1], 0.266279, 2e-6);
  EXPECT_NEAR(w[2], 0.114508, 2e-6);
  EXPECT_THROW(boltzmann_weights(e, 0), Error);
}

std::string sdf_record(const std::string& title, const std::string& energy, bool with_h = true) {
  std::string s = title + "\n  vicinal 01012600003D\n\n";
  s += with_h ? "  3  2  0  0  0  0  0  0  0  0999 V2000\n" : "  2  1  0  0  0  0  0  0  0  0999 V2000\n";
  s += "    0.0000    0.0000    0.0000 O   0  0  0  0  0  0  0  0  0  0  0  0\n";
  s += "    0.9572    0.0000    0.0000 H   0  0  0  0  0  0  0  0  0  0  0  0\n";
  if (with_h) s += "   -0.2400    0.9266    0.1000 H   0  0  0  0  0  0  0  0  0  0  0  0\n";
  s += "  1  2  1  0\n";
  if (with_h) s += "  1  3  1  0\n";
  s += "M  END\n";
  if (!energy.empty()) s += "> <vicinal_energy_kcal_mol>\n" + energy + "\n\n";
  return s + "$$$$\n";
}

TEST(Ensemble, ReadsSdfConformersWithEnergies) {
  const auto path = testing::write_scratch("water.sdf", sdf_record("a", "0.0") + sdf_record("b", "0.5"));
  const Ensemble e = read_ensemble(path);
  EXPECT_EQ(e.frame_count(), 2u);
  EXPECT_EQ(e.atom_count(), 3);
  EXPECT_EQ(e.titles[1], "b");
  std::string basis;
  const auto w = frame_weights(e, 298.15, &basis);
  EXPECT_EQ(basis, "energies");
  EXPECT_NEAR(w[0] / w[1], 1.0 / 0.430026, 1e-4);  // exp(0.5/RT), as above
}

TEST(Ensemble, FramesThatDifferAreNamed) {
  const auto path = testing::write_scratch("mixed.sdf", sdf_record("a", "") + sdf_record("b", "") +
                                                            sdf_record("c", "", false));
  EXPECT_NE(error_of([&] { read_ensemble(path); }).find("frame 3 has 2 atoms, but the first frame has 3"),
            std::string::npos);
  const auto partial = testing::write_scratch("partial.sdf", sdf_record("a", "1.0") + sdf_record("b", ""));
  EXPECT_NE(error_of([&] { read_ensemble(partial); }).find("frame 2 has no vicinal_energy_kcal_mol"),
            std::string::npos);
}

TEST(Ensemble, WritesAndReadsBack) {
  const auto path = testing::write_scratch("w.sdf", sdf_record("a", "0.0") + sdf_record("b", "0.5"));
  Ensemble e = read_ensemble(path);
  e.weight = {0.25, 0.75};
  const auto out = (testing::scratch_dir() / "out.sdf").string();
  write_ensemble_sdf(e, out);
  const Ensemble back = read_ensemble(out);
  ASSERT_EQ(back.frame_count(), 2u);
  EXPECT_NEAR(back.weight[1], 0.75, 1e-9);
  EXPECT_NEAR(back.energy_kcal_mol[1], 0.5, 1e-9);
  EXPECT_NEAR(back.frame(1)[3], 0.9572, 1e-4);
}

TEST(Ensemble, UnreadableFilesAreNamed) {
  EXPECT_NE(error_of([&] { read_ensemble("/nonexistent/x.sdf"); }).find("/nonexistent/x.sdf"), std::string::npos);
  std::string text = sdf_record("a", "");
  const auto cut = testing::write_scratch("cut.sdf", text.substr(0, 60));
  EXPECT_NE(error_of([&] { read_ensemble(cut); }).find("cut.sdf"), std::string::npos);
}

}  // namespace
}  // namespace vicinal::structure
