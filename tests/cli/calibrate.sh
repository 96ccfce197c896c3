#!/usr/bin/env bash
# vicinal karplus calibrate: CSV calibration, saved set usable by id, bootstrap seed, self-consistent mode, bad input.
source "$(dirname "$0")/lib.sh"

# Synthetic pairs from J = 7 cos^2 - 1 cos + 1.5 (noise-free apart from rounding; ours).
/usr/bin/python3 - <<'PY'
import math
with open("pairs.csv", "w") as f:
    f.write("j_hz,sigma_hz,dihedral_deg,note\n")
    for k in range(36):
        a = -175 + 10 * k
        x = math.cos(math.radians(a))
        f.write(f"{7*x*x - x + 1.5:.4f},0.3,{a},synthetic\n")
PY
run 0 --json karplus calibrate --points pairs.csv --bootstrap 50 --seed 3
json_get 'abs(d["coefficients"][0]["value"] - 7) < 0.01 and abs(d["coefficients"][1]["value"] + 1) < 0.01' \
  | grep -qx True || fail "coefficients not recovered"
low=$(json_get 'd["coefficients"][0]["bootstrap_low"]')
run 0 --json karplus calibrate --points pairs.csv --bootstrap 50 --seed 3
[[ $(json_get 'd["coefficients"][0]["bootstrap_low"]') == "$low" ]] || fail "bootstrap not reproducible"
json_get 'len(d["comparison"]) > 0' | grep -qx True || fail "no published set compared"

# The report page: coefficients with bootstrap intervals, the comparison with
# published sets, the points with fitted and published curves, the residuals.
run 0 karplus calibrate --points pairs.csv --bootstrap 50 --seed 3 --like hh-karplus-1963 --report "$WORK/kr"
for f in calibration.json report.html figures/calibration-curves.svg figures/calibration-curves.pdf \
         figures/calibration-residuals.png tables/calibration-coefficients.csv tables/calibration-comparison.csv; do
  [[ -s "$WORK/kr/$f" ]] || fail "report file $f missing"
done
for id in summary coefficients comparison provenance; do contains kr/report.html "<section id=\"$id\">"; done
[[ $(grep -o "<figure" kr/report.html | wc -l) -eq 2 ]] || fail "the calibration page should hold 2 figures"
contains kr/report.html "hh-karplus-1963"; contains kr/report.html "bootstrap 2.5 %"
/usr/bin/python3 - "$WORK/kr" <<'PY' || fail "calibration report disagrees with the fit"
import csv, json, sys
d = json.load(open(sys.argv[1] + "/calibration.json"))
assert d["format"] == "vicinal-calibration" and len(d["data"]) == 36
fitted = [c for c in d["curves"] if c["fitted"]][0]
# The fitted curve in the document is the fitted model: 7 cos^2 - cos + 1.5 at 0 deg = 7.5 Hz.
assert abs(fitted["j_hz"][fitted["dihedral_deg"].index(0)] - 7.5) < 0.02, fitted["j_hz"][90]
assert any(c["label"] == "hh-karplus-1963" and not c["fitted"] for c in d["curves"])
rows = list(csv.reader(open(sys.argv[1] + "/tables/calibration-coefficients.csv")))
assert rows[1][0] == "A" and abs(float(rows[1][1]) - 7) < 0.01 and float(rows[1][3]) <= 7 <= float(rows[1][4]), rows[1]
comp = list(csv.reader(open(sys.argv[1] + "/tables/calibration-comparison.csv")))
assert comp[1][0] == "this calibration" and len(comp) == 2 + len(d["comparison"])
PY
run 0 report "$WORK/kr/calibration.json" --out "$WORK/kr2/report.html"
cmp -s "$WORK/kr/report.html" "$WORK/kr2/report.html" || fail "page rebuilt from calibration.json differs"

# The shipped example (invented pairs drawn from 8.6 cos^2 - 0.9 cos + 0.5 with
# two outliers): the bootstrap intervals hold the generating coefficients, and
# the calibration fits its own data better than the published curves.
run 0 --json karplus calibrate --points "$VICINAL_DATA_DIR/examples/calibration/rigid-hh-pairs.csv" --like hh-karplus-1963
json_get 'all(c["bootstrap_low"] <= t <= c["bootstrap_high"] for c, t in zip(d["coefficients"], (8.6, -0.9, 0.5)))' \
  | grep -qx True || fail "example: generating coefficients outside the bootstrap intervals"
json_get 'all(d["statistics"]["rmsd_hz"] < s["rmsd_hz"] for s in d["comparison"]) and len(d["comparison"]) == 2' \
  | grep -qx True || fail "example: comparison"

# Save a set into a user folder and use it by id.
mkdir -p sets
export VICINAL_KARPLUS_DIR="$WORK/sets"
run 0 karplus calibrate --points pairs.csv --id hh-test-lab --bootstrap 20
[[ -s sets/hh-test-lab.json ]] || fail "set not written"
contains sets/hh-test-lab.json "Provenance: input pairs.csv"
run 0 karplus sets
contains out "hh-test-lab"
unset VICINAL_KARPLUS_DIR

# Fourier form and robust loss run; the text output names them.
run 0 karplus calibrate --points pairs.csv --form fourier --order 2 --loss cauchy --bootstrap 20
contains out "fourier"; contains out "cauchy"

# Self-consistent mode on sites measured with two phi sets (values ours, from the sets themselves).
/usr/bin/python3 - <<'PY'
import math, random
random.seed(5)
# Coefficients and offsets as stated in the shipped set files (read at test time).
import json, os
db = os.path.join(os.environ["VICINAL_DATA_DIR"], "db", "karplus")
sets = [json.load(open(os.path.join(db, n))) for n in ("hn-ha-vuister-bax-1993.json", "hn-cb-hu-bax-1997.json", "hn-co-hu-bax-1997.json")]
with open("sites.csv", "w") as f:
    f.write("site,type,j_hz,sigma_hz,start_deg\n")
    for s in range(20):
        phi = random.uniform(-160, -50)
        for st in sets:
            c = st["coefficients"]; x = math.cos(math.radians(phi + st["offset_deg"]))
            f.write(f"r{s},{st['id']},{c['A']*x*x + c['B']*x + c['C'] + random.gauss(0, 0.1):.3f},0.1,\n")
PY
run 0 --json karplus calibrate --sites sites.csv --report "$WORK/sc"
json_get 'len(d["sites"]) == 20 and len(d["types"]) == 3' | grep -qx True || fail "self-consistent shape"
# Its report: a figure per type, the coefficient and site tables; rebuilt unchanged.
for f in self-consistent.json report.html figures/self-consistent-hn-ha-vuister-bax-1993.svg \
         figures/self-consistent-hn-co-hu-bax-1997.png tables/self-consistent-types.csv tables/self-consistent-sites.csv; do
  [[ -s "$WORK/sc/$f" ]] || fail "self-consistent report file $f missing"
done
[[ $(grep -o "<figure" sc/report.html | wc -l) -eq 3 ]] || fail "the self-consistent page should hold 3 figures"
for id in summary types sites provenance; do contains sc/report.html "<section id=\"$id\">"; done
/usr/bin/python3 - "$WORK/sc/self-consistent.json" <<'PY' || fail "self-consistent document"
import json, sys
d = json.load(open(sys.argv[1]))
assert d["format"] == "vicinal-self-consistent" and len(d["curves"]) == 3
assert sum(len(c["points"]) for c in d["curves"]) == d["n"] == 60
angles = {s["site"]: s["angle_deg"] for s in d["sites"]}
assert all(p["angle_deg"] == angles[p["site"]] for c in d["curves"] for p in c["points"])
PY
run 0 report "$WORK/sc/self-consistent.json" --out "$WORK/sc2/report.html"
cmp -s "$WORK/sc/report.html" "$WORK/sc2/report.html" || fail "page rebuilt from self-consistent.json differs"

# Bad input.
printf "j_hz,sigma_hz,dihedral_deg\n5,0.3,60\n5,0.3,sixty\n" >bad.csv
run 2 karplus calibrate --points bad.csv; one_line_error; contains err "bad.csv:3"; contains err "dihedral_deg"
run 2 karplus calibrate --points bad.csv --report "$WORK/never"; one_line_error
[[ ! -e "$WORK/never" ]] || fail "bad input left a report folder"
run 2 karplus calibrate --points pairs.csv --loss bisquare; one_line_error
run 2 karplus calibrate --points pairs.csv --form haasnoot; one_line_error
run 2 karplus calibrate; one_line_error
run 2 karplus calibrate --points pairs.csv --id hh-x; one_line_error; contains err "VICINAL_KARPLUS_DIR"
run 2 karplus calibrate --points pairs.csv --id "Bad Id" --out x.json; one_line_error
[[ ! -e x.json ]] || fail "a set with a bad id was written"
printf "j_hz,sigma_hz,dihedral_deg\n5,0.3,60\n6,0.3,70\n" >few.csv
run 2 karplus calibrate --points few.csv; one_line_error

# From the library: couplings of compounds imported from SMILES (the importer
# builds 3D), dihedrals measured along each stored path. Values invented.
# Ethanol CCO: C1 C2 O3, H 4-6 on C1, 7-8 on C2, OH 9. Propanal CCC=O: C1 C2 C3
# O4, H 5-7 on C1, 8-9 on C2, 10 on C3. 1-Propanol OCCC: O1 C2 C3 C4, OH 5,
# H 6-7 on C2, 8-9 on C3, 10-12 on C4.
LIB=(--library "$WORK/cal.sqlite")
cat > lib.csv <<'CSV'
compound,smiles,measurement,solvent,temperature_k,field_mhz,source,nuclei,j_hz,sigma_hz,note
ethanol,CCO,run 1,CDCl3,298,400,invented,"4,7",7.0,0.1,3 bonds
ethanol,CCO,run 1,CDCl3,298,400,invented,"7,9",5.1,0.2,3 bonds
ethanol,CCO,run 1,CDCl3,298,400,invented,"4,5",-12.0,0.2,2 bonds: left out
propanal,CCC=O,run 1,CDCl3,298,400,invented,"5,8",7.4,0.1,3 bonds
propanal,CCC=O,run 1,CDCl3,298,400,invented,"8,10",1.4,0.1,3 bonds
propanal,CCC=O,run 1,CDCl3,298,400,invented,"1,10",2.0,0.2,C-H: left out by --nuclei
propanal,CCC=O,run 1,CDCl3,298,400,invented,"6|7,9",6.9,0.2,stereo-unassigned: skipped
propanol,OCCC,run 1,CDCl3,298,400,invented,"5,6",5.6,0.2,3 bonds
propanol,OCCC,run 1,CDCl3,298,400,invented,"6,8",6.8,0.2,3 bonds
propanol,OCCC,run 1,CDCl3,298,400,invented,"8,10",7.3,,3 bonds without sigma
CSV
run 0 "${LIB[@]}" library import lib.csv
# A coupling without sigma is refused unless a default is given.
run 2 "${LIB[@]}" karplus calibrate --from-library --nuclei H,H; one_line_error; contains err "--default-sigma-hz"
run 0 "${LIB[@]}" --json karplus calibrate --from-library --nuclei H,H --default-sigma-hz 0.3 --bootstrap 20
contains err "stereo-unassigned"
json_get 'd["n"] == 7 and len(d["points"]) == 7' | grep -qx True || fail "7 library points expected"
json_get 'sum(p["sigma_defaulted"] for p in d["points"]) == 1' | grep -qx True || fail "one defaulted sigma expected"
cp out all-points.json
# The SMARTS filter keeps the two alcohols (2 + 3 couplings).
run 0 "${LIB[@]}" --json karplus calibrate --from-library --smarts '[OX2H]' --default-sigma-hz 0.3 --bootstrap 20
[[ $(json_get 'd["n"]') == 5 ]] || fail "5 alcohol points expected"

# The dihedral of ethanol H4-C1-C2-H7 against RDKit on the exported structure,
# with RDKit finding the path itself. Source: RDKit (rdMolTransforms.GetDihedralDeg).
run 0 "${LIB[@]}" library export all.sdf
/usr/bin/python3 - <<'PY' || fail "dihedral differs from RDKit"
import json
from rdkit import Chem
from rdkit.Chem import rdMolTransforms
mol = next(m for m in Chem.SDMolSupplier("all.sdf", removeHs=False)
           if m is not None and json.loads(m.GetProp("vicinal_compound"))["name"] == "ethanol")
path = list(Chem.GetShortestPath(mol, 3, 6))
assert len(path) == 4, path
rdkit_deg = rdMolTransforms.GetDihedralDeg(mol.GetConformer(), *path)
points = json.load(open("all-points.json"))["points"]
ours = [p for p in points if p["compound"] == "ethanol" and {p["path"][0], p["path"][-1]} == {4, 7}]
assert len(ours) == 1, ours
diff = (ours[0]["dihedral_deg"] - rdkit_deg + 180) % 360 - 180
print(f"ethanol H4..H7: vicinal {ours[0]['dihedral_deg']:.3f}, RDKit {rdkit_deg:.3f}")
assert abs(diff) < 0.01, diff
PY

# Set file from the library: the provenance names the library, query and points.
run 0 "${LIB[@]}" karplus calibrate --from-library --nuclei H,H --default-sigma-hz 0.3 --bootstrap 20 \
  --id hh-from-lib --out lib-set.json
contains lib-set.json "Provenance: input library $WORK/cal.sqlite (query: bonds 3, nuclei H,H)"
contains lib-set.json "; 7 points;"

# Errors: nothing matches; a compound stored without 3D coordinates (every z = 0).
run 2 "${LIB[@]}" karplus calibrate --from-library --name nothing-like-this; one_line_error
contains err "no 3-bond coupling"
/usr/bin/python3 - <<'PY'
import shutil, sqlite3
shutil.copy("cal.sqlite", "flat.sqlite")
db = sqlite3.connect("flat.sqlite")
for cid, text in db.execute("SELECT id, molfile FROM compounds").fetchall():
    lines = text.split("\n")
    n = int(lines[3][:3])
    for i in range(4, 4 + n):  # V2000 atom lines: z is columns 21-30
        lines[i] = lines[i][:20] + "    0.0000" + lines[i][30:]
    db.execute("UPDATE compounds SET molfile = ? WHERE id = ?", ("\n".join(lines), cid))
db.commit()
PY
run 2 --library "$WORK/flat.sqlite" karplus calibrate --from-library --nuclei H,H --default-sigma-hz 0.3
one_line_error; contains err "no 3D coordinates"
run 2 karplus calibrate --from-library --points pairs.csv; one_line_error
echo "calibrate: ok"
