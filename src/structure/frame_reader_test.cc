#include "structure/frame_reader.h"

#include <gtest/gtest.h>

#include "core/error_testing.h"
#include "core/error.h"
#include "structure/test_files.h"

namespace vicinal::structure {
namespace {

using vicinal::testing::error_of;

const std::vector<int> kWater{8, 1, 1};

std::string xyz_frame(double shift, int atoms = 3) {
  std::string s = std::to_string(atoms) + "\nframe\n";
  const char* el[] = {"O", "H", "H", "H"};
  for (int i = 0; i < atoms; ++i) s += std::string(el[i]) + " " + std::to_string(i + shift) + " 0.5 -1.25e0\n";
  return s;
}

TEST(FrameReader, StreamsXyzFramesInOrder) {
  const auto path = testing::write_scratch("three.xyz", xyz_frame(0) + xyz_frame(10) + "\n" + xyz_frame(20));
  std::vector<double> first_x;
  const std::size_t n = stream_frames(path, kWater, [&](std::size_t f, std::span<const double> xyz) {
    ASSERT_EQ(xyz.size(), 9u);
    EXPECT_EQ(first_x.size(), f);
    first_x.push_back(xyz[0]);
    EXPECT_DOUBLE_EQ(xyz[8], -1.25);
  });
  EXPECT_EQ(n, 3u);
  EXPECT_EQ(first_x, (std::vector<double>{0, 10, 20}));
}

TEST(FrameReader, NamesTheFrameWithTheWrongAtomCount) {
  const auto path = testing::write_scratch("count.xyz", xyz_frame(0) + xyz_frame(1) + xyz_frame(2, 4));
  const auto e = error_of([&] { stream_frames(path, kWater, [](std::size_t, std::span<const double>) {}); });
  EXPECT_NE(e.find("frame 3 has 4 atoms, but the first frame has 3"), std::string::npos) << e;
  EXPECT_NE(e.find("count.xyz:11"), std::string::npos) << e;
}

TEST(FrameReader, TruncatedAndMalformedXyz) {
  std::string text = xyz_frame(0) + xyz_frame(1);
  text.resize(text.size() - 20);  // cut into the last atom line
  const auto cut = testing::write_scratch("cut.xyz", text);
  const auto e = error_of([&] { stream_frames(cut, kWater, [](std::size_t, std::span<const double>) {}); });
  EXPECT_NE(e.find("frame 2"), std::string::npos) << e;
  const auto element = testing::write_scratch("element.xyz", xyz_frame(0) + "3\nx\nO 0 0 0\nC 1 0 0\nH 2 0 0\n");
  EXPECT_NE(error_of([&] { stream_frames(element, kWater, [](std::size_t, std::span<const double>) {}); })
                .find("frame 2: atom 2 is C, but H in the first frame"),
            std::string::npos);
  const auto number = testing::write_scratch("number.xyz", "3\nx\nO 0 0 0\nH 1 zero 0\nH 2 0 0\n");
  EXPECT_NE(error_of([&] { stream_frames(number, kWater, [](std::size_t, std::span<const double>) {}); })
                .find("'zero' is not a coordinate"),
            std::string::npos);
}

std::string pdb_atom(int serial, const char* name, const char* element, double x) {
  char line[82];
  std::snprintf(line, sizeof line, "ATOM  %5d %-4s HOH A   1    %8.3f%8.3f%8.3f  1.00  0.00          %2s\n", serial, name,
                x, 1.0, 2.0, element);
  return line;
}

std::string pdb_model(int model, double x, int atoms = 3) {
  std::string s = "MODEL     " + std::to_string(model) + "\n";
  const char* names[] = {"O", "H1", "H2", "H3"};
  const char* el[] = {"O", "H", "H", "H"};
  for (int i = 0; i < atoms; ++i) s += pdb_atom(i + 1, names[i], el[i], x + i);
  return s + "ENDMDL\n";
}

TEST(FrameReader, StreamsPdbModels) {
  const auto path = testing::write_scratch("models.pdb", pdb_model(1, 0) + pdb_model(2, 5) + "END\n");
  std::vector<double> x;
  EXPECT_EQ(stream_frames(path, kWater, [&](std::size_t, std::span<const double> xyz) { x.push_back(xyz[3]); }), 2u);
  EXPECT_EQ(x, (std::vector<double>{1, 6}));
}

TEST(FrameReader, PdbErrorsNameTheFrame) {
  const auto count = testing::write_scratch("count.pdb", pdb_model(1, 0) + pdb_model(2, 5, 2));
  const auto e = error_of([&] { stream_frames(count, kWater, [](std::size_t, std::span<const double>) {}); });
  EXPECT_NE(e.find("frame 2 has 2 atoms, but the first frame has 3"), std::string::npos) << e;
  std::string text = pdb_model(1, 0) + pdb_model(2, 5);
  text.resize(text.find("ENDMDL", text.find("MODEL     2")));  // model 2 never ends
  const auto cut = testing::write_scratch("cut.pdb", text);
  EXPECT_NE(error_of([&] { stream_frames(cut, kWater, [](std::size_t, std::span<const double>) {}); })
                .find("frame 2 ends without ENDMDL"),
            std::string::npos);
  EXPECT_NE(error_of([&] { stream_frames("nope.mol2", kWater, [](std::size_t, std::span<const double>) {}); })
                .find("multi-model PDB"),
            std::string::npos);
}

}  // namespace
}  // namespace vicinal::structure
