#!/usr/bin/env bash
# Two vicinal processes importing into one library at the same time: both
# succeed (one waits for the other's write lock) and nothing is lost; a backup
# taken meanwhile is a consistent snapshot.
source "$(dirname "$0")/lib.sh"
count() { /usr/bin/python3 -c "import sqlite3,sys; print(sqlite3.connect(sys.argv[1]).execute(sys.argv[2]).fetchone()[0])" "$@"; }
/usr/bin/python3 - <<'PY'
for tag in "abcdef":
    with open(f"{tag}.csv", "w") as f:
        f.write("compound,smiles,measurement,solvent,nuclei,j_hz\n")
        for i in range(2000):
            f.write(f"ethanol,CCO,{tag}-{i},CDCl3,\"4,7\",7.0\n")
PY
run 0 --library "$WORK/lib.sqlite" library init
for pair in "a b" "c d" "e f"; do
  set -- $pair
  "$VICINAL" -q --library "$WORK/lib.sqlite" library import "$1.csv" >"$1.out" 2>&1 & p1=$!
  "$VICINAL" -q --library "$WORK/lib.sqlite" library import "$2.csv" >"$2.out" 2>&1 & p2=$!
  "$VICINAL" -q --library "$WORK/lib.sqlite" library backup "$WORK/snap-$1.sqlite" >/dev/null 2>&1 & p3=$!
  wait $p1 || { cat "$1.out"; fail "import of $1 failed while $2 ran"; }
  wait $p2 || { cat "$2.out"; fail "import of $2 failed while $1 ran"; }
  wait $p3 || fail "backup failed during imports"
  n=$(count snap-$1.sqlite "select count(*) from couplings")
  (( n % 2000 == 0 )) || fail "backup snapshot holds a partial file ($n couplings)"
  [[ $(count snap-$1.sqlite "pragma integrity_check") == ok ]] || fail "backup snapshot integrity"
done
[[ $(count lib.sqlite "select count(*) from couplings") == 12000 ]] || fail "couplings were lost"
run 0 --library "$WORK/lib.sqlite" library check
echo "library_concurrency: ok"
