#!/usr/bin/python3
"""Kills vicinal (SIGKILL) at random moments during `library import`,
`library merge` and the upgrade of a version-1 library (driver for
tests/cli/library_crash.sh).

After every kill the library holds either none or all of the file (couplings
before, or before + the file's) and `vicinal library check` (SQLite's
integrity and foreign-key checks plus vicinal's own rules) passes. For an upgrade: the library is still at
version 1 with its rows and no new table, and a pre-upgrade copy, if present,
is whole (a version-1 library with the same rows); or it is at the current
version with every compound's fingerprint and the copy beside it (all
migrations run in one transaction: no version in between). These are read directly
with SQLite (integrity and foreign keys first), before `vicinal library
check` opens the file and finishes the upgrade. Kill delays are drawn over the whole run: some within the
first 20 ms (start-up, opening), some around the end (commit), the rest
anywhere in between.

Runs go on until $LIBRARY_CRASH_KILLS (default 210) of them were killed
mid-way (runs that finish before their kill are checked the same way).
"""
import csv
import os
import random
import shutil
import signal
import sqlite3
import subprocess
import sys
import time

VICINAL = os.environ["VICINAL"]
WORK = os.environ["WORK"]
KILLS = int(os.environ.get("LIBRARY_CRASH_KILLS", "210"))
ROWS = 1500
random.seed(int(os.environ.get("LIBRARY_CRASH_SEED", "0")) or None)


def vicinal(*args, check=True):
    r = subprocess.run([VICINAL, "-q", *args], cwd=WORK, capture_output=True, text=True)
    if check and r.returncode != 0:
        sys.exit(f"FAIL: vicinal {' '.join(args)} exited {r.returncode}: {r.stderr}")
    return r


def query(path, sql):
    # Read-write, as any next user opens it: SQLite then rolls back what a killed
    # writer left in its journal (that recovery is part of what is tested).
    con = sqlite3.connect(path)
    try:
        return con.execute(sql).fetchall()
    finally:
        con.close()


def one(path, sql):
    return query(path, sql)[0][0]


def intact(path, what):
    if one(path, "pragma integrity_check") != "ok":
        sys.exit(f"FAIL: integrity_check of {path} after {what}")
    if query(path, "pragma foreign_key_check"):
        sys.exit(f"FAIL: foreign_key_check of {path} after {what}")


def library_check(path, what):
    r = vicinal("--library", path, "library", "check", check=False)
    if r.returncode != 0:
        sys.exit(f"FAIL: vicinal library check after {what}: exit {r.returncode}\n{r.stdout}{r.stderr}")


def timed(*args):
    start = time.monotonic()
    vicinal(*args)
    return time.monotonic() - start


# ---- inputs: couplings files with ROWS new rows each (distinct measurement sets)
vicinal("--library", "seed.sqlite", "library", "init")
with open(os.path.join(WORK, "seed.csv"), "w") as f:
    f.write('compound,smiles,nuclei,j_hz\nethanol,CCO,"4,7",7\npropanal,CCC=O,"7,10",1.4\n')
vicinal("--library", "seed.sqlite", "library", "import", "seed.csv")
vicinal("--library", "seed.sqlite", "library", "export", "seed-out.csv")
MOLFILE = {r["compound"]: r["molfile"] for r in csv.DictReader(open(os.path.join(WORK, "seed-out.csv"))) if r["molfile"]}
PAIR = {"ethanol": "4,7", "propanal": "7,10"}


def couplings_file(tag):
    """Molfiles rather than SMILES, so the run spends its time parsing and storing."""
    path = os.path.join(WORK, f"f{tag}.csv")
    with open(path, "w", newline="") as f:
        w = csv.writer(f)
        w.writerow(["compound", "molfile", "measurement", "solvent", "nuclei", "j_hz", "note"])
        for i in range(ROWS):
            name = "ethanol" if i % 2 else "propanal"
            w.writerow([name, MOLFILE[name] if i < 2 else "", f"{tag}-{i}", "CDCl3", PAIR[name], 5 + (i % 50) / 10,
                        f"row {i}"])
    return path


# ---- the library under test, a library to merge from, a larger version-1 library
LIB = os.path.join(WORK, "lib.sqlite")
vicinal("--library", LIB, "library", "init")
# The longest of three runs sets the kill window (one run alone can be quick by luck).
import_s = max(timed("--library", LIB, "library", "import", couplings_file(f"warmup{k}")) for k in range(3))
# The library is set back to this state whenever it has grown, so that the
# checks after each kill stay quick.
BASE = os.path.join(WORK, "base.sqlite")
vicinal("--library", LIB, "library", "backup", BASE)
BASE_COUPLINGS = 3 * ROWS


def reset_library():
    for suffix in ("", "-wal", "-shm"):
        if os.path.exists(LIB + suffix):
            os.remove(LIB + suffix)
    shutil.copy(BASE, LIB)


OTHER = os.path.join(WORK, "other.sqlite")
vicinal("--library", OTHER, "library", "init")
vicinal("--library", OTHER, "library", "import", couplings_file("other"))
other_round = 0


def fresh_other():
    """The merge source under new set names, so that merging it adds ROWS again."""
    global other_round
    other_round += 1
    path = os.path.join(WORK, f"other-{other_round}.sqlite")
    shutil.copy(OTHER, path)
    con = sqlite3.connect(path)
    con.execute("update measurement_sets set name = name || ?", (f"-m{other_round}",))
    con.commit()
    con.close()
    return path


merge_s = 0
for k in range(2):
    scratch = os.path.join(WORK, f"scratch{k}.sqlite")
    shutil.copy(LIB, scratch)
    merge_s = max(merge_s, timed("--library", scratch, "library", "merge", fresh_other()))

# Version 1 with 20 compounds and ROWS + 20 couplings, made like the fixture
# (tests/data/library/README.md): a current library with migrations 004 and
# 002 undone (003 changed no tables).
BIG_V1 = os.path.join(WORK, "big-v1.sqlite")
vicinal("--library", BIG_V1, "library", "init")
with open(os.path.join(WORK, "alcohols.csv"), "w") as f:
    f.write("compound,smiles,nuclei,j_hz\n")
    for n in range(1, 21):
        f.write(f'alcohol {n},{"C" * n}O,"1,{n + 1}",{1 + n / 100}\n')
vicinal("--library", BIG_V1, "library", "import", "alcohols.csv")
vicinal("--library", BIG_V1, "library", "import", couplings_file("v1"))
con = sqlite3.connect(BIG_V1)
con.executescript("DROP INDEX couplings_by_set_identity; CREATE INDEX couplings_by_identity ON couplings(identity);"
                  "DROP INDEX couplings_by_isotopes; DROP TABLE compound_fingerprints; PRAGMA user_version = 1;"
                  "PRAGMA journal_mode = DELETE; VACUUM;")
con.close()
V1_COUPLINGS = one(BIG_V1, "select count(*) from couplings")
# The schema version this vicinal writes: one migration file per version.
CURRENT = len([f for f in os.listdir(os.path.join(os.environ["VICINAL_DATA_DIR"], "schema")) if f.endswith(".sql")])
V1_COMPOUNDS = one(BIG_V1, "select count(*) from compounds")
shutil.copy(BIG_V1, os.path.join(WORK, "probe.sqlite"))
upgrade_s = timed("--library", "probe.sqlite", "library", "stats")
if one(os.path.join(WORK, "probe.sqlite"), "pragma user_version") != CURRENT:
    sys.exit("FAIL: the version-1 library was not upgraded")


def delay(span):
    """A kill time: 15 % within the first 20 ms, 15 % around the end, 70 % anywhere."""
    r = random.random()
    if r < 0.15:
        return random.uniform(0, 0.02)
    if r < 0.30:
        return random.uniform(0.8 * span, 1.4 * span)
    return random.uniform(0, span)


def kill_at(args, seconds):
    p = subprocess.Popen([VICINAL, "-q", *args], cwd=WORK, stdout=subprocess.DEVNULL, stderr=subprocess.DEVNULL)
    time.sleep(seconds)
    killed = p.poll() is None
    if killed:
        p.send_signal(signal.SIGKILL)
    p.wait()
    return killed, p.returncode


stats = {"import": [0, 0], "merge": [0, 0], "upgrade": [0, 0]}  # [killed, finished first]
next_file, pending_file, pending_other = 0, None, None
start = time.monotonic()
killed_total, i, late = 0, 0, 0  # late: killed after the commit
while killed_total < KILLS:
    i += 1
    if i > 3 * KILLS:
        sys.exit(f"FAIL: only {killed_total} of {i - 1} runs were killed mid-way")
    kind = ("import", "import", "import", "import", "import", "import", "merge", "merge", "upgrade", "upgrade")[i % 10]
    if kind in ("import", "merge"):
        if kind == "import":
            if pending_file is None:
                next_file += 1
                pending_file = couplings_file(next_file)
            args, span = ["--library", LIB, "library", "import", pending_file], import_s
        else:
            if pending_other is None:
                pending_other = fresh_other()
            args, span = ["--library", LIB, "library", "merge", pending_other], merge_s
        before = one(LIB, "select count(*) from couplings")
        when = delay(span)
        killed, code = kill_at(args, when)
        what = f"run {i} ({kind}, killed at {when * 1000:.0f} ms)"
        if not killed and code != 0:
            sys.exit(f"FAIL: {what}: the run ended with exit code {code} before the kill")
        after = one(LIB, "select count(*) from couplings")
        if after == before + ROWS:  # the whole file went in: the next run needs a new one
            late += killed
            if kind == "import":
                pending_file = None
            else:
                pending_other = None
        elif after != before:
            sys.exit(f"FAIL: {what} left {after - before} of {ROWS} couplings")
        library_check(LIB, what)  # integrity_check, foreign_key_check and vicinal's own rules
        if after > BASE_COUPLINGS + 2 * ROWS:
            reset_library()
    else:
        lib = os.path.join(WORK, "upgrade.sqlite")
        backup = os.path.join(WORK, "upgrade.v1.backup.sqlite")
        for f in os.listdir(WORK):
            if f.startswith(("upgrade", ".upgrade")):
                os.remove(os.path.join(WORK, f))
        shutil.copy(BIG_V1, lib)
        when = delay(upgrade_s)
        killed, code = kill_at(["--library", lib, "library", "stats"], when)
        what = f"run {i} (upgrade, killed at {when * 1000:.0f} ms)"
        if not killed and code != 0:
            sys.exit(f"FAIL: {what}: the run ended with exit code {code} before the kill")
        intact(lib, what)
        version = one(lib, "pragma user_version")
        if one(lib, "select count(*) from couplings") != V1_COUPLINGS:
            sys.exit(f"FAIL: {what}: couplings changed")
        tables = {r[0] for r in query(lib, "select name from sqlite_master where type = 'table'")}
        if version == 1:
            if "compound_fingerprints" in tables:
                sys.exit(f"FAIL: {what}: version 1 with a version-2 table (half an upgrade)")
        elif version == CURRENT:
            if one(lib, "select count(*) from compound_fingerprints") != V1_COMPOUNDS:
                sys.exit(f"FAIL: {what}: version {version} without every fingerprint (half an upgrade)")
            if not os.path.exists(backup):
                sys.exit(f"FAIL: {what}: upgraded without the pre-upgrade copy")
        else:
            sys.exit(f"FAIL: {what}: schema version {version}")
        if os.path.exists(backup):
            intact(backup, what + ", its pre-upgrade copy")
            if one(backup, "pragma user_version") != 1 or one(backup, "select count(*) from couplings") != V1_COUPLINGS:
                sys.exit(f"FAIL: {what}: the pre-upgrade copy is not the version-1 library")
        library_check(lib, what)
        if one(lib, "pragma user_version") != CURRENT or not os.path.exists(backup):
            sys.exit(f"FAIL: {what}: opening again did not finish the upgrade with its copy")
    stats[kind][0 if killed else 1] += 1
    killed_total += killed

print(f"library_crash: ok, {killed_total} kills in {i} runs, {time.monotonic() - start:.0f} s: " +
      ", ".join(f"{k} {v[0]} killed / {v[1]} finished first" for k, v in stats.items()) +
      f"; {late} import/merge kills came after the commit"
      f" (one import {import_s * 1000:.0f} ms, merge {merge_s * 1000:.0f} ms, upgrade {upgrade_s * 1000:.0f} ms)")
