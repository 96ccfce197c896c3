#!/usr/bin/env bash
# vicinal library derive: dihedral intervals stored in derived_results for each
# 3J coupling, replaced when derived again, shown by library show (text, JSON).
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

run 2 "${L[@]}" library derive nothing-like-this; one_line_error
run 2 "${L[@]}" library derive --set no-such-set; one_line_error; contains err "no-such-set"
echo "library_derive: ok"
