#!/usr/bin/env bash
# Killing vicinal (SIGKILL) at random moments during `library import` and
# `library merge` leaves the library readable, integrity_check clean, and
# holding either none or all of the file's couplings.
source "$(dirname "$0")/lib.sh"
KILLS=${LIBRARY_CRASH_KILLS:-30}
ROWS=10000
count() { /usr/bin/python3 -c "import sqlite3,sys; print(sqlite3.connect(sys.argv[1]).execute(sys.argv[2]).fetchone()[0])" "$@"; }

# The two compounds as molfiles (from a SMILES import), so that generated
# files spend their time in parsing and storing rather than in 3D building and
# the kills land in the write transaction too.
printf 'compound,smiles,nuclei,j_hz\nethanol,CCO,"4,7",7\npropanal,CCC=O,"7,10",1.4\n' > seed.csv
run 0 --library "$WORK/seed.sqlite" library import seed.csv
run 0 --library "$WORK/seed.sqlite" library export seed-out.csv

# A file of ROWS couplings in distinct measurement sets (so every row is new);
# `$1` makes the set names unique to this file.
make_file() {
  /usr/bin/python3 - "$1" "$ROWS" <<'PY'
import csv, sys
tag, rows = sys.argv[1], int(sys.argv[2])
molfile = {r["compound"]: r["molfile"] for r in csv.DictReader(open("seed-out.csv")) if r["molfile"]}
pair = {"ethanol": "4,7", "propanal": "7,10"}
with open(f"f{tag}.csv", "w", newline="") as f:
    w = csv.writer(f)
    w.writerow(["compound", "molfile", "measurement", "solvent", "nuclei", "j_hz", "note"])
    for i in range(rows):
        name = "ethanol" if i % 2 else "propanal"
        w.writerow([name, molfile[name] if i < 2 else "", f"{tag}-{i}", "CDCl3", pair[name], 5 + (i % 50) / 10, f"row {i}"])
PY
}

run 0 --library "$WORK/lib.sqlite" library init
make_file warmup
start=$(date +%s%N)
run 0 --library "$WORK/lib.sqlite" library import fwarmup.csv
elapsed_ms=$(( ($(date +%s%N) - start) / 1000000 ))
window_ms=$(( elapsed_ms * 12 / 10 + 20 ))

# A second library to merge from, killed the same way.
run 0 --library "$WORK/other.sqlite" library init
make_file other
run 0 --library "$WORK/other.sqlite" library import fother.csv

killed=0 completed=0
for ((i = 1; i <= KILLS; i++)); do
  before=$(count lib.sqlite "select count(*) from couplings")
  if (( i % 5 == 0 )); then
    cmd=(library merge "$WORK/other.sqlite")
    merged=$(count lib.sqlite "select count(*) from measurement_sets where name like 'other-%'")
    if (( merged > 0 )); then cmd=(library import fwarmup.csv); fi   # merge already done: re-import (adds nothing)
    add=$(( merged > 0 ? 0 : ROWS ))
  else
    make_file "$i"
    cmd=(library import "f$i.csv")
    add=$ROWS
  fi
  "$VICINAL" -q --library "$WORK/lib.sqlite" "${cmd[@]}" >/dev/null 2>&1 &
  pid=$!
  delay_ms=$(( RANDOM % window_ms ))
  sleep "$(printf '0.%03d' "$delay_ms")" 2>/dev/null || sleep "$(( delay_ms / 1000 ))"
  if kill -9 "$pid" 2>/dev/null; then killed=$((killed + 1)); else completed=$((completed + 1)); fi
  wait "$pid" 2>/dev/null || true
  [[ $(count lib.sqlite "pragma integrity_check") == ok ]] || fail "integrity_check failed after kill $i"
  [[ $(count lib.sqlite "select count(*) from pragma_foreign_key_check") == 0 ]] || fail "foreign keys after kill $i"
  after=$(count lib.sqlite "select count(*) from couplings")
  [[ $after == "$before" || $after == $((before + add)) ]] ||
    fail "kill $i (${cmd[*]} after ${delay_ms} ms) left $((after - before)) of $add couplings"
done
run 0 --library "$WORK/lib.sqlite" library check
(( killed >= KILLS / 2 )) || fail "only $killed of $KILLS runs were killed mid-way (window ${window_ms} ms)"
echo "library_crash: ok ($killed killed mid-run, $completed finished first; window ${window_ms} ms)"
