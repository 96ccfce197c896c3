#!/usr/bin/env bash
# vicinal predict: tables, JSON keys, labels, the J matrix CSV and bad input.
DATA=$(cd "$(dirname "$0")/../data/structure" && pwd)
source "$(dirname "$0")/lib.sh"

# Every H-C-C-H of the oxane chair with the Haasnoot sets (auto).
run 0 --json predict --structure "$DATA/oxane-chair.sdf"
[[ $(json_get 'd["conformers"]') == 1 ]] || fail "one conformer expected"
json_get 'sorted(d["couplings"][0].keys())' | grep -q "'dihedral_deg', 'j_hz', 'name', 'nuclei', 'path', 'per_conformer', 'set'" \
  || fail "JSON keys: $(json_get 'sorted(d["couplings"][0].keys())')"
json_get 'all(c["set"].startswith("hh-haasnoot-1980") for c in d["couplings"])' | grep -q True || fail "auto set"
# Oxane: C2-C3, C3-C5... ring CH2-CH2 pairs (C1-C2, C2-C3, C5-C6, C6-C1 = 4 bonds x 4 pairs).
[[ $(json_get 'len(d["couplings"])') == 16 ]] || fail "16 ring H-C-C-H pairs expected, got $(json_get 'len(d["couplings"])')"

# Listed couplings by label, with measured values, a table and --explain.
cat >"$WORK/c.csv" <<'CSV'
nuclei,j_hz,sigma_hz,note
"H-2a,H-3a",11.2,0.3,
"H-2a,H-3b",4.1,0.3,
CSV
run 0 predict --structure "$DATA/oxane-chair.sdf" --labels "$DATA/oxane-labels.csv" --couplings "$WORK/c.csv" --explain
contains out "H-2a/H-3a"
contains out "J obs / Hz"
contains out "dchi_alpha"
contains out "Haasnoot set"

# The J matrix as CSV.
run 0 predict --structure "$DATA/oxane-chair.sdf" --labels "$DATA/oxane-labels.csv" --couplings "$WORK/c.csv" --csv "$WORK/m.csv"
[[ -s "$WORK/m.csv" ]] || fail "no matrix written"
head -1 "$WORK/m.csv" | grep -q "^conformer,title,weight,H-2a/H-3a j_hz" || fail "matrix header: $(head -1 "$WORK/m.csv")"

# A multi-model PDB: backbone couplings by PDB name (CHAIN:RESNUM:ATOM) and by pattern.
run 0 --json predict --ensemble "$DATA/ala4-models.pdb" --structure "$DATA/ala4-models.pdb" --set hn-ha-vogeli-2007
[[ $(json_get 'd["conformers"]') == 3 ]] || fail "3 models expected"
[[ $(json_get 'len(d["couplings"])') == 3 ]] || fail "3 phi couplings (residues 2-4) expected"

# Bad input: one line, exit 2, nothing written.
rm -f "$WORK/m.csv"
run 2 predict --structure "$WORK/missing.sdf" --csv "$WORK/m.csv"; one_line_error; contains err "missing.sdf"
head -c 300 "$DATA/oxane-chair.sdf" >"$WORK/cut.sdf"
run 2 predict --structure "$WORK/cut.sdf" --csv "$WORK/m.csv"; one_line_error; contains err "cut.sdf"
printf 'nuclei\n"H-2a,H-9z"\n' >"$WORK/bad-label.csv"
run 2 predict --structure "$DATA/oxane-chair.sdf" --labels "$DATA/oxane-labels.csv" --couplings "$WORK/bad-label.csv" --csv "$WORK/m.csv"
one_line_error; contains err "unknown atom label 'H-9z'"; contains err "bad-label.csv:2"
printf 'nuclei\n"H-2a,H-5a"\n' >"$WORK/far.csv"
run 2 predict --structure "$DATA/oxane-chair.sdf" --labels "$DATA/oxane-labels.csv" --couplings "$WORK/far.csv" --csv "$WORK/m.csv"
one_line_error; contains err "bonds apart"
printf 'nuclei\n"H-2a,H-2a"\n' >"$WORK/same.csv"
run 2 predict --structure "$DATA/oxane-chair.sdf" --labels "$DATA/oxane-labels.csv" --couplings "$WORK/same.csv"
one_line_error; contains err "two different atoms"
printf 'nuclei\n"H-2a,H-3a|H-3b"\n' >"$WORK/alt.csv"
run 2 predict --structure "$DATA/oxane-chair.sdf" --labels "$DATA/oxane-labels.csv" --couplings "$WORK/alt.csv"
one_line_error; contains err "alternative"
# Frames with different atom counts: the first differing frame is named.
{ printf '3\na\nO 0 0 0\nH 0.96 0 0\nH -0.24 0.93 0\n'; printf '2\nb\nO 0 0 0\nH 0.96 0 0\n'; } >"$WORK/water.xyz"
run 2 predict --ensemble "$WORK/water.xyz" --csv "$WORK/m.csv"; one_line_error; contains err "frame 2 has 2 atoms"
run 2 predict --structure "$DATA/oxane-chair.sdf" --set no-such-set; one_line_error
[[ ! -e "$WORK/m.csv" ]] || fail "a failed run wrote the matrix"
echo "predict: ok"
