# Helpers for the command-line tests. Each test script sources this file;
# $VICINAL is the binary under test and $WORK a scratch folder (set by ctest).
set -euo pipefail
: "${VICINAL:?set VICINAL to the vicinal binary}"
WORK=${WORK:-$(mktemp -d)}
rm -rf "$WORK" && mkdir -p "$WORK"
cd "$WORK"

fail() { echo "FAIL: $*" >&2; exit 1; }

# run CODE cmd... : runs vicinal with the arguments, requires exit code CODE,
# leaves stdout in $WORK/out and stderr in $WORK/err.
run() {
  local want=$1; shift
  local got=0
  "$VICINAL" "$@" >"$WORK/out" 2>"$WORK/err" || got=$?
  [[ $got -eq $want ]] || { cat "$WORK/out" "$WORK/err" >&2; fail "vicinal $* exited $got, expected $want"; }
}

# contains FILE TEXT : the file holds the text (fixed string).
contains() { grep -qF -- "$2" "$1" || { cat "$1" >&2; fail "$1 lacks: $2"; }; }
lacks() { ! grep -qF -- "$2" "$1" || { cat "$1" >&2; fail "$1 should not contain: $2"; }; }

# one_line_error : stderr is exactly one line starting with "vicinal: error:".
one_line_error() {
  [[ $(wc -l <"$WORK/err") -eq 1 ]] || { cat "$WORK/err" >&2; fail "error is not one line"; }
  contains "$WORK/err" "vicinal: error:"
}

# json_get EXPR : evaluates a Python expression on the JSON in $WORK/out (as d).
json_get() { /usr/bin/python3 -c "import json,sys; d=json.load(open('$WORK/out')); print($1)"; }
