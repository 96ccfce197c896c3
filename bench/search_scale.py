"""Substructure search over a library of 100,000 compounds, side by side with
a plain Open Babel scan of the same molecules (opt-in: `make bench-search`,
about 11 minutes the first time, 7 of them RDKit embedding every structure;
the inputs are kept in build-bench/bench-inputs). Writes
bench/results/search-scale.md.

Run with /usr/bin/python3 (it needs RDKit and Open Babel's Python module):
    /usr/bin/python3 bench/search_scale.py --build build-bench
"""
import argparse
import json
import os
import sqlite3
import sys
import time

HERE = os.path.dirname(os.path.abspath(__file__))
sys.path.insert(0, HERE)
import compare  # noqa: E402  (run, interleaved, rows_for, HEADER, fmt_s, PYBEL_SMARTS_SCRIPT)
import make_inputs  # noqa: E402

# (SMARTS, what it finds): a rare and a common substructure.
QUERIES = [("IC(CC#N)C", "a carbon bearing iodine and a cyanomethyl group"), ("c1ccccc1", "any benzene ring")]


def main():
    ap = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    ap.add_argument("--build", default="build-bench")
    ap.add_argument("--compounds", type=int, default=100_000)
    ap.add_argument("--reps", type=int, default=3)
    ap.add_argument("--out", default=os.path.join(HERE, "results", "search-scale.md"))
    args = ap.parse_args()

    build = os.path.abspath(args.build)
    work = os.path.join(build, "bench-inputs")
    os.makedirs(work, exist_ok=True)
    scan = os.path.join(work, "pybel_smarts.py")
    with open(scan, "w") as f:
        f.write(compare.PYBEL_SMARTS_SCRIPT)
    V = [os.path.join(build, "vicinal"), "--quiet", "--threads", "1"]

    print(f"search: {args.compounds:,} structures (RDKit, first time only)", flush=True)
    made_before = os.path.exists(os.path.join(work, f"search-{args.compounds}.csv"))
    started = time.perf_counter()
    table, sdf = make_inputs.write_search_library_inputs(work, args.compounds)
    made_in = time.perf_counter() - started

    library = os.path.join(work, f"search-{args.compounds}.sqlite")
    if not os.path.exists(library):
        print("search: importing", flush=True)
        for suffix in ("", "-wal", "-shm"):  # what a failed run left
            if os.path.exists(library + ".part" + suffix):
                os.remove(library + ".part" + suffix)
        compare.run(V + ["--library", library + ".part", "library", "init"])
        import_wall, import_rss, _ = compare.run(V + ["--library", library + ".part", "library", "import", table])
        os.replace(library + ".part", library)
    else:
        import_wall = import_rss = None
    with sqlite3.connect(library) as db:
        compounds = db.execute("SELECT count(*) FROM compounds").fetchone()[0]

    md = ["# Substructure search at scale", "",
          f"Machine: {os.cpu_count()} cores, shared; load average at start {os.getloadavg()[0]:.2f}. "
          "Contenders run interleaved, whole process each, vicinal with one thread.", "",
          f"Library: {compounds:,} compounds (bench/make_inputs.py `search_compounds`: a-CH2-(CH2)n-CH(b)-CH2-c, "
          f"a, b, c among {len(make_inputs.SEARCH_GROUPS)} common substituents; 3D by RDKit distance geometry), "
          f"one coupling each, imported by `vicinal library import` from a CSV with each structure inline"
          + (f" in {compare.fmt_s(import_wall)} ({compounds / import_wall:,.0f} compounds/s, peak "
             f"{import_rss:.0f} MB)" if import_wall else " (import timed when the library was first built)")
          + (". Inputs kept from an earlier run." if made_before else f". Inputs made in {compare.fmt_s(made_in)}."),
          "",
          "vicinal: `library find --smarts Q --limit 5`: tests the SMARTS only on compounds whose stored "
          "fingerprint contains the query's, counts the couplings of the matching compounds and reads the first "
          "five. Open Babel: pybel reads every structure from one SDF file of the same molecules and tests the "
          "SMARTS on each, nothing more.", ""]
    for smarts, what in QUERIES:
        print(f"search: {smarts}", flush=True)
        res = compare.interleaved([
            ("vicinal library find --smarts", V + ["--library", library, "--json", "library", "find", "--smarts",
                                                    smarts, "--limit", "5"]),
            ("Open Babel (pybel) scan of the same molecules", [compare.PY, scan, smarts, sdf])], args.reps)
        found = json.loads(compare.run(V + ["--library", library, "--json", "library", "find", "--smarts", smarts,
                                            "--limit", "5"])[2])
        scanned = json.loads(compare.run([compare.PY, scan, smarts, sdf])[2].strip().splitlines()[-1])
        md += [f"## `{smarts}` ({what})", "",
               f"Matching compounds: vicinal {found['compounds_matching_smarts']:,}, Open Babel scan "
               f"{scanned['matched']:,}; compounds the fingerprint screen skipped: "
               f"{found['compounds_skipped_by_fingerprint']:,}.", ""]
        md += compare.HEADER + compare.rows_for(res, compounds, "compounds/s", "vicinal library find --smarts")
        md.append("")
    with open(args.out, "w") as f:
        f.write("\n".join(md))
    print("\n".join(md))


if __name__ == "__main__":
    main()
