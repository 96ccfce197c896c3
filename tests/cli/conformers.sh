#!/usr/bin/env bash
# vicinal conformers generate|info: files, JSON keys, weights and bad input.
source "$(dirname "$0")/lib.sh"

run 0 --json conformers generate --smiles 'CCCC' --out "$WORK/butane.sdf"
[[ -s "$WORK/butane.sdf" ]] || fail "no SDF written"
[[ $(json_get 'len(d["conformers"])') == 3 ]] || fail "butane: anti and two gauche expected"
json_get 'round(sum(c["weight"] for c in d["conformers"]), 9)' | grep -qx "1.0" || fail "weights do not add to 1"
json_get 'sorted(d["conformers"][0].keys())' | grep -q "'energy_kcal_mol', 'index', 'relative_kcal_mol', 'title', 'weight'" \
  || fail "conformer keys"
grep -q "vicinal_energy_kcal_mol" "$WORK/butane.sdf" || fail "energy field missing"
grep -q "vicinal_weight" "$WORK/butane.sdf" || fail "weight field missing"

# info reads it back; the weights at another temperature follow Boltzmann:
# w_gauche / w_anti = exp(-dE / RT) (common practice, no source).
run 0 --json conformers info "$WORK/butane.sdf" --temperature-k 400
/usr/bin/python3 - "$WORK/out" <<'PY' || fail "Boltzmann weights at 400 K"
import json, math, sys
d = json.load(open(sys.argv[1]))
c = d["conformers"]
rt = 8.314462618e-3 / 4.184 * 400
for x in c:
    expect = math.exp(-x["relative_kcal_mol"] / rt) / sum(math.exp(-y["relative_kcal_mol"] / rt) for y in c)
    assert abs(x["weight"] - expect) < 1e-9, (x, expect)
assert d["weights"] == "energies"
PY
run 0 conformers info "$WORK/butane.sdf"
contains out "3 conformers"

# Bad input: one line, exit 2, nothing written.
run 2 conformers generate --smiles 'C1CC(' --out "$WORK/bad.sdf"; one_line_error; contains err "does not parse"
run 2 conformers generate --structure "$WORK/none.sdf" --out "$WORK/bad.sdf"; one_line_error
run 2 conformers generate --smiles 'CCCC' --structure "$WORK/butane.sdf" --out "$WORK/bad.sdf"; one_line_error
run 2 conformers generate --smiles 'CCCC' --out "$WORK/bad.sdf" --max 0; one_line_error
[[ ! -e "$WORK/bad.sdf" ]] || fail "a failed run wrote a file"
run 2 conformers info "$WORK/none.sdf"; one_line_error; contains err "none.sdf"
echo "conformers: ok"
