"""Writes chain.sdf, chain-renumbered.sdf, chain.csv and chain-renumbered.csv
(see README.md): 1-bromo-20-hydroxyicosane from RDKit (fixed seeds), the same
molecule with shuffled atom numbers, and six invented couplings on each."""
import random
from rdkit import Chem
from rdkit.Chem import AllChem
m = Chem.AddHs(Chem.MolFromSmiles("BrCCCCCCCCCCCCCCCCCCCCO"))
AllChem.EmbedMolecule(m, randomSeed=5); AllChem.MMFFOptimizeMolecule(m)
order = list(range(m.GetNumAtoms())); random.Random(11).shuffle(order)
r = Chem.RenumberAtoms(m, order)          # new atom i is old atom order[i]
where = {old: new for new, old in enumerate(order)}
Chem.MolToMolFile(m, "chain.sdf"); Chem.MolToMolFile(r, "chain-renumbered.sdf")
def hs(c): return sorted(n.GetIdx() for n in m.GetAtomWithIdx(c).GetNeighbors() if n.GetSymbol() == "H")
rows, rrows = [], []
j = 5.0
for c in (3, 9, 15):                       # carbons (0-based) along the chain and their neighbours
    a = hs(c)[0]                           # one proton of the CH2: its like and unlike partners
    for b in hs(c + 1):
        rows.append((a, b, j)); j += 0.7
head = "compound,structure,measurement,solvent,nuclei,j_hz,sigma_hz\n"
def write(name, sdf, mapping):
    with open(name, "w") as f:
        f.write(head)
        for i, (a, b, jj) in enumerate(rows):
            f.write(f"bromo-icosanol,{sdf if i == 0 else ''},chain run,CDCl3,\"H{mapping(a)+1},H{mapping(b)+1}\",{jj:.1f},0.1\n")
write("chain.csv", "chain.sdf", lambda x: x)
write("chain-renumbered.csv", "chain-renumbered.sdf", lambda x: where[x])
