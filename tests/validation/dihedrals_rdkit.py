#!/usr/bin/python3
"""Dihedral angles computed by `vicinal predict` against RDKit on the same
coordinates. Source: RDKit (rdMolTransforms.GetDihedralDeg), a general-purpose
cheminformatics library, on conformers embedded here with fixed seeds."""
import json
import os
import subprocess
import sys

from rdkit import Chem
from rdkit.Chem import AllChem, rdMolTransforms

vicinal = os.environ["VICINAL"]
work = os.environ.get("WORK", "/tmp/vicinal-dihedrals")
os.makedirs(work, exist_ok=True)

# An invented chain with stereocentres and rotatable bonds; five conformers.
mol = Chem.AddHs(Chem.MolFromSmiles("OC[C@@H](O)[C@H](C)CC(=O)OC"))
ids = list(AllChem.EmbedMultipleConfs(mol, numConfs=5, randomSeed=2024))
path = os.path.join(work, "chain.sdf")
writer = Chem.SDWriter(path)
for cid in ids:
    writer.write(mol, confId=cid)
writer.close()

out = subprocess.run([vicinal, "--json", "predict", "--ensemble", path], capture_output=True, text=True)
if out.returncode != 0:
    sys.exit(f"vicinal failed: {out.stderr}")
doc = json.loads(out.stdout)
assert doc["conformers"] == len(ids), doc["conformers"]
# RDKit reads the same file back, so both see the same (rounded) coordinates.
frames = [m for m in Chem.SDMolSupplier(path, removeHs=False)]
checked = 0
worst = 0.0
for c in doc["couplings"]:
    a, b, cc, d = (i - 1 for i in c["dihedral_atoms"])
    for frame_mol, frame in zip(frames, c["per_conformer"]):
        ref = rdMolTransforms.GetDihedralDeg(frame_mol.GetConformer(), a, b, cc, d)
        diff = abs((frame["dihedral_deg"] - ref + 180.0) % 360.0 - 180.0)
        worst = max(worst, diff)
        checked += 1
if checked < 20:
    sys.exit(f"too few dihedrals compared: {checked}")
if worst > 1e-3:
    sys.exit(f"dihedral differs from RDKit by {worst} degrees")
print(f"dihedrals: {checked} angles agree with RDKit within {worst:.2e} degrees")
