#!/usr/bin/python3
"""Writes the structure test inputs in this folder. Deterministic: RDKit ETKDG
with fixed seeds and MMFF94 minimisation. Run: /usr/bin/python3 make_structure_data.py"""
from rdkit import Chem
from rdkit.Chem import AllChem

# Oxane (tetrahydropyran) in a chair, with atom labels for its ring protons.
# Ten embeddings, MMFF94-minimised; the lowest (the chair) is kept.
oxane = Chem.AddHs(Chem.MolFromSmiles("C1CCOCC1"))
conf_ids = AllChem.EmbedMultipleConfs(oxane, numConfs=10, randomSeed=7)
energies = [e for _, e in AllChem.MMFFOptimizeMoleculeConfs(oxane, maxIters=2000)]
best = conf_ids[min(range(len(energies)), key=energies.__getitem__)]
oxane = Chem.Mol(oxane, confId=best)
oxane.SetProp("_Name", "oxane chair")
with open("oxane-chair.sdf", "w") as f:
    f.write(Chem.MolToMolBlock(oxane) + "$$$$\n")

# Labels: ring carbons C-1..C-5 in SMILES order (O is atom 4), protons H-<carbon><a|b>.
rows = ["label,atom"]
for atom in oxane.GetAtoms():
    if atom.GetSymbol() == "C":
        rows.append(f"C-{atom.GetIdx() + 1},{atom.GetIdx() + 1}")
        hs = [n.GetIdx() + 1 for n in atom.GetNeighbors() if n.GetSymbol() == "H"]
        for suffix, h in zip("ab", sorted(hs)):
            rows.append(f"H-{atom.GetIdx() + 1}{suffix},{h}")
with open("oxane-labels.csv", "w") as f:
    f.write("\n".join(rows) + "\n")

# Ac-Ala-Ala-Ala-NMe, three models from different embeddings, as multi-model PDB
# with hydrogens and PDB atom names (from RDKit's sequence reader).
pep = Chem.MolFromSequence("AAAA")
pep = Chem.AddHs(pep, addCoords=False, addResidueInfo=True)
ids = AllChem.EmbedMultipleConfs(pep, numConfs=3, randomSeed=11)
AllChem.MMFFOptimizeMoleculeConfs(pep)
with open("ala4-models.pdb", "w") as f:
    for model, cid in enumerate(ids, start=1):
        f.write(f"MODEL     {model:4d}\n")
        block = Chem.MolToPDBBlock(pep, confId=cid, flavor=2 | 8)  # no CONECT, no END
        f.write("".join(l + "\n" for l in block.splitlines() if l.startswith(("ATOM", "HETATM"))))
        f.write("ENDMDL\n")
    f.write("END\n")
