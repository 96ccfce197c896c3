-- Version 1 of the coupling library: compounds with their atom numbering,
-- measurement sets (conditions and provenance), measured couplings, results
-- derived from them, and free-text notes.
-- Applied by src/library/schema.cc inside one transaction; PRAGMA user_version
-- is set by the caller. Never edit a shipped migration: add a new file.

CREATE TABLE compounds (
  id            INTEGER PRIMARY KEY,
  name          TEXT NOT NULL,
  smiles        TEXT NOT NULL,             -- isomeric SMILES
  inchi         TEXT NOT NULL CHECK (inchi LIKE 'InChI=%'),
  inchikey      TEXT NOT NULL UNIQUE CHECK (length(inchikey) = 27),  -- standard key, stereo included
  molfile       TEXT NOT NULL,             -- the structure with the atom numbering the couplings use
  created_utc   TEXT NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%SZ', 'now')),
  updated_utc   TEXT NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%SZ', 'now'))
);
CREATE INDEX compounds_by_name ON compounds(name);

-- One row per atom of a compound: its 1-based index in the molfile, element
-- and canonical rank (the same atom gets the same rank whatever the numbering).
CREATE TABLE atoms (
  compound_id     INTEGER NOT NULL REFERENCES compounds(id) ON DELETE CASCADE,
  atom_index      INTEGER NOT NULL CHECK (atom_index >= 1),
  element         TEXT NOT NULL,
  canonical_rank  INTEGER NOT NULL CHECK (canonical_rank >= 1),
  PRIMARY KEY (compound_id, atom_index)
) WITHOUT ROWID;

-- Names the group gives atoms ("H-2", "H-6a"), as couplings refer to them.
CREATE TABLE atom_labels (
  compound_id  INTEGER NOT NULL,
  label        TEXT NOT NULL CHECK (length(label) > 0),
  atom_index   INTEGER NOT NULL,
  PRIMARY KEY (compound_id, label),
  FOREIGN KEY (compound_id, atom_index) REFERENCES atoms(compound_id, atom_index) ON DELETE CASCADE
) WITHOUT ROWID;

CREATE TABLE measurement_sets (
  id             INTEGER PRIMARY KEY,
  compound_id    INTEGER NOT NULL REFERENCES compounds(id) ON DELETE CASCADE,
  name           TEXT NOT NULL DEFAULT '',
  solvent        TEXT NOT NULL DEFAULT '',
  temperature_k  REAL CHECK (temperature_k IS NULL OR (temperature_k > 0 AND temperature_k < 1000)),
  field_mhz      REAL CHECK (field_mhz IS NULL OR field_mhz > 0),
  ph             REAL CHECK (ph IS NULL OR (ph >= 0 AND ph <= 14)),
  instrument     TEXT NOT NULL DEFAULT '',
  method         TEXT NOT NULL DEFAULT '',  -- how J was measured (first-order, simulation, ...)
  measured_by    TEXT NOT NULL DEFAULT '',
  measured_on    TEXT NOT NULL DEFAULT '',  -- date as given
  source         TEXT NOT NULL DEFAULT '',  -- citation or DOI
  imported_from  TEXT NOT NULL DEFAULT '',  -- file or library it came from
  created_utc    TEXT NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%SZ', 'now'))
);
CREATE INDEX sets_by_compound ON measurement_sets(compound_id);
CREATE INDEX sets_by_solvent ON measurement_sets(solvent);
CREATE INDEX sets_by_source ON measurement_sets(source);

CREATE TABLE couplings (
  id          INTEGER PRIMARY KEY,
  set_id      INTEGER NOT NULL REFERENCES measurement_sets(id) ON DELETE CASCADE,
  nucleus_a   TEXT NOT NULL,              -- labels as given, alternatives joined by '|'
  nucleus_b   TEXT NOT NULL,
  atoms_a     TEXT NOT NULL,              -- 1-based atom indices, '|'-joined
  atoms_b     TEXT NOT NULL,
  path        TEXT NOT NULL,              -- bonded path between the first alternatives, '-'-joined indices
  bond_count  INTEGER NOT NULL CHECK (bond_count >= 1),
  isotope_a   TEXT NOT NULL,
  isotope_b   TEXT NOT NULL,
  j_hz        REAL NOT NULL CHECK (abs(j_hz) <= 1000),
  sigma_hz    REAL CHECK (sigma_hz IS NULL OR sigma_hz >= 0),
  sign_known  INTEGER NOT NULL DEFAULT 0 CHECK (sign_known IN (0, 1)),
  assignment  TEXT NOT NULL CHECK (assignment IN ('assigned', 'stereo-unassigned')),
  ranks_a     TEXT NOT NULL,              -- canonical ranks of atoms_a, '|'-joined
  ranks_b     TEXT NOT NULL,
  identity    TEXT NOT NULL,              -- numbering-independent key of the pair within its compound
  karplus_set TEXT NOT NULL DEFAULT '',   -- Karplus set preferred for this coupling
  note        TEXT NOT NULL DEFAULT '',
  origin      TEXT NOT NULL DEFAULT ''    -- file or library this value came from
);
CREATE INDEX couplings_by_set ON couplings(set_id);
CREATE INDEX couplings_by_identity ON couplings(identity);
CREATE INDEX couplings_by_j ON couplings(j_hz);

-- Results computed from couplings (e.g. dihedral intervals from a Karplus set).
CREATE TABLE derived_results (
  id            INTEGER PRIMARY KEY,
  coupling_id   INTEGER NOT NULL REFERENCES couplings(id) ON DELETE CASCADE,
  karplus_set   TEXT NOT NULL,
  from_deg      REAL NOT NULL CHECK (from_deg >= -180 AND from_deg <= 360),
  to_deg        REAL NOT NULL CHECK (to_deg >= -180 AND to_deg <= 360),
  created_utc   TEXT NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%SZ', 'now'))
);
CREATE INDEX derived_by_coupling ON derived_results(coupling_id);

-- Free text attached to exactly one compound, set or coupling.
CREATE TABLE notes (
  id           INTEGER PRIMARY KEY,
  compound_id  INTEGER REFERENCES compounds(id) ON DELETE CASCADE,
  set_id       INTEGER REFERENCES measurement_sets(id) ON DELETE CASCADE,
  coupling_id  INTEGER REFERENCES couplings(id) ON DELETE CASCADE,
  text         TEXT NOT NULL,
  created_utc  TEXT NOT NULL DEFAULT (strftime('%Y-%m-%dT%H:%M:%SZ', 'now')),
  CHECK ((compound_id IS NOT NULL) + (set_id IS NOT NULL) + (coupling_id IS NOT NULL) = 1)
);
CREATE INDEX notes_by_compound ON notes(compound_id);
CREATE INDEX notes_by_set ON notes(set_id);
