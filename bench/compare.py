"""Times vicinal against outside references, side by side, and writes the table.

Run with /usr/bin/python3 (it needs numpy, scipy, mdtraj, openbabel):
    /usr/bin/python3 bench/compare.py --build build-bench
Every comparison runs its contenders interleaved (A B A B ...) in one run, so
load from other work on the machine hits them alike; each run is a separate
process timed by wall clock, with its peak resident memory from /usr/bin/time.
References that report their own inner time (solve only, without interpreter
start-up and imports) print it, and both numbers are shown.
Writes bench/results/latest.md (the tables) and bench/results/scaling.svg.
"""
import argparse
import json
import os
import shutil
import statistics
import subprocess
import sys
import tempfile
import time

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
import make_inputs  # noqa: E402
import svg_plot  # noqa: E402

PY = "/usr/bin/python3"


def run(cmd, cwd=None):
    """Runs cmd once; returns (wall_s, peak_rss_mb, stdout)."""
    with tempfile.NamedTemporaryFile("r", suffix=".time") as t:
        start = time.perf_counter()
        p = subprocess.run(["/usr/bin/time", "-f", "%M", "-o", t.name] + cmd, cwd=cwd,
                           stdout=subprocess.PIPE, stderr=subprocess.PIPE, text=True)
        wall = time.perf_counter() - start
        if p.returncode != 0:
            raise RuntimeError(f"{' '.join(cmd)} failed ({p.returncode}):\n{p.stderr[-2000:]}")
        rss_kb = int(t.read().strip().splitlines()[-1])
    return wall, rss_kb / 1024, p.stdout


def inner_time(stdout):
    """The inner time a reference script prints as its last line: {"inner_s": ...}."""
    lines = [ln for ln in stdout.strip().splitlines() if ln.startswith("{") and "inner_s" in ln]
    return json.loads(lines[-1]).get("inner_s") if lines else None


class Result:
    def __init__(self, name):
        self.name, self.walls, self.rss, self.inner = name, [], [], []

    def add(self, wall, rss, stdout):
        self.walls.append(wall)
        self.rss.append(rss)
        t = inner_time(stdout)
        if t is not None:
            self.inner.append(t)

    @property
    def median(self):
        return statistics.median(self.walls)


def interleaved(contenders, reps, cwd=None):
    """contenders: list of (name, cmd). Runs A B A B ...; returns {name: Result}."""
    results = {name: Result(name) for name, _ in contenders}
    for _ in range(reps):
        for name, cmd in contenders:
            results[name].add(*run(cmd, cwd))
    return results


def fmt_s(s):
    if s < 1e-3:
        return f"{s * 1e6:.1f} us"
    return f"{s * 1000:.1f} ms" if s < 1 else f"{s:.2f} s"


def rows_for(results, work, unit, baseline):
    """Markdown rows: contender, median, min-max, inner, ratio to baseline, throughput, memory."""
    base = results[baseline].median
    out = []
    for r in results.values():
        inner = fmt_s(statistics.median(r.inner)) if r.inner else "-"
        out.append(f"| {r.name} | {fmt_s(r.median)} | {fmt_s(min(r.walls))} - {fmt_s(max(r.walls))} | {inner} "
                   f"| {r.median / base:.2f} | {work / r.median:,.1f} {unit} | {max(r.rss):.0f} MB |")
    return out


HEADER = ["| contender | median wall | min - max | inner (solve/read only) | time / vicinal | throughput | peak RSS |",
          "|---|---|---|---|---|---|---|"]

NNLS_SCRIPT = r"""
import csv, json, sys, time
import numpy as np
from scipy.optimize import nnls
matrix, couplings = sys.argv[1], sys.argv[2]
with open(matrix) as f:
    rows = list(csv.reader(f))[1:]
J = np.array([[float(v) for v in r[1:]] for r in rows])           # conformers x couplings
with open(couplings) as f:
    c = list(csv.reader(f))[1:]
j_obs = np.array([float(r[1]) for r in c]); s = np.array([float(r[2]) for r in c])
# The augmented problem: min |(J^T w - j_obs)/s|^2 + |lam (sum w - 1)|^2, w >= 0,
# lam large so that sum w = 1 holds to solver precision (common practice, no source).
lam = 1e3 * np.abs(J).max() / s.min()
A = np.vstack([J.T / s[:, None], lam * np.ones((1, J.shape[0]))])
b = np.concatenate([j_obs / s, [lam]])
t0 = time.perf_counter()
w, _ = nnls(A, b, maxiter=50 * A.shape[1])
t1 = time.perf_counter()
chi2 = float((((J.T @ w) - j_obs) / s) ** 2 @ np.ones_like(s))
print(json.dumps({"chi2": chi2, "sum_w": float(w.sum()), "inner_s": t1 - t0}))
"""

MDTRAJ_SCRIPT = r"""
import json, sys, time
t0 = time.perf_counter()
import mdtraj as md
t1 = time.perf_counter()
traj = md.load(sys.argv[1])
idx, J = md.compute_J3_HN_HA(traj)
mean = J.mean(axis=0)
t2 = time.perf_counter()
print(json.dumps({"frames": traj.n_frames, "couplings": int(J.shape[1]), "inner_s": t2 - t1}))
"""

PYBEL_SCRIPT = r"""
import json, sys, time
from openbabel import openbabel as ob, pybel
ob.obErrorLog.SetOutputLevel(0)
t0 = time.perf_counter()
frames = 0
for mol in pybel.readfile("pdb", sys.argv[1]):
    frames += 1
t1 = time.perf_counter()
print(json.dumps({"frames": frames, "inner_s": t1 - t0}))
"""

SQLITE_SCRIPT = r"""
import csv, json, sqlite3, sys, time
t0 = time.perf_counter()
with open(sys.argv[1]) as f:
    r = csv.reader(f); header = next(r); rows = list(r)
db = sqlite3.connect(sys.argv[2])
db.execute("CREATE TABLE couplings (" + ",".join(header) + ")")
with db:
    db.executemany("INSERT INTO couplings VALUES (" + ",".join("?" * len(header)) + ")", rows)
db.close()
print(json.dumps({"rows": len(rows), "inner_s": time.perf_counter() - t0}))
"""


# The plain scan: argv[2] is one SDF file of every molecule, or a text file
# listing one SDF file per molecule.
PYBEL_SMARTS_SCRIPT = r"""
import json, sys, time
from openbabel import openbabel as ob, pybel
ob.obErrorLog.SetOutputLevel(0)
t0 = time.perf_counter()
pattern = pybel.Smarts(sys.argv[1])
if sys.argv[2].endswith(".sdf"):
    molecules = pybel.readfile("sdf", sys.argv[2])
else:
    with open(sys.argv[2]) as f:
        molecules = (next(pybel.readfile("sdf", path)) for path in f.read().split())
matched = sum(bool(pattern.findall(mol)) for mol in molecules)
print(json.dumps({"matched": matched, "inner_s": time.perf_counter() - t0}))
"""


def google_benchmarks(build, min_time, env):
    """Runs every bench program; returns {program: [benchmark dicts]}."""
    out = {}
    for prog in ["karplus_bench", "j_matrix_bench", "frame_reader_bench", "fit_bench", "spin_bench",
                 "library_bench"]:
        p = subprocess.run([os.path.join(build, "bench", prog), "--benchmark_format=json",
                            f"--benchmark_min_time={min_time}"], stdout=subprocess.PIPE,
                           env=dict(os.environ, OMP_NUM_THREADS="1", **env),
                           stderr=subprocess.PIPE, text=True, check=True)
        out[prog] = json.loads(p.stdout)["benchmarks"]
    return out


def gb_seconds(b, key="real_time"):
    scale = {"ns": 1e-9, "us": 1e-6, "ms": 1e-3, "s": 1.0}[b["time_unit"]]
    return b[key] * scale


def main():
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--build", default="build-bench")
    ap.add_argument("--reps", type=int, default=5, help="runs of each fast contender")
    ap.add_argument("--slow-reps", type=int, default=3, help="runs of each trajectory contender")
    ap.add_argument("--frames", type=int, default=200)
    ap.add_argument("--atoms", type=int, default=4000)
    ap.add_argument("--library-rows", type=int, default=1_000_000, help="largest library import")
    ap.add_argument("--min-time", type=float, default=0.1, help="Google Benchmark min time per case (s)")
    ap.add_argument("--out", default=os.path.join(HERE, "results"))
    args = ap.parse_args()

    build = os.path.abspath(args.build)
    vicinal = os.path.join(build, "vicinal")
    floor = os.path.join(build, "bench", "parse_floor")
    work = os.path.join(build, "bench-inputs")
    os.makedirs(work, exist_ok=True)
    os.makedirs(args.out, exist_ok=True)
    for name, text in [("nnls.py", NNLS_SCRIPT), ("mdtraj_j.py", MDTRAJ_SCRIPT), ("pybel_read.py", PYBEL_SCRIPT),
                       ("sqlite_insert.py", SQLITE_SCRIPT), ("pybel_smarts.py", PYBEL_SMARTS_SCRIPT)]:
        with open(os.path.join(work, name), "w") as f:
            f.write(text)
    V = [vicinal, "--quiet", "--threads", "1"]
    md = ["# vicinal benchmarks", "",
          f"Machine: {os.cpu_count()} cores, shared; load average at start {os.getloadavg()[0]:.2f}. "
          f"vicinal runs with --threads 1 (the references are single-threaded). Contenders run interleaved; "
          f"times are whole-process wall clock unless marked inner.", ""]
    targets = []
    scaling = {}
    t_start = time.time()

    # 1. Exact population fit vs SciPy NNLS on the augmented problem.
    print("fit: exact fit vs scipy nnls", flush=True)
    fit_rows = []
    fit_sizes = [(1000, 40), (100, 40), (300, 40), (1000, 10), (1000, 160)]
    main_fit = None
    for conformers, couplings in fit_sizes:
        m = os.path.join(work, f"matrix-{conformers}x{couplings}.csv")
        c = os.path.join(work, f"couplings-{conformers}x{couplings}.csv")
        make_inputs.write_fit_problem(m, c, conformers, couplings)
        res = interleaved([("vicinal fit --matrix --draws 0", V + ["--json", "fit", "--couplings", c, "--matrix", m,
                                                                    "--draws", "0", "--rms-hz", "0"]),
                           ("SciPy nnls (augmented)", [PY, os.path.join(work, "nnls.py"), m, c])], args.reps)
        # Both solve the same convex problem: their chi2 must agree.
        v_out = json.loads(run(V + ["--json", "fit", "--couplings", c, "--matrix", m, "--draws", "0",
                                    "--rms-hz", "0"])[2])
        s_out = json.loads(run([PY, os.path.join(work, "nnls.py"), m, c])[2].strip().splitlines()[-1])
        agree = abs(v_out["chi2"] - s_out["chi2"]) <= 1e-4 * max(1.0, s_out["chi2"])
        fit_rows.append((conformers, couplings, res, v_out["chi2"], s_out["chi2"], agree))
        if (conformers, couplings) == (1000, 40):
            main_fit = res
    md += ["## Exact population fit vs SciPy NNLS", "",
           "Same files for both (`vicinal fit --matrix`; SciPy reads the CSV and solves the augmented NNLS "
           "problem with a weighted sum-to-one row). Whole process each.", "",
           "| conformers x couplings | vicinal | SciPy (whole) | SciPy nnls inner | SciPy / vicinal | chi2 vicinal | chi2 SciPy | agree |",
           "|---|---|---|---|---|---|---|---|"]
    for conformers, couplings, res, cv, cs, agree in fit_rows:
        v, s = res["vicinal fit --matrix --draws 0"], res["SciPy nnls (augmented)"]
        md.append(f"| {conformers} x {couplings} | {fmt_s(v.median)} | {fmt_s(s.median)} | "
                  f"{fmt_s(statistics.median(s.inner))} | {s.median / v.median:.2f} | {cv:.4f} | {cs:.4f} | "
                  f"{'yes' if agree else 'NO'} |")
    md += ["", "1000 x 40 in detail:", ""] + HEADER + rows_for(main_fit, 1, "fits/s",
                                                                "vicinal fit --matrix --draws 0") + [""]

    # 2. Ensemble prediction over a trajectory vs MDTraj, Open Babel, cat, parse floor.
    print("trajectory: generating", flush=True)
    traj = os.path.join(work, f"traj-{args.frames}.pdb")
    top = os.path.join(work, "topology.pdb")
    if not os.path.exists(traj):
        atoms = make_inputs.write_trajectory(traj, top, args.atoms, args.frames)
    with open(top) as f:
        atoms = sum(1 for ln in f if ln.startswith("ATOM"))
    size_mb = os.path.getsize(traj) / 1e6
    predict = V + ["predict", "--structure", top, "--ensemble", traj, "--stream", "--set", "hn-ha-hu-bax-1997"]
    print("trajectory: timing", flush=True)
    res = interleaved([("vicinal predict --stream", predict),
                       ("MDTraj load + compute_J3_HN_HA", [PY, os.path.join(work, "mdtraj_j.py"), traj]),
                       ("Open Babel (pybel) read every frame", [PY, os.path.join(work, "pybel_read.py"), traj]),
                       ("cat FILE > /dev/null", ["sh", "-c", f"cat '{traj}' > /dev/null"]),
                       ("parse floor (from_chars, one pass)", [floor, traj])], args.slow_reps)
    md += [f"## Ensemble prediction: {args.frames} frames x {atoms} atoms ({size_mb:.1f} MB PDB)", "",
           "vicinal: 3J(HN,HA) (Hu & Bax 1997 set) for every residue, mean over frames, topology read by Open "
           "Babel from the first model. MDTraj: its own 3J(HN,HA) for the same residues. Open Babel: reads "
           "every model as a molecule (the generic reader path), computes nothing.", ""]
    md += HEADER + rows_for(res, args.frames, "frames/s", "vicinal predict --stream")
    v_traj = res["vicinal predict --stream"].median
    md += ["", f"vicinal throughput: {size_mb / v_traj:.1f} MB/s.", ""]
    ob_ratio = res["Open Babel (pybel) read every frame"].median / v_traj
    ob_inner_ratio = statistics.median(res["Open Babel (pybel) read every frame"].inner) / v_traj
    floor_ratio = v_traj / res["parse floor (from_chars, one pass)"].median
    targets.append(("ensemble prediction >= 50x the generic reader (Open Babel) path",
                    f"{ob_ratio:.1f}x (inner read only: {ob_inner_ratio:.1f}x)", ob_inner_ratio >= 50))
    targets.append(("ensemble prediction within 3x of raw parse speed",
                    f"{floor_ratio:.2f}x the parse floor", floor_ratio <= 3))

    # Frames scaling (vicinal and the floor only).
    frame_sizes = [args.frames // 4, args.frames // 2, args.frames]
    scaling["frames (4k atoms)"] = {"vicinal predict --stream": [], "parse floor": []}
    for n in frame_sizes:
        path = os.path.join(work, f"traj-{n}.pdb")
        if not os.path.exists(path):
            make_inputs.write_trajectory(path, os.path.join(work, "topology-scratch.pdb"), args.atoms, n)
        r = interleaved([("v", V + ["predict", "--structure", top, "--ensemble", path, "--stream", "--set",
                                    "hn-ha-hu-bax-1997"]), ("f", [floor, path])], args.reps)
        scaling["frames (4k atoms)"]["vicinal predict --stream"].append((n, r["v"].median))
        scaling["frames (4k atoms)"]["parse floor"].append((n, r["f"].median))

    # 3. Library import vs SQLite's own bulk insert of the same rows.
    print("library: import vs sqlite bulk insert", flush=True)
    lib_sizes = [100_000, 300_000, args.library_rows]
    compounds = 500
    md += ["## Library import vs SQLite bulk insert", "",
           f"Realistic input (bench/make_inputs.py `write_library_bulk`): {compounds} compounds "
           "(X-(CH2)n-Y chains, n = 2-25, X != Y among OH, NH2, SH, Cl, F, Br, OMe), each given once by a 3D SDF "
           "file with explicit hydrogens (RDKit ETKDG, fixed seeds), then many H-H couplings per compound over "
           "many measurement sets (four solvents, a temperature series), compound by compound. vicinal: "
           "`library import` into a fresh library (created by `library init`, not timed): reads and checks every "
           "row, computes each compound's InChI, InChIKey, canonical ranks, symmetry and fingerprint once, "
           "each distinct coupling's identity key once, and stores everything in one transaction with its "
           "indexes; with two threads (the default on this machine) one reads the file and does the Open Babel "
           "work while the other stores what has been read. Ceiling: SQLite's own bulk insert of the same CSV rows into one plain table without indexes "
           "in one transaction: the sqlite3 shell's `.import --csv` (C, prepared statement) and Python "
           "csv + executemany.", "",
           "| rows | vicinal, 1 thread | vicinal, 2 threads | sqlite3 .import | Python executemany | "
           "vicinal rows/s (1 / 2 threads) | .import rows/s | vicinal 2 threads / .import | peak RSS vicinal |",
           "|---|---|---|---|---|---|---|---|---|"]
    scaling["library rows"] = {"vicinal import, 1 thread": [], "vicinal import, 2 threads": [], "sqlite3 .import": []}
    lib = os.path.join(work, "lib.sqlite")
    ref = os.path.join(work, "ref.sqlite")
    big_lib = os.path.join(work, "lib-big.sqlite")

    def remove(*paths):
        for p in paths:
            for suffix in ("", "-wal", "-shm"):
                if os.path.exists(p + suffix):
                    os.remove(p + suffix)

    def import_once(csv_path, target, threads=1):
        remove(target)
        run(V + ["--library", target, "library", "init"])
        with_threads = V[:V.index("--threads") + 1] + [str(threads)] + V[V.index("--threads") + 2:]
        return run(one_omp + with_threads + ["--library", target, "library", "import", csv_path])

    def ceiling(cmd):
        remove(ref)
        return run(cmd)[0]

    one_omp = ["env", "OMP_NUM_THREADS=1"]
    import_rate = ratio = None
    for n in lib_sizes:
        csv_path = make_inputs.write_library_bulk(work, compounds, n)
        vt, v2t, ct, pt, vr = [], [], [], [], []
        # The largest file is the target's: three runs, as one run on this
        # shared machine can be a third off.
        for _ in range(3 if n == lib_sizes[-1] else 2 if n <= 100_000 else 1):
            target = big_lib if n == lib_sizes[-1] else lib
            w, rss, _ = import_once(csv_path, lib)
            vt.append(w)
            vr.append(rss)
            w, rss, _ = import_once(csv_path, target, threads=2)
            v2t.append(w)
            vr.append(rss)
            ct.append(ceiling(["sqlite3", ref, ".import --csv " + csv_path + " couplings"]))
            pt.append(ceiling([PY, os.path.join(work, "sqlite_insert.py"), csv_path, ref]))
        v, v2 = statistics.median(vt), statistics.median(v2t)
        c, p = statistics.median(ct), statistics.median(pt)
        md.append(f"| {n:,} | {fmt_s(v)} | {fmt_s(v2)} | {fmt_s(c)} | {fmt_s(p)} | {n / v:,.0f} / {n / v2:,.0f} | "
                  f"{n / c:,.0f} | {v2 / c:.1f} | {max(vr):.0f} MB |")
        scaling["library rows"]["vicinal import, 1 thread"].append((n, v))
        scaling["library rows"]["vicinal import, 2 threads"].append((n, v2))
        scaling["library rows"]["sqlite3 .import"].append((n, c))
        import_rate, ratio = n / v2, v2 / c
    # The same number of rows over 10 compounds: the per-row part of the work.
    few = make_inputs.write_library_bulk(work, 10, 100_000)
    w_few = statistics.median([import_once(few, lib)[0] for _ in range(2)])
    md += ["", f"100,000 rows over 10 compounds, 1 thread (the per-row work without most of the per-compound work): "
           f"{fmt_s(w_few)}, {100_000 / w_few:,.0f} rows/s.", ""]
    remove(lib)
    targets.append(("library import >= 100,000 couplings/s",
                    f"{import_rate:,.0f} couplings/s with 2 threads at {lib_sizes[-1]:,} rows over {compounds} "
                    f"compounds ({ratio:.1f}x the time of sqlite3 .import)", import_rate >= 100000))

    # A compound as a group measures one: (R)-4-chlorobutan-2-ol, not among
    # the bulk compounds, eight distinct vicinal H-H pairs in three solvents.
    # Atoms as Open Babel numbers the SMILES with hydrogens added: C1 C2 O3 C4
    # C5 Cl6, then H7-H9 on C1, H10 on C2, H11 on O3, H12-H13 on C4, H14-H15 on C5.
    typical = "chlorobutanol (typical)"
    typical_csv = os.path.join(work, "typical.csv")
    with open(typical_csv, "w") as f:
        f.write("compound,smiles,solvent,nuclei,j_hz\n")
        pairs = [(7, 10), (10, 11), (10, 12), (10, 13), (12, 14), (12, 15), (13, 14), (13, 15)]
        structure = "C[C@@H](O)CCCl"  # on the first row only
        for solvent in ("CDCl3", "D2O", "DMSO-d6"):
            for k, (a, b) in enumerate(pairs):
                f.write(f"{typical},{structure},{solvent},\"H{a},H{b}\",{6 + k / 10:.1f}\n")
                structure = ""
    run(V + ["--library", big_lib, "library", "import", typical_csv])

    # Lookup and substructure search in the big library.
    print("library: lookup and substructure search", flush=True)
    some = "bulk 250 " + make_inputs.bulk_compounds(compounds)[249]
    lookup_env = {"VICINAL_BENCH_LIBRARY": big_lib, "VICINAL_BENCH_COMPOUND": some,
                  "VICINAL_BENCH_TYPICAL_COMPOUND": typical}
    smarts = "BrCCCCCCCCCCCCCCCCCCCC"
    sdfs = [os.path.join(work, "structures", f"c{i + 1:03d}.sdf") for i in range(compounds)]
    with open(os.path.join(work, "sdf-list.txt"), "w") as f:
        f.write("\n".join(sdfs) + "\n")
    res = interleaved([("vicinal library find --smarts", V + ["--library", big_lib, "--json", "library", "find",
                                                              "--smarts", smarts, "--limit", "5"]),
                       ("Open Babel (pybel) scan of the same molecules",
                        [PY, os.path.join(work, "pybel_smarts.py"), smarts, os.path.join(work, "sdf-list.txt")])],
                      args.reps)
    show = interleaved([("vicinal library show --json", V + ["--library", big_lib, "--json", "library", "show",
                                                             some])], args.reps)["vicinal library show --json"]
    md += [f"## Library lookup and substructure search ({lib_sizes[-1]:,} couplings, {compounds} compounds)", "",
           f"Substructure `{smarts}` (whole process each): vicinal tests the SMARTS only on compounds whose stored "
           "fingerprint contains the query's, then counts the couplings of the matching compounds and reads the "
           "first five (--limit 5); the scan reads every structure file and tests the SMARTS on each, nothing more. "
           f"Over {compounds} compounds here; over 100,000 in `make bench-search` (results/search-scale.md), "
           "whose inputs take too long to make for this run.", ""]
    md += HEADER + rows_for(res, compounds, "compounds/s", "vicinal library find --smarts")
    md += ["", f"`library show --json` of one compound (about {lib_sizes[-1] // compounds:,} couplings), whole "
           f"process: {fmt_s(show.median)}; the lookup itself is `lookup_compound` in the in-process table.", ""]

    # 4. Google Benchmark programs (in-process, one thread).
    print("google benchmarks", flush=True)
    gb = google_benchmarks(build, args.min_time, lookup_env)
    md += ["## In-process benchmarks (Google Benchmark, one thread)", "",
           "Wall and CPU time per iteration; on a shared machine CPU time is the steadier number.", "",
           "| benchmark | wall | CPU | items/s |", "|---|---|---|---|"]
    for prog, benches in gb.items():
        for b in benches:
            ips = b.get("items_per_second")
            md.append(f"| {b['name']} | {fmt_s(gb_seconds(b))} | {fmt_s(gb_seconds(b, 'cpu_time'))} | "
                      f"{f'{ips:,.0f}' if ips else '-'} |")
    md.append("")

    def series(prog, prefix, key):
        return [(key(b["name"]), gb_seconds(b)) for b in gb[prog] if b["name"].startswith(prefix)]

    scaling["spins"] = {"simulate": series("spin_bench", "simulate_spins/", lambda n: int(n.split("/")[1]))}
    scaling["conformers (40 couplings)"] = {"exact fit": [
        (int(b["name"].split("/")[1]), gb_seconds(b)) for b in gb["fit_bench"]
        if b["name"].startswith("exact_fit/") and b["name"].split("/")[2] == "40"]}
    scaling["couplings (1000 frames)"] = {"J matrix": [
        (int(b["name"].split("/")[2]), gb_seconds(b)) for b in gb["j_matrix_bench"]
        if b["name"].split("/")[1] == "1000"]}
    scaling["couplings (1000 conformers fit)"] = {"exact fit": [
        (int(b["name"].split("/")[2]), gb_seconds(b)) for b in gb["fit_bench"]
        if b["name"].startswith("exact_fit/") and b["name"].split("/")[1] == "1000"]}
    twelve = [(gb_seconds(b), gb_seconds(b, "cpu_time")) for b in gb["spin_bench"]
              if b["name"] == "simulate_spins/12"]
    targets.append(("simulation of 12 coupled spins < 2 s (one thread)",
                    f"wall {fmt_s(twelve[0][0])}, CPU {fmt_s(twelve[0][1])}" if twelve else "not measured",
                    bool(twelve) and twelve[0][1] < 2))

    def in_process(name):
        found = [b for b in gb["library_bench"] if b["name"] == name and not b.get("error_occurred")]
        return found[0] if found else None

    sqlite_floor = in_process("lookup_compound_sqlite_floor")
    for name, what in (("lookup_typical_compound", "a compound with"),
                       ("lookup_compound", "a bulk compound with")):
        lookup = in_process(name)
        extra = ""
        if lookup and name == "lookup_compound":
            extra = f"; whole `library show --json` process {fmt_s(show.median)}"
            if sqlite_floor:
                extra += (f"; SQLite alone reads the same rows in {fmt_s(gb_seconds(sqlite_floor))} "
                          f"(`lookup_compound_sqlite_floor`): vicinal / SQLite = "
                          f"{gb_seconds(lookup) / gb_seconds(sqlite_floor):.2f}")
        targets.append((f"lookup of one compound's couplings < 1 ms at {args.library_rows:,} couplings",
                        f"{fmt_s(gb_seconds(lookup))} for {what} {lookup.get('couplings', 0):,.0f} couplings "
                        f"(in process){extra}" if lookup else "not measured",
                        bool(lookup) and gb_seconds(lookup) < 1e-3))
    fit_in = [gb_seconds(b) for b in gb["fit_bench"] if b["name"] == "exact_fit/1000/40"]
    scipy_inner = statistics.median(main_fit["SciPy nnls (augmented)"].inner)
    v_whole = main_fit["vicinal fit --matrix --draws 0"].median
    s_whole = main_fit["SciPy nnls (augmented)"].median
    targets.append(("exact fit no slower than SciPy NNLS (1000 x 40)",
                    f"whole process: vicinal {fmt_s(v_whole)} vs SciPy {fmt_s(s_whole)}; solve only: vicinal "
                    f"{fmt_s(fit_in[0]) if fit_in else '?'} (Google Benchmark, own random problem of the same size) "
                    f"vs SciPy nnls {fmt_s(scipy_inner)}",
                    v_whole <= s_whole and bool(fit_in) and fit_in[0] <= scipy_inner))

    # Scaling table and plot.
    md += ["## Scaling", "", "| series | size | time |", "|---|---|---|"]
    for panel, lines in scaling.items():
        for label, pts in lines.items():
            for n, t in pts:
                md.append(f"| {panel}: {label} | {n:,} | {fmt_s(t)} |")
    svg_path = os.path.join(args.out, "scaling.svg")
    svg_plot.write_panels(svg_path, scaling)
    md += ["", f"Plot: {os.path.relpath(svg_path, os.path.dirname(HERE))} (log-log).", ""]

    md = md[:4] + ["## Targets", "", "| target | measured | met |", "|---|---|---|"] + [
        f"| {t} | {m} | {'met' if ok else 'MISSED'} |" for t, m, ok in targets] + [""] + md[4:]
    md.append(f"Total benchmark time: {time.time() - t_start:.0f} s.")
    text = "\n".join(md) + "\n"
    with open(os.path.join(args.out, "latest.md"), "w") as f:
        f.write(text)
    print(text)


if __name__ == "__main__":
    main()
