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

# The report page: parameters with uncertainties, the chi^2 map, the couplings
# figure and the cycle figure; every figure as SVG, PDF and PNG, tables as CSV;
# `vicinal report` rebuilds the same page from pucker.json alone.
run 0 pucker fit --ring deoxyribose --couplings "$EX/deoxy-nucleoside.csv" --report "$WORK/pr" --map-step-deg 10
contains err "report written to $WORK/pr/report.html"
for f in pucker.json report.html figures/chi2-map.svg figures/chi2-map.pdf figures/chi2-map.png figures/cycle.svg \
         figures/couplings.png tables/pucker-parameters.csv tables/pucker-couplings.csv tables/pucker.json; do
  [[ -s "$WORK/pr/$f" ]] || fail "report file $f missing"
done
for id in summary parameters ring-couplings provenance; do contains pr/report.html "<section id=\"$id\">"; done
[[ $(grep -o "<figure" pr/report.html | wc -l) -eq 3 ]] || fail "the pucker page should hold 3 figures"
contains pr/report.html "chi² over (P_N, P_S)"; contains pr/report.html "Ring couplings around the pseudorotation cycle"
contains pr/report.html "C2&#39;-endo"; contains pr/report.html "x_S"; lacks pr/report.html "<script"
contains pr/tables/pucker-parameters.csv "P_S / deg"
/usr/bin/python3 - "$WORK/pr/pucker.json" <<'PY' || fail "pucker.json does not match the fit"
import json, sys
d = json.load(open(sys.argv[1]))
assert d["format"] == "vicinal-pucker-fit" and d["version"] == 1, d["format"]
m = d["map"]
assert len(m["chi2"]) == len(m["phase_n_deg"]) * len(m["phase_s_deg"]), "map grid"
# The map's smallest value is not below the fitted minimum (the fit is the best point).
assert min(m["chi2"]) >= d["chi2"] - 1e-6, (min(m["chi2"]), d["chi2"])
assert 0 < d["parameters"]["x_S"]["sd"] < 0.5
PY
run 0 report "$WORK/pr/pucker.json" --out "$WORK/pr2/report.html"
cmp -s "$WORK/pr/report.html" "$WORK/pr2/report.html" || fail "page rebuilt from pucker.json differs"
[[ -s "$WORK/pr2/figures/chi2-map.svg" ]] || fail "rebuilt figures missing"
printf '{"format": "vicinal-pucker-fit", "version": 1, "title": "x"}' >broken.json
run 2 report broken.json --out "$WORK/broken/report.html"; one_line_error; contains err "broken.json"
[[ ! -e "$WORK/broken/report.html" ]] || fail "a page was written for a broken document"

# Proline: the pyrrolidine ring (ring torsions and relations checked against
# RDKit in tests/validation/proline_pucker_rdkit.py). C-gamma-exo at P = 18,
# C-gamma-endo at P = 198 (endo = towards the carbonyl carbon; common practice, from memory).
run 0 --json pucker predict --ring proline --phase-deg 18 --amplitude-deg 38
[[ $(json_get 'd["nearest_envelope"]') == "CG-exo" ]] || fail "proline P 18 should be CG-exo"
json_get 'd["torsions_deg"][1] < 0' | grep -qx True || fail "chi1 should be negative for CG-exo"
run 0 --json pucker predict --ring proline --phase-deg 198 --amplitude-deg 38
[[ $(json_get 'd["nearest_envelope"]') == "CG-endo" ]] || fail "proline P 198 should be CG-endo"
run 0 --json pucker fit --ring proline --couplings "$EX/proline.csv" --fix none --tie-amplitudes
json_get '0.5 < d["parameters"]["x_S"]["value"] < 0.85 and 150 < d["parameters"]["P_S"]["value"] < 210' \
  | grep -qx True || fail "proline example: $(json_get 'd["parameters"]')"
json_get 'd["parameters"]["P_S"]["nearest_envelope"] in ("CG-endo", "CB-exo")' | grep -qx True || fail "proline South name"

# Ribose: three couplings; with P_N fixed as well the fit still runs.
run 0 pucker fit --ring ribose --couplings "$EX/ribonucleoside.csv" --fix amplitudes,pn --pn-deg 9
contains out "P_N = 9"

# Bad input: one-line errors naming line and column, exit 2, no half-written map.
printf "coupling,j_hz,sigma_hz\nH1'-H2',9.1,0.3\nH5'-H4',3,0.3\n" >bad.csv
run 2 pucker fit --couplings bad.csv; one_line_error; contains err "bad.csv:3"; contains err "'coupling'"
run 2 pucker fit --couplings bad.csv --report "$WORK/never"; one_line_error
[[ ! -e "$WORK/never" ]] || fail "bad input left a report folder"
# A report folder that cannot be created (a file in the way) is named, exit 2.
printf "x" >"$WORK/a-file"
run 2 pucker fit --ring deoxyribose --couplings "$EX/deoxy-nucleoside.csv" --report "$WORK/a-file/report"
one_line_error; contains err "a-file/report"
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
