// Coupling identity keys: the same coupling gets the same key whatever the
// atom numbering; couplings that differ in 3D (diastereotopic protons, cis vs
// trans across C=C) get different keys; enantiotopic protons, which give the
// same couplings in an achiral solvent, share one.
#include "library/identity.h"

#include <gtest/gtest.h>
#include <openbabel/atom.h>
#include <openbabel/obconversion.h>
#include <openbabel/obiter.h>
#include <openbabel/stereo/stereo.h>

#include <algorithm>
#include <numeric>
#include <random>

#include "structure/molecule_io.h"

namespace vicinal::library {
namespace {

// The molecule with its atoms in a shuffled order; `where[i]` is the new
// 1-based index of old atom i + 1. Coordinates move with the atoms.
OpenBabel::OBMol shuffled(const OpenBabel::OBMol& mol, unsigned seed, std::vector<int>& where) {
  OpenBabel::OBMol copy(mol);
  std::vector<int> order(copy.NumAtoms());
  std::iota(order.begin(), order.end(), 1);
  std::mt19937 rng(seed);
  std::shuffle(order.begin(), order.end(), rng);
  std::vector<OpenBabel::OBAtom*> atoms;
  for (int old : order) atoms.push_back(copy.GetAtom(old));
  copy.RenumberAtoms(atoms);
  where.assign(order.size(), 0);
  for (std::size_t i = 0; i < order.size(); ++i) where[static_cast<std::size_t>(order[i] - 1)] = static_cast<int>(i) + 1;
  return copy;
}

std::vector<int> hydrogens_on(OpenBabel::OBMol& mol, int heavy) {
  std::vector<int> out;
  FOR_NBORS_OF_ATOM(nb, mol.GetAtom(heavy)) if (nb->GetAtomicNum() == 1) out.push_back(static_cast<int>(nb->GetIdx()));
  return out;
}

TEST(CouplingIdentity, SameCouplingSameKeyUnderRenumbering) {
  auto mol = structure::molecule_from_smiles("C[C@H](Cl)CC", true);  // (S)-2-chlorobutane
  CompoundIdentity id(mol, "test");
  for (unsigned seed = 1; seed <= 2; ++seed) {
    std::vector<int> where;
    auto other = shuffled(mol, seed, where);
    CompoundIdentity id2(other, "shuffled");
    EXPECT_EQ(id.inchikey(), id2.inchikey());
    for (int a = 1; a <= id.atom_count(); ++a)
      for (int b = a + 1; b <= id.atom_count(); ++b) {
        if (mol.GetAtom(a)->GetAtomicNum() != 1 || mol.GetAtom(b)->GetAtomicNum() != 1) continue;
        EXPECT_EQ(id.coupling_key({a}, {b}), id2.coupling_key({where[a - 1]}, {where[b - 1]}))
            << "atoms " << a << "," << b << " seed " << seed;
      }
  }
}

TEST(CouplingIdentity, DiastereotopicProtonsDiffer) {
  // C3 of (S)-2-chlorobutane carries two diastereotopic protons: their
  // couplings to H2 are different couplings.
  auto mol = structure::molecule_from_smiles("C[C@H](Cl)CC", true);
  CompoundIdentity id(mol, "test");
  const auto h2 = hydrogens_on(mol, 2), h4 = hydrogens_on(mol, 4);
  ASSERT_EQ(h2.size(), 1u);
  ASSERT_EQ(h4.size(), 2u);
  EXPECT_NE(id.coupling_key({h2[0]}, {h4[0]}), id.coupling_key({h2[0]}, {h4[1]}));
  // As a stereo-unassigned pair the two are one coupling, in either order.
  EXPECT_EQ(id.coupling_key({h2[0]}, {h4[0], h4[1]}), id.coupling_key({h4[1], h4[0]}, {h2[0]}));
}

TEST(CouplingIdentity, CisAndTransAcrossDoubleBondDiffer) {
  auto mol = structure::molecule_from_smiles("C=C", true);
  CompoundIdentity id(mol, "ethene");
  const auto h1 = hydrogens_on(mol, 1), h2 = hydrogens_on(mol, 2);
  ASSERT_EQ(h1.size(), 2u);
  const std::string k0 = id.coupling_key({h1[0]}, {h2[0]}), k1 = id.coupling_key({h1[0]}, {h2[1]});
  EXPECT_NE(k0, k1);
  // The other cis pair is the same coupling as the first cis pair.
  const std::string other = id.coupling_key({h1[1]}, {h2[0]});
  EXPECT_EQ(other, k1);
  // Geminal couplings of both carbons are one coupling.
  EXPECT_EQ(id.coupling_key({h1[0]}, {h1[1]}), id.coupling_key({h2[1]}, {h2[0]}));
}

TEST(CouplingIdentity, EnantiotopicProtonsShareKeys) {
  // Ethanol's CH2 protons are enantiotopic: CH2-CH3 couplings of either are
  // the same measurement, and all three methyl protons are equivalent.
  auto mol = structure::molecule_from_smiles("CCO", true);
  CompoundIdentity id(mol, "ethanol");
  const auto methyl = hydrogens_on(mol, 1), ch2 = hydrogens_on(mol, 2);
  ASSERT_EQ(methyl.size(), 3u);
  ASSERT_EQ(ch2.size(), 2u);
  const std::string k = id.coupling_key({methyl[0]}, {ch2[0]});
  for (int m : methyl)
    for (int c : ch2) EXPECT_EQ(id.coupling_key({m}, {c}), k);
}

TEST(CouplingIdentity, LongChainKeysDoNotDependOnNumbering) {
  // Br-(CH2)20-OH has 2^20 graph automorphisms (each CH2's protons swap):
  // far too many to list, and a key built from part of the list would depend
  // on the atom order. Vicinal and geminal pairs along the chain must get the
  // same keys whatever the numbering.
  auto mol = structure::molecule_from_smiles("BrCCCCCCCCCCCCCCCCCCCCO", true);
  CompoundIdentity id(mol, "chain");
  std::vector<int> where;
  auto other = shuffled(mol, 7, where);
  CompoundIdentity id2(other, "shuffled");
  for (int c = 2; c <= 20; c += 6) {
    const auto here = hydrogens_on(mol, c), next = hydrogens_on(mol, c + 1);
    ASSERT_EQ(here.size(), 2u);
    for (int a : here) {
      for (int b : next)
        EXPECT_EQ(id.coupling_key({a}, {b}), id2.coupling_key({where[a - 1]}, {where[b - 1]})) << "carbon " << c;
    }
    EXPECT_EQ(id.coupling_key({here[0]}, {here[1]}), id2.coupling_key({where[here[1] - 1]}, {where[here[0] - 1]}));
    // The two protons of one CH2 are enantiotopic, so of the four vicinal
    // pairs, the like pairs are one coupling and the unlike pairs another.
    EXPECT_EQ(id.coupling_key({here[0]}, {next[0]}), id.coupling_key({here[1]}, {next[1]}));
    EXPECT_EQ(id.coupling_key({here[0]}, {next[1]}), id.coupling_key({here[1]}, {next[0]}));
    EXPECT_NE(id.coupling_key({here[0]}, {next[0]}), id.coupling_key({here[0]}, {next[1]}));
  }
}

TEST(CouplingIdentity, KeysOnlyGivesTheSameRanksAndKeys) {
  // Upgrades recompute stored keys without the InChI and SMILES; writing
  // those could leave perceived data on the molecule that the keys then use,
  // so both ways must agree on every pair.
  for (const char* smiles : {"C[C@H](Cl)CC", "C/C=C/[C@@H](O)C", "CO[C@@H]1O[C@H](CO)[C@@H](O)[C@H](O)[C@H]1O",
                             "CC(C)(C)C", "O[C@@H](C)[C@H](C)O"}) {
    auto mol = structure::molecule_from_smiles(smiles, true);
    CompoundIdentity all(mol, smiles), keys(mol, smiles, CompoundIdentity::Names::KeysOnly);
    EXPECT_TRUE(keys.inchikey().empty());
    for (int a = 1; a <= all.atom_count(); ++a) {
      EXPECT_EQ(all.rank(a), keys.rank(a)) << smiles << " atom " << a;
      for (int b = a + 1; b <= all.atom_count(); ++b)
        EXPECT_EQ(all.coupling_key({a}, {b}), keys.coupling_key({a}, {b})) << smiles << " atoms " << a << "," << b;
    }
  }
}

TEST(CouplingIdentity, RanksAreAPermutation) {
  auto mol = structure::molecule_from_smiles("OC(=O)[C@@H](N)C", true);
  CompoundIdentity id(mol, "alanine");
  std::vector<unsigned> ranks;
  for (int a = 1; a <= id.atom_count(); ++a) ranks.push_back(id.rank(a));
  std::sort(ranks.begin(), ranks.end());
  for (std::size_t i = 0; i < ranks.size(); ++i) EXPECT_EQ(ranks[i], i + 1);
}


// Canonical isomeric SMILES as the coupling key writes it.
std::string canonical_smiles(OpenBabel::OBMol& mol) {
  OpenBabel::OBConversion conv;
  conv.SetOutFormat("can");
  conv.AddOption("n", OpenBabel::OBConversion::OUTOPTIONS);
  return conv.WriteString(&mol, true);
}

TEST(CouplingIdentity, ReflectedStereoIsWhatTheMirrorImageGives) {
  // The coupling key names a mirror image by reflecting the perceived stereo
  // rather than perceiving it again from mirrored coordinates. Both must give
  // the same canonical SMILES for every marked pair (the two nuclei of a pair
  // replaced by marker elements, as the key does), over molecules with
  // stereocentres, cis/trans double bonds, ring cis/trans (para-stereocentres)
  // and a meso compound. Reference: Open Babel's own perception of the
  // mirrored 3D structure.
  for (const char* smiles : {"C[C@H](Cl)CC", "C/C=C/[C@@H](O)C", "O[C@H]1CC[C@@H](Cl)CC1",
                             "O[C@@H](C)[C@H](C)O", "CC(C)[C@@H]1CC[C@@H](C)C[C@H]1O", "ClCCC(=O)CCBr"}) {
    auto mol = structure::molecule_from_smiles(smiles, true);
    int compared = 0;
    for (int a = 1; a <= static_cast<int>(mol.NumAtoms()); ++a)
      for (int b = a + 1; b <= static_cast<int>(mol.NumAtoms()); ++b) {
        if (mol.GetAtom(a)->GetAtomicNum() != 1 || mol.GetAtom(b)->GetAtomicNum() != 1) continue;
        OpenBabel::OBMol marked(mol);
        marked.GetAtom(a)->SetAtomicNum(116);
        marked.GetAtom(b)->SetAtomicNum(117);
        marked.DeleteData(OpenBabel::OBGenericDataType::StereoData);
        OpenBabel::OBMol mirrored(marked);
        OpenBabel::PerceiveStereo(&marked, true);
        reflect_stereo(marked);
        FOR_ATOMS_OF_MOL(atom, mirrored) atom->SetVector(-atom->GetX(), atom->GetY(), atom->GetZ());
        OpenBabel::PerceiveStereo(&mirrored, true);
        ASSERT_EQ(canonical_smiles(marked), canonical_smiles(mirrored)) << smiles << " atoms " << a << "," << b;
        ++compared;
      }
    EXPECT_GT(compared, 10) << smiles;
  }
}

}  // namespace
}  // namespace vicinal::library
