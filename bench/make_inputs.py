"""Deterministic inputs for bench/compare.py (written to a scratch folder, never committed).

trajectory: a protein-like system of identical peptide chains (one 12-residue
peptide built and embedded by RDKit, with hydrogens, replicated on a grid) and
`frames` models, each chain moved rigidly and every atom jittered by a small
Gaussian. Backbone amide H is named H and alpha H is named HA (HA2/HA3 for Gly)
as in the PDB convention, so MDTraj finds the HN-HA couplings.
fit problem: conformers x couplings J matrix and measured couplings.
library rows: the couplings CSV of `vicinal library import`.
"""
import csv
import numpy as np

PEPTIDE = "MKTAYIAKQRQISFVKSHFSRQ"[:12]


def build_peptide():
    from rdkit import Chem
    from rdkit.Chem import AllChem
    mol = Chem.MolFromSequence(PEPTIDE)
    mol = Chem.AddHs(mol, addResidueInfo=True)
    params = AllChem.ETKDGv3()
    params.randomSeed = 11
    params.useRandomCoords = True
    if AllChem.EmbedMolecule(mol, params) != 0:
        raise RuntimeError("RDKit could not embed the peptide")
    xyz = mol.GetConformer().GetPositions()
    atoms = []
    counters = {}
    for atom in mol.GetAtoms():
        info = atom.GetPDBResidueInfo()
        res = (info.GetResidueNumber(), info.GetResidueName())
        name = info.GetName().strip()
        if atom.GetSymbol() == "H":
            heavy = atom.GetNeighbors()[0]
            heavy_name = heavy.GetPDBResidueInfo().GetName().strip()
            n = counters.setdefault((res, heavy_name), 0) + 1
            counters[(res, heavy_name)] = n
            if heavy_name == "N":
                name = "H" if n == 1 and res[0] != 1 else f"H{n}"
            elif heavy_name == "CA":
                name = "HA" if res[1] != "GLY" else f"HA{n + 1}"
            else:
                name = f"H{heavy_name[1:]}{n}"[:4]
        atoms.append((name, res[1], res[0], atom.GetSymbol()))
    return atoms, xyz


def pdb_name(name, element):
    return f" {name:<3}" if len(name) < 4 and len(element) == 1 else f"{name:<4}"


def write_trajectory(path, topology_path, target_atoms, frames, seed=5):
    atoms, xyz = build_peptide()
    xyz = xyz - xyz.mean(axis=0)
    chains = max(1, round(target_atoms / len(atoms)))
    side = int(np.ceil(chains ** (1 / 3)))
    span = np.ptp(xyz, axis=0).max() + 4.0
    offsets = np.array([(i % side, i // side % side, i // side // side) for i in range(chains)], float) * span
    rng = np.random.default_rng(seed)
    chain_ids = "ABCDEFGHIJKLMNOPQRSTUVWXYZ0123456789abcdefghijklmnopqrstuvwxyz"

    def model(frame_xyz, out):
        serial = 0
        for c in range(chains):
            for (name, resname, resnum, element), p in zip(atoms, frame_xyz[c]):
                serial += 1
                out.append(f"ATOM  {serial % 100000:5d} {pdb_name(name, element)} {resname:>3} "
                           f"{chain_ids[c % len(chain_ids)]}{resnum:4d}    {p[0]:8.3f}{p[1]:8.3f}{p[2]:8.3f}"
                           f"  1.00  0.00          {element:>2}\n")
            out.append("TER\n")

    first = None
    with open(path, "w") as f:
        for fr in range(frames):
            shift = rng.normal(0, 0.3, (chains, 1, 3))
            jitter = rng.normal(0, 0.05, (chains, len(atoms), 3))
            frame_xyz = xyz[None, :, :] + offsets[:, None, :] + shift + jitter
            lines = [f"MODEL     {fr + 1:4d}\n"]
            model(frame_xyz, lines)
            lines.append("ENDMDL\n")
            f.write("".join(lines))
            if first is None:
                first = lines[1:-1] + ["END\n"]
    with open(topology_path, "w") as f:
        f.write("".join(first))
    return chains * len(atoms)


def write_fit_problem(matrix_path, couplings_path, conformers, couplings, seed=6):
    """J uniform in 0..12 Hz; measured J a mixture of 5 conformers plus noise of 2 Hz,
    enough to put them outside the hull so the optimum has chi2 > 0 and a small support."""
    rng = np.random.default_rng(seed)
    j = rng.uniform(0, 12, (conformers, couplings))
    chosen = rng.choice(conformers, 5, replace=False)
    j_obs = j[chosen].mean(axis=0) + rng.normal(0, 2.0, couplings)
    names = [f"H-{k + 1}/H-{k + 2}" for k in range(couplings)]
    with open(matrix_path, "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["title"] + names)
        for c in range(conformers):
            w.writerow([f"c{c + 1}"] + [f"{v:.6f}" for v in j[c]])
    with open(couplings_path, "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["nuclei", "j_hz", "sigma_hz"])
        for k in range(couplings):
            w.writerow([f"H-{k + 1},H-{k + 2}", f"{j_obs[k]:.6f}", "0.5"])
    return j, j_obs, np.full(couplings, 0.5)


# Straight chains C_nX: n carbons then one end atom X; hydrogens on X.
END_GROUPS = [("O", 1), ("N", 2), ("S", 1), ("Cl", 0), ("F", 0)]


def library_rows(rows):
    """Straight-chain C2..C30 alcohols, amines, thiols, chlorides and fluorides
    (no symmetry, so every CH-CH pair along the chain is a distinct coupling),
    one H-H coupling per neighbouring pair of carbons, one measurement set per
    pass over the compounds. Hydrogens are numbered after the heavy atoms in
    atom order. The SMILES is given on the first row of each compound block only."""
    out = []
    measurement = 0
    while True:
        for end, _ in END_GROUPS:
            for n in range(2, 31):
                first_h = {0: n + 2}
                for c in range(1, n):
                    first_h[c] = first_h[c - 1] + (3 if c == 1 else 2)
                for c in range(n - 1):
                    if len(out) == rows:
                        return out
                    out.append((f"C{n}{end} chain", "C" * n + end if c == 0 else "", f"run {measurement}",
                                "CDCl3", 280 + measurement, 400, "generated", f"{first_h[c]},{first_h[c + 1]}",
                                round(6.5 + 0.01 * ((c + measurement) % 50), 2), 0.1))
        measurement += 1


LIBRARY_COLUMNS = ["compound", "smiles", "measurement", "solvent", "temperature_k", "field_mhz", "source",
                   "nuclei", "j_hz", "sigma_hz"]


def write_library_csv(path, rows):
    data = library_rows(rows)
    with open(path, "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(LIBRARY_COLUMNS)
        w.writerows(data)
    return data
