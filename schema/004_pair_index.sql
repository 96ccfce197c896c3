-- Version 4: one index on (set_id, identity) in place of couplings_by_set and
-- couplings_by_identity. Every search by identity also names the set (the
-- import's duplicate check, conflicts, derived rows, stats), and identity keys
-- are long marked SMILES: alone they sent each new row to a random place in a
-- large index, which was a fifth of the import time. Led by set_id, new rows
-- land at the end of the index, and one index is maintained instead of two.
DROP INDEX couplings_by_set;
DROP INDEX couplings_by_identity;
CREATE INDEX couplings_by_set_identity ON couplings(set_id, identity);
