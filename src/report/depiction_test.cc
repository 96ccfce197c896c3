#include "report/depiction.h"

#include <gtest/gtest.h>
#include <openbabel/atom.h>
#include <openbabel/bond.h>
#include <openbabel/builder.h>
#include <openbabel/mol.h>
#include <openbabel/obconversion.h>

#include <regex>

#include "core/error.h"
#include "report/markup_nesting.h"

namespace vicinal::report {
namespace {

OpenBabel::OBMol from_smiles(const std::string& smiles) {
  OpenBabel::OBConversion conversion;
  conversion.SetInFormat("smi");
  OpenBabel::OBMol mol;
  EXPECT_TRUE(conversion.ReadString(&mol, smiles));
  mol.AddHydrogens();
  return mol;
}

int count(const std::string& text, const std::string& what) {
  int n = 0;
  for (auto at = text.find(what); at != std::string::npos; at = text.find(what, at + 1)) ++n;
  return n;
}

// Glyceraldehyde, OCC(O)C=O: atoms O1 C2 C3 O4 C5 O6, then the hydrogens Open
// Babel adds in atom order: H7 on O1, H8 and H9 on C2, H10 on C3, H11 on O4,
// H12 on C5 (the order of added hydrogens is common practice, no source; the
// test below checks it through the element of each labelled atom).
const std::map<int, std::string> kLabels = {{2, "C-3"}, {3, "C-2"}, {5, "C-1"},
                                            {8, "H-3a"}, {9, "H-3b"}, {10, "H-2"}};

TEST(Depiction, CarriesTheChemistsLabelsAndNoAtomNumbers) {
  const auto mol = from_smiles("OCC(O)C=O");
  ASSERT_EQ(mol.NumAtoms(), 12u);
  for (int h : {8, 9}) {
    ASSERT_EQ(mol.GetAtom(h)->GetAtomicNum(), 1u);
    ASSERT_TRUE(mol.GetBond(h, 2)) << "H" << h << " sits on C2";
  }
  ASSERT_TRUE(mol.GetBond(10, 3));
  const std::string svg = depiction_svg(mol, kLabels, {.title = "glyceraldehyde"});
  for (const auto& [atom, label] : kLabels) EXPECT_EQ(count(svg, ">" + label + "</text>"), 1) << label;
  EXPECT_EQ(count(svg, "class=\"atom-label\""), 6);
  EXPECT_EQ(svg.find("fill=\"rgb(255,0,0)\""), std::string::npos) << "Open Babel's atom numbers are gone";
  EXPECT_EQ(svg.rfind("<svg", 0), 0u);
  EXPECT_EQ(markup_nesting_problem(svg), "");
  EXPECT_NE(svg.find("<title>glyceraldehyde</title>"), std::string::npos);
  EXPECT_EQ(svg.find("topsvg"), std::string::npos);
  EXPECT_EQ(svg.find("<script"), std::string::npos);
  EXPECT_EQ(svg.find("<?xml"), std::string::npos);
}

TEST(Depiction, DrawsLabelledHydrogensAndFoldsTheRest) {
  const auto mol = from_smiles("OCC(O)C=O");
  const std::string plain = depiction_svg(mol, {});
  EXPECT_EQ(count(plain, ">H</text>"), 0) << "no hydrogen drawn as an atom of its own";
  EXPECT_EQ(count(plain, ">OH</text>") + count(plain, ">HO</text>"), 2) << "hydroxyl hydrogens stay with O";
  EXPECT_EQ(count(plain, ">.</text>"), 0) << "folding must not leave radicals";
  EXPECT_EQ(count(plain, "atom-label"), 0);

  const std::string labelled = depiction_svg(mol, kLabels);
  EXPECT_EQ(count(labelled, ">H</text>"), 3) << "H-2, H-3a and H-3b are drawn";
  EXPECT_EQ(count(labelled, ">.</text>"), 0);
}

TEST(Depiction, KeepsStereochemistryWhenHydrogensAreFolded) {
  // Mirror images differ only in wedge against hash at the stereocentre.
  const std::string r = depiction_svg(from_smiles("C[C@H](O)CC"), {{2, "C-2"}});
  const std::string s = depiction_svg(from_smiles("C[C@@H](O)CC"), {{2, "C-2"}});
  EXPECT_NE(r, s);
  const std::string flat = depiction_svg(from_smiles("CC(O)CC"), {{2, "C-2"}});
  EXPECT_NE(r, flat);
  EXPECT_NE(s, flat);
}

TEST(Depiction, WorksFrom3DCoordinates) {
  auto mol = from_smiles("OCC(O)C=O");
  OpenBabel::OBBuilder builder;
  ASSERT_TRUE(builder.Build(mol));
  ASSERT_EQ(mol.GetDimension(), 3);
  const std::string svg = depiction_svg(mol, kLabels);
  EXPECT_EQ(count(svg, "class=\"atom-label\""), 6);
}

TEST(Depiction, EscapesLabelsAndRejectsAtomsOutsideTheMolecule) {
  const auto mol = from_smiles("OCC(O)C=O");
  const std::string svg = depiction_svg(mol, {{2, "<b>&\"x\""}});
  EXPECT_NE(svg.find(">&lt;b&gt;&amp;&quot;x&quot;</text>"), std::string::npos);
  EXPECT_EQ(svg.find("<b>"), std::string::npos);
  EXPECT_THROW(depiction_svg(mol, {{13, "H-9"}}), Error);
  EXPECT_THROW(depiction_svg(mol, {{0, "H-0"}}), Error);
  EXPECT_THROW(depiction_svg(OpenBabel::OBMol(), {}), Error);
}

}  // namespace
}  // namespace vicinal::report
