"""Protein backbone couplings: vicinal's Karplus sets against MDTraj.

MDTraj (mdtraj.nmr, used here only as an outside reference) computes phi from
coordinates and 3J from it with its own coefficient tables. We build an
alanine tetrapeptide with RDKit, set phi of the inner residues to a range of
values, let MDTraj measure phi and compute J, and compare with
`vicinal karplus curve` at the same phi (linear interpolation on a 0.5 degree
grid, error below 2e-4 Hz) and with `vicinal karplus angles`, whose exact
solutions must include the phi the coupling came from.

Source: MDTraj compute_J3_HN_HA model "Bax1997" = Hu & Bax, J. Am. Chem. Soc.
119, 6360 (1997), Table 2; model "Ruterjans1999" = Schmidt, Bluemel, Loehr &
Rueterjans, J. Biomol. NMR 14, 1 (1999), Table 1; model "Bax2007" of
compute_J3_HN_HA, compute_J3_HN_C and compute_J3_HN_CB = Voegeli, Ying,
Grishaev & Bax, J. Am. Chem. Soc. 129, 9377 (2007), Table 1.
"""
import json
import os
import subprocess
import sys

import mdtraj
import numpy as np
from rdkit import Chem
from rdkit.Chem import AllChem, rdMolTransforms

VICINAL = os.environ["VICINAL"]
WORK = os.environ.get("WORK", "/tmp/karplus_mdtraj")
os.makedirs(WORK, exist_ok=True)

# (MDTraj function, MDTraj model, vicinal set id)
PAIRS = [
    (mdtraj.compute_J3_HN_HA, "Bax1997", "hn-ha-hu-bax-1997"),
    (mdtraj.compute_J3_HN_HA, "Ruterjans1999", "hn-ha-schmidt-1999"),
    (mdtraj.compute_J3_HN_HA, "Bax2007", "hn-ha-vogeli-2007-dynamic"),
    (mdtraj.compute_J3_HN_C, "Bax2007", "hn-co-vogeli-2007-dynamic"),
    (mdtraj.compute_J3_HN_CB, "Bax2007", "hn-cb-vogeli-2007-dynamic"),
]


def vicinal(*args):
    done = subprocess.run([VICINAL, "--json", *args], capture_output=True, text=True)
    if done.returncode != 0:
        sys.exit(f"vicinal {' '.join(args)} failed: {done.stderr}")
    return json.loads(done.stdout)


def backbone_atom(mol, residue, name):
    for atom in mol.GetAtoms():
        info = atom.GetPDBResidueInfo()
        if info.GetResidueNumber() == residue and info.GetName().strip() == name:
            return atom.GetIdx()
    sys.exit(f"no atom {name} in residue {residue}")


def peptide_frames(path):
    """Ala4 with phi of residues 2 and 3 set over the full turn; returns the phi values set."""
    mol = Chem.AddHs(Chem.MolFromSequence("AAAA"), addCoords=True, addResidueInfo=True)
    if AllChem.EmbedMolecule(mol, randomSeed=7) != 0:
        sys.exit("RDKit could not embed the peptide")
    base = Chem.Conformer(mol.GetConformer())
    mol.RemoveAllConformers()
    targets = []
    for k, phi in enumerate(np.arange(-175.0, 180.0, 12.5)):
        conf = Chem.Conformer(base)
        conf.SetId(k)
        cid = mol.AddConformer(conf, assignId=False)
        for residue, value in ((2, phi), (3, -phi / 2 - 40)):
            quad = [backbone_atom(mol, residue - 1, "C"), backbone_atom(mol, residue, "N"),
                    backbone_atom(mol, residue, "CA"), backbone_atom(mol, residue, "C")]
            rdMolTransforms.SetDihedralDeg(mol.GetConformer(cid), *quad, float(value))
        targets.append((phi, -phi / 2 - 40))
    writer = Chem.PDBWriter(path)
    for conf in mol.GetConformers():
        writer.write(mol, confId=conf.GetId())
    writer.close()
    return np.array(targets)


def main():
    pdb = os.path.join(WORK, "ala4.pdb")
    targets = peptide_frames(pdb)
    traj = mdtraj.load(pdb)
    _, phi_rad = mdtraj.compute_phi(traj)
    phi = np.degrees(phi_rad)
    # Geometry first: MDTraj measures the phi RDKit set (common practice, no source).
    set_phi = targets.ravel()
    measured = phi[:, :2].ravel()  # residues 2 and 3; MDTraj also reports residue 4
    diff = (measured - set_phi + 180) % 360 - 180
    # PDB coordinates carry 0.001 A, which moves a dihedral by up to ~0.2 deg.
    assert np.max(np.abs(diff)) < 0.5, f"phi set by RDKit and measured by MDTraj differ by {np.max(np.abs(diff))}"

    worst = 0.0
    for function, model, set_id in PAIRS:
        _, j_ref = function(traj, model=model)
        curve = vicinal("karplus", "curve", "--set", set_id, "--step", "0.5")
        grid = np.array([p["dihedral_deg"] for p in curve["points"]])
        j_grid = np.array([p["j_hz"] for p in curve["points"]])
        j_ours = np.interp(phi.ravel(), grid, j_grid).reshape(phi.shape)
        err = float(np.max(np.abs(j_ours - j_ref)))
        worst = max(worst, err)
        assert err < 1e-3, f"{set_id} vs MDTraj {function.__name__}({model}): max |dJ| = {err:.2e} Hz"
        # The inverse: J computed by MDTraj at a known phi must give that phi back.
        for frame in (0, len(phi) // 3, 2 * len(phi) // 3):
            j, p = float(j_ref[frame, 0]), float(phi[frame, 0])
            sol = vicinal("karplus", "angles", "--set", set_id, "--j", repr(j), "--sigma", "0")
            closest = min(abs((r - p + 180) % 360 - 180) for r in sol["exact_deg"])
            assert closest < 1e-3, f"{set_id}: J = {j:.4f} Hz from phi {p:.3f}; exact solutions {sol['exact_deg']}"
        print(f"{set_id:28s} = MDTraj {function.__name__}(model={model!r}): max |dJ| {err:.1e} Hz over {phi.size} phi")
    print(f"karplus_mdtraj: ok (worst {worst:.1e} Hz)")


if __name__ == "__main__":
    main()
