#include "structure/molecule_io.h"

#include <gtest/gtest.h>

#include <openbabel/atom.h>

#include "core/error_testing.h"
#include "core/error.h"
#include "structure/test_files.h"

namespace vicinal::structure {
namespace {

using vicinal::testing::error_of;

TEST(MoleculeIo, SmilesGetsHydrogensAndCheckedStereo) {
  ReadNotes notes;
  // (2R,3S)-butane-2,3-diol-like chain with two stereocentres.
  OpenBabel::OBMol mol = molecule_from_smiles("C[C@@H](O)[C@H](O)CO", true, &notes);
  EXPECT_TRUE(notes.built_3d);
  EXPECT_TRUE(notes.added_hydrogens);
  EXPECT_EQ(mol.NumAtoms(), 7u + 10u);
  EXPECT_TRUE(mol.Has3D());
}

TEST(MoleculeIo, UnspecifiedStereocentresTakeAnyConfigurationWithANote) {
  // Lactic acid and oxolan-3-ol written without stereo: each has one
  // stereocentre (atom 2 and atom 2), which any 3D structure must fix one way.
  for (const std::string smiles : {"CC(O)C(=O)O", "OC1CCOC1"}) {
    ReadNotes notes;
    OpenBabel::OBMol mol = molecule_from_smiles(smiles, true, &notes);
    EXPECT_TRUE(mol.Has3D()) << smiles;
    std::string all;
    for (const auto& m : notes.messages) all += m + "\n";
    EXPECT_NE(all.find("stereocentre at atom 2 not specified"), std::string::npos) << smiles << ": " << all;
    EXPECT_NE(all.find("arbitrary configuration"), std::string::npos) << all;
  }
  // A specified centre beside an unspecified one: only the open one is named.
  ReadNotes notes;
  molecule_from_smiles("C[C@@H](O)C(O)CC", true, &notes);
  std::string all;
  for (const auto& m : notes.messages) all += m + "\n";
  EXPECT_NE(all.find("stereocentre at atom 4 not specified"), std::string::npos) << all;
}

TEST(MoleculeIo, SpecifiedStereoIsStillCompared) {
  // The 3D structure of (S)-butan-2-ol checked against the SMILES of the (R)
  // form (same atom order): a mismatch.
  const OpenBabel::OBMol built = molecule_from_smiles("C[C@H](O)CC", true);
  const OpenBabel::OBMol r_form = molecule_from_smiles("C[C@@H](O)CC", false);
  const StereoCheck mismatch = compare_specified_stereo(r_form, built);
  EXPECT_FALSE(mismatch.same);
  EXPECT_TRUE(mismatch.unspecified_centres.empty());
  EXPECT_NE(mismatch.wanted, mismatch.got);
  const OpenBabel::OBMol s_form = molecule_from_smiles("C[C@H](O)CC", false);
  EXPECT_TRUE(compare_specified_stereo(s_form, built).same);
  // Without stereo in the wanted SMILES, any configuration passes and the centre is listed.
  const StereoCheck open = compare_specified_stereo(molecule_from_smiles("CC(O)CC", false), built);
  EXPECT_TRUE(open.same) << open.wanted << " vs " << open.got;
  EXPECT_EQ(open.unspecified_centres, std::vector<int>{2});
  // A double bond: E wanted, Z built.
  const OpenBabel::OBMol z_built = molecule_from_smiles("C/C=C\\CO", true);
  EXPECT_FALSE(compare_specified_stereo(molecule_from_smiles("C/C=C/CO", false), z_built).same);
  const StereoCheck open_bond = compare_specified_stereo(molecule_from_smiles("CC=CCO", false), z_built);
  EXPECT_TRUE(open_bond.same);
  EXPECT_EQ(open_bond.unspecified_double_bonds, (std::vector<std::pair<int, int>>{{2, 3}}));
}

TEST(MoleculeIo, BadSmilesAndFilesAreNamed) {
  EXPECT_NE(error_of([] { molecule_from_smiles("C1CC(", false); }).find("SMILES 'C1CC('"), std::string::npos);
  EXPECT_NE(error_of([] { read_molecule("/nonexistent/a.sdf"); }).find("/nonexistent/a.sdf"), std::string::npos);
  EXPECT_NE(error_of([] { read_molecule("a.cif"); }).find("unknown structure file extension"), std::string::npos);
  const auto empty = testing::write_scratch("empty.sdf", "");
  EXPECT_NE(error_of([&] { read_molecule(empty); }).find("empty"), std::string::npos);
}

TEST(MoleculeIo, KeepsFileNumberingAndAddsMissingHydrogensAfterIt) {
  // Heavy atoms only: ethanol as XYZ (C, C, O).
  const auto path = testing::write_scratch("ethanol.xyz", "3\nno H\nC 0 0 0\nC 1.52 0 0\nO 2.0 1.35 0\n");
  ReadNotes notes;
  OpenBabel::OBMol mol = read_molecule(path, &notes);
  EXPECT_TRUE(notes.added_hydrogens);
  EXPECT_EQ(mol.NumAtoms(), 9u);
  EXPECT_EQ(mol.GetAtom(3)->GetAtomicNum(), 8u);
  EXPECT_EQ(mol.GetAtom(4)->GetAtomicNum(), 1u);
}

}  // namespace
}  // namespace vicinal::structure
