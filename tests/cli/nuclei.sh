#!/usr/bin/env bash
# vicinal nuclei: listing, isotopologue scaling and bad input.
source "$(dirname "$0")/lib.sh"

run 0 nuclei
for iso in 1H 2H 3H 13C 15N 19F 29Si 31P 77Se 113Cd 119Sn 195Pt; do contains out "$iso"; done
contains out "Pure Appl. Chem. 73, 1795"

# J(H,D) = J(H,H) x gamma(2H)/gamma(1H); ratio 0.15350 from the IUPAC 2001 table
# (Harris et al., Pure Appl. Chem. 73, 1795, Table 1 and 2). Source: that table.
run 0 --json nuclei scale --j 10 --to 1H,2H
got=$(json_get 'round(d["to"]["j_hz"], 3)')
[[ $got == 1.535 ]] || fail "J(H,D) from 10 Hz: $got, expected 1.535"
# Global options are accepted after the command too.
run 0 nuclei scale --j 10 --to 1H,2H --json
json_get 'd["to"]["nuclei"]' | grep -q "2H" || fail "JSON after the command"

# Bad input: one-line errors, exit code 2.
run 2 nuclei scale --j 10 --to 1H,99X; one_line_error; contains err "unknown isotope"
run 2 nuclei scale --j 10 --to 1H13C; one_line_error
run 2 nuclei scale --j abc --to 1H,2H; one_line_error
run 2 nuclei scale --j 10 --between 1H,1H --to 13C,2H; one_line_error; contains err "isotopologues"
run 2 no-such-command; one_line_error
echo "nuclei: ok"
