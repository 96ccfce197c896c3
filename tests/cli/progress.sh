#!/usr/bin/env bash
# Progress on a terminal: `library import` shows how much of the file is read
# in kB or MB (not a bare byte count), erases the line when done, and stays
# silent with --quiet or when stderr is not a terminal. `script` (util-linux)
# gives the command a pseudo-terminal. Invented values.
source "$(dirname "$0")/lib.sh"
command -v script >/dev/null || fail "script (util-linux) is needed for this test"

# Ethanol (SMILES CCO): methyl H 4-6, CH2 H 7-8. One coupling in each of
# 2,000 measurement sets, about 77 kB.
{
  echo "compound,smiles,measurement,solvent,nuclei,j_hz"
  for set in $(seq 2000); do echo "ethanol,CCO,run $set,CDCl3,\"H4,H7\",7.1"; done
} >rows.csv
bytes=$(stat -c %s rows.csv)

# in_terminal FILE args... : runs vicinal on a pseudo-terminal, everything it
# prints (stdout and stderr) in FILE.
in_terminal() {
  local file=$1; shift
  script -qec "$(printf '%q ' "$VICINAL" "$@")" /dev/null >"$file" </dev/null
}

in_terminal shown --library "$WORK/a.sqlite" library import rows.csv
whole=$(/usr/bin/python3 -c "print(f'{$bytes / 1000:.1f}')")
contains shown "importing: 0.0 of $whole kB (0%)"
contains shown "importing: $whole of $whole kB (100%)"
contains shown $'\r\033[K'
lacks shown "/$bytes"
grep -qE "couplings +2000 " shown || fail "the import's summary (2000 couplings added) is missing"

in_terminal quiet --quiet --library "$WORK/b.sqlite" library import rows.csv
lacks quiet "importing:"

run 0 --library "$WORK/c.sqlite" library import rows.csv
lacks err "importing:"
echo "progress: ok"
