"""Textbook facts about spin-system spectra, checked on `vicinal multiplet simulate`.

Each check names where the expected result comes from.
"""
import json
import math
import os
import subprocess
import sys
import tempfile

VICINAL = os.environ["VICINAL"]
WORK = os.environ.get("WORK") or tempfile.mkdtemp()
os.makedirs(WORK, exist_ok=True)


def simulate(system, *extra):
    path = os.path.join(WORK, "system.json")
    with open(path, "w") as f:
        json.dump(system, f)
    out = subprocess.run([VICINAL, "--json", "multiplet", "simulate", path, "--merge-hz", "0.01", *extra],
                         capture_output=True, text=True, check=True)
    return json.loads(out.stdout)["lines"]


def proton(label, ppm, count=1):
    return {"label": label, "isotope": "1H", "shift_ppm": ppm, "count": count}


def expect(cond, message):
    if not cond:
        sys.exit("FAIL: " + message)


# 1. AB quartet. Source: Pople, Schneider and Bernstein, High-resolution Nuclear
#    Magnetic Resonance, McGraw-Hill 1959 (textbook result): with C = sqrt(dnu^2 + J^2)/2
#    lines at nu_mean -+ J/2 -+ C, inner/outer intensity (1 + J/2C)/(1 - J/2C).
for dnu, j in ((20.0, 7.0), (5.0, 12.0), (1.0, 15.0)):
    lines = simulate({"field_mhz": 100, "observe": "1H", "spins": [proton("A", 2.0), proton("B", 2.0 + dnu / 100)],
                      "couplings": [{"between": ["A", "B"], "j_hz": j}]})
    c = math.hypot(dnu, j) / 2
    mean = 200 + dnu / 2
    s = j / (2 * c)
    want = [(mean - j / 2 - c, 1 - s), (mean + j / 2 - c, 1 + s), (mean - j / 2 + c, 1 + s), (mean + j / 2 + c, 1 - s)]
    expect(len(lines) == 4, f"AB dnu={dnu}: {len(lines)} lines")
    for l, (f, i) in zip(lines, want):
        expect(abs(l["hz"] - f) < 1e-6 and abs(l["intensity"] - i / 2) < 1e-6, f"AB dnu={dnu}: {l} vs {(f, i / 2)}")
print("AB quartet: closed form reproduced")

# 2. n equivalent spin-1/2 neighbours: n + 1 lines, binomial intensities
#    (common practice, no source). Partner far away (first-order limit).
for n in range(1, 7):
    lines = [l for l in simulate({"field_mhz": 500, "observe": "1H", "spins": [proton("A", 1.0), proton("X", 200.0, n)],
                                  "couplings": [{"between": ["A", "X"], "j_hz": 7.0}]}) if l["ppm"] < 50]
    expect(len(lines) == n + 1, f"{n} neighbours: {len(lines)} lines")
    ratios = [l["intensity"] / lines[0]["intensity"] for l in lines]
    expect(all(abs(r - math.comb(n, k)) < 1e-3 * math.comb(n, k) for k, r in enumerate(ratios)),
           f"{n} neighbours: {ratios}")
print("binomial multiplets: ok for n = 1..6")

# 3. Spin-I neighbours give 2nI + 1 lines (common practice, no source):
#    one 11B (I = 3/2) -> 1:1:1:1 quartet; three 2H (I = 1) -> 7 lines 1:3:6:7:6:3:1.
lines = simulate({"field_mhz": 400, "observe": "1H", "spins": [proton("H", 0.2), {"label": "B", "isotope": "11B"}],
                  "couplings": [{"between": ["H", "B"], "j_hz": 81.0}]})
expect([round(l["intensity"] * 4, 6) for l in lines] == [1, 1, 1, 1], f"11B quartet: {lines}")
lines = simulate({"field_mhz": 400, "observe": "1H",
                  "spins": [proton("H", 2.0), {"label": "D", "isotope": "2H", "count": 3}],
                  "couplings": [{"between": ["H", "D"], "j_hz": 1.0}]})
expect([round(l["intensity"] * 27, 6) for l in lines] == [1, 3, 6, 7, 6, 3, 1], f"CD3 septet: {lines}")
print("2nI + 1 lines: ok")

# 4. H coupled to one D: 1:1:1 triplet, J(H,D) = J(H,H) x gamma(2H)/gamma(1H) = 0.15350 J(H,H).
#    Source: IUPAC Recommendations 2001, Harris et al., Pure Appl. Chem. 73, 1795 (2001), Tables 1 and 2
#    (gamma 1H 26.7522128, 2H 4.10662791 x 10^7 rad T^-1 s^-1).
j_hh = 7.5
j_hd = j_hh * 4.10662791 / 26.7522128
lines = simulate({"field_mhz": 400, "observe": "1H", "spins": [proton("H", 2.0), {"label": "D", "isotope": "2H"}],
                  "couplings": [{"between": ["H", "D"], "j_hz": j_hd}]})
expect(len(lines) == 3 and all(abs(l["intensity"] - 1 / 3) < 1e-9 for l in lines), f"HD triplet: {lines}")
expect(abs((lines[2]["hz"] - lines[0]["hz"]) / 2 - 1.151) < 1e-3, f"J(H,D) {lines}")
print("H-D triplet: ok")

# 5. Magnetically equivalent nuclei show no splitting from their mutual coupling
#    (common practice, no source): CH2 with J(gem) = 14 Hz, alone and as two labels.
alone = simulate({"field_mhz": 400, "observe": "1H", "spins": [proton("M", 2.0, 2)],
                  "couplings": [{"between": ["M", "M"], "j_hz": 14.0}]})
two = simulate({"field_mhz": 400, "observe": "1H", "spins": [proton("M1", 2.0), proton("M2", 2.0)],
                "couplings": [{"between": ["M1", "M2"], "j_hz": 14.0}]})
expect(len(alone) == 1 and len(two) == 1 and abs(two[0]["intensity"] - 2) < 1e-9, f"A2: {alone} {two}")
print("equivalent nuclei: no splitting")

# 6. Roof effect (common practice, no source): in AX/AB the doublets lean
#    towards each other, more so as dnu/J shrinks.
previous = 1.0
for dnu in (300.0, 60.0, 20.0, 6.0):
    lines = simulate({"field_mhz": 100, "observe": "1H", "spins": [proton("A", 1.0), proton("X", 1.0 + dnu / 100)],
                      "couplings": [{"between": ["A", "X"], "j_hz": 8.0}]})
    inner, outer = lines[1]["intensity"], lines[0]["intensity"]
    expect(inner > outer and lines[2]["intensity"] > lines[3]["intensity"], f"roof direction at dnu {dnu}")
    expect(inner / outer > previous, f"roof grows as dnu shrinks ({dnu})")
    previous = inner / outer
print("roof effect: ok")
print("spin_textbook: ok")
