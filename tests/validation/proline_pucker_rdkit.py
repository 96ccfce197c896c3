"""Checks db/pucker/proline.json and the pseudorotation model on the
pyrrolidine ring of a proline against RDKit geometries.

Molecule: N-acetyl-L-proline N'-methylamide (Ac-Pro-NHMe), the usual model of
a proline inside a peptide. 120 conformers are embedded (RDKit ETKDG, random
seed 11) and minimised with MMFF94; RDKit and MMFF94 are the outside reference
for the geometry. Checks:
 1. ideal pseudorotation (Altona and Sundaralingam, J. Am. Chem. Soc. 94, 8205,
    1972; formula from memory) describes the ring: the five measured
    endocyclic torsions differ from nu_max cos(P + 144 (j - 2)) with P and
    nu_max from the same torsions by at most 3 degrees;
 2. `vicinal pucker predict --ring proline` at each conformer's (P, nu_max)
    gives those torsions (within 3 degrees) and every ring H-H dihedral
    through the file's phi = a nu + b (within 6 degrees);
 3. the file's relations against least-squares lines over the conformers
    (|a - a_fit| <= 0.1, |b - b_fit| <= 3 degrees): they were derived this way
    (see the file), so this guards against editing slips;
 4. the envelope names: a conformer whose C-gamma lies on the side of the
    ring plane (N, CA, CB, CD) where the carbonyl carbon C' of the proline
    lies is C-gamma-endo (common practice, from memory: endo = towards C'),
    and vicinal's nearest envelope must say CG-endo (or CB-exo, the other
    envelope of the same twist) for it, CG-exo or CB-endo otherwise;
    in addition chi1 = nu1 is positive for endo and negative for exo (from
    memory of proline pucker surveys);
 5. substituents (element, beta atoms) and orientation signs xi against the
    molecule, rule of Haasnoot, de Leeuw and Altona (Tetrahedron 36, 2783,
    1980; from memory) as in pucker_relations.py;
 6. the pro-R/pro-S designations the file states for the CH2 protons, by
    RDKit's CIP labeller on the molecule with that proton replaced by 2H.
"""
import json
import os
import subprocess
import sys

import numpy as np
from rdkit import Chem
from rdkit.Chem import AllChem, rdCIPLabeler
from rdkit.Chem import rdMolTransforms as T

DATA = os.environ.get("VICINAL_DATA_DIR", os.path.join(os.path.dirname(__file__), "..", ".."))
VICINAL = os.environ.get("VICINAL")
SMILES = "CC(=O)N1CCC[C@H]1C(=O)NC"  # Ac-L-Pro-NHMe
failures = []


def check(ok, message):
    if not ok:
        failures.append(message)


ring = json.load(open(os.path.join(DATA, "db", "pucker", "proline.json")))
m = Chem.AddHs(Chem.MolFromSmiles(SMILES))
nb = lambda i: [a.GetIdx() for a in m.GetAtomWithIdx(i).GetNeighbors()]
sym = lambda i: m.GetAtomWithIdx(i).GetSymbol()
five = [r for r in m.GetRingInfo().AtomRings() if len(r) == 5][0]
names = {"N": [a for a in five if sym(a) == "N"][0]}
names["CD"] = [a for a in nb(names["N"]) if a in five and len([h for h in nb(a) if sym(h) == "H"]) == 2][0]
names["CA"] = [a for a in nb(names["N"]) if a in five and a != names["CD"]][0]
names["CB"] = [a for a in nb(names["CA"]) if a in five and a != names["N"]][0]
names["CG"] = [a for a in nb(names["CB"]) if a in five and a != names["CA"]][0]
names["C'"] = [a for a in nb(names["CA"]) if a not in five and sym(a) == "C"][0]
names["C(acetyl)"] = [a for a in nb(names["N"]) if a not in five][0]
seq = [names[a] for a in ring["ring_atoms"]]
carbon = {"HA": "CA", "HB": "CB", "HG": "CG", "HD": "CD"}

cids = list(AllChem.EmbedMultipleConfs(m, 120, randomSeed=11))
AllChem.MMFFOptimizeMoleculeConfs(m, maxIters=2000)


def plane_normal(conf, atoms):
    pts = np.array([list(conf.GetAtomPosition(i)) for i in atoms])
    centre = pts.mean(0)
    return centre, np.linalg.svd(pts - centre)[2][2]


def side(conf, atom, centre, normal):
    return np.sign(np.dot(np.array(list(conf.GetAtomPosition(atom))) - centre, normal))


def protons(conf):
    """cis/trans: the CH2 proton on the face of the ring plane where HA lies, or the other one."""
    normal = plane_normal(conf, seq)[1]
    pos = lambda i: np.array(list(conf.GetAtomPosition(i)))
    face = lambda x, c: np.sign(np.dot(pos(x) - pos(names[c]), normal))
    h = lambda c: [a for a in nb(names[c]) if sym(a) == "H"]
    lab = {"HA": h("CA")[0]}
    for c in ("CB", "CG", "CD"):
        for x in h(c):
            lab["H" + c[1] + ("cis" if face(x, c) == face(lab["HA"], "CA") else "trans")] = x
    return lab


def pseudorotation(nu):
    s = np.sin(np.radians(36)) + np.sin(np.radians(72))
    num = (nu[4] + nu[1]) - (nu[3] + nu[0])
    return np.degrees(np.arctan2(num, 2 * nu[2] * s)) % 360, np.hypot(nu[2], num / (2 * s))


couplings = {c["name"]: c for c in ring["couplings"]}
lines = {name: ([], []) for name in couplings}
samples = []
for cid in cids:
    conf = m.GetConformer(cid)
    lab = protons(conf)
    check(len(lab) == 7, f"conformer {cid}: protons not labelled by face: {sorted(lab)}")
    nu = np.array([T.GetDihedralDeg(conf, *[seq[(j + k - 1) % 5] for k in range(4)]) for j in range(5)])
    p, amplitude = pseudorotation(nu)
    model = amplitude * np.cos(np.radians(p + 144 * (np.arange(5) - 2)))
    check(np.max(np.abs(model - nu)) <= 3.0, f"conformer {cid}: pseudorotation misses a torsion by {np.max(np.abs(model - nu)):.1f} deg")
    phi = {}
    for name, c in couplings.items():
        a, b = name.split("-")
        value = T.GetDihedralDeg(conf, lab[a], names[carbon[a[:2]]], names[carbon[b[:2]]], lab[b])
        value += 360 * round((c["a"] * nu[c["nu"]] + c["b"] - value) / 360)
        lines[name][0].append(nu[c["nu"]])
        lines[name][1].append(value)
        phi[name] = value
    centre, normal = plane_normal(conf, [names[x] for x in ("N", "CA", "CB", "CD")])
    endo = side(conf, names["CG"], centre, normal) == side(conf, names["C'"], centre, normal)
    samples.append((cid, p, amplitude, nu, phi, endo))

# 1-2, 4: vicinal at each conformer's (P, nu_max), on every fifth conformer.
kinds = {"endo": 0, "exo": 0}
for cid, p, amplitude, nu, phi, endo in samples[::5]:
    out = subprocess.run([VICINAL, "--json", "pucker", "predict", "--ring", "proline", "--phase-deg", f"{p:.4f}",
                          "--amplitude-deg", f"{amplitude:.4f}"], capture_output=True, text=True)
    check(out.returncode == 0, f"vicinal pucker predict failed: {out.stderr}")
    if out.returncode != 0:
        break
    d = json.loads(out.stdout)
    check(np.max(np.abs(np.array(d["torsions_deg"]) - nu)) <= 3.0, f"conformer {cid}: torsions {d['torsions_deg']} vs {nu}")
    for c in d["couplings"]:
        diff = (c["dihedral_deg"] - phi[c["name"]] + 180) % 360 - 180
        check(abs(diff) <= 6.0, f"conformer {cid} {c['name']}: vicinal {c['dihedral_deg']:.1f} vs RDKit {phi[c['name']]:.1f}")
    # Near the twist at P = 180 (or 0) the nearest envelope may be the
    # neighbour of the same half: CB-exo beside CG-endo, CB-endo beside CG-exo.
    want = {"CG-endo", "CB-exo"} if endo else {"CG-exo", "CB-endo"}
    check(d["nearest_envelope"] in want or not (p < 45 or 135 < p < 225),
          f"conformer {cid}: P {p:.0f} named {d['nearest_envelope']}, geometry says {sorted(want)}")
    if p < 45 or 135 < p < 225:
        kinds["endo" if endo else "exo"] += 1
    check((nu[1] > 0) == endo, f"conformer {cid}: chi1 {nu[1]:.0f} with {'endo' if endo else 'exo'}")
check(kinds["endo"] > 0 and kinds["exo"] > 0, f"both puckers should occur among the conformers: {kinds}")

# 3: the relations.
for name, c in couplings.items():
    a_fit, b_fit = np.polyfit(*lines[name], 1)
    if "--print" in sys.argv:
        print(f"{name}: a {a_fit:.3f} b {b_fit:.1f}")
    check(abs(a_fit - c["a"]) <= 0.1, f"{name}: a {c['a']} vs RDKit {a_fit:.3f}")
    check(abs(b_fit - c["b"]) <= 3.0, f"{name}: b {c['b']} vs RDKit {b_fit:.1f}")

# 5: substituents and orientation signs, in the first conformer.
conf = m.GetConformer(cids[0])
lab = protons(conf)
atom_name = {v: k for k, v in names.items()}
for name, c in couplings.items():
    a, b = name.split("-")
    ends = {carbon[a[:2]]: (lab[a], carbon[b[:2]], lab[b]), carbon[b[:2]]: (lab[b], carbon[a[:2]], lab[a])}
    listed = {(s["on"], s["atom"]) for s in c["substituents"]}
    for on, (h_own, other, h_other) in ends.items():
        for x in nb(names[on]):
            if sym(x) != "H" and x != names[other]:
                check((on, atom_name.get(x, "?")) in listed, f"{name}: substituent {atom_name.get(x, x)} on {on} missing")
    for s in c["substituents"]:
        h_own, other, h_other = ends[s["on"]]
        idx = names[s["atom"]]
        check(sym(idx) == s["element"], f"{name} {s['atom']}: element")
        beta = sorted(sym(x) for x in nb(idx) if sym(x) != "H" and x != names[s["on"]])
        check(beta == sorted(s["beta"]), f"{name} {s['atom']}: beta {s['beta']} vs {beta}")
        turn = (T.GetDihedralDeg(conf, h_own, names[s["on"]], names[other], h_other)
                - T.GetDihedralDeg(conf, idx, names[s["on"]], names[other], h_other)) % 360
        xi = 1 if abs(turn - 120) < 40 else -1
        if "--print" in sys.argv:
            print(f"{name} {s['atom']} on {s['on']}: xi {xi}")
        check(xi == s["orientation"], f"{name} {s['atom']}: orientation {s['orientation']} vs {xi}")

# 6: pro-R / pro-S.
for proton, want in ring["prochirality"].items():
    mm = Chem.Mol(m)
    mm.GetAtomWithIdx(lab[proton]).SetIsotope(2)
    Chem.AssignStereochemistryFrom3D(mm, confId=cids[0])
    rdCIPLabeler.AssignCIPLabels(mm)
    centre = mm.GetAtomWithIdx(names[carbon[proton[:2]]])
    got = "pro-" + centre.GetProp("_CIPCode") if centre.HasProp("_CIPCode") else "?"
    check(got == want, f"{proton}: file says {want}, RDKit CIP {got}")

if failures:
    print("\n".join(failures[:30]))
    sys.exit(1)
print(f"proline pucker: ok ({len(samples)} conformers, {kinds['endo']} endo and {kinds['exo']} exo checked by vicinal)")
