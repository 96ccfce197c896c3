#include "structure/openbabel_read.h"

#include <gtest/gtest.h>

#include <stdexcept>

#include "core/error_testing.h"
#include "structure/ensemble.h"
#include "structure/molecule_io.h"
#include "structure/test_files.h"

namespace vicinal::structure {
namespace {

using vicinal::testing::error_of;

// A HETATM record whose name and residue columns are missing: Open Babel 3.1's
// PDB reader throws std::out_of_range on it (found by the frame_reader fuzz
// target; tests/fuzz/regressions/frame_reader/ keeps the input).
constexpr const char* kShiftedRecord = "HETATM  1       0.000   0.000   0.120  1.00  0.00           N\n";

TEST(GuardedRead, OpenBabelExceptionBecomesInputError) {
  const std::string path = testing::write_scratch("shifted.pdb", kShiftedRecord);
  EXPECT_NE(error_of([&] { read_molecule(path); }).find("shifted.pdb"), std::string::npos);
  EXPECT_NE(error_of([&] { read_ensemble(path); }).find("Open Babel could not read the PDB input"), std::string::npos);
}

TEST(GuardedRead, PassesResultsAndOurErrorsThrough) {
  EXPECT_TRUE(guarded_read([] { return true; }, "x.pdb", "PDB"));
  EXPECT_FALSE(guarded_read([] { return false; }, "x.pdb", "PDB"));
  EXPECT_EQ(error_of([] { guarded_read([]() -> bool { throw Error("ours"); }, "x.pdb", "PDB"); }), "ours");
  EXPECT_NE(error_of([] { guarded_read([]() -> bool { throw std::out_of_range("substr"); }, "x.pdb", "PDB"); })
                .find("x.pdb"),
            std::string::npos);
}

}  // namespace
}  // namespace vicinal::structure
