#include "structure/molecule_io.h"

#include <gtest/gtest.h>
#include <openbabel/atom.h>

#include "core/error.h"
#include "structure/test_files.h"

namespace vicinal::structure {
namespace {

std::string error_of(const std::function<void()>& f) {
  try {
    f();
  } catch (const Error& e) {
    return e.one_line();
  }
  return "no error";
}

TEST(MoleculeIo, SmilesGetsHydrogensAndCheckedStereo) {
  ReadNotes notes;
  // (2R,3S)-butane-2,3-diol-like chain with two stereocentres.
  OpenBabel::OBMol mol = molecule_from_smiles("C[C@@H](O)[C@H](O)CO", true, &notes);
  EXPECT_TRUE(notes.built_3d);
  EXPECT_TRUE(notes.added_hydrogens);
  EXPECT_EQ(mol.NumAtoms(), 7u + 10u);
  EXPECT_TRUE(mol.Has3D());
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
