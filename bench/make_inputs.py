"""Deterministic inputs for bench/compare.py (written to a scratch folder, never committed).

trajectory: a protein-like system of identical peptide chains (one 12-residue
peptide built and embedded by RDKit, with hydrogens, replicated on a grid) and
`frames` models, each chain moved rigidly and every atom jittered by a small
Gaussian. Backbone amide H is named H and alpha H is named HA (HA2/HA3 for Gly)
as in the PDB convention, so MDTraj finds the HN-HA couplings.
fit problem: conformers x couplings J matrix and measured couplings.
library import: a few hundred compounds given once by 3D SDF files, then many
couplings per compound (the CSV of `vicinal library import`).
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


# The realistic library import: a few hundred compounds, each given once by a
# 3D structure file (SDF written here by RDKit, explicit hydrogens, so the
# import builds nothing), then many couplings per compound over many
# measurement sets (a temperature series in a few solvents), as a group that
# measures the same compounds again and again would have them.
BULK_ENDS = ["O", "N", "S", "Cl", "F", "Br", "OC"]
BULK_SOLVENTS = ["CDCl3", "DMSO-d6", "CD3OD", "D2O"]


def bulk_compounds(count):
    """X-(CH2)n-Y chains, X != Y (no graph symmetry), n = 2..25: SMILES list."""
    out = []
    for n in range(2, 26):
        for i, x in enumerate(BULK_ENDS):
            for y in BULK_ENDS[i + 1:]:
                out.append(x + "C" * n + y)
                if len(out) == count:
                    return out
    raise ValueError(f"at most {len(out)} bulk compounds")


def bulk_structure(smiles, path, seed):
    """Writes one 3D SDF record (RDKit ETKDG, fixed seed); returns the H-H
    couplings as 1-based atom pairs: per C-C bond the first H of one carbon to
    each H of the next (two distinct couplings), and H on X to the first H of its carbon."""
    from rdkit import Chem
    from rdkit.Chem import AllChem
    mol = Chem.AddHs(Chem.MolFromSmiles(smiles))
    params = AllChem.ETKDGv3()
    params.randomSeed = seed
    if AllChem.EmbedMolecule(mol, params) != 0:
        raise RuntimeError(f"RDKit could not embed {smiles}")
    with open(path, "w") as f:
        f.write(Chem.MolToMolBlock(mol) + "$$$$\n")
    hs = {a.GetIdx(): [n.GetIdx() + 1 for n in a.GetNeighbors() if n.GetSymbol() == "H"] for a in mol.GetAtoms()}
    pairs = []
    for b in mol.GetBonds():
        u, v = b.GetBeginAtom(), b.GetEndAtom()
        if not hs[u.GetIdx()] or not hs[v.GetIdx()] or u.GetSymbol() == "H" or v.GetSymbol() == "H":
            continue
        if u.GetSymbol() == "C" and v.GetSymbol() == "C":
            pairs += [(hs[u.GetIdx()][0], h) for h in hs[v.GetIdx()][:2]]
        else:  # H on a heteroatom next to a CH2
            pairs.append((hs[u.GetIdx()][0], hs[v.GetIdx()][0]))
    return pairs


BULK_COLUMNS = ["compound", "structure", "measurement", "solvent", "temperature_k", "field_mhz", "source", "nuclei",
                "j_hz", "sigma_hz"]


def write_library_bulk(folder, compounds, couplings):
    """Writes folder/structures/*.sdf (once; reused) and folder/bulk-C-N.csv with
    exactly `couplings` rows over `compounds` compounds, compound by compound;
    the structure column is filled on each compound's first row only. Returns the CSV path."""
    import os
    smiles = bulk_compounds(compounds)
    sdir = os.path.join(folder, "structures")
    os.makedirs(sdir, exist_ok=True)
    pairs = []
    for i, s in enumerate(smiles):
        sdf = os.path.join(sdir, f"c{i + 1:03d}.sdf")
        pair_file = sdf + ".pairs"
        if os.path.exists(pair_file):
            with open(pair_file) as f:
                pairs.append([tuple(int(v) for v in ln.split()) for ln in f])
            continue
        p = bulk_structure(s, sdf, seed=100 + i)
        with open(pair_file, "w") as f:
            f.write("".join(f"{a} {b}\n" for a, b in p))
        pairs.append(p)
    per_pass = sum(len(p) for p in pairs)
    sets = -(-couplings // per_pass)  # measurement sets per compound
    path = os.path.join(folder, f"bulk-{compounds}-{couplings}.csv")
    if os.path.exists(path):
        return path
    written = 0
    with open(path, "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(BULK_COLUMNS)
        for i, p in enumerate(pairs):
            first = True
            for s in range(sets):
                solvent = BULK_SOLVENTS[s % len(BULK_SOLVENTS)]
                temperature = 240 + s // len(BULK_SOLVENTS) % 100  # 240-339 K; the name keeps sets apart
                for k, (a, b) in enumerate(p):
                    if written == couplings:
                        return path
                    w.writerow([f"bulk {i + 1} {smiles[i]}", f"structures/c{i + 1:03d}.sdf" if first else "",
                                f"{solvent} run {s // len(BULK_SOLVENTS) + 1}", solvent, temperature, 600, "generated",
                                f"H{a},H{b}", f"{6.0 + 0.01 * ((k * 7 + s) % 300):.2f}", "0.1"])
                    first = False
                    written += 1
    return path


# Compounds for the substructure search at scale: a-CH2-(CH2)n-CH(b)-CH2-c
# with a, b, c among common substituents (each bonded through its first
# atom), distinct by canonical SMILES (RDKit), every one with a vicinal
# H-C-C-H.
SEARCH_GROUPS = ["C", "CC", "C(C)C", "O", "OC", "N", "NC", "N(C)C", "F", "Cl", "Br", "I", "S", "SC", "C(=O)O",
                 "C(=O)OC", "C(=O)N", "C#N", "c1ccccc1", "c1ccncc1", "C1CC1", "C1CCCC1", "C=C", "OC(=O)C",
                 "C(F)(F)F"]


def search_compounds(count):
    """`count` distinct SMILES, in a fixed order."""
    from rdkit import Chem
    out, seen = [], set()
    for n in range(0, 40):
        for a in SEARCH_GROUPS:
            for b in SEARCH_GROUPS:
                for c in SEARCH_GROUPS:
                    canonical = Chem.CanonSmiles(f"C({a}){'C' * n}C({b})C{c}")
                    if canonical in seen:
                        continue
                    seen.add(canonical)
                    out.append(canonical)
                    if len(out) == count:
                        return out
    raise ValueError(f"at most {len(out)} search compounds")


def search_record(job):
    """(index, SMILES) -> (index, 3D SDF record with hydrogens, one vicinal
    H-H pair as 1-based atoms), or None when RDKit cannot embed it."""
    from rdkit import Chem
    from rdkit.Chem import AllChem
    index, smiles = job
    mol = Chem.AddHs(Chem.MolFromSmiles(smiles))
    # Plain distance geometry: half the time of ETKDG, and a substructure
    # search does not look at conformations.
    params = AllChem.KDG()
    params.randomSeed = 1000 + index
    if AllChem.EmbedMolecule(mol, params) != 0:
        return None
    for bond in mol.GetBonds():
        u, v = bond.GetBeginAtom(), bond.GetEndAtom()
        hu = [x.GetIdx() + 1 for x in u.GetNeighbors() if x.GetSymbol() == "H"]
        hv = [x.GetIdx() + 1 for x in v.GetNeighbors() if x.GetSymbol() == "H"]
        if u.GetSymbol() == "C" and v.GetSymbol() == "C" and hu and hv:
            return index, Chem.MolToMolBlock(mol) + "$$$$\n", (hu[0], hv[0])
    return None


def write_search_library_inputs(folder, count, processes=2):
    """folder/search-N.sdf (every structure, for the plain scan) and
    folder/search-N.csv (one coupling per compound, its structure inline), made
    once; a compound RDKit cannot embed is left out. Returns (csv, sdf)."""
    import os
    from multiprocessing import Pool
    sdf, table = os.path.join(folder, f"search-{count}.sdf"), os.path.join(folder, f"search-{count}.csv")
    if not (os.path.exists(sdf) and os.path.exists(table)):
        smiles = search_compounds(count)
        with Pool(processes) as pool:
            records = [r for r in pool.imap(search_record, enumerate(smiles), chunksize=200) if r]
        with open(sdf + ".part", "w") as f:
            for _, record, _ in records:
                f.write(record)
        with open(table + ".part", "w", newline="") as f:
            w = csv.writer(f)
            w.writerow(["compound", "molfile", "solvent", "nuclei", "j_hz"])
            for index, record, (a, b) in records:
                w.writerow([f"search {index + 1} {smiles[index]}", record, "CDCl3", f"H{a},H{b}", "7.0"])
        os.replace(sdf + ".part", sdf)
        os.replace(table + ".part", table)
    return table, sdf
