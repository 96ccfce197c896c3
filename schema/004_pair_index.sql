-- Version 4: the index on identity alone becomes one on (set_id, identity).
-- Every search by identity also names the set (the import's duplicate check,
-- conflicts, derived rows, stats), and identity keys are long marked SMILES:
-- alone they sent each new row to a random place in a large index, which was
-- a fifth of the import time. Led by set_id, new rows land at the end.
-- couplings_by_set stays: it gives a set's couplings in id order.
DROP INDEX couplings_by_identity;
CREATE INDEX couplings_by_set_identity ON couplings(set_id, identity);
