#!/usr/bin/env bash
# Hostile input, tables and JSON files: predict coupling lists and labels,
# multiplet peak lists, spin systems, Karplus set files, calibration points, fit
# matrices and couplings, pucker and acyclic couplings, ring and rule files.
# Truncated, UTF-16, Latin-1, NUL bytes, 1e400, 40-digit numbers, NaN/inf, a
# 10 MB line, 100,000-level JSON, atoms out of range, duplicated headers and
# keys, unknown keys, mixed line endings, empty, a folder, an unreadable file:
# each ends in one error line naming the file (line, field) with exit code 2,
# within 20 s, with no output written. Details: hostile_input.py.
HERE=$(cd "$(dirname "$0")" && pwd)
source "$HERE/lib.sh"
export WORK
/usr/bin/python3 "$HERE/hostile_input.py" tables
