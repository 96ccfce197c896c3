-- Version 2: a path fingerprint per compound (Open Babel FP2, 1024 bits) so
-- that substructure searches test SMARTS only on compounds whose fingerprint
-- contains the query's. Rows are filled by the program (src/library/store.cc)
-- for every compound that lacks one, including those of upgraded libraries.
CREATE TABLE compound_fingerprints (
  compound_id  INTEGER PRIMARY KEY REFERENCES compounds(id) ON DELETE CASCADE,
  kind         TEXT NOT NULL,
  bits         BLOB NOT NULL
);
-- Searches by nucleus type and bond count.
CREATE INDEX couplings_by_isotopes ON couplings(isotope_a, isotope_b, bond_count);
