#!/usr/bin/env bash
# vicinal library derive: dihedral intervals stored in derived_results for each
# 3J coupling, replaced when derived again, shown by library show (text, JSON),
# carried by JSON/SDF export, import and merge (round trips exact, not doubled).
# Outside check: the stored interval ends against an independent numpy grid
# solution of |J(phi) - J| <= 2 sigma for the Fourier form
# J = C0 + C1 cos(phi) + C2 cos(2 phi) with the shipped set hh-karplus-1963
# (C0 = 7, C1 = -1, C2 = 5, rms 0).
# Source: M. Karplus, 1963, J. Am. Chem. Soc. 85, 2870 (coefficients as cited in
# db/karplus/hh-karplus-1963.json). The J values are invented.
source "$(dirname "$0")/lib.sh"
L=(--library "$WORK/lib.sqlite")
count() { /usr/bin/python3 -c "import sqlite3,sys; print(sqlite3.connect(sys.argv[1]).execute(sys.argv[2]).fetchone()[0])" "$@"; }

# Ethanol from SMILES CCO: C1 C2 O3, methyl H 4-6, CH2 H 7-8, OH 9.
cat > a.csv <<'CSV'
compound,smiles,measurement,solvent,nuclei,j_hz,sigma_hz,set
ethanol,CCO,run 1,CDCl3,"4,7",7.0,0.1,hh-karplus-1963
ethanol,,run 1,CDCl3,"7,9",5.1,0.2,
ethanol,,run 1,CDCl3,"4,5",-12.0,0.2,
CSV
run 0 "${L[@]}" library import a.csv
run 0 "${L[@]}" --json library derive
[[ $(json_get 'd["couplings_derived"]') == 1 ]] || fail "one 3J coupling with a set expected"
[[ $(json_get 'd["skipped"]["not a 3J coupling"]') == 1 ]] || fail "the 2J coupling was not skipped"
[[ $(json_get 'sum(d["skipped"].values())') == 2 ]] || fail "two couplings should be skipped"
rows=$(count "$WORK/lib.sqlite" "select count(*) from derived_results")
[[ $rows -ge 2 ]] || fail "expected at least two intervals, got $rows"

/usr/bin/python3 - "$WORK/lib.sqlite" <<'PY' || fail "stored intervals differ from the numpy grid solution"
import sqlite3, sys
import numpy as np
rows = sqlite3.connect(sys.argv[1]).execute(
    "select karplus_set, from_deg, to_deg from derived_results order by from_deg").fetchall()
assert all(r[0] == "hh-karplus-1963" for r in rows), rows
phi = np.linspace(-180, 180, 3_600_001)
j = 7.0 - np.cos(np.radians(phi)) + 5.0 * np.cos(np.radians(2 * phi))
inside = np.abs(j - 7.0) <= 2 * 0.1
edges = np.flatnonzero(np.diff(inside.astype(int)))
starts = [phi[0]] if inside[0] else []
starts += [phi[k + 1] for k in edges if not inside[k]]
ends = [phi[k] for k in edges if inside[k]] + ([phi[-1]] if inside[-1] else [])
assert len(starts) == len(rows), (starts, ends, rows)
for (s, f, t), a, b in zip(rows, starts, ends):
    assert abs(f - a) < 0.01 and abs(t - b) < 0.01, (f, t, a, b)
print(f"{len(rows)} intervals agree with the grid to 0.01 deg")
PY

# Deriving again replaces, it does not add.
run 0 "${L[@]}" library derive ethanol
[[ $(count "$WORK/lib.sqlite" "select count(*) from derived_results") == "$rows" ]] || fail "derive again added rows"

run 0 "${L[@]}" --json library show ethanol
[[ $(json_get 'd["sets"][0]["couplings"][0]["derived"][0]["karplus_set"]') == hh-karplus-1963 ]] || fail "show --json lacks the derived set"
[[ $(json_get 'len(d["sets"][0]["couplings"][0]["derived"][0]["intervals"])') == "$rows" ]] || fail "show --json intervals"
[[ $(json_get 'd["sets"][0]["couplings"][1]["derived"]') == "[]" ]] || fail "an underived coupling shows results"
run 0 "${L[@]}" library show ethanol
contains out "(hh-karplus-1963)"

# Derived rows travel with the couplings through export and import: JSON and
# SDF round trips are exact. created_utc is first set to a fixed past time so
# that a re-stamped row cannot pass by being written in the same second.
/usr/bin/python3 -c "import sqlite3,sys; c=sqlite3.connect(sys.argv[1]); c.execute(\"update derived_results set created_utc = '2023-02-03T04:05:06Z'\"); c.commit()" "$WORK/lib.sqlite"
# rows DB: the derived rows with their coupling's identity and J, in a fixed
# order, read with Python's sqlite3 (not through vicinal).
rows_of() {
  /usr/bin/python3 -c "import sqlite3,sys; print(sqlite3.connect(sys.argv[1]).execute('select k.identity, k.j_hz, d.karplus_set, d.from_deg, d.to_deg, d.created_utc from derived_results d join couplings k on k.id = d.coupling_id order by 1, 2, 3, 4, 5').fetchall())" "$1"
}
for ext in json sdf; do
  run 0 "${L[@]}" library export "all.$ext"
  contains "all.$ext" "2023-02-03T04:05:06Z"
  run 0 --library "$WORK/rt-$ext.sqlite" library import "all.$ext"
  run 0 --library "$WORK/rt-$ext.sqlite" library export "again.$ext"
  cmp "all.$ext" "again.$ext" || fail "$ext round trip with derived results differs"
  [[ "$(rows_of "$WORK/rt-$ext.sqlite")" == "$(rows_of "$WORK/lib.sqlite")" ]] || fail "$ext import changed derived rows"
  # Importing the export into the library it came from adds no derived row.
  run 0 "${L[@]}" library import "all.$ext"
  [[ $(count "$WORK/lib.sqlite" "select count(*) from derived_results") == "$rows" ]] || fail "$ext re-import doubled"
done
run 0 "${L[@]}" library export all.csv
contains err "derived dihedral intervals left out"
run 0 "${L[@]}" library export --help
contains out "CSV,"; contains out "has no place for them"

# merge carries the other library's derived rows to the matching couplings,
# and merging again (or merging into their source) does not double them.
run 0 --library "$WORK/m.sqlite" library import a.csv
[[ $(count "$WORK/m.sqlite" "select count(*) from derived_results") == 0 ]] || fail "fresh library has derived rows"
run 0 --library "$WORK/m.sqlite" --json library merge "$WORK/lib.sqlite"
[[ $(json_get 'd["couplings_added"]') == 0 ]] || fail "merge added couplings"
[[ "$(rows_of "$WORK/m.sqlite")" == "$(rows_of "$WORK/lib.sqlite")" ]] || fail "merge did not carry the derived rows"
run 0 --library "$WORK/m.sqlite" library merge "$WORK/lib.sqlite"
[[ $(count "$WORK/m.sqlite" "select count(*) from derived_results") == "$rows" ]] || fail "merging twice doubled"
run 0 "${L[@]}" library merge "$WORK/m.sqlite"
[[ $(count "$WORK/lib.sqlite" "select count(*) from derived_results") == "$rows" ]] || fail "merge back doubled"
# A coupling that has rows for a set keeps them: other rows for that set in
# the merged library do not join them.
cp lib.sqlite shifted.sqlite
/usr/bin/python3 -c "import sqlite3,sys; c=sqlite3.connect(sys.argv[1]); c.execute('update derived_results set from_deg = from_deg - 1'); c.commit()" shifted.sqlite
run 0 "${L[@]}" library merge "$WORK/shifted.sqlite"
[[ "$(rows_of "$WORK/lib.sqlite")" == "$(rows_of "$WORK/m.sqlite")" ]] || fail "merge mixed two derivations"

# Bad derived rows are refused with the file, the JSON path and the field;
# nothing is stored.
bad_json() {  # bad_json OUT KEY VALUE: all.json with derived[0].KEY = VALUE (JSON text)
  /usr/bin/python3 -c "
import json, sys
d = json.load(open('all.json'))
row = d['compounds'][0]['sets'][0]['couplings'][0]['derived'][0]
row[sys.argv[2]] = json.loads(sys.argv[3])
json.dump(d, open(sys.argv[1], 'w'))" "$@"
}
at='compounds[0].sets[0].couplings[0].derived[0]'
bad_json bad-range.json from_deg 200
bad_json bad-order.json from_deg 170
bad_json bad-set.json karplus_set '"hh-no-such-set"'
bad_json bad-time.json created_utc '"yesterday"'
bad_json bad-key.json colour '"red"'
for f in bad-range:from_deg bad-order:to_deg bad-set:karplus_set bad-time:created_utc bad-key:colour; do
  run 2 --library "$WORK/bad.sqlite" library import "${f%%:*}.json"; one_line_error
  contains err "${f%%:*}.json"; contains err "$at"; contains err "${f#*:}"
done
contains err "unknown key 'colour'"
run 2 --library "$WORK/bad.sqlite" library import bad-range.json; contains err "outside [-180, 180]"
run 2 --library "$WORK/bad.sqlite" library import bad-order.json; contains err "ends before it starts"
run 2 --library "$WORK/bad.sqlite" library import bad-set.json; contains err "unknown Karplus set 'hh-no-such-set'"
[[ ! -e bad.sqlite ]] || [[ $(count "$WORK/bad.sqlite" "select count(*) from couplings") == 0 ]] || fail "a refused file left rows"
# The same rule for a library to merge (300 passes the table's CHECK).
cp lib.sqlite wrong.sqlite
/usr/bin/python3 -c "import sqlite3,sys; c=sqlite3.connect(sys.argv[1]); c.execute('update derived_results set from_deg = 300, to_deg = 310'); c.commit()" wrong.sqlite
run 2 --library "$WORK/m.sqlite" library merge "$WORK/wrong.sqlite"; one_line_error
contains err "wrong.sqlite"; contains err "derived[0].from_deg"

run 2 "${L[@]}" library derive nothing-like-this; one_line_error
run 2 "${L[@]}" library derive --set no-such-set; one_line_error; contains err "no-such-set"
echo "library_derive: ok"
