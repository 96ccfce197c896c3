#!/usr/bin/env bash
# Several vicinal processes on one library at once: four importers and a merge
# write while two readers (stats, find) and a backup read. Every writer
# succeeds (each waits for the write lock), no row is lost (exact count), no
# reader sees half a file (every count it reports is a whole number of files),
# and "database is locked" never reaches the user. Three rounds.
source "$(dirname "$0")/lib.sh"
ROWS=1500
count() { /usr/bin/python3 -c "import sqlite3,sys; print(sqlite3.connect(sys.argv[1]).execute(sys.argv[2]).fetchone()[0])" "$@"; }
/usr/bin/python3 - "$ROWS" <<'PY'
import sys
rows = int(sys.argv[1])
for tag in ["a1", "a2", "a3", "a4", "b1", "b2", "b3", "b4", "c1", "c2", "c3", "c4", "m"]:
    with open(f"{tag}.csv", "w") as f:
        f.write("compound,smiles,measurement,solvent,nuclei,j_hz\n")
        for i in range(rows):
            f.write(f"ethanol,CCO,{tag}-{i},CDCl3,\"4,7\",7.0\n")
PY
run 0 --library "$WORK/other.sqlite" library init
run 0 --library "$WORK/other.sqlite" library import m.csv
run 0 --library "$WORK/lib.sqlite" library init

# A reader: repeats its command until the flag file goes, logging each count.
reader() {  # NAME ARGS...
  local name=$1; shift
  : >"$name.counts"
  while [[ -e writing ]]; do
    "$VICINAL" --json --library "$WORK/lib.sqlite" "$@" >"$name.json" 2>>"$name.err" || { echo "exit $?" >>"$name.err"; return; }
    /usr/bin/python3 -c "
import json, sys; d = json.load(open(sys.argv[1]))
print(d['matches'] if 'matches' in d else d['couplings'])" \
      "$name.json" >>"$name.counts"
  done
}

expected=0
for round in a b c; do
  touch writing
  reader stats library stats & r1=$!
  reader find library find --nuclei H,H --limit 1 & r2=$!
  pids=()
  for k in 1 2 3 4; do
    "$VICINAL" -q --library "$WORK/lib.sqlite" library import "$round$k.csv" >"$round$k.out" 2>&1 & pids+=($!)
  done
  merge=0
  if [[ $round == b ]]; then
    "$VICINAL" -q --library "$WORK/lib.sqlite" library merge "$WORK/other.sqlite" >merge.out 2>&1 & pids+=($!); merge=1
  fi
  "$VICINAL" -q --library "$WORK/lib.sqlite" library backup "$WORK/snap-$round.sqlite" >"backup-$round.out" 2>&1 & pids+=($!)
  for p in "${pids[@]}"; do wait "$p" || { cat ./*.out; fail "a writer or the backup failed in round $round"; }; done
  rm writing
  wait $r1 $r2
  expected=$((expected + 4 * ROWS + merge * ROWS))
  [[ $(count lib.sqlite "select count(*) from couplings") == "$expected" ]] || fail "round $round: rows lost or doubled"
  n=$(count "snap-$round.sqlite" "select count(*) from couplings")
  (( n % ROWS == 0 )) || fail "the backup holds part of a file ($n couplings)"
  [[ $(count "snap-$round.sqlite" "pragma integrity_check") == ok ]] || fail "backup snapshot integrity"
  for r in stats find; do
    [[ ! -s $r.err ]] || { cat "$r.err"; fail "reader $r failed during round $round"; }
    [[ -s $r.counts ]] || fail "reader $r never ran during round $round"
    while read -r c; do (( c % ROWS == 0 )) || fail "reader $r saw $c couplings: part of a file"; done <"$r.counts"
  done
done
! grep -il "locked\|busy" ./*.out ./*.err || fail "'database is locked' reached the user"
run 0 --library "$WORK/lib.sqlite" library check
echo "library_concurrency: ok ($expected couplings; readers ran $(cat stats.counts find.counts | wc -l) times in the last round)"
