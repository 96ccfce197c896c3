#!/usr/bin/env bash
# vicinal library: init, import (CSV, JSON, SDF), export round trips, identity
# across atom numberings, conflicts, bad input, --skip-bad, find, show, stats,
# check, backup, merge, upgrades from schema version 1 and text stored byte for byte.
source "$(dirname "$0")/lib.sh"
DATA=$(cd "$(dirname "$0")/../data/library" && pwd)
L=(--library "$WORK/lib.sqlite")
count() { /usr/bin/python3 -c "import sqlite3,sys; print(sqlite3.connect(sys.argv[1]).execute(sys.argv[2]).fetchone()[0])" "$@"; }

run 0 "${L[@]}" library init
contains out "schema version 4"
run 0 "${L[@]}" library init          # again: nothing changes
contains out "already present"

# Ethanol from SMILES CCO: C1 C2 O3, methyl H 4-6, CH2 H 7-8, OH 9.
# 2-chloropropane-1-ol style stereo is covered by the unit tests; here the
# numbering-independence is checked through whole files. Invented values.
cat > a.csv <<'CSV'
compound,smiles,measurement,solvent,temperature_k,field_mhz,source,nuclei,j_hz,sigma_hz,note
ethanol,CCO,run 1,CDCl3,298,400,invented,"4,7",7.0,0.1,methyl-CH2
ethanol,,run 1,CDCl3,298,400,invented,"7,9",5.1,0.2,CH2-OH
propanal,CCC=O,run 1,CDCl3,298,400,invented,"7,10",1.4,0.1,CH2-CHO
CSV
run 0 "${L[@]}" --json library import a.csv
[[ $(json_get 'd["couplings_added"]') == 3 ]] || fail "3 couplings expected"
[[ $(json_get 'd["compounds_added"]') == 2 ]] || fail "2 compounds expected"

# The same couplings written with another numbering (SMILES OCC: O1 C2 C3,
# OH 4, CH2 5-6, methyl 7-9) and as a 3D molfile made by RDKit in yet another
# order: recognised as already present.
cat > b.csv <<'CSV'
compound,smiles,measurement,solvent,temperature_k,field_mhz,source,nuclei,j_hz,sigma_hz,note
ethanol,OCC,run 1,CDCl3,298,400,invented,"8,6",7.0,0.1,methyl-CH2
ethanol,OCC,run 1,CDCl3,298,400,invented,"4,5",5.1,0.2,CH2-OH
CSV
run 0 "${L[@]}" --json library import b.csv
[[ $(json_get 'd["couplings_added"]') == 0 ]] || fail "renumbered couplings were stored again"
[[ $(json_get 'd["couplings_already_present"]') == 2 ]] || fail "renumbered couplings not recognised"
/usr/bin/python3 - <<'PY'
from rdkit import Chem
from rdkit.Chem import AllChem
m = Chem.AddHs(Chem.MolFromSmiles("C(O)C"))      # C1 O2 C3, H on C1: 4,5; OH 6; methyl 7-9
AllChem.EmbedMolecule(m, randomSeed=7)
open("ethanol.mol", "w").write(Chem.MolToMolBlock(m))
PY
cat > c.csv <<'CSV'
compound,structure,measurement,solvent,temperature_k,field_mhz,source,nuclei,j_hz,sigma_hz,note
ethanol,ethanol.mol,run 1,CDCl3,298,400,invented,"H4,H8",7.0,0.1,methyl-CH2
ethanol,ethanol.mol,run 1,CDCl3,298,400,invented,"H5,H6",5.3,0.2,CH2-OH again
CSV
run 0 "${L[@]}" --json library import c.csv
[[ $(json_get 'd["couplings_already_present"]') == 1 ]] || fail "molfile numbering not recognised"
[[ $(json_get 'len(d["conflicts"])') == 1 ]] || fail "the conflicting value was not reported"
[[ $(json_get 'd["conflicts"][0]["stored_j_hz"]') == 5.1 ]] || fail "conflict report"
[[ $(json_get 'd["conflicts"][0]["new_j_hz"]') == 5.3 ]] || fail "conflict report"
run 0 "${L[@]}" library show ethanol
contains out "5.1"; contains out "5.3 !"; contains out "kept side by side"
run 0 "${L[@]}" --json library show LFQSCWFLJHTTHZ-UHFFFAOYSA-N
[[ $(json_get 'd["name"]') == ethanol ]] || fail "show by InChIKey"

# Round trips: export -> import into an empty library -> export is identical.
for ext in csv json sdf; do
  run 0 "${L[@]}" library export "all.$ext"
  run 0 --library "$WORK/rt-$ext.sqlite" library import "all.$ext"
  run 0 --library "$WORK/rt-$ext.sqlite" library export "again.$ext"
  cmp "all.$ext" "again.$ext" || fail "$ext round trip differs"
  # Importing the export into the library it came from adds nothing.
  run 0 "${L[@]}" --json library import "all.$ext"
  [[ $(json_get 'd["couplings_added"]') == 0 ]] || fail "$ext re-import added couplings"
done
[[ $(count rt-json.sqlite "select count(*) from couplings") == 4 ]] || fail "JSON round trip lost couplings"

# Bad input: the whole file is refused with line, column and reason.
before=$(count lib.sqlite "select count(*) from couplings")
cat > bad.csv <<'CSV'
compound,smiles,solvent,temperature_k,nuclei,j_hz
butane,CCCC,CDCl3,298,"5,8",7.1
butane,CCCC,CDCl3,298,"5,8",seven
CSV
run 2 "${L[@]}" library import bad.csv; one_line_error; contains err "bad.csv:3"; contains err "j_hz"
printf 'compound,smiles,solvent,temperature_k,nuclei,j_hz\nbutane,CCCC,CDCl3,1200,"5,8",7.1\n' > badt.csv
run 2 "${L[@]}" library import badt.csv; one_line_error; contains err "badt.csv:2"; contains err "temperature"
printf 'compound,smiles,nuclei,j_hz\nbutane,CCCC,"5,H99",7.1\n' > bada.csv
run 2 "${L[@]}" library import bada.csv; one_line_error; contains err "bada.csv:2"; contains err "99"
printf 'compound,smiles,nuclei,j_hz\nbutane,C1CC,"5,8",7.1\n' > bads.csv
run 2 "${L[@]}" library import bads.csv; one_line_error; contains err "bads.csv:2"
printf 'compound,smiles,nuclei,j_hz,colour\nbutane,CCCC,"5,8",7.1,red\n' > badc.csv
run 2 "${L[@]}" library import badc.csv; one_line_error; contains err "unknown column 'colour'"
printf 'compound,smiles,nuclei,j_hz\nbutane,CCCC,"5,8",1500\n' > badj.csv
run 2 "${L[@]}" library import badj.csv; one_line_error; contains err "1000"
[[ $(count lib.sqlite "select count(*) from couplings") == "$before" ]] || fail "a refused file left rows behind"
# A refused file does not leave behind the library the import would have
# created, nor the folders made for it.
run 2 --library "$WORK/never.sqlite" library import badj.csv; one_line_error
[[ ! -e never.sqlite && ! -e never.sqlite-wal && ! -e never.sqlite-shm ]] || fail "a refused file left a new library"
run 2 --library "$WORK/new/deeper/never.sqlite" library import badj.csv; one_line_error
[[ ! -e new ]] || fail "a refused file left the folders made for a new library"

# --skip-bad: good rows stored, bad ones in the reject file with reasons.
cat > mixed.csv <<'CSV'
compound,smiles,solvent,nuclei,j_hz
butane,CCCC,CDCl3,"5,8",7.1
butane,CCCC,CDCl3,"5,8",seven
butane,CCCC,CDCl3,"5,H99",3
pentane,CCCCC,CDCl3,"6,9",7.0
CSV
run 0 "${L[@]}" --json library import mixed.csv --skip-bad --rejects rejects.csv
[[ $(json_get 'd["couplings_added"]') == 2 ]] || fail "--skip-bad stored the wrong rows"
[[ $(json_get 'd["rejected"]') == 2 ]] || fail "--skip-bad rejected count"
contains rejects.csv "mixed.csv:3"; contains rejects.csv "mixed.csv:4"; contains rejects.csv "seven"

# find: by name, nuclei, bonds, J range, solvent, source, InChIKey, SMARTS.
run 0 "${L[@]}" --json library find --nuclei H,H --bonds 3
n_hh=$(json_get 'd["matches"]')
[[ $n_hh -ge 5 ]] || fail "find --nuclei H,H --bonds 3 found $n_hh"
# --limit reads fewer couplings but still counts every match.
run 0 "${L[@]}" --json library find --nuclei H,H --bonds 3 --limit 2
[[ $(json_get 'd["matches"]') == "$n_hh" && $(json_get 'd["shown"]') == 2 && $(json_get 'len(d["couplings"])') == 2 ]] \
  || fail "find --limit 2: $(cat out)"
run 0 "${L[@]}" library find --nuclei H,H --bonds 3 --limit 2
contains out "$n_hh couplings match (2 shown"
run 2 "${L[@]}" library find --nuclei H,H --limit -1; one_line_error
run 0 "${L[@]}" --json library find --name ETHAN
[[ $(json_get 'set(c["compound"] for c in d["couplings"])') == "{'ethanol'}" ]] || fail "find --name"
run 0 "${L[@]}" --json library find --j-min 5 --j-max 5.2
[[ $(json_get 'd["matches"]') == 1 ]] || fail "find J range"
run 0 "${L[@]}" --json library find --inchikey LFQSCWFLJHTTHZ
[[ $(json_get 'd["matches"]') == 3 ]] || fail "find by InChIKey skeleton block"
run 0 "${L[@]}" --json library find --source INVENT --solvent cdcl3
[[ $(json_get 'd["matches"]') -ge 3 ]] || fail "find by source and solvent"
for smarts in 'CO' 'C=O' 'CCCC' 'CCCCC' '[OX2H]' 'C(C)C'; do
  run 0 "${L[@]}" --json library find --smarts "$smarts"
  with=$(json_get '[c["compound"] for c in d["couplings"]]')
  run 0 "${L[@]}" --json library find --smarts "$smarts" --no-prescreen
  without=$(json_get '[c["compound"] for c in d["couplings"]]')
  [[ $with == "$without" ]] || fail "pre-screen changed the hits for $smarts: $with vs $without"
done
run 0 "${L[@]}" --json library find --smarts 'CCCCC'
[[ $(json_get 'd["compounds_skipped_by_fingerprint"]') -ge 1 ]] || fail "the pre-screen skipped nothing"
[[ $(json_get 'set(c["compound"] for c in d["couplings"])') == "{'pentane'}" ]] || fail "SMARTS CCCCC"
run 2 "${L[@]}" library find --smarts 'C(('; one_line_error
run 2 "${L[@]}" library show nothing-like-this; one_line_error

# stats with a histogram.
run 0 "${L[@]}" library stats --plot hist.svg
contains out "H-C-C-H"; contains hist.svg "<svg"

# Text comes back byte for byte (quotes, semicolons, SQL, Unicode, long text).
/usr/bin/python3 - <<'PY'
import csv
name = "O'Brien \"ester\"; DROP TABLE compounds; -- β-D-glucose 🧪 溶媒"
note = "x" * 20000 + "; '); DELETE FROM couplings; --"
with open("text.csv", "w", newline="", encoding="utf-8") as f:
    w = csv.writer(f)
    w.writerow(["compound", "smiles", "source", "nuclei", "j_hz", "note"])
    w.writerow([name, "CC(C)O", "doi:10.0000/x;y \"z\"", "5,11", "6.1", note])
open("text.expected", "w", encoding="utf-8").write(name + "\n" + note + "\n")
PY
run 0 "${L[@]}" library import text.csv
run 0 "${L[@]}" --json library find --smarts 'CC(C)O'
/usr/bin/python3 - <<'PY' || fail "text not returned byte for byte"
import json
d = json.load(open("out"))
name, note = open("text.expected", encoding="utf-8").read().split("\n")[:2]
c = d["couplings"][0]
assert c["compound"] == name, c["compound"]
assert c["note"] == note
assert c["conditions"]["source"] == "doi:10.0000/x;y \"z\""
PY
[[ $(count lib.sqlite "select count(*) from compounds") -ge 5 ]] || fail "tables damaged"

# check and backup.
run 0 "${L[@]}" library check; contains out "no problems"
run 0 "${L[@]}" library backup "$WORK/copy.sqlite"
[[ $(count copy.sqlite "pragma integrity_check") == ok ]] || fail "backup integrity"
[[ $(count copy.sqlite "select count(*) from couplings") == $(count lib.sqlite "select count(*) from couplings") ]] ||
  fail "backup differs"
/usr/bin/python3 -c "import sqlite3; c=sqlite3.connect('copy.sqlite'); c.execute('PRAGMA ignore_check_constraints=1'); c.execute('update couplings set j_hz = 5000 where id = 1'); c.commit()"
run 2 --library "$WORK/copy.sqlite" library check; contains out "J out of range"; one_line_error

# merge: a second library with one new coupling, one equal and one conflicting.
cat > other.csv <<'CSV'
compound,smiles,measurement,solvent,temperature_k,field_mhz,source,nuclei,j_hz,sigma_hz
ethanol,CCO,run 1,CDCl3,298,400,invented,"5,8",7.0,0.1
propanal,CCC=O,run 1,CDCl3,298,400,invented,"7,10",1.6,0.1
propanal,CCC=O,run 1,CDCl3,298,400,invented,"1,8",7.4,0.1
CSV
run 0 --library "$WORK/other.sqlite" library import other.csv
run 0 "${L[@]}" --json library merge "$WORK/other.sqlite"
[[ $(json_get 'd["couplings_added"]') == 2 ]] || fail "merge added $(json_get 'd["couplings_added"]')"
[[ $(json_get 'd["couplings_already_present"]') == 1 ]] || fail "merge duplicates"
[[ $(json_get 'd["conflicts"][0]["stored_j_hz"]') == 1.4 ]] || fail "merge conflict"
run 0 "${L[@]}" --json library merge "$WORK/other.sqlite"
[[ $(json_get 'd["couplings_added"]') == 0 ]] || fail "merging twice added rows"
run 2 "${L[@]}" library merge "$WORK/nonexistent.sqlite"; one_line_error

# Upgrade from schema version 1: a backup copy beside it, then the current version.
cp "$DATA/v1.sqlite" old.sqlite
run 0 --library "$WORK/old.sqlite" library check
contains err "upgraded the library from schema version 1 to 4"
[[ -f old.v1.backup.sqlite ]] || fail "no backup before the upgrade"
[[ $(count old.v1.backup.sqlite "pragma user_version") == 1 ]] || fail "backup is not the old version"
[[ $(count old.sqlite "pragma user_version") == 4 ]] || fail "not upgraded"
run 0 --library "$WORK/old.sqlite" --json library find --smarts 'C=O'
[[ $(json_get 'd["matches"]') == 1 ]] || fail "substructure search after upgrade"
[[ $(count old.sqlite "select count(*) from compound_fingerprints") == 2 ]] || fail "fingerprints not filled"
# Upgrade from version 2 recomputes coupling keys: version 2 keyed this long
# chain's couplings by atom numbering, so a renumbered file added them again.
cp "$DATA/v2-chain.sqlite" chain.sqlite
run 0 --library "$WORK/chain.sqlite" library check
contains err "upgraded the library from schema version 2 to 4"
cp "$DATA"/chain-renumbered.* .
run 0 --library "$WORK/chain.sqlite" --json library import chain-renumbered.csv
[[ $(json_get 'd["couplings_added"]') == 0 ]] || fail "renumbered chain couplings stored again after the upgrade"
[[ $(json_get 'len(d["conflicts"])') == 0 ]] || fail "renumbered chain couplings conflict after the upgrade"
# Merging a version-2 file: its keys are recomputed before they are compared.
run 0 --library "$WORK/chain-fresh.sqlite" library init
run 0 --library "$WORK/chain-fresh.sqlite" library import chain-renumbered.csv
run 0 --library "$WORK/chain-fresh.sqlite" --json library merge "$DATA/v2-chain.sqlite"
[[ $(json_get 'd["couplings_added"]') == 0 ]] || fail "merging a version-2 library duplicated couplings"
# A version-2 library whose stored structure no longer reads: the upgrade is
# refused with the library and compound named, and the file stays at version 2.
cp "$DATA/v2-chain.sqlite" damaged.sqlite
/usr/bin/python3 -c "import sqlite3; c=sqlite3.connect('damaged.sqlite'); c.execute(\"update compounds set molfile='garbage'\"); c.commit()"
run 2 --library "$WORK/damaged.sqlite" library check; one_line_error; contains err "bromo-icosanol"; contains err "damaged.sqlite"
[[ $(count damaged.sqlite "pragma user_version") == 2 ]] || fail "a failed upgrade changed the version"
# A newer library is refused, and a non-library too.
cp lib.sqlite newer.sqlite
/usr/bin/python3 -c "import sqlite3; c=sqlite3.connect('newer.sqlite'); c.execute('pragma user_version=99'); c.commit()"
run 2 --library "$WORK/newer.sqlite" library show ethanol; one_line_error; contains err "newer"
echo "not a database" > junk.sqlite
run 2 --library "$WORK/junk.sqlite" library show ethanol; one_line_error
run 2 --library "$WORK/none.sqlite" library show ethanol; one_line_error; contains err "library init"
printf "x" >"$WORK/in-the-way"
run 2 --library "$WORK/in-the-way/lib.sqlite" library init; one_line_error; contains err "in-the-way"

# Rows sharing stereo-unassigned alternatives are one group (H-4a/H-4b in an
# unknown order), not two values of one coupling: importing the demo's file
# twice adds five couplings, reports no conflict, and finds them all present.
run 0 --library "$WORK/groups.sqlite" library init
run 0 --library "$WORK/groups.sqlite" --json library import "$VICINAL_DATA_DIR/examples/demo/couplings.csv"
[[ $(json_get 'len(d["conflicts"])') == 0 ]] || fail "alternatives reported as conflicts"
run 0 --library "$WORK/groups.sqlite" --json library import "$VICINAL_DATA_DIR/examples/demo/couplings.csv"
[[ $(json_get 'len(d["conflicts"])') == 0 ]] || fail "alternatives conflict on re-import"
[[ $(count groups.sqlite "select count(*) from couplings") == 5 ]] || fail "re-import added rows"
echo "library: ok"
