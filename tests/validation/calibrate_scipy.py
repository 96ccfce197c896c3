"""vicinal karplus calibrate against SciPy on the same synthetic data.

Source: SciPy (scipy.optimize.least_squares with loss='linear', 'huber' and
'cauchy' and f_scale) as the outside reference optimiser. Its robust losses
are rho(z) = z (z <= 1) or 2 sqrt(z) - 1 (Huber) and ln(1 + z) (Cauchy) on
z = (r / f_scale)^2, scaled by f_scale^2: the same functions as Ceres'
HuberLoss(a) and CauchyLoss(a) with a = f_scale (common practice, from the two
libraries' documentation). The data are synthetic (seeded) with three outliers.
"""
import json
import os
import subprocess
import sys

import numpy as np
from scipy.optimize import least_squares

vicinal = os.environ["VICINAL"]
work = os.environ.get("WORK", "/tmp/calibrate_scipy")
os.makedirs(work, exist_ok=True)

rng = np.random.default_rng(2024)
angles = np.linspace(-175, 175, 48)
sigma = np.full(angles.size, 0.4)
x = np.cos(np.radians(angles - 60))
j = 6.9 * x**2 - 1.4 * x + 1.7 + rng.normal(0, 0.4, angles.size)
j[[4, 17, 30]] += [6.0, -5.0, 7.0]
path = os.path.join(work, "pairs.csv")
with open(path, "w") as f:
    f.write("j_hz,sigma_hz,dihedral_deg\n")
    for a, b, c in zip(j, sigma, angles):
        f.write(f"{a:.6f},{b},{c}\n")

failures = []
for loss, scale in (("squared", 1.0), ("huber", 1.5), ("cauchy", 2.0)):
    out = subprocess.run([vicinal, "--json", "karplus", "calibrate", "--points", path, "--offset-deg", "-60",
                          "--loss", loss, "--loss-scale", str(scale), "--bootstrap", "20"],
                         capture_output=True, text=True)
    if out.returncode != 0:
        failures.append(f"{loss}: exit {out.returncode}: {out.stderr}")
        continue
    ours = [c["value"] for c in json.loads(out.stdout)["coefficients"]]

    def residuals(p):
        xx = np.cos(np.radians(angles - 60))
        return (j - (p[0] * xx**2 + p[1] * xx + p[2])) / sigma

    ref = least_squares(residuals, [0, 0, 0], loss="linear" if loss == "squared" else loss, f_scale=scale,
                        xtol=1e-14, ftol=1e-14, gtol=1e-14).x
    for name, a, b in zip("ABC", ours, ref):
        if abs(a - b) > 1e-3:
            failures.append(f"{loss} {name}: vicinal {a:.5f}, SciPy {b:.5f}")

if failures:
    print("\n".join(failures))
    sys.exit(1)
print("calibrate vs SciPy: ok")
