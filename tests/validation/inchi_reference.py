"""Compound identity in the coupling library against outside references.

The library identifies a compound by the standard InChIKey that Open Babel
computes from the stored 3D structure (src/library/identity.cc). Checked here:
1. published InChIKeys of well-known compounds. Source: the standard InChIKeys
   as listed by the InChI Trust / IUPAC InChI Technical Manual examples and
   PubChem (recalled from memory: ethanol, benzene, L-/D-alanine, acetic acid,
   caffeine, methane, water);
2. independent implementations: the Debian RDKit is built without InChI, so
   (a) RDKit checks that the compound stored is the one given: its canonical
   isomeric SMILES of our stored SMILES (written by Open Babel from the 3D
   structure) equals its canonical SMILES of the input, stereo included; and
   (b) the InChI Trust library itself (libinchi1, called through ctypes)
   hashes our standard InChI to the same InChIKey we store.
Run by ctest with $VICINAL (the binary) and $WORK (scratch folder).
"""
import csv
import json
import os
import shutil
import subprocess
import ctypes
import ctypes.util
import sys

from rdkit import Chem
from rdkit import RDLogger

RDLogger.DisableLog("rdApp.*")

VICINAL = os.environ["VICINAL"]
WORK = os.environ.get("WORK", "/tmp/vicinal-inchi")
shutil.rmtree(WORK, ignore_errors=True)
os.makedirs(WORK)

# Source: InChI Trust / PubChem standard InChIKeys (from memory).
PUBLISHED = {
    "ethanol": ("CCO", "LFQSCWFLJHTTHZ-UHFFFAOYSA-N"),
    "benzene": ("c1ccccc1", "UHOVQNZJYSORNB-UHFFFAOYSA-N"),
    "L-alanine": ("C[C@@H](C(=O)O)N", "QNAYBMKLOCPYGJ-REOHCLBHSA-N"),
    "D-alanine": ("C[C@H](C(=O)O)N", "QNAYBMKLOCPYGJ-UWTATZPHSA-N"),
    "acetic acid": ("CC(=O)O", "QTBSBXVTEAMEQO-UHFFFAOYSA-N"),
    "caffeine": ("Cn1cnc2c1c(=O)n(C)c(=O)n2C", "RYYVLZVUVIJVGH-UHFFFAOYSA-N"),
    "methane": ("C", "VNWKTOKETHGBQD-UHFFFAOYSA-N"),
    "water": ("O", "XLYOFNOQVPJJNP-UHFFFAOYSA-N"),
}

# Cross-checked against RDKit only (stereo of several kinds).
RDKIT_ONLY = {
    "(S)-2-chlorobutane": "C[C@H](Cl)CC",
    "(R)-2-chlorobutane": "C[C@@H](Cl)CC",
    "(E)-but-2-ene": "C/C=C/C",
    "(Z)-but-2-ene": "C/C=C\\C",
    "methyl beta-D-glucopyranoside": "CO[C@@H]1O[C@H](CO)[C@@H](O)[C@H](O)[C@H]1O",
    "cis-4-tert-butylcyclohexanol": "CC(C)(C)[C@H]1CC[C@@H](O)CC1",
    "L-threonine": "C[C@@H](O)[C@H](N)C(=O)O",
    "propanal": "CCC=O",
}


libinchi = ctypes.CDLL(ctypes.util.find_library("inchi") or "libinchi.so.1")
libinchi.GetStdINCHIKeyFromStdINCHI.argtypes = [ctypes.c_char_p, ctypes.c_char_p]


def vicinal(*args):
    out = subprocess.run([VICINAL, "--library", os.path.join(WORK, "lib.sqlite"), *args],
                         capture_output=True, text=True)
    if out.returncode != 0:
        sys.exit(f"vicinal {' '.join(args)} failed: {out.stderr}")
    return out.stdout


rows = [(name, smiles) for name, (smiles, _) in PUBLISHED.items()] + list(RDKIT_ONLY.items())
path = os.path.join(WORK, "compounds.csv")
with open(path, "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["compound", "smiles", "nuclei", "j_hz"])
    for name, smiles in rows:
        # Any coupling will do: atoms 1 and 2 (or 1 and 2 of the added H for
        # one-heavy-atom molecules) are always present.
        w.writerow([name, smiles, "1,2", "1.0"])
vicinal("library", "import", path)

failures = []
for name, smiles in rows:
    shown = json.loads(vicinal("--json", "library", "show", name))
    ours_key, ours_inchi = shown["inchikey"], shown["inchi"]
    if name in PUBLISHED and ours_key != PUBLISHED[name][1]:
        failures.append(f"{name}: InChIKey {ours_key}, published {PUBLISHED[name][1]}")
    given, stored = Chem.CanonSmiles(smiles), Chem.CanonSmiles(shown["smiles"])
    if given != stored:
        failures.append(f"{name}: stored structure {stored} is not the given {given} (RDKit)")
    key = ctypes.create_string_buffer(64)
    rc = libinchi.GetStdINCHIKeyFromStdINCHI(ours_inchi.encode(), key)
    if rc != 0 or key.value.decode() != ours_key:
        failures.append(f"{name}: libinchi hashes {ours_inchi} to {key.value.decode()} (rc {rc}), we store {ours_key}")
    print(f"{name:32s} {ours_key}  RDKit {'same' if given == stored else 'DIFFERS'}")

# Enantiomers and E/Z isomers must be different compounds in the library.
keys = {name: json.loads(vicinal("--json", "library", "show", name))["inchikey"] for name, _ in rows}
for a, b in [("L-alanine", "D-alanine"), ("(S)-2-chlorobutane", "(R)-2-chlorobutane"),
             ("(E)-but-2-ene", "(Z)-but-2-ene")]:
    if keys[a] == keys[b]:
        failures.append(f"{a} and {b} share the key {keys[a]}")

if failures:
    sys.exit("\n".join(failures))
print("inchi_reference: ok")
