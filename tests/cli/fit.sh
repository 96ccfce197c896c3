#!/usr/bin/env bash
# vicinal fit (--matrix path) and vicinal rotamers: results, reproducibility, bad input.
source "$(dirname "$0")/lib.sh"

# Two conformers, one coupling: J = 0 and 10 Hz, measured 4.0 +- 0.5 Hz.
# Closed form: w2 = 0.4, chi2 = 0, range w2 = 0.4 +- sqrt(3.8415) * 0.5 / 10
# (chi-square 1 dof, 95 %; common practice, no source).
cat >couplings.csv <<'CSV'
nuclei,j_hz,sigma_hz
"H-1,H-2",4.0,0.5
CSV
cat >matrix.csv <<'CSV'
title,H-1/H-2
anti,0
gauche,10
CSV
run 0 --json fit --couplings couplings.csv --matrix matrix.csv --seed 5
got=$(json_get 'round(d["populations"][1]["weight"], 6)'); [[ $got == 0.4 ]] || fail "weight $got"
got=$(json_get 'round(d["populations"][1]["range"][0], 4), round(d["populations"][1]["range"][1], 4)')
[[ $got == "0.302 0.498" ]] || fail "range $got"
got=$(json_get 'round(d["populations"][1]["sd"], 2)'); [[ $got == 0.05 ]] || fail "Monte Carlo sd $got"
json_get 'd["chi2"], d["rmsd_hz"], d["residuals"][0]["coupling"], d["populations"][0]["ci95"][1], d["populations"][0]["conformer"]' >keys || fail "JSON keys"
contains keys "H-1/H-2"
contains keys "anti"
cp out first.json
# Same seed, same numbers; another seed, other numbers.
run 0 --json fit --couplings couplings.csv --matrix matrix.csv --seed 5
cmp -s out first.json || fail "same seed gave different output"
run 0 --json fit --couplings couplings.csv --matrix matrix.csv --seed 6
! cmp -s out first.json || fail "another seed gave identical output"

# Tables by default, with the verdict.
run 0 fit --couplings couplings.csv --matrix matrix.csv --draws 200
contains out "range at chi2 + 3.84"
contains out "reproduce every coupling within 2 sigma"

# A coupling no mixture can reach: the verdict says so.
cat >far.csv <<'CSV'
nuclei,j_hz,sigma_hz
"H-1,H-2",14.0,0.3
CSV
run 0 fit --couplings far.csv --matrix matrix.csv --draws 0
contains out "No mixture of these conformers fits H-1/H-2 within 2 sigma"

# Figures: bar chart and observed-vs-predicted, both written.
run 0 fit --couplings couplings.csv --matrix matrix.csv --draws 100 --svg pops.svg
[[ -s pops.svg && -s pops-couplings.svg ]] || fail "figures not written"
contains pops.svg "<svg"

# Bad input: one-line errors, exit 2, no files left behind.
cat >zero.csv <<'CSV'
nuclei,j_hz,sigma_hz
"H-1,H-2",4.0,0
CSV
run 2 fit --couplings zero.csv --matrix matrix.csv; one_line_error; contains err "sigma_hz must be above 0"
run 2 fit --couplings zero.csv --matrix matrix.csv --rms-hz 0; one_line_error
printf 'nuclei,j_hz,sigma_hz\n' >none.csv
run 2 fit --couplings none.csv --matrix matrix.csv; one_line_error; contains err "no couplings"
printf 'title,H-1/H-2\n' >empty.csv
run 2 fit --couplings couplings.csv --matrix empty.csv; one_line_error; contains err "no conformer"
printf 'title,H-7/H-8\nx,1\n' >other.csv
run 2 fit --couplings couplings.csv --matrix other.csv; one_line_error; contains err "no column for the coupling H-1,H-2"
printf 'nuclei,j_hz\n"H-1,H-2",4.0\n' >nosigma.csv
run 2 fit --couplings nosigma.csv --matrix matrix.csv; one_line_error; contains err "sigma"
run 0 fit --couplings nosigma.csv --matrix matrix.csv --sigma-hz 0.5 --draws 0
run 2 fit --couplings couplings.csv; one_line_error
run 2 fit --couplings couplings.csv --matrix matrix.csv --model rotamer-angles; one_line_error
run 2 fit --couplings couplings.csv --matrix matrix.csv --draws 1; one_line_error
run 2 fit --couplings couplings.csv --matrix matrix.csv --svg pops.txt; one_line_error
[[ ! -e pops.txt ]] || fail "a file was left behind"
echo "fit: ok"
