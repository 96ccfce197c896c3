#!/usr/bin/env bash
# Hostile input, the library's inputs: import CSV, JSON and SDF, structure and
# label files named in a CSV, a library to merge, the library file itself.
# Truncated, UTF-16, Latin-1, NUL bytes, 1e400, 40-digit numbers, NaN/inf, a
# 10 MB line, 100,000-level JSON, atoms out of range, duplicated headers and
# keys, unknown keys, mixed line endings, empty, a folder, an unreadable file:
# each ends in one error line naming the file (line, field) with exit code 2,
# within 20 s, with no output written. Details: hostile_input.py.
HERE=$(cd "$(dirname "$0")" && pwd)
source "$HERE/lib.sh"
export WORK
/usr/bin/python3 "$HERE/hostile_input.py" library
