#!/usr/bin/python3
"""Hostile input for every command that reads a file (driver for tests/cli/hostile_*.sh).

Each *slot* is one file a command reads (a library CSV, a spin-system JSON, a
structure, ...), with a small valid example of it. From the example the driver
makes hostile variants at run time (truncated, UTF-16, Latin-1, NUL bytes,
1e400, 40-digit integers, NaN/inf, a 10 MB line, 100,000-level JSON, atoms out
of range, duplicated headers or keys, unknown keys, mixed line endings, empty,
a folder, an unreadable file) and runs the command on each under `timeout 20`.

Every hostile run must end with exit code 2 and exactly one stderr line
"vicinal: error: ..." naming the file (and the line and field where that
applies), shorter than 2,000 characters; no output file may appear and no
temporary file may be left; a library it writes to keeps its row count.
Mixed line endings are valid text: those runs must succeed with the same
output as the example (or be refused like the others). The unaltered example
must succeed, so that every refusal is about the hostile part.

Usage: hostile_input.py GROUP   (library, tables or structures); $VICINAL and
$WORK as for the other CLI tests.
"""
import json
import math
import os
import shutil
import sqlite3
import subprocess
import sys

VICINAL = os.environ["VICINAL"]
WORK = os.environ["WORK"]
HERE = os.path.dirname(os.path.abspath(__file__))
DATA = os.path.join(HERE, "..", "data")
ROOT = os.path.join(HERE, "..", "..")
EX = os.path.join(ROOT, "examples")
DB = os.path.join(ROOT, "db")
BIG = 10_000_000  # "a 10 MB single line"
NUMBER_KINDS = {"1e400", "40-digits", "nan", "inf", "-inf", "10MB-number"}
AS_ROOT = os.geteuid() == 0


def read(path):
    with open(path, "rb") as f:
        return f.read()


def vicinal(args, cwd, env=None, timeout=60):
    return subprocess.run([VICINAL, *args], cwd=cwd, capture_output=True, env=env, timeout=timeout)


class Slot:
    """One input file of one command.

    argv uses {FILE} (the hostile file), {OUT} (an output that must not
    appear), {DIR} (the case folder) and {LIB} (a library copy, when
    library=True). Markers are byte strings found once in `base`:
      number  (find, template)  a number whose value is replaced; `field` names it
      atom    (find, template)  an atom index (or count) replaced by 0, -1, 2^31, 99
      dup     find              a "key": value (JSON) written twice
      text    find              Latin-1 'e-acute' is put before it (default: line 2)
    """

    def __init__(self, name, fmt, file, base, argv, out=None, field=None, number=None, atom=None, dup=None,
                 text=None, atom_field=None, library=False, extra=None, env=None, skip=(), truncate=None, deep=None,
                 located=True):
        self.name, self.fmt, self.file, self.base, self.argv = name, fmt, file, base, argv
        self.out, self.field, self.number, self.atom, self.dup, self.text = out, field, number, atom, dup, text
        self.atom_field = atom_field
        self.library, self.extra, self.env, self.skip = library, extra or {}, env or {}, set(skip)
        self.truncate_fn, self.deep_fn, self.located = truncate, deep, located
        for marker in [m[0] for m in (number, atom) if m] + [m for m in (dup, text) if m]:
            assert base.count(marker) == 1, f"{name}: marker {marker!r} must occur once"

    def line_of(self, marker):
        return self.base[: self.base.index(marker)].count(b"\n") + 1

    # ---- hostile variants: kind -> (content bytes or a special, line the damage is on or None)
    def truncated(self):
        if self.truncate_fn:
            return self.truncate_fn(self.base)
        if self.fmt == "csv":  # cut the last row inside its first field: too few fields or an open quote
            lines = self.base.rstrip(b"\n").split(b"\n")
            last = lines[-1]
            first = last.split(b",")[0]
            return b"\n".join(lines[:-1]) + b"\n" + last[: max(1, len(first) // 2)]
        if self.fmt == "mol":  # half of the atom block
            lines = self.base.split(b"\n")
            atoms = int(lines[3][:3])
            return b"\n".join(lines[: 4 + atoms // 2]) + b"\n"
        return self.base[: len(self.base) // 2]

    def variants(self):
        b = self.base
        if self.fmt == "sqlite":  # a library file: damaged, empty, not SQLite at all
            return {"truncated": (self.truncated(), None), "empty": (b"", None), "directory": ("DIR", None),
                    "unreadable": ("UNREADABLE", None), "nul-header": (b"\0" * 100 + b[100:], None),
                    "text": (b"compound,smiles\nethanol,CCO\n", None), "long-line": (b"x" * BIG, None),
                    "damaged-pages": (b[:4096] + bytes(range(256)) * ((len(b) - 4096) // 256), None),
                    "other-program": (FOREIGN_SQLITE, None)}
        line2 = b.index(b"\n") + 1
        out = {
            "truncated": (self.truncated(), None),
            "utf16": (b"\xff\xfe" + b.decode("utf-8").encode("utf-16-le"), None),
            "empty": (b"", None),
            "directory": ("DIR", None),
            "unreadable": ("UNREADABLE", None),
            "long-line": (b.split(b"\n")[0] + b"x" * BIG, None),
            "mixed-eol": (mixed_eol(b), None),
        }
        if self.text:
            at = b.index(self.text)
            out["latin1"] = (b[:at] + b"\xe9" + b[at:], self.line_of(self.text))
        else:
            out["latin1"] = (b[:line2] + b"\xe9" + b[line2:], 2)
        end2 = b.index(b"\n", line2) if b.count(b"\n") > 1 else len(b)
        middle = (line2 + end2) // 2
        out["nul"] = (b[:middle] + b"\0" + b[middle:], 2)
        if self.number:
            find, template = self.number
            line = self.line_of(find)
            for kind, value in [("1e400", b"1e400"), ("40-digits", b"1234567890" * 4), ("nan", b"nan"),
                                ("inf", b"inf"), ("-inf", b"-inf"), ("10MB-number", b"9" * BIG)]:
                out[kind] = (b.replace(find, template.replace(b"{}", value)), line)
        if self.atom:
            find, template = self.atom
            for kind, value in [("atom-0", b"0"), ("atom-minus-1", b"-1"), ("atom-2^31", b"2147483648"),
                                ("atom-beyond", b"99")]:
                out[kind] = (b.replace(find, template.replace(b"{}", value)), self.line_of(find))
        if self.fmt == "csv":
            header, rest = b.split(b"\n", 1)
            out["duplicated-header"] = (header + b"," + header.split(b",")[0] + b"\n" + rest, 1)
        if self.fmt == "json":
            out["deep-json"] = (b"[" * 100_000 + b"]" * 100_000, None)
            at = b.index(b"{") + 1
            out["unknown-key"] = (b[:at] + b' "colour": "red",' + b[at:], None)
        if self.deep_fn:
            out["deep-json"] = (self.deep_fn(b"[" * 100_000 + b"]" * 100_000), None)
        if self.dup:
            out["duplicated-key"] = (b.replace(self.dup, self.dup + b", " + self.dup), self.line_of(self.dup))
        for kind in self.skip:
            out.pop(kind, None)
        return out


def foreign_sqlite():
    """Another program's SQLite file: tables, rollback journal, no schema version."""
    path = os.path.join(WORK, "foreign.sqlite")
    if os.path.exists(path):
        os.remove(path)
    con = sqlite3.connect(path)
    con.executescript("CREATE TABLE samples (id INTEGER PRIMARY KEY, name TEXT); INSERT INTO samples (name) VALUES ('x');")
    con.close()
    return read(path)


def mixed_eol(b):
    lines = b.split(b"\n")
    ends = [b"\r\n", b"\n", b"\r"]
    out = b""
    for i, line in enumerate(lines[:-1]):
        out += line + ends[i % 3]
    return out + lines[-1]


def listing(folder):
    found = set()
    for dirpath, dirnames, filenames in os.walk(folder):
        for n in dirnames + filenames:
            found.add(os.path.relpath(os.path.join(dirpath, n), folder))
    return found


def couplings_in(path):
    con = sqlite3.connect(path)
    try:
        return con.execute("select count(*) from couplings").fetchone()[0]
    finally:
        con.close()


class Runner:
    def __init__(self):
        self.failures, self.cases = [], 0
        os.makedirs(WORK, exist_ok=True)
        self.template = os.path.join(WORK, "template.sqlite")
        if not os.path.exists(self.template):
            r = vicinal(["-q", "--library", self.template, "library", "init"], WORK)
            assert r.returncode == 0, r.stderr

    def fail(self, slot, kind, why, r=None):
        detail = ""
        if r is not None:
            detail = f"\n    exit {r.returncode}; stderr: {r.stderr[:600]!r}"
        self.failures.append(f"{slot.name}/{kind}: {why}{detail}")

    def prepare(self, slot, kind, content):
        folder = os.path.join(WORK, slot.name, kind)
        shutil.rmtree(folder, ignore_errors=True)
        os.makedirs(folder)
        for name, data in slot.extra.items():
            path = os.path.join(folder, name)
            os.makedirs(os.path.dirname(path), exist_ok=True)
            with open(path, "wb") as f:
                f.write(data)
        path = os.path.join(folder, slot.file)
        os.makedirs(os.path.dirname(path), exist_ok=True)
        if content == "DIR":
            os.makedirs(path)
        else:
            with open(path, "wb") as f:
                f.write(slot.base if content == "UNREADABLE" else content)
            if content == "UNREADABLE":
                os.chmod(path, 0)
        if slot.library:
            shutil.copy(self.template, os.path.join(folder, "lib.sqlite"))
        return folder, path

    def command(self, slot, folder, path, unreadable):
        subst = {"{FILE}": path, "{DIR}": folder, "{LIB}": os.path.join(folder, "lib.sqlite"),
                 "{OUT}": os.path.join(folder, slot.out or "unused")}
        argv = []
        for a in slot.argv:
            for k, v in subst.items():
                a = a.replace(k, v)
            argv.append(a)
        cmd = ["timeout", "20", VICINAL, *argv]
        if unreadable and AS_ROOT:
            # root reads mode-000 files; drop the two capabilities that allow it.
            cmd = ["setpriv", "--inh-caps=-dac_override,-dac_read_search",
                   "--bounding-set=-dac_override,-dac_read_search", *cmd]
        env = dict(os.environ)
        for k, v in slot.env.items():
            env[k] = v.replace("{DIR}", folder)
        return cmd, env

    def run_slot(self, slot):
        # The example itself must be accepted and write its output.
        folder, path = self.prepare(slot, "valid", slot.base)
        cmd, env = self.command(slot, folder, path, False)
        r = subprocess.run(cmd, cwd=folder, capture_output=True, env=env)
        self.cases += 1
        if r.returncode != 0:
            self.fail(slot, "valid", "the unaltered example was refused", r)
            return
        if slot.out and not os.path.exists(os.path.join(folder, slot.out)):
            self.fail(slot, "valid", f"the example run wrote no {slot.out}", r)
        valid_stdout = r.stdout.replace(folder.encode(), b"@")

        for kind, (content, line) in slot.variants().items():
            self.cases += 1
            folder, path = self.prepare(slot, kind, content)
            before = listing(folder)
            lib = os.path.join(folder, "lib.sqlite")
            rows = couplings_in(lib) if slot.library else None
            given = read(path) if slot.fmt == "sqlite" and os.path.isfile(path) and content != "UNREADABLE" else None
            cmd, env = self.command(slot, folder, path, content == "UNREADABLE")
            try:
                r = subprocess.run(cmd, cwd=folder, capture_output=True, env=env, timeout=30)
            except subprocess.TimeoutExpired:
                self.fail(slot, kind, "did not end within 30 s")
                continue
            finally:
                if content == "UNREADABLE":
                    os.chmod(path, 0o644)
            # SQLite's own side files of a library it opened are not output.
            after = {f for f in listing(folder) if not f.endswith(("-wal", "-shm"))}
            if slot.library and rows is not None and couplings_in(lib) != rows and kind != "mixed-eol":
                self.fail(slot, kind, f"the library changed from {rows} to {couplings_in(lib)} couplings", r)
            if kind == "mixed-eol" and r.returncode == 0:
                if r.stdout.replace(folder.encode(), b"@") != valid_stdout:
                    self.fail(slot, kind, "accepted, but the output differs from the LF example's", r)
                continue
            if given is not None and read(path) != given:
                self.fail(slot, kind, "the refused database file was changed", r)
            if r.returncode == 124:
                self.fail(slot, kind, "timed out after 20 s", r)
                continue
            if r.returncode != 2:
                self.fail(slot, kind, f"exit code {r.returncode}, expected 2", r)
                continue
            if after != before:
                self.fail(slot, kind, f"files appeared: {sorted(after - before)}", r)
            # Notes may come first; the run must end with one error line.
            lines = r.stderr.decode("utf-8", "replace").split("\n")
            err = lines[-2] + "\n" if len(lines) >= 2 and lines[-1] == "" else ""
            if not err.startswith("vicinal: error: ") or any(not l.startswith("note: ") for l in lines[:-2]):
                self.fail(slot, kind, "stderr does not end with one 'vicinal: error:' line after notes", r)
                continue
            if len(err) > 2000 or len(r.stderr) > 20000:
                self.fail(slot, kind, f"the error line is {len(err)} characters long, stderr {len(r.stderr)}", r)
                continue
            name = os.path.basename(slot.file)
            wanted = [name]
            # JSON faults the parser meets carry a line; those found later carry the key path.
            parse_level = kind in ("nul", "latin1") or (slot.fmt != "csv" and kind in NUMBER_KINDS - {"40-digits"})
            if slot.located and line and (slot.fmt == "csv" or parse_level):
                wanted.append(f"{name}:{line}")
            if kind in NUMBER_KINDS and slot.field and not parse_level:
                wanted.append(slot.field)
            if kind.startswith("atom-") and slot.atom_field:
                wanted.append(slot.atom_field)
            if kind == "duplicated-key":
                wanted.append(slot.dup.split(b":")[0].strip(b'"').decode())
            if kind == "unknown-key":
                wanted.append("colour")
            for w in wanted:
                if w not in err:
                    self.fail(slot, kind, f"the error does not name {w!r}", r)
                    break


# ---------------------------------------------------------------- the slots

def library_slots():
    csv_base = (b"compound,smiles,measurement,solvent,temperature_k,nuclei,j_hz,sigma_hz,note\n"
                b'ethanol,CCO,run 1,CDCl3,298,"4,7",7.25,0.1,methyl-CH2\n'
                b'ethanol,,run 1,CDCl3,298,"7,9",5.1,0.2,CH2-OH\n')
    json_base = (b'{"format": "vicinal-library", "version": 1, "compounds": [\n'
                 b' {"name": "ethanol", "smiles": "CCO", "sets": [\n'
                 b'  {"name": "run 1", "solvent": "CDCl3", "temperature_k": 298, "couplings": [\n'
                 b'   {"nuclei": "4,7", "j_hz": 7.25, "sigma_hz": 0.1, "note": "methyl-CH2"},\n'
                 b'   {"nuclei": "7,9", "j_hz": 5.1, "sigma_hz": 0.2, "note": "CH2-OH"}]}]}]}\n')
    # SDF as `library export` writes it, from the CSV above.
    seed = os.path.join(WORK, "seed")
    os.makedirs(seed, exist_ok=True)
    with open(os.path.join(seed, "in.csv"), "wb") as f:
        f.write(csv_base)
    for args in (["library", "init"], ["library", "import", "in.csv"], ["library", "export", "all.sdf"]):
        r = vicinal(["-q", "--library", os.path.join(seed, "lib.sqlite"), *args], seed)
        assert r.returncode == 0, r.stderr
    sdf_base = read(os.path.join(seed, "all.sdf"))
    molfile = sdf_base[: sdf_base.index(b"M  END")] + b"M  END\n"
    other_lib = read(os.path.join(seed, "lib.sqlite"))

    def deep_sdf(deep):
        start = sdf_base.index(b"> <vicinal_compound>\n") + len(b"> <vicinal_compound>\n")
        return sdf_base[:start] + deep + sdf_base[sdf_base.index(b"\n", start):]

    lib = ["-q", "--library", "{LIB}"]
    slots = [
        Slot("library-csv", "csv", "in.csv", csv_base, [*lib, "library", "import", "{FILE}"], library=True,
             field="j_hz", number=(b"7.25", b"{}"), atom=(b'"4,7"', b'"{},7"'), text=b"methyl"),
        Slot("library-json", "json", "in.json", json_base, [*lib, "library", "import", "{FILE}"], library=True,
             field="j_hz", number=(b"7.25", b"{}"), atom=(b'"4,7"', b'"{},7"'), dup=b'"j_hz": 7.25',
             text=b"methyl", atom_field="nuclei"),
        Slot("library-sdf", "sdf", "in.sdf", sdf_base, [*lib, "library", "import", "{FILE}"], library=True,
             field="j_hz", number=(b'"j_hz":7.25', b'"j_hz":{}'), atom=(b'"nuclei":"4,7"', b'"nuclei":"{},7"'),
             dup=b'"j_hz":7.25', text=b"methyl", deep=deep_sdf, located=False, atom_field="nuclei"),
        # A structure file named in the CSV's structure column.
        Slot("library-structure", "mol", "ethanol.mol", molfile, [*lib, "library", "import", "{DIR}/in.csv"],
             library=True, extra={"in.csv": b'compound,structure,nuclei,j_hz\nethanol,ethanol.mol,"4,7",7.25\n'},
             number=(molfile.split(b"\n")[4][:10], b"{}"), atom=mol_bond(molfile),
             located=False),
        # An atom-label file named in the CSV's labels column.
        Slot("library-labels", "csv", "labels.csv", b"label,atom\nH-a,4\nH-b,7\n",
             [*lib, "library", "import", "{DIR}/in.csv"], library=True,
             extra={"in.csv": b'compound,smiles,labels,nuclei,j_hz\nethanol,CCO,labels.csv,"H-a,H-b",7.25\n'},
             field="atom", number=(b"H-a,4", b"H-a,{}"), atom=(b"H-a,4", b"H-a,{}")),
        # Another library to merge from, and the library file itself.
        Slot("library-merge", "sqlite", "other.sqlite", other_lib, [*lib, "library", "merge", "{FILE}"],
             library=True, skip={"utf16", "latin1", "mixed-eol"}),
        Slot("library-file", "sqlite", "lib.sqlite", read(os.path.join(WORK, "template.sqlite")),
             ["-q", "--library", "{FILE}", "library", "stats"],
             skip={"utf16", "latin1", "mixed-eol"}),
    ]
    return slots


def mol_bond(molfile):
    """The first bond line of a molfile, its first atom to be replaced."""
    lines = molfile.split(b"\n")
    bond = lines[4 + int(lines[3][:3])]
    return bond + b"\n", b"{}" + bond[3:] + b"\n"


def table_slots():
    data = os.path.join(DATA, "structure")
    pairs = b"j_hz,sigma_hz,dihedral_deg\n" + b"".join(
        f"{v},0.3,{a}\n".encode() for v, a in [(9.25, 180), (8.1, 160), (6.0, 140), (3.9, 120), (1.9, 100),
                                                (0.9, 90), (0.6, 80), (1.2, 60), (2.7, 40), (5.0, 20), (7.6, 0),
                                                (4.2, -45), (1.0, -80), (5.9, -140)])
    # Sites measured with three phi sets, values from the sets' own curves (as tests/cli/calibrate.sh).
    sites = b"site,type,j_hz,sigma_hz,start_deg\n"
    sets = [json.load(open(os.path.join(DB, "karplus", f"{n}.json")))
            for n in ("hn-ha-vuister-bax-1993", "hn-cb-hu-bax-1997", "hn-co-hu-bax-1997")]
    for k in range(8):
        phi = -150 + 12 * k
        for st in sets:
            c, x = st["coefficients"], math.cos(math.radians(phi + st["offset_deg"]))
            j = 6.125 if (k, st["id"]) == (0, sets[0]["id"]) else round(c["A"] * x * x + c["B"] * x + c["C"], 3)
            sites += f"r{k},{st['id']},{j},0.2,\n".encode()
    karplus_set = read(os.path.join(DB, "karplus", "hh-karplus-1963.json")).replace(
        b'"id": "hh-karplus-1963"', b'"id": "hh-hostile-test"')
    ring = read(os.path.join(DB, "pucker", "ribose.json"))
    # An analysis as `vicinal demo` saves it, for `vicinal report`.
    r = vicinal(["-q", "demo", "--out", os.path.join(WORK, "demo"), "--draws", "0"], WORK)
    assert r.returncode == 0, r.stderr
    analysis = read(os.path.join(WORK, "demo", "analysis.json"))
    rules = read(os.path.join(DB, "acyclic", "matsumori-1999.json"))
    return [
        Slot("predict-couplings", "csv", "couplings.csv", b'nuclei,j_hz,sigma_hz\n"9,11",11.25,0.3\n"H-2a,H-3b",4.1,0.3\n',
             ["predict", "--structure", f"{data}/oxane-chair.sdf", "--labels", f"{data}/oxane-labels.csv",
              "--couplings", "{FILE}", "--csv", "{OUT}"], out="m.csv",
             field="j_hz", number=(b"11.25", b"{}"), atom=(b'"9,11"', b'"{},11"')),
        Slot("predict-labels", "csv", "labels.csv", read(os.path.join(data, "oxane-labels.csv")),
             ["predict", "--structure", f"{data}/oxane-chair.sdf", "--labels", "{FILE}", "--couplings",
              "{DIR}/c.csv", "--csv", "{OUT}"], out="m.csv",
             extra={"c.csv": b'nuclei\n"H-2a,H-3a"\n"H-2a,H-3b"\n'},
             field="atom", number=(b"H-2a,9", b"H-2a,{}"), atom=(b"H-2a,9", b"H-2a,{}")),
        Slot("multiplet-peaks", "csv", "peaks.csv", read(os.path.join(EX, "multiplets", "ddd_peaks.csv")),
             ["multiplet", "analyse", "{FILE}", "--field-mhz", "400", "--svg", "{OUT}"], out="tree.svg",
             field="position_hz", number=(b"1560.92", b"{}")),
        Slot("spin-system", "json", "system.json", read(os.path.join(EX, "multiplets", "vinyl.json")),
             ["multiplet", "simulate", "{FILE}", "--csv", "{OUT}"], out="lines.csv",
             field="j_hz", number=(b"17.3", b"{}"), atom=(b'"count": 3', b'"count": {}'), atom_field="count",
             dup=b'"j_hz": 10.6', text=b"Invented"),
        Slot("karplus-set", "json", "sets/mine.json", karplus_set,
             ["karplus", "curve", "--set", "hh-hostile-test", "--svg", "{OUT}"], out="curve.svg",
             env={"VICINAL_KARPLUS_DIR": "{DIR}/sets"}, field="C0", number=(b'"C0": 7.0', b'"C0": {}'),
             dup=b'"C0": 7.0', text=b"Karplus 1963"),
        Slot("calibrate-points", "csv", "pairs.csv", pairs,
             ["karplus", "calibrate", "--points", "{FILE}", "--bootstrap", "10", "--id", "hh-hostile-fit",
              "--out", "{OUT}"], out="set.json", field="j_hz", number=(b"9.25", b"{}")),
        Slot("calibrate-sites", "csv", "sites.csv", sites, ["karplus", "calibrate", "--sites", "{FILE}"],
             field="j_hz", number=(b"6.125", b"{}")),
        Slot("rank-couplings", "csv", "couplings.csv", b'nuclei,j_hz,sigma_hz\n"H-2a,H-3a",11.25,0.3\n"H-2a,H-3b",4.1,0.3\n',
             ["rank", "--couplings", "{FILE}", "--candidate", f"chair={data}/oxane-chair.sdf", "--candidate",
              f"again={data}/oxane-chair.sdf", "--labels", f"{data}/oxane-labels.csv"],
             field="j_hz", number=(b"11.25", b"{}")),
        Slot("fit-matrix", "csv", "matrix.csv", b"title,H-1/H-2\nanti,0.5\ngauche,10\n",
             ["fit", "--couplings", "{DIR}/c.csv", "--matrix", "{FILE}", "--draws", "0", "--svg", "{OUT}"],
             out="pops.svg", extra={"c.csv": b'nuclei,j_hz,sigma_hz\n"H-1,H-2",4.0,0.5\n'},
             field="H-1/H-2", number=(b"anti,0.5", b"anti,{}")),
        Slot("fit-couplings", "csv", "couplings.csv", b'nuclei,j_hz,sigma_hz\n"H-1,H-2",4.25,0.5\n',
             ["fit", "--couplings", "{FILE}", "--matrix", "{DIR}/m.csv", "--draws", "0", "--svg", "{OUT}"],
             out="pops.svg", extra={"m.csv": b"title,H-1/H-2\nanti,0.5\ngauche,10\n"},
             field="j_hz", number=(b"4.25", b"{}")),
        Slot("pucker-couplings", "csv", "couplings.csv", read(os.path.join(EX, "pucker", "deoxy-nucleoside.csv")),
             ["pucker", "fit", "--ring", "deoxyribose", "--couplings", "{FILE}", "--map", "{OUT}",
              "--map-step-deg", "30"], out="map.svg", field="j_hz", number=(b"H1'-H2',8.6", b"H1'-H2',{}")),
        Slot("pucker-ring", "json", "ring.json", ring,
             ["pucker", "fit", "--ring", "{FILE}", "--couplings", f"{EX}/pucker/ribonucleoside.csv",
              "--fix", "amplitudes,pn", "--pn-deg", "9", "--map", "{OUT}", "--map-step-deg", "30"], out="map.svg",
             text=b"beta-D"),
        Slot("acyclic-couplings", "csv", "couplings.csv", read(os.path.join(EX, "acyclic", "methyl-carbinol.csv")),
             ["configuration", "--couplings", "{FILE}"], field="j_hz", number=(b"H2-H3,3.3", b"H2-H3,{}")),
        # analysis.json is written by vicinal and read back; keys it does not
        # know are left alone (a newer vicinal may add some), so unknown-key is not tried.
        Slot("report-analysis", "json", "analysis.json", analysis, ["report", "{FILE}", "--out", "{OUT}"],
             out="report.html", skip={"unknown-key"}),
        Slot("acyclic-rules", "json", "rules.json", rules,
             ["configuration", "--couplings", f"{EX}/acyclic/methyl-carbinol.csv", "--rules", "{FILE}"]),
    ]


def structure_slots():
    data = os.path.join(DATA, "structure")
    sdf = read(os.path.join(data, "oxane-chair.sdf"))
    lines = sdf.split(b"\n")
    natoms = int(lines[3][:3])
    first_atom = lines[4]
    atoms = [(l[31:34].strip().decode(), l[:10].strip().decode(), l[10:20].strip().decode(), l[20:30].strip().decode())
             for l in lines[4:4 + natoms]]
    frame = f"{natoms}\n{{}}\n" + "".join(f"{s} {x} {y} {z}\n" for s, x, y, z in atoms)
    xyz = (frame.format("frame one") + frame.format("frame two")).encode()
    pdb = read(os.path.join(data, "ala4-models.pdb"))
    frame_sdf = sdf[: sdf.index(b"$$$$")]
    two_frames = (frame_sdf + b"> <vicinal_energy_kcal_mol>\n0.25\n\n$$$$\n" +
                  frame_sdf.replace(b"oxane chair", b"oxane again", 1) + b"> <vicinal_energy_kcal_mol>\n1.5\n\n$$$$\n")
    xyz_first = xyz.split(b"\n")[2]
    pdb_atom = next(l for l in pdb.split(b"\n") if l.startswith(b"ATOM"))
    return [
        Slot("predict-structure", "mol", "chair.sdf", sdf, ["predict", "--structure", "{FILE}", "--csv", "{OUT}"],
             out="m.csv", number=(first_atom[:10], b"{}"), atom=mol_bond(sdf), located=False),
        # Two frames; truncated: the last frame loses its last two atoms.
        Slot("predict-ensemble-xyz", "xyz", "frames.xyz", xyz,
             ["predict", "--ensemble", "{FILE}", "--csv", "{OUT}"], out="m.csv", located=False,
             number=(b"frame two\n" + xyz_first, b"frame two\n" + xyz_first.replace(xyz_first.split()[1], b"{}", 1)),
             atom=(xyz[: xyz.index(b"\n")] + b"\nframe one", b"{}\nframe one"),
             truncate=lambda b: b"\n".join(b.split(b"\n")[:-3]) + b"\n"),
        # Three models; truncated inside the last one.
        Slot("predict-ensemble-pdb", "pdb", "models.pdb", pdb,
             ["predict", "--ensemble", "{FILE}", "--structure", "{FILE}", "--set", "hn-ha-vogeli-2007", "--csv",
              "{OUT}"], out="m.csv", located=False,
             number=(pdb_atom, pdb_atom[:30] + b"{}".rjust(8) + pdb_atom[38:]),
             truncate=lambda b: b[: b.rindex(b"ATOM", 0, b.rindex(b"ENDMDL"))]),
        Slot("conformers-info", "mol", "ensemble.sdf", two_frames, ["conformers", "info", "{FILE}"], located=False,
             field="vicinal_energy_kcal_mol", number=(b"\n1.5\n", b"\n{}\n")),
    ]


def main():
    group = sys.argv[1]
    runner = Runner()
    global FOREIGN_SQLITE
    FOREIGN_SQLITE = foreign_sqlite()
    slots = {"library": library_slots, "tables": table_slots, "structures": structure_slots}[group]()
    only = os.environ.get("HOSTILE_ONLY")
    for slot in slots:
        if only and only not in slot.name:
            continue
        runner.run_slot(slot)
    for f in runner.failures:
        print("FAIL:", f, file=sys.stderr)
    print(f"hostile {group}: {runner.cases} cases, {len(runner.failures)} failures")
    sys.exit(1 if runner.failures else 0)


if __name__ == "__main__":
    main()
