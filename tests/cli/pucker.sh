#!/usr/bin/env bash
# vicinal pucker: ring list, forward couplings, two-state fit, chi^2 map, bad input.
source "$(dirname "$0")/lib.sh"
EX="$VICINAL_DATA_DIR/examples/pucker"

run 0 pucker rings
contains out "deoxyribose"; contains out "ribose"; contains out "H2''-H3'"

# Facts of the trade for ribose (common practice, from memory): C3'-endo
# (P ~ 18, A-form RNA) has J(H1',H2') below 2 Hz and J(H3',H4') near 9 Hz;
# C2'-endo (P ~ 162) has J(H1',H2') near 8 Hz and J(H3',H4') below 2 Hz.
run 0 --json pucker predict --ring ribose --phase-deg 18 --amplitude-deg 38
[[ $(json_get 'd["nearest_envelope"]') == "C3'-endo" ]] || fail "P 18 is not C3'-endo"
json_get '[c["j_hz"] for c in d["couplings"] if c["name"]=="H1'"'"'-H2'"'"'"][0] < 2.0' | grep -qx True || fail "ribose N J1'2'"
json_get '[c["j_hz"] for c in d["couplings"] if c["name"]=="H3'"'"'-H4'"'"'"][0] > 7.5' | grep -qx True || fail "ribose N J3'4'"
run 0 --json pucker predict --ring ribose --phase-deg 162 --amplitude-deg 38
json_get '[c["j_hz"] for c in d["couplings"] if c["name"]=="H1'"'"'-H2'"'"'"][0] > 7.0' | grep -qx True || fail "ribose S J1'2'"
json_get '[c["j_hz"] for c in d["couplings"] if c["name"]=="H3'"'"'-H4'"'"'"][0] < 2.5' | grep -qx True || fail "ribose S J3'4'"
# DNA (C2'-endo): J(H1',H2') > J(H1',H2'') and J(H2'',H3') small (common practice, from memory).
run 0 --json pucker predict --ring deoxyribose --phase-deg 162 --amplitude-deg 36
json_get '(lambda j: j["H1'"'"'-H2'"'"'"] > j["H1'"'"'-H2'"'"''"'"'"] and j["H2'"'"''"'"'-H3'"'"'"] < 3)({c["name"]: c["j_hz"] for c in d["couplings"]})' \
  | grep -qx True || fail "deoxyribose S couplings"

# The shipped example: a mostly South deoxynucleoside (invented data).
run 0 pucker fit --ring deoxyribose --couplings "$EX/deoxy-nucleoside.csv" --map "$WORK/map.svg"
contains out "P_N"; contains out "Constraints: nu_max_N = 36, nu_max_S = 36"; contains out "C2'-endo"
contains "$WORK/map.svg" "<svg"
run 0 --json pucker fit --ring deoxyribose --couplings "$EX/deoxy-nucleoside.csv"
json_get '0.5 < d["parameters"]["x_S"]["value"] < 0.95' | grep -qx True || fail "x_S of the example"
json_get 'd["parameters"]["x_S"]["sd"] > 0' | grep -qx True || fail "x_S has no uncertainty"

# Monte Carlo uncertainties are reproducible with a seed.
run 0 --json pucker fit --ring deoxyribose --couplings "$EX/deoxy-nucleoside.csv" --monte-carlo 30 --seed 4
a=$(json_get 'd["parameters"]["P_S"]["sd"]')
run 0 --json pucker fit --ring deoxyribose --couplings "$EX/deoxy-nucleoside.csv" --monte-carlo 30 --seed 4
b=$(json_get 'd["parameters"]["P_S"]["sd"]')
[[ $a == "$b" ]] || fail "Monte Carlo differs with the same seed: $a vs $b"
json_get 'd["uncertainty_from"]' | grep -q "seed 4" || fail "seed not reported"

# Ribose: three couplings; with P_N fixed as well the fit still runs.
run 0 pucker fit --ring ribose --couplings "$EX/ribonucleoside.csv" --fix amplitudes,pn --pn-deg 9
contains out "P_N = 9"

# Bad input: one-line errors naming line and column, exit 2, no half-written map.
printf "coupling,j_hz,sigma_hz\nH1'-H2',9.1,0.3\nH5'-H4',3,0.3\n" >bad.csv
run 2 pucker fit --couplings bad.csv; one_line_error; contains err "bad.csv:3"; contains err "'coupling'"
printf "coupling,j_hz,sigma_hz\nH1'-H2',nine,0.3\n" >bad2.csv
run 2 pucker fit --couplings bad2.csv; one_line_error; contains err "bad2.csv:2"; contains err "'j_hz'"
printf "coupling,j_hz,sigma_hz\nH1'-H2',9,0\n" >bad3.csv
run 2 pucker fit --couplings bad3.csv; one_line_error; contains err "sigma_hz"
run 2 pucker fit --couplings "$EX/ribonucleoside.csv" --ring ribose --fix none; one_line_error; contains err "free parameters"
run 2 pucker fit --couplings "$EX/deoxy-nucleoside.csv" --fix sugar; one_line_error
run 2 pucker fit --couplings "$EX/deoxy-nucleoside.csv" --ring hexose; one_line_error; contains err "unknown ring type"
run 2 pucker fit --couplings "$EX/deoxy-nucleoside.csv" --map "$WORK/map.txt"; one_line_error
[[ ! -e "$WORK/map.txt" ]] || fail "a map with a bad extension was written"
run 2 pucker fit --couplings missing.csv; one_line_error
echo "pucker: ok"
