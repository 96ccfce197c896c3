#include "structure/atom_labels.h"

#include <gtest/gtest.h>

#include <openbabel/generic.h>

#include "core/error_testing.h"
#include "structure/molecule_io.h"
#include "structure/test_files.h"

namespace vicinal::structure {
namespace {

using vicinal::testing::error_of;

TEST(AtomLabels, ResolvesLabelsIndicesAndElementIndices) {
  OpenBabel::OBMol mol = molecule_from_smiles("CCO", false);  // C1 C2 O3, then H
  AtomLabels labels(static_cast<int>(mol.NumAtoms()), "ethanol");
  labels.add("C-1", 1);
  labels.add("H-1a", 4);
  EXPECT_EQ(labels.resolve("C-1"), 1);
  EXPECT_EQ(labels.resolve(" H-1a "), 4);
  EXPECT_EQ(labels.resolve("3"), 3);
  EXPECT_EQ(labels.resolve("O3", &mol), 3);
  EXPECT_EQ(labels.describe(4, mol), "H-1a");
  EXPECT_EQ(labels.describe(5, mol), "H5");
  EXPECT_NE(error_of([&] { labels.resolve("C3", &mol); }).find("atom 3 is O, not C"), std::string::npos);
  EXPECT_NE(error_of([&] { labels.resolve("99"); }).find("atoms 1 to 9"), std::string::npos);
  const std::string unknown = error_of([&] { labels.resolve("H-7"); });
  EXPECT_NE(unknown.find("unknown atom label 'H-7'"), std::string::npos) << unknown;
  EXPECT_NE(unknown.find("C-1, H-1a"), std::string::npos) << unknown;
  EXPECT_NE(error_of([&] { labels.add("C-1", 2); }).find("names atom 2 here but atom 1"), std::string::npos);
}

TEST(AtomLabels, ReadsCsvWithLineNumbersInErrors) {
  const auto good = testing::write_scratch("labels.csv", "label,atom\nH-2,5\nC-2,2\n");
  const auto labels = AtomLabels::from_csv(good, 9);
  EXPECT_EQ(labels.resolve("H-2"), 5);
  const auto bad = testing::write_scratch("bad-labels.csv", "label,atom\nH-2,5\nH-3,five\n");
  EXPECT_NE(error_of([&] { AtomLabels::from_csv(bad, 9); }).find("bad-labels.csv:3"), std::string::npos);
  const auto range = testing::write_scratch("range-labels.csv", "label,atom\nH-2,50\n");
  EXPECT_NE(error_of([&] { AtomLabels::from_csv(range, 9); }).find("atoms 1 to 9"), std::string::npos);
}

TEST(AtomLabels, PdbNamesAsChainResidueAtom) {
  // Glycine fragment written by hand in PDB columns.
  const std::string pdb =
      "ATOM      1  N   GLY A   7       0.000   1.450   0.000  1.00  0.00           N\n"
      "ATOM      2  CA  GLY A   7       0.000   0.000   0.000  1.00  0.00           C\n"
      "ATOM      3  C   GLY A   7       1.430  -0.500   0.000  1.00  0.00           C\n"
      "ATOM      4  O   GLY A   7       2.350   0.300   0.000  1.00  0.00           O\n"
      "ATOM      5  HA2 GLY A   7      -0.520  -0.360   0.890  1.00  0.00           H\n"
      "END\n";
  const auto path = testing::write_scratch("gly.pdb", pdb);
  ReadNotes notes;
  OpenBabel::OBMol mol = read_molecule(path, &notes);
  const auto labels = AtomLabels::for_molecule(mol, path);
  EXPECT_EQ(labels.resolve("A:7:CA"), 2);
  EXPECT_EQ(labels.resolve("7:HA2"), 5);
  EXPECT_NE(error_of([&] { labels.resolve("A:7:HB"); }).find("A:7:C"), std::string::npos);
}

TEST(AtomLabels, SdfDataField) {
  OpenBabel::OBMol mol = molecule_from_smiles("CC", false);
  auto* data = new OpenBabel::OBPairData;
  data->SetAttribute(kSdfLabelField);
  data->SetValue("C-1 1\nC-2 2\nH-1a 3\n");
  mol.SetData(data);
  const auto labels = AtomLabels::from_sdf_field(mol, "x.sdf");
  EXPECT_EQ(labels.resolve("H-1a"), 3);
  EXPECT_EQ(labels.size(), 3u);
}

}  // namespace
}  // namespace vicinal::structure
