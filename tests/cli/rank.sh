#!/usr/bin/env bash
# vicinal rank: two diastereomers from SMILES (conformers generated), output
# shape, and bad input.
source "$(dirname "$0")/lib.sh"

# 3-chlorobutan-2-ol, two diastereomers with the same atom order. Open Babel
# appends hydrogens after the heavy atoms in atom order: H10 on C2, H12 on C4.
syn='C[C@@H](O)[C@H](C)Cl'
anti='C[C@@H](O)[C@@H](C)Cl'
cat >couplings.csv <<'CSV'
nuclei,j_hz,sigma_hz
"H10,H12",8.2,0.3
CSV
run 0 --json rank --couplings couplings.csv --candidate "syn=$syn" --candidate "anti=$anti" --max-conformers 6
got=$(json_get 'len(d["candidates"])'); [[ $got == 2 ]] || fail "candidates: $got"
got=$(json_get 'round(sum(c["probability"] for c in d["candidates"]), 9)'); [[ $got == 1.0 ]] || fail "probabilities sum to $got"
json_get 'd["candidates"][0]["name"], d["candidates"][0]["chi2"], d["candidates"][0]["contributions"][0]["value"]' >/dev/null \
  || fail "JSON keys"
got=$(json_get 'd["candidates"][0]["probability"] >= d["candidates"][1]["probability"]'); [[ $got == True ]] || fail "not sorted"
json_get 'd["verdict"]' | grep -q "confirm it independently" || fail "verdict lacks the caution"
got=$(json_get 'd["energies_used"]'); [[ $got == True ]] || fail "generated conformers should carry energies"

run 0 rank --couplings couplings.csv --candidate "syn=$syn" --candidate "anti=$anti" --max-conformers 6 \
  --errors student-t --free-populations
contains out "Student-t"
contains out "confirm it independently"

# Bad input: one-line errors, exit 2.
cat >missing.csv <<'CSV'
nuclei,j_hz,sigma_hz
"H10,H40",8.2,0.3
CSV
run 2 -q rank --couplings missing.csv --candidate "syn=$syn" --candidate "anti=$anti" --max-conformers 3
one_line_error; contains err "candidate syn"
run 2 -q rank --couplings couplings.csv --candidate "syn=$syn"; one_line_error; contains err "two candidates"
run 2 -q rank --couplings couplings.csv --candidate "syn" --candidate "anti=$anti"; one_line_error
printf 'nuclei,j_hz,sigma_hz\n"H10,H12",8.2,0\n' >zero.csv
run 2 -q rank --couplings zero.csv --candidate "syn=$syn" --candidate "anti=$anti" --max-conformers 3; one_line_error
echo "rank: ok"
