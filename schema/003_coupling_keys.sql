-- Version 3: coupling identity keys are computed from the molecule's whole
-- symmetry group (skeleton automorphisms times swaps of like leaves) and name
-- a pair with one marker element. Keys of version 1-2 libraries were built
-- from a listing of automorphisms that stopped early for molecules with many
-- (long CH2 chains, several methyl groups), so they could depend on the atom
-- numbering. No table changes: the program recomputes every stored key from
-- the stored structure when it upgrades a library (src/library/rekey.cc).
SELECT 1;
