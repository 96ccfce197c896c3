#!/usr/bin/python3
"""Haasnoot predictions for a rigid six-membered chair (oxane, tests/data/
structure/oxane-chair.sdf): antiperiplanar (trans-diaxial) ring protons couple
with 8-14 Hz, gauche pairs (axial-equatorial, equatorial-equatorial) with
about 1-5.5 Hz. Source: common practice, no source (textbook ranges for
3J(H,H) in cyclohexane-type chairs); the upper end allows the diaxial coupling
of a CH2-CH2 pair with only carbon substituents, 13.1 Hz in cyclohexane
(Garbisch and Griffith, J. Am. Chem. Soc. 90, 6543 (1968), from memory). The dihedral classes are taken from RDKit
on the same coordinates, independently of vicinal."""
import json
import os
import subprocess
import sys

from rdkit import Chem
from rdkit.Chem import rdMolTransforms

vicinal = os.environ["VICINAL"]
here = os.path.dirname(os.path.abspath(__file__))
sdf = os.path.join(here, "..", "data", "structure", "oxane-chair.sdf")
mol = Chem.MolFromMolFile(sdf, removeHs=False)

out = subprocess.run([vicinal, "--json", "predict", "--structure", sdf], capture_output=True, text=True)
if out.returncode != 0:
    sys.exit(out.stderr)
anti, gauche, failures = [], [], []
for c in json.loads(out.stdout)["couplings"]:
    a, b, cc, d = (i - 1 for i in c["path"])
    phi = abs(rdMolTransforms.GetDihedralDeg(mol.GetConformer(), a, b, cc, d))
    name = f'{c["name"]} ({phi:.0f} deg, {c["j_hz"]:.2f} Hz, {c["set"]})'
    if phi > 150:
        anti.append(name)
        if not 8.0 <= c["j_hz"] <= 14.0:
            failures.append("antiperiplanar " + name)
    elif phi < 80:
        gauche.append(name)
        if not 1.0 <= c["j_hz"] <= 5.5:
            failures.append("gauche " + name)
if len(anti) != 4 or len(gauche) != 12:
    failures.append(f"expected 4 antiperiplanar and 12 gauche pairs, got {len(anti)} and {len(gauche)}")
print("antiperiplanar:", *anti, sep="\n  ")
print("gauche:", *gauche, sep="\n  ")
if failures:
    sys.exit("outside the expected range:\n  " + "\n  ".join(failures))
