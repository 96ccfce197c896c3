"""Checks db/pucker/*.json against RDKit geometries of real nucleosides.

For each ring file: builds the nucleoside (uridine for ribose, 2'-deoxyuridine
for deoxyribose), embeds conformers (RDKit ETKDG, MMFF94), and checks
 - every linear relation phi(H,H) = a * nu + b against a least-squares line
   through the conformers (|a - a_fit| <= 0.15, |b - b_fit| <= 5 deg);
 - every listed substituent (element, beta atoms) against the molecule;
 - every orientation sign xi against the geometry, with the rule of Haasnoot,
   de Leeuw and Altona (Tetrahedron 36, 2783, 1980; from memory): viewed along
   C-C with the substituted carbon in front, +1 when the substituent lies
   120 degrees clockwise of that carbon's proton.
Source: the ribose relations are from memory of de Leeuw, Haasnoot and Altona
(Isr. J. Chem. 20, 108, 1980); the deoxyribose relations were derived this way
(see the file), so for them this check guards the file against editing slips.
RDKit and MMFF94 are the outside reference for the geometry.
"""
import json
import os
import sys

import numpy as np
from rdkit import Chem
from rdkit.Chem import AllChem
from rdkit.Chem import rdMolTransforms as T

DATA = os.environ.get("VICINAL_DATA_DIR", os.path.join(os.path.dirname(__file__), "..", ".."))
SMILES = {
    "ribose": "O=C1C=CN([C@@H]2O[C@H](CO)[C@@H](O)[C@H]2O)C(=O)N1",        # uridine
    "deoxyribose": "O=C1C=CN([C@H]2C[C@H](O)[C@@H](CO)O2)C(=O)N1",        # 2'-deoxyuridine
}
failures = []


def check(ok, message):
    if not ok:
        failures.append(message)


def sugar_atoms(m):
    ring = [r for r in m.GetRingInfo().AtomRings() if len(r) == 5][0]
    o4 = [a for a in ring if m.GetAtomWithIdx(a).GetSymbol() == "O"][0]
    nbrs = [a.GetIdx() for a in m.GetAtomWithIdx(o4).GetNeighbors()]
    c1 = [a for a in nbrs if any(x.GetSymbol() == "N" for x in m.GetAtomWithIdx(a).GetNeighbors())][0]
    c4 = [a for a in nbrs if a != c1][0]
    c2 = [a.GetIdx() for a in m.GetAtomWithIdx(c1).GetNeighbors() if a.GetIdx() in ring and a.GetIdx() != o4][0]
    c3 = [a.GetIdx() for a in m.GetAtomWithIdx(c4).GetNeighbors() if a.GetIdx() in ring and a.GetIdx() != o4][0]
    n1 = [a.GetIdx() for a in m.GetAtomWithIdx(c1).GetNeighbors() if a.GetSymbol() == "N"][0]
    names = {"O4'": o4, "C1'": c1, "C2'": c2, "C3'": c3, "C4'": c4, "N1": n1}
    for c, o in (("C2'", "O2'"), ("C3'", "O3'")):
        ox = [a.GetIdx() for a in m.GetAtomWithIdx(names[c]).GetNeighbors() if a.GetSymbol() == "O"]
        if ox:
            names[o] = ox[0]
    names["C5'"] = [a.GetIdx() for a in m.GetAtomWithIdx(c4).GetNeighbors()
                    if a.GetSymbol() == "C" and a.GetIdx() not in ring][0]
    return names


def protons(m, conf, names):
    """Proton labels in one conformer; H2' is the C2' proton on the base's face."""
    h = lambda c: [a.GetIdx() for a in m.GetAtomWithIdx(names[c]).GetNeighbors() if a.GetSymbol() == "H"]
    lab = {"H1'": h("C1'")[0], "H3'": h("C3'")[0], "H4'": h("C4'")[0]}
    h2 = h("C2'")
    if len(h2) == 2:
        h2 = sorted(h2, key=lambda x: abs(T.GetDihedralDeg(conf, names["N1"], names["C1'"], names["C2'"], x)))
        lab["H2'"], lab["H2''"] = h2
    else:
        lab["H2'"] = h2[0]
    return lab


def carbon_of(label):
    return {"H1'": "C1'", "H2'": "C2'", "H2''": "C2'", "H3'": "C3'", "H4'": "C4'"}[label]


for ring_id, smiles in SMILES.items():
    ring = json.load(open(os.path.join(DATA, "db", "pucker", ring_id + ".json")))
    m = Chem.AddHs(Chem.MolFromSmiles(smiles))
    cids = list(AllChem.EmbedMultipleConfs(m, 120, randomSeed=7))
    AllChem.MMFFOptimizeMoleculeConfs(m)
    names = sugar_atoms(m)
    seq = [names[a] for a in ring["ring_atoms"]]
    for c in ring["couplings"]:
        a_name, b_name = c["name"].split("-")
        j = c["nu"]
        xs, ys = [], []
        for cid in cids:
            conf = m.GetConformer(cid)
            lab = protons(m, conf, names)
            nu = T.GetDihedralDeg(conf, *[seq[(j + k - 1) % 5] for k in range(4)])
            phi = T.GetDihedralDeg(conf, lab[a_name], names[carbon_of(a_name)], names[carbon_of(b_name)], lab[b_name])
            phi += 360 * round((c["a"] * nu + c["b"] - phi) / 360)
            xs.append(nu)
            ys.append(phi)
        a_fit, b_fit = np.polyfit(xs, ys, 1)
        check(abs(a_fit - c["a"]) <= 0.15, f"{ring_id} {c['name']}: a {c['a']} vs RDKit {a_fit:.3f}")
        check(abs(b_fit - c["b"]) <= 5.0, f"{ring_id} {c['name']}: b {c['b']} vs RDKit {b_fit:.1f}")
        # Substituents and their orientation signs, in the first conformer.
        conf = m.GetConformer(cids[0])
        lab = protons(m, conf, names)
        ends = {carbon_of(a_name): (lab[a_name], carbon_of(b_name), lab[b_name]),
                carbon_of(b_name): (lab[b_name], carbon_of(a_name), lab[a_name])}
        listed = {(s["on"], s["atom"]) for s in c["substituents"]}
        for carbon, (h_own, other, h_other) in ends.items():
            for nb in m.GetAtomWithIdx(names[carbon]).GetNeighbors():
                if nb.GetSymbol() == "H" or nb.GetIdx() == names[other]:
                    continue
                atom = [k for k, v in names.items() if v == nb.GetIdx()][0]
                check((carbon, atom) in listed, f"{ring_id} {c['name']}: substituent {atom} on {carbon} missing")
        for s in c["substituents"]:
            carbon = s["on"]
            h_own, other, h_other = ends[carbon]
            idx = names[s["atom"]]
            check(m.GetAtomWithIdx(idx).GetSymbol() == s["element"], f"{ring_id} {c['name']} {s['atom']}: element")
            beta = sorted(x.GetSymbol() for x in m.GetAtomWithIdx(idx).GetNeighbors()
                          if x.GetSymbol() != "H" and x.GetIdx() != names[carbon])
            check(beta == sorted(s["beta"]), f"{ring_id} {c['name']} {s['atom']}: beta {s['beta']} vs {beta}")
            # Clockwise turn from own proton to substituent, viewed from this carbon:
            # dihedral(H_own) - dihedral(S) measured against the far proton.
            turn = (T.GetDihedralDeg(conf, h_own, names[carbon], names[other], h_other)
                    - T.GetDihedralDeg(conf, idx, names[carbon], names[other], h_other)) % 360
            xi = 1 if abs(turn - 120) < 40 else -1
            check(xi == s["orientation"], f"{ring_id} {c['name']} {s['atom']}: orientation {s['orientation']} vs {xi}")

if failures:
    print("\n".join(failures))
    sys.exit(1)
print("pucker relations: ok")
