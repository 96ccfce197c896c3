#!/usr/bin/env bash
# vicinal configuration: the six staggered arrangements, ambiguity, bad input.
source "$(dirname "$0")/lib.sh"
EX="$VICINAL_DATA_DIR/examples/acyclic"

# Invented example: couplings of the threo rotamer with H2 anti C4.
run 0 configuration --couplings "$EX/methyl-carbinol.csv"
contains out "threo"; contains out "Candidates"; contains out "Matsumori"
run 0 --json configuration --couplings "$EX/methyl-carbinol.csv"
[[ $(json_get 'd["verdict"]') == clear ]] || fail "example verdict: $(json_get 'd["statement"]')"
[[ $(json_get 'd["candidates"][0]["name"]') == "threo, H2 anti C4" ]] || fail "example best: $(json_get 'd["candidates"][0]["name"]')"

# The report page: measured and predicted couplings of the six arrangements,
# the deviation and score figures; rebuilt unchanged from configuration.json.
run 0 configuration --couplings "$EX/methyl-carbinol.csv" --report "$WORK/cr"
for f in configuration.json report.html figures/deviations.svg figures/deviations.pdf figures/scores.png \
         tables/candidates.csv tables/arrangement-couplings.csv tables/measured-couplings.csv; do
  [[ -s "$WORK/cr/$f" ]] || fail "report file $f missing"
done
for id in summary arrangements candidates provenance; do contains cr/report.html "<section id=\"$id\">"; done
[[ $(grep -o "<figure" cr/report.html | wc -l) -eq 2 ]] || fail "the configuration page should hold 2 figures"
contains cr/report.html "How far each coupling lies from each arrangement"
contains cr/report.html "threo, H2 anti C4"; contains cr/report.html "Matsumori"
# The best candidate's row leads the candidates table; every arrangement is a row of the prediction table.
/usr/bin/python3 - "$WORK/cr" <<'PY' || fail "configuration tables disagree with the document"
import csv, json, sys
d = json.load(open(sys.argv[1] + "/configuration.json"))
rows = list(csv.reader(open(sys.argv[1] + "/tables/candidates.csv")))
assert rows[1][1] == d["candidates"][0]["name"] == "threo, H2 anti C4", rows[1]
pred = list(csv.reader(open(sys.argv[1] + "/tables/arrangement-couplings.csv")))
assert [r[1] for r in pred[1:]] == [a["short_name"] for a in d["arrangements"]] and len(pred) == 7
assert d["format"] == "vicinal-configuration" and [m["name"] for m in d["measured"]][0] == "H2-H3"
PY
run 0 report "$WORK/cr/configuration.json" --out "$WORK/cr2/report.html"
cmp -s "$WORK/cr/report.html" "$WORK/cr2/report.html" || fail "page rebuilt from configuration.json differs"

# Only 3J(H2,H3) large: both configurations have an anti H/H rotamer (Matsumori
# et al., J. Org. Chem. 64, 866, 1999, from memory): reported as ambiguous.
printf "coupling,j_hz,sigma_hz\nH2-H3,9.6,0.3\n" >hh.csv
run 0 configuration --couplings hh.csv
contains out "Ambiguous"
run 0 --json configuration --couplings hh.csv
[[ $(json_get 'd["verdict"]') == ambiguous ]] || fail "one large 3J(H,H) should be ambiguous"

# Oxygen on C3: 2J(C3,H2) becomes available.
printf "coupling,j_hz,sigma_hz\nH2-H3,2.1,0.3\nC3-H2,-5.5,0.5\nC2-H3,-0.5,0.5\nH2-C4,2,0.5\nH3-C1,2,0.5\n" >diol.csv
run 0 --json configuration --couplings diol.csv --x3 oxygen
json_get 'len(d["arrangements"])' | grep -qx 6 || fail "six arrangements expected"

# Bad input.
run 2 configuration --couplings diol.csv; one_line_error; contains err "diol.csv:3"; contains err "C3-H2"
printf "coupling,j_hz,sigma_hz\nH2-H3,x,0.3\n" >bad.csv
run 2 configuration --couplings bad.csv; one_line_error; contains err "bad.csv:2"
run 2 configuration --couplings hh.csv --x3 nitrogen; one_line_error
run 2 configuration --couplings nothing.csv; one_line_error
echo "configuration: ok"
