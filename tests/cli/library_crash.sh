#!/usr/bin/env bash
# Crash safety of the coupling library: at least 200 runs of `library import`,
# `library merge` and the upgrade of a version-1 library killed with SIGKILL at
# random moments; after each the library is intact (SQLite integrity and
# foreign keys, `vicinal library check`) and holds none or all of the file, or
# is either still at version 1 or fully upgraded. Details: library_crash.py.
HERE=$(cd "$(dirname "$0")" && pwd)
source "$HERE/lib.sh"
export WORK
/usr/bin/python3 "$HERE/library_crash.py"
