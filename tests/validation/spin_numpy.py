"""Independent numerical check of `vicinal multiplet simulate`.

A second implementation written with numpy along a different code path: the
full Hamiltonian of every nucleus (protons and a deuteron, no grouping, no
Fz blocks, no first-order shortcut for the deuteron) built densely from
Kronecker products and diagonalised whole. Lines are the eigenvalue
differences connected by the proton F- with intensity |<f|F-|i>|^2.
vicinal must give the same line positions and intensities for random systems
(strongly coupled protons, a pair of magnetically equivalent protons entered
as "count": 2, and a spin-1 deuteron).
Source: independent numerical check (numpy.linalg.eigh, dense Kronecker-product
Hamiltonian H = sum nu_i Iz_i + sum J_ij I_i.I_j; textbook spin algebra, common practice).
"""
import json
import os
import subprocess
import sys
import tempfile

import numpy as np

VICINAL = os.environ["VICINAL"]
WORK = os.environ.get("WORK") or tempfile.mkdtemp()
os.makedirs(WORK, exist_ok=True)


def spin_ops(s):
    m = np.arange(s, -s - 1, -1)
    n = len(m)
    z = np.diag(m)
    plus = np.zeros((n, n))
    for k in range(1, n):
        plus[k - 1, k] = np.sqrt(s * (s + 1) - m[k] * (m[k] + 1))
    x = (plus + plus.T) / 2
    y = (plus - plus.T) / 2j
    return x, y, z, plus.T


def embed(op, k, dims):
    out = np.array([[1.0]])
    for i, d in enumerate(dims):
        out = np.kron(out, op if i == k else np.eye(d))
    return out


def reference_lines(spins, nu, j, observed):
    dims = [int(round(2 * s + 1)) for s in spins]
    ops = [[embed(o, k, dims) for o in spin_ops(s)] for k, s in enumerate(spins)]
    h = sum(nu[k] * ops[k][2] for k in range(len(spins)))
    for a in range(len(spins)):
        for b in range(a + 1, len(spins)):
            if j[a][b]:
                h = h + j[a][b] * (ops[a][0] @ ops[b][0] + ops[a][1] @ ops[b][1] + ops[a][2] @ ops[b][2])
    energy, vectors = np.linalg.eigh(h)
    minus = sum(ops[k][3] for k in observed)
    amp = vectors.conj().T @ minus @ vectors  # amp[f, i] = <f|F-|i>
    inten = np.abs(amp) ** 2
    freq = energy[None, :] - energy[:, None]  # E_i - E_f
    mask = inten > 1e-12
    lines = sorted(zip(freq[mask], inten[mask]))
    merged = []
    for f, i in lines:
        if merged and f - merged[-1][0] <= 1e-3:
            pf, pi = merged[-1]
            merged[-1] = ((pf * pi + f * i) / (pi + i), pi + i)
        else:
            merged.append((f, i))
    total = sum(i for _, i in merged)
    return [(f, i * len(observed) / total) for f, i in merged]


def check(seed):
    rng = np.random.default_rng(seed)
    field = 100.0
    ppm = {"A": 2.0 + rng.uniform(0, 0.3), "B": 2.0 + rng.uniform(0, 0.3), "C": 2.0 + rng.uniform(0, 0.3),
           "M": 2.0 + rng.uniform(0, 0.3)}
    pairs = {("A", "B"), ("A", "C"), ("B", "C"), ("A", "M"), ("B", "M"), ("C", "M")}
    jv = {p: round(float(rng.uniform(-3, 16)), 3) for p in sorted(pairs)}
    j_mm = 12.0    # mutual coupling inside the equivalent pair: must not matter
    j_ad = 2.3     # proton A to the deuteron
    system = {"field_mhz": field, "observe": "1H",
              "spins": [{"label": k, "isotope": "1H", "shift_ppm": v, "count": 2 if k == "M" else 1}
                        for k, v in ppm.items()] + [{"label": "D", "isotope": "2H"}],
              "couplings": [{"between": list(p), "j_hz": v} for p, v in sorted(jv.items())]
              + [{"between": ["M", "M"], "j_hz": j_mm}, {"between": ["A", "D"], "j_hz": j_ad}]}
    path = os.path.join(WORK, f"random_{seed}.json")
    with open(path, "w") as f:
        json.dump(system, f)
    out = subprocess.run([VICINAL, "--json", "multiplet", "simulate", path], capture_output=True, text=True,
                         check=True)
    got = [(l["hz"], l["intensity"]) for l in json.loads(out.stdout)["lines"]]

    # numpy: M as two separate spins M1, M2; the deuteron with its own Larmor
    # offset in the proton rotating frame (400 MHz vs 61.4 MHz: -3.4e8 Hz).
    names = ["A", "B", "C", "M1", "M2", "D"]
    spins = [0.5] * 5 + [1.0]
    nu = [ppm["A"] * field, ppm["B"] * field, ppm["C"] * field, ppm["M"] * field, ppm["M"] * field, -3.4e8]
    j = [[0.0] * 6 for _ in range(6)]

    def setj(a, b, v):
        ia, ib = names.index(a), names.index(b)
        j[min(ia, ib)][max(ia, ib)] = v

    for (a, b), v in jv.items():
        for x in ([a] if a != "M" else ["M1", "M2"]):
            for y in ([b] if b != "M" else ["M1", "M2"]):
                setj(x, y, v)
    setj("M1", "M2", j_mm)
    setj("A", "D", j_ad)
    want = reference_lines(spins, nu, j, observed=[0, 1, 2, 3, 4])
    want = [(f, i) for f, i in want if i > 1e-6 * max(i for _, i in want)]
    got = [(f, i) for f, i in got if i > 1e-6 * max(i for _, i in got)]
    if len(got) != len(want):
        sys.exit(f"seed {seed}: vicinal gives {len(got)} lines, numpy {len(want)}")
    worst_f = max(abs(a[0] - b[0]) for a, b in zip(got, want))
    worst_i = max(abs(a[1] - b[1]) for a, b in zip(got, want))
    # The deuteron is first order in vicinal; its second-order effect here is J^2/3.4e8 Hz.
    if worst_f > 2e-3 or worst_i > 1e-4:
        sys.exit(f"seed {seed}: worst line deviation {worst_f:.2e} Hz, intensity {worst_i:.2e}")
    print(f"seed {seed}: {len(got)} lines agree (max {worst_f:.1e} Hz, {worst_i:.1e} in intensity)")


for seed in (1, 2, 3):
    check(seed)
print("spin_numpy: ok")
