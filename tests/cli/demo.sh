#!/usr/bin/env bash
# vicinal demo and vicinal report: the shipped scenario end to end, the report
# rebuilt from the saved analysis, and bad analysis files refused.
source "$(dirname "$0")/lib.sh"

run 0 demo --out "$WORK/demo" --draws 200
for f in report.html analysis.json library.sqlite figures/couplings.pdf figures/multiplet.png \
         figures/karplus-1-H-2-H-3.svg tables/ranking.csv tables/allowed-angles.csv; do
  [[ -s "$WORK/demo/$f" ]] || fail "demo did not write $f"
done
# The invented data were made for a trans H-2/H-3 (diaxial, 9.1 Hz): the summary must say so.
contains "$WORK/out" "Favoured: trans (2R,3S)"
contains "$WORK/out" "ddd, J = 10.9, 9.1, 4.6 Hz"
contains "$WORK/out" "Report: $WORK/demo/report.html"
contains "$WORK/out" "Confirm it independently"
# The favoured candidate comes first in the ranking with the larger probability.
/usr/bin/python3 - "$WORK/demo/analysis.json" <<'PY' || fail "analysis.json ranking is not as expected"
import json, sys
d = json.load(open(sys.argv[1]))
c = d["candidates"]
assert d["format"] == "vicinal-analysis" and d["ranking"]["favoured"] == c[0]["name"] == "trans (2R,3S)"
assert c[0]["probability"] > c[1]["probability"]
# Every population set sums to one.
for cand in c:
    for key in ("population", "free_population"):
        assert abs(sum(x[key] for x in cand["conformers"]) - 1) < 1e-6, (cand["name"], key)
# A diaxial 9.1 Hz coupling allows an anti dihedral (common practice, no source).
h23 = d["couplings"][0]
assert h23["nuclei"] == "H-2,H-3"
assert any(iv["from"] <= 180 and iv["to"] >= 150 or iv["to"] >= -180 and iv["from"] <= -150 for iv in h23["allowed_deg"])
PY

# The report rebuilt from the saved analysis is the same page.
run 0 report "$WORK/demo/analysis.json" --out "$WORK/again/report.html"
cmp -s "$WORK/demo/report.html" "$WORK/again/report.html" || fail "report rebuilt from analysis.json differs"
[[ -s "$WORK/again/figures/couplings.svg" && -s "$WORK/again/tables/measured-couplings.csv" ]] || fail "report files missing"
lacks "$WORK/again/report.html" "<script"
lacks "$WORK/again/report.html" "src=\"http"
lacks "$WORK/again/report.html" "<link"
contains "$WORK/again/report.html" "Haasnoot"

run 0 --json report "$WORK/demo/analysis.json" --out "$WORK/again/r2.html" --no-files
[[ $(json_get 'd["report"]') == "$WORK/again/r2.html" ]] || fail "report --json names the wrong file"

# Bad input: exit 2, one line, nothing written.
run 2 report "$WORK/missing.json" --out "$WORK/bad.html"
one_line_error
echo '{"format": "vicinal-analysis", "version": 1, "title": ' > "$WORK/broken.json"
run 2 report "$WORK/broken.json" --out "$WORK/bad.html"
one_line_error
echo '{"format": "vicinal-analysis", "version": 1, "title": "t"}' > "$WORK/partial.json"
run 2 report "$WORK/partial.json" --out "$WORK/bad.html"
one_line_error
contains "$WORK/err" "compound"
echo '{"format": "something-else"}' > "$WORK/other.json"
run 2 report "$WORK/other.json" --out "$WORK/bad.html"
one_line_error
[[ ! -e "$WORK/bad.html" ]] || fail "a refused analysis left a report behind"
echo "demo ok"
