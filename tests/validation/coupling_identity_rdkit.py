#!/usr/bin/python3
"""Which couplings the library takes for the same one, against RDKit.

vicinal names a coupling by its nuclei's canonical ranks reduced over the
molecule's symmetry, split by the 3D arrangement where it matters
(src/library/pair_symmetry.h). RDKit gives an independent answer to the same
question: mark the two nuclei with two unusual isotopes, perceive stereo from
the 3D coordinates, and write the canonical isomeric SMILES; two couplings are
the same when their marked SMILES agree, taking either nucleus first and the
mirror image as equal (enantiotopic nuclei give the same couplings in an
achiral solvent: common practice, no source).

For about forty small molecules (RDKit 3D structures, fixed seeds) and a
C20 chain, every H-H coupling over 2-4 bonds and every C-H coupling over 2-3
bonds is imported into a library; within each compound the grouping of
couplings by vicinal's stored identity must equal RDKit's grouping. The same
couplings imported again on a copy with shuffled atom numbers must all be
recognised as present."""
import itertools
import json
import os
import random
import subprocess
import sys

from rdkit import Chem
from rdkit.Chem import AllChem

VICINAL = os.environ["VICINAL"]
WORK = os.environ.get("WORK", "/tmp/vicinal-identity-rdkit")
os.makedirs(WORK, exist_ok=True)

MOLECULES = {
    "ethanol": "CCO", "s-2-chlorobutane": "C[C@H](Cl)CC", "cyclohexanol": "OC1CCCCC1",
    "methyl-glucoside": "CO[C@@H]1O[C@H](CO)[C@@H](O)[C@H](O)[C@H]1O", "proline": "OC(=O)[C@@H]1CCCN1",
    "alanine": "C[C@H](N)C(=O)O", "e-2-butene": "C/C=C/C", "z-2-butene": "C/C=C\\C", "propene": "C=CC",
    "styrene": "C=Cc1ccccc1", "dichloroethane": "ClCCCl", "chiral-butanediol": "C[C@@H](O)[C@H](O)C",
    "meso-butanediol": "C[C@@H](O)[C@@H](O)C", "cyclopropane": "C1CC1", "isobutene": "CC(C)=C",
    "neopentane": "CC(C)(C)C", "isobutanol": "CC(C)CO", "glycerol": "OCC(O)CO",
    "threonine": "C[C@@H](O)[C@H](N)C(=O)O", "valine": "CC(C)[C@H](N)C(=O)O", "dichloroethene": "ClC(Cl)=C",
    "ethylamine": "CCN", "toluene": "Cc1ccccc1", "deoxyribose": "OC[C@H]1OC(O)C[C@@H]1O",
    "methylcyclohexane": "CC1CCCCC1", "cis-dimethylcyclohexane": "C[C@H]1CCCC[C@H]1C",
    "bromohexane": "BrCCCCCC", "heptan-4-ol": "CCCC(O)CCC", "ethene": "C=C", "allene": "C=C=C",
    "trifluoroethanol": "OCC(F)(F)F", "tert-butanol": "CC(C)(C)O", "diisopropyl-ether": "CC(C)OC(C)C",
    "cyclohexene": "C1CCC=CC1", "menthol": "CC(C)[C@@H]1CC[C@@H](C)C[C@H]1O", "butanoic-acid": "CCCC(=O)O",
    "bromo-icosanol": "BrCCCCCCCCCCCCCCCCCCCCO",
}


def pairs(mol):
    distance = Chem.GetDistanceMatrix(mol)
    for a, b in itertools.combinations(range(mol.GetNumAtoms()), 2):
        ea, eb = mol.GetAtomWithIdx(a).GetSymbol(), mol.GetAtomWithIdx(b).GetSymbol()
        d = distance[a][b]
        if (ea == eb == "H" and 2 <= d <= 4) or ({ea, eb} == {"C", "H"} and 2 <= d <= 3):
            # The long chain: only couplings near one end and across its middle, to keep the run short.
            if mol.GetNumAtoms() > 40 and not (a < 12 or 30 <= a < 40):
                continue
            yield a, b


def marked_smiles(mol, a, b, first, second):
    """Canonical SMILES of the marked molecule and of its mirror image (z
    negated, stereo perceived again: flipping '@' in the string would not be
    canonical), the smaller."""
    out = []
    for mirror in (False, True):
        m = Chem.Mol(mol)
        m.GetAtomWithIdx(a).SetIsotope(first)
        m.GetAtomWithIdx(b).SetIsotope(second)
        if mirror:
            conf = m.GetConformer()
            for i in range(m.GetNumAtoms()):
                p = conf.GetAtomPosition(i)
                conf.SetAtomPosition(i, (p.x, p.y, -p.z))
        Chem.AssignStereochemistryFrom3D(m)
        out.append(Chem.MolToSmiles(m))
    return min(out)


def rdkit_key(mol, a, b):
    return min(marked_smiles(mol, a, b, 901, 902), marked_smiles(mol, a, b, 902, 901))


def write_inputs(tag, numbering):
    """One SDF per molecule and one CSV of all pairs; `numbering` shuffles atoms."""
    rows = ["compound,structure,measurement,solvent,nuclei,j_hz,sigma_hz"]
    expected = {}
    for k, (name, smiles) in enumerate(MOLECULES.items()):
        mol = Chem.AddHs(Chem.MolFromSmiles(smiles))
        AllChem.EmbedMolecule(mol, randomSeed=17 + k)
        AllChem.MMFFOptimizeMolecule(mol)
        order = list(range(mol.GetNumAtoms()))
        if numbering:
            random.Random(k).shuffle(order)
        new_index = {old: new for new, old in enumerate(order)}
        shuffled = Chem.RenumberAtoms(mol, order)
        path = os.path.join(WORK, f"{tag}-{name}.sdf")
        Chem.MolToMolFile(shuffled, path)
        for i, (a, b) in enumerate(pairs(mol)):
            na, nb = new_index[a] + 1, new_index[b] + 1
            symbol_a, symbol_b = mol.GetAtomWithIdx(a).GetSymbol(), mol.GetAtomWithIdx(b).GetSymbol()
            # A different value on every row: rows the library takes for one
            # coupling are then kept side by side (as a conflict), not dropped.
            key = rdkit_key(mol, a, b)
            j = 1.0 + i / 100
            rows.append(f'{name},{path if i == 0 else ""},run,CDCl3,"{symbol_a}{na},{symbol_b}{nb}",{j:.2f},0.1')
            expected[(name, na, nb)] = key
    csv_path = os.path.join(WORK, f"{tag}.csv")
    with open(csv_path, "w") as f:
        f.write("\n".join(rows) + "\n")
    return csv_path, expected


def vicinal(*args):
    run = subprocess.run([VICINAL, "--quiet", "--threads", "1", "--library", os.path.join(WORK, "lib.sqlite"), *args],
                         capture_output=True, text=True)
    if run.returncode != 0:
        sys.exit(f"vicinal {' '.join(args)} failed: {run.stderr}")
    return run.stdout


for suffix in ("", "-wal", "-shm"):
    if os.path.exists(os.path.join(WORK, "lib.sqlite" + suffix)):
        os.remove(os.path.join(WORK, "lib.sqlite" + suffix))
vicinal("library", "init")
csv_path, expected = write_inputs("first", numbering=False)
vicinal("library", "import", csv_path)

import sqlite3  # noqa: E402  (read the stored identities directly)

con = sqlite3.connect(os.path.join(WORK, "lib.sqlite"))
stored = con.execute("SELECT c.name, k.atoms_a, k.atoms_b, k.identity FROM couplings k "
                     "JOIN measurement_sets s ON s.id = k.set_id JOIN compounds c ON c.id = s.compound_id").fetchall()
ours = {(name, int(a), int(b)): identity for name, a, b, identity in stored}
if set(ours) != set(expected):
    sys.exit(f"FAIL: {len(expected)} couplings written, {len(ours)} stored")

failures = []
for name in MOLECULES:
    keys = [k for k in expected if k[0] == name]
    for x, y in itertools.combinations(keys, 2):
        same_ours, same_rdkit = ours[x] == ours[y], expected[x] == expected[y]
        if same_ours != same_rdkit:
            failures.append(f"{name}: {x[1:]} and {y[1:]}: vicinal says {'same' if same_ours else 'different'}, "
                            f"RDKit {'same' if same_rdkit else 'different'} ({ours[x]} | {ours[y]})")

again, _ = write_inputs("renumbered", numbering=True)
report = json.loads(subprocess.run([VICINAL, "--json", "--quiet", "--library", os.path.join(WORK, "lib.sqlite"),
                                    "library", "import", again], capture_output=True, text=True, check=True).stdout)
if report["couplings_added"] != 0:
    failures.append(f"renumbered import added {report['couplings_added']} couplings (all should be present already)")

if failures:
    print("\n".join(failures[:20]))
    sys.exit(f"FAIL: {len(failures)} disagreements")
print(f"coupling identity vs RDKit: {len(expected)} couplings over {len(MOLECULES)} compounds agree; "
      "renumbered copies all recognised")
