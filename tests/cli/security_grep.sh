#!/usr/bin/env bash
# Security checks: (1) no SQL in src/ is built from values (every SQL argument
# is a literal or an allow-listed fixed piece; values are bound parameters) and
# there are no shell-outs (system, popen, exec*, fork, posix_spawn) in src/;
# (2) the scanner catches each of those in a planted file, so it can fail;
# (3) the library never copies files: a `structure` path (relative with ../ or
# absolute) is only read, its content stored as molfile text, and paths that
# are not structures are refused with exit 2. Details: security_scan.py.
HERE=$(cd "$(dirname "$0")" && pwd)
source "$HERE/lib.sh"
SRC=$HERE/../../src

/usr/bin/python3 "$HERE/security_scan.py" "$SRC" >scan.txt || { cat scan.txt; fail "src/ builds SQL from values or shells out"; }

# The scanner finds what it is meant to find.
mkdir -p planted/library
cat >planted/library/bad.cc <<'CC'
void f(Database& db, const std::string& name) {
  Statement s(db, "SELECT id FROM compounds WHERE name = '" + name + "'");
  db.exec(fmt::format("DELETE FROM couplings WHERE id = {}", name));
  std::string q = "UPDATE t SET a = 1 WHERE b = " + name;
  Statement t(db, q);
  std::system("true");  // system( in a comment alone would not count
  FILE* p = popen("ls", "r");
  execvp("sh", argv);
}
CC
! /usr/bin/python3 "$HERE/security_scan.py" planted >planted.txt || fail "the scanner passed a planted file"
for want in "bad.cc:2: SQL argument" "bad.cc:3: SQL argument" "bad.cc:5: SQL argument" "bad.cc:4: SQL text built" \
            "bad.cc:6: shell-out" "bad.cc:7: shell-out" "bad.cc:8: shell-out"; do
  contains planted.txt "$want"
done
[[ $(wc -l <planted.txt) -eq 9 ]] || { cat planted.txt; fail "the scanner reported more than the planted faults"; }

# Structure paths in an import are read, never copied; non-structures are refused.
run 0 --library "$WORK/lib.sqlite" library init
mkdir -p deep/er
printf 'compound,smiles\nx,CCO\n' >deep/er/ethanol.csv   # any file outside the CSV's folder
for path in ../../etc/passwd /etc/passwd ../../../../../../etc/shadow ../ethanol.csv; do
  printf 'compound,structure,nuclei,j_hz\nethanol,%s,"4,7",7\n' "$path" >deep/er/in.csv
  run 2 --library "$WORK/lib.sqlite" library import deep/er/in.csv; one_line_error
done
/usr/bin/python3 -c "
from rdkit import Chem; m = Chem.AddHs(Chem.MolFromSmiles('CCO')); from rdkit.Chem import AllChem
AllChem.EmbedMolecule(m, randomSeed=1); Chem.MolToMolFile(m, 'deep/ethanol.mol')"
before=$(ls -A "$WORK" | sort)
printf 'compound,structure,nuclei,j_hz\nethanol,../ethanol.mol,"4,7",7\n' >deep/er/in.csv
run 0 --library "$WORK/lib.sqlite" library import deep/er/in.csv
after=$(ls -A "$WORK" | grep -v '^lib.sqlite-\(wal\|shm\)$' | sort)
[[ $before == "$after" ]] || fail "an import created files: $(comm -13 <(echo "$before") <(echo "$after"))"
[[ $(ls -A deep | sort | tr '\n' ' ') == "er ethanol.mol " ]] || fail "files appeared beside the structure"
/usr/bin/python3 -c "
import sqlite3; m = sqlite3.connect('lib.sqlite').execute('select molfile from compounds').fetchone()[0]
assert 'M  END' in m and 'ethanol.mol' not in m, 'the library keeps a path, not the structure'"
echo "security_grep: ok"
