#!/usr/bin/python3
"""Backbone 3J couplings on a peptide with three models (tests/data/structure/
ala4-models.pdb, made by make_structure_data.py) from `vicinal predict` against
MDTraj's compute_J3_HN_HA / compute_J3_HN_C / compute_J3_HN_CB on the same file.
Source: MDTraj (mdtraj.nmr), whose coefficients cite Hu & Bax 1997 (Table 2),
Schmidt et al. 1999 (Table 1) and Voegeli, Ying, Grishaev & Bax 2007 (Table 1);
each is compared with the vicinal set that cites the same paper and values."""
import json
import os
import subprocess
import sys

import mdtraj
import numpy as np

vicinal = os.environ["VICINAL"]
here = os.path.dirname(os.path.abspath(__file__))
pdb = os.path.join(here, "..", "data", "structure", "ala4-models.pdb")
traj = mdtraj.load(pdb)

checks = [  # (vicinal set, MDTraj function, MDTraj model)
    ("hn-ha-hu-bax-1997", mdtraj.compute_J3_HN_HA, "Bax1997"),
    ("hn-ha-schmidt-1999", mdtraj.compute_J3_HN_HA, "Ruterjans1999"),
    ("hn-ha-vogeli-2007-dynamic", mdtraj.compute_J3_HN_HA, "Bax2007"),
    ("hn-co-vogeli-2007-dynamic", mdtraj.compute_J3_HN_C, "Bax2007"),
    ("hn-cb-vogeli-2007-dynamic", mdtraj.compute_J3_HN_CB, "Bax2007"),
]
failures = []
for set_id, function, model in checks:
    out = subprocess.run([vicinal, "--json", "predict", "--structure", pdb, "--ensemble", pdb, "--set", set_id],
                         capture_output=True, text=True)
    if out.returncode != 0:
        sys.exit(f"vicinal --set {set_id} failed: {out.stderr}")
    doc = json.loads(out.stdout)
    indices, j = function(traj, model=model)
    reference = {tuple(int(i) + 1 for i in row): j[:, k] for k, row in enumerate(indices)}
    ours = {tuple(c["dihedral_atoms"]): np.array([f["j_hz"] for f in c["per_conformer"]]) for c in doc["couplings"]}
    if set(ours) != set(reference):
        failures.append(f"{set_id}: phi angles differ: vicinal {sorted(ours)} vs MDTraj {sorted(reference)}")
        continue
    worst = max(float(np.max(np.abs(ours[k] - reference[k]))) for k in reference)
    print(f"{set_id} vs MDTraj {function.__name__}({model}): {len(reference)} phi x {traj.n_frames} models, "
          f"largest difference {worst:.2e} Hz")
    if worst > 1e-3:
        failures.append(f"{set_id}: differs from MDTraj {model} by {worst} Hz")
if failures:
    sys.exit("\n".join(failures))
