#!/usr/bin/env bash
# Runs the libFuzzer programs of a VICINAL_FUZZ build one after another.
#   tests/fuzz/run.sh BUILD_DIR SECONDS [TARGET...]     (default: every target)
# Each target starts from its seeds in tests/fuzz/corpus/<target>/ (read only)
# and writes what it finds to BUILD_DIR/fuzz-corpus/<target>/; crashes land in
# BUILD_DIR/fuzz-artifacts/<target>/ and the log in BUILD_DIR/fuzz-logs/.
# libFuzzer runs in this process on one thread (no -jobs/-workers), so a run
# uses one core. One input running over FUZZ_TIMEOUT seconds (default 10)
# counts as a hang. Exits non-zero if any target failed.
set -uo pipefail
here="$(cd "$(dirname "$0")" && pwd)"
build="${1:?usage: run.sh BUILD_DIR SECONDS [TARGET...]}"
seconds="${2:?usage: run.sh BUILD_DIR SECONDS [TARGET...]}"
shift 2
targets=("$@")
if [[ ${#targets[@]} -eq 0 ]]; then
  for f in "$here"/*_fuzz.cc; do t="$(basename "$f" _fuzz.cc)"; targets+=("$t"); done
fi
export VICINAL_DATA_DIR="${VICINAL_DATA_DIR:-$(cd "$here/../.." && pwd)}"
# Leak reports from Open Babel's plugin registry are not ours: see the file.
export LSAN_OPTIONS="suppressions=$here/../sanitize/lsan.supp:print_suppressions=0"
export UBSAN_OPTIONS="print_stacktrace=1"

failed=()
printf '%-16s %12s %8s %8s %s\n' target executions exec/s corpus result
for t in "${targets[@]}"; do
  exe="$build/tests/fuzz/${t}_fuzz"
  [[ -x "$exe" ]] || { echo "run.sh: $exe is not built (make fuzz builds it)" >&2; failed+=("$t"); continue; }
  corpus="$build/fuzz-corpus/$t" artifacts="$build/fuzz-artifacts/$t" log="$build/fuzz-logs/$t.log"
  mkdir -p "$corpus" "$artifacts" "$(dirname "$log")"
  "$exe" "$corpus" "$here/corpus/$t" -max_total_time="$seconds" -timeout="${FUZZ_TIMEOUT:-10}" -rss_limit_mb=2048 \
    -print_final_stats=1 -artifact_prefix="$artifacts/" >"$log" 2>&1
  rc=$?
  runs=$(grep -o 'stat::number_of_executed_units: *[0-9]*' "$log" | grep -o '[0-9]*$' | tail -n 1)
  speed=$(grep -o 'stat::average_exec_per_sec: *[0-9]*' "$log" | grep -o '[0-9]*$' | tail -n 1)
  size=$(find "$corpus" -type f | wc -l)
  result=ok
  if [[ $rc -ne 0 ]]; then result="FAILED (exit $rc; see $log and $artifacts/)"; failed+=("$t"); fi
  printf '%-16s %12s %8s %8s %s\n' "$t" "${runs:-?}" "${speed:-?}" "$size" "$result"
done
if [[ ${#failed[@]} -gt 0 ]]; then
  echo "fuzz: failures in ${failed[*]}" >&2
  exit 1
fi
