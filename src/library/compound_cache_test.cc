// A compound parked by the cache and brought back from its molfile gives the
// same record and the same coupling facts (path, isotopes, ranks, identity
// key) as it gave whole.
#include "library/compound_cache.h"

#include <gtest/gtest.h>
#include <openbabel/atom.h>

#include <string>
#include <vector>

namespace vicinal::library {
namespace {

std::unique_ptr<CompoundBuilder> from_smiles(const std::string& name, const std::string& smiles) {
  StructureSpec spec;
  spec.text = smiles;
  return std::make_unique<CompoundBuilder>(name, spec, Location("test.csv", 2));
}

// Every H-H coupling of the compound, as "nuclei path isotopes ranks key".
std::vector<std::string> facts(CompoundBuilder& builder) {
  std::vector<int> hydrogens;
  for (int i = 1; i <= static_cast<int>(builder.molecule().NumAtoms()); ++i)
    if (const_cast<OpenBabel::OBMol&>(builder.molecule()).GetAtom(i)->GetAtomicNum() == 1) hydrogens.push_back(i);
  std::vector<std::string> out;
  for (std::size_t i = 0; i < hydrogens.size(); ++i)
    for (std::size_t j = i + 1; j < hydrogens.size(); ++j) {
      const auto c = builder.coupling({{{std::to_string(hydrogens[i])}, {std::to_string(hydrogens[j])}}}, 5.0,
                                      std::nullopt, Location("test.csv", 3));
      out.push_back(c.nucleus_a + "," + c.nucleus_b + " " + join_atoms(c.path, '-') + " " + c.isotope_a + "," +
                    c.isotope_b + " " + c.ranks_a + "," + c.ranks_b + " " + c.identity);
    }
  return out;
}

// Two stereocentres, diastereotopic CH2 protons between them, and a cis C=C:
// keys that need the 3D arrangement (marked SMILES).
const char* const kChiral = "C[C@@H](O)C[C@H](Cl)/C=C\\C";

TEST(CompoundCache, ParkedCompoundComesBackTheSame) {
  // Each build from SMILES gets its own 3D coordinates: the facts are taken
  // from the very compound the cache parks.
  CompoundCache cache(1);
  CompoundBuilder& whole = cache.add("chiral", from_smiles("chiral", kChiral));
  const CompoundRecord record = whole.record();
  const auto expected = facts(whole);
  ASSERT_GT(expected.size(), 50u);
  cache.add("other", from_smiles("other", "OCC(F)CBr"));
  EXPECT_EQ(cache.whole(), 1u);  // "chiral" parked

  CompoundBuilder& back = cache.at("chiral");
  EXPECT_EQ(cache.whole(), 1u);  // "other" parked in its place
  EXPECT_EQ(back.record().molfile, record.molfile);
  EXPECT_EQ(back.record().inchikey, record.inchikey);
  EXPECT_EQ(back.record().labels, record.labels);
  ASSERT_EQ(back.record().atoms.size(), record.atoms.size());
  for (std::size_t i = 0; i < record.atoms.size(); ++i)
    EXPECT_EQ(back.identity().rank(static_cast<int>(i) + 1), record.atoms[i].canonical_rank) << "atom " << i + 1;
  EXPECT_EQ(facts(back), expected);
  EXPECT_EQ(cache.at("other").record().name, "other");
}

TEST(CompoundCache, KeepsTheMostRecentlyUsedWhole) {
  CompoundCache cache(2);
  cache.add("a", from_smiles("a", "CCO"));
  cache.add("b", from_smiles("b", "CCN"));
  cache.at("a");                             // now "b" is the least recently used
  cache.add("c", from_smiles("c", "CCS"));  // parks "b"
  EXPECT_EQ(cache.whole(), 2u);
  EXPECT_TRUE(cache.contains("b"));
  EXPECT_EQ(cache.at("b").record().name, "b");
  EXPECT_EQ(cache.at("a").record().name, "a");
  EXPECT_EQ(cache.whole(), 2u);
  EXPECT_EQ(&cache.stored_key("c"), &cache.stored_key(std::string("c")));
}

}  // namespace
}  // namespace vicinal::library
