"""vicinal fit --matrix against SciPy: exact optimum of the population fit.

Reference: scipy.optimize.nnls (Lawson-Hanson) on the problem augmented with a
heavily weighted sum-to-one row, followed by an exact equality-constrained
least-squares refinement on the NNLS support (numpy), with the KKT conditions
checked here; and scipy.optimize.minimize(method="SLSQP") on the original
constrained problem. Population ranges are checked against SLSQP maximising and
minimising one population under chi2 <= chi2_min + 3.841 (chi-square, 1 dof,
95 %: scipy.stats.chi2.ppf).
Source: SciPy 1.10 (scipy.optimize.nnls, scipy.optimize.minimize SLSQP,
scipy.stats.chi2); the problems are random, seeded, generated here.
"""
import json
import os
import subprocess
import sys

import numpy as np
from scipy.optimize import minimize, nnls
from scipy.stats import chi2 as chi2_dist

VICINAL = os.environ["VICINAL"]
WORK = os.environ.get("WORK", "/tmp/fit_scipy")
os.makedirs(WORK, exist_ok=True)
failures = []


def check(ok, what):
    if not ok:
        failures.append(what)
        print("FAIL:", what)


def write_problem(tag, J, obs, sigma, rms):
    m, n = J.shape
    names = [f"H-{r + 1}/X-{r + 1}" for r in range(m)]
    with open(f"{WORK}/{tag}-couplings.csv", "w") as f:
        f.write("nuclei,j_hz,sigma_hz\n")
        for r in range(m):
            f.write(f"\"H-{r + 1},X-{r + 1}\",{obs[r]!r},{sigma[r]!r}\n")
    with open(f"{WORK}/{tag}-matrix.csv", "w") as f:
        f.write("title," + ",".join(names) + "\n")
        for i in range(n):
            f.write(f"c{i + 1}," + ",".join(repr(J[r, i]) for r in range(m)) + "\n")
    return f"{WORK}/{tag}-couplings.csv", f"{WORK}/{tag}-matrix.csv"


def run_vicinal(couplings, matrix, rms):
    out = subprocess.run([VICINAL, "--json", "fit", "--couplings", couplings, "--matrix", matrix,
                          "--rms-hz", repr(rms), "--draws", "0"], capture_output=True, text=True)
    if out.returncode != 0:
        raise SystemExit(f"vicinal failed: {out.stderr}")
    return json.loads(out.stdout)


def reference_optimum(A, b):
    """NNLS on the augmented problem, then exact refinement on its support."""
    m, n = A.shape
    big = 1e4 * max(1.0, np.abs(A).max())
    w, _ = nnls(np.vstack([A, big * np.ones((1, n))]), np.append(b, big))
    for _ in range(50):
        support = np.where(w > 1e-10)[0]
        k = len(support)
        # KKT system of min |A_S w - b|^2 s.t. sum w = 1 (least-squares solve; the
        # support of NNLS has independent columns in practice).
        K = np.zeros((k + 1, k + 1))
        As = A[:, support]
        K[:k, :k] = 2 * As.T @ As
        K[:k, k] = 1
        K[k, :k] = 1
        rhs = np.append(2 * As.T @ b, 1.0)
        sol = np.linalg.lstsq(K, rhs, rcond=None)[0]
        if (sol[:k] >= 0).all():
            w = np.zeros(n)
            w[support] = sol[:k]
            break
        w[support] = np.maximum(sol[:k], 0)  # drop what went negative and retry
        w /= w.sum()
    return w


def kkt_ok(A, b, w):
    g = 2 * A.T @ (A @ w - b)
    mu = g.min()
    scale = max(1.0, np.abs(g).max())
    return all(g[i] - mu < 1e-7 * scale for i in range(len(w)) if w[i] > 1e-9)


rng = np.random.default_rng(20261201)
shapes = [(5, 3), (8, 20), (4, 4), (40, 200), (3, 50), (12, 12), (40, 1000)]
for case, (m, n) in enumerate(shapes):
    J = rng.uniform(0.5, 11.5, size=(m, n))
    truth = rng.dirichlet(np.ones(min(n, 3)))
    chosen = rng.choice(n, size=min(n, 3), replace=False)
    obs = J[:, chosen] @ truth + rng.normal(0, 0.8, size=m)
    sigma = rng.uniform(0.2, 0.6, size=m)
    rms = 0.5
    if case == 2:  # a degenerate case: two identical conformers
        J[:, 3] = J[:, 1]
    s = np.sqrt(sigma**2 + rms**2)
    A, b = J / s[:, None], obs / s
    couplings, matrix = write_problem(f"case{case}", J, obs, sigma, rms)
    got = run_vicinal(couplings, matrix, rms)
    w_ref = reference_optimum(A, b)
    chi2_ref = float(np.sum((A @ w_ref - b) ** 2))
    w_got = np.array([p["weight"] for p in got["populations"]])
    chi2_got = got["chi2"]
    check(kkt_ok(A, b, w_ref), f"case {case}: SciPy reference fails KKT")
    check(kkt_ok(A, b, w_got), f"case {case}: vicinal weights fail KKT (checked in NumPy)")
    check(abs(w_got.sum() - 1) < 1e-10 and w_got.min() >= 0, f"case {case}: weights not on the simplex")
    check(abs(chi2_got - chi2_ref) <= 1e-8 * max(1.0, chi2_ref),
          f"case {case} ({m}x{n}): chi2 {chi2_got!r} vs SciPy {chi2_ref!r}")
    check(abs(float(np.sum((A @ w_got - b) ** 2)) - chi2_got) <= 1e-9 * max(1.0, chi2_got),
          f"case {case}: reported chi2 does not match the reported weights")
    if got["weights_unique"]:
        check(np.abs(w_got - w_ref).max() < 1e-6, f"case {case}: unique weights differ from SciPy by "
              f"{np.abs(w_got - w_ref).max():.2e}")
    if case == 2:
        check(not got["weights_unique"], "case 2: identical conformers reported as unique")
    if n <= 20:  # SLSQP as a second, independent optimiser
        cons = ({"type": "eq", "fun": lambda w: w.sum() - 1},)
        res = minimize(lambda w: np.sum((A @ w - b) ** 2), np.full(n, 1 / n), jac=lambda w: 2 * A.T @ (A @ w - b),
                       bounds=[(0, 1)] * n, constraints=cons, method="SLSQP",
                       options={"ftol": 1e-15, "maxiter": 2000})
        check(chi2_got <= res.fun * (1 + 1e-7) + 1e-9, f"case {case}: SLSQP found lower chi2 {res.fun} < {chi2_got}")
        check(abs(chi2_got - res.fun) <= 1e-5 * max(1.0, res.fun), f"case {case}: SLSQP {res.fun} vs {chi2_got}")
    print(f"case {case} ({m} couplings x {n} conformers): chi2 vicinal {chi2_got:.12g}, SciPy {chi2_ref:.12g}, "
          f"unique={got['weights_unique']}")

    # Ranges: SLSQP min/max of each population within chi2_min + delta (small cases).
    if n <= 12:
        delta = chi2_dist.ppf(0.95, 1)
        check(abs(got["identifiability"]["delta_chi2"] - delta) < 1e-9, "delta chi2 differs from scipy.stats.chi2.ppf")
        limit = chi2_got + delta
        for i in range(n):
            ends = []
            for sign in (+1, -1):
                best = None
                for start in range(6):
                    w0 = rng.dirichlet(np.ones(n)) if start else w_got
                    cons = ({"type": "eq", "fun": lambda w: w.sum() - 1},
                            {"type": "ineq", "fun": lambda w: limit - np.sum((A @ w - b) ** 2)})
                    r = minimize(lambda w: sign * w[i], w0, bounds=[(0, 1)] * n, constraints=cons, method="SLSQP",
                                 options={"ftol": 1e-12, "maxiter": 1000})
                    if r.success and np.sum((A @ r.x - b) ** 2) <= limit + 1e-6:
                        v = r.x[i]
                        best = v if best is None else (min(best, v) if sign > 0 else max(best, v))
                ends.append(best)
            lo, hi = got["populations"][i]["range"]
            check(ends[0] is not None and abs(lo - ends[0]) < 1e-4, f"case {case} population {i}: min {lo} vs SLSQP {ends[0]}")
            check(ends[1] is not None and abs(hi - ends[1]) < 1e-4, f"case {case} population {i}: max {hi} vs SLSQP {ends[1]}")

if failures:
    sys.exit(f"{len(failures)} check(s) failed")
print("fit_scipy: ok")
