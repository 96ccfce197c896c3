#!/usr/bin/env bash
# The demo report in a real browser: headless Chromium renders it to a PNG
# (which must not be blank), its DOM carries the expected sections and
# figures, and the page asks for nothing outside itself.
here=$(cd "$(dirname "$0")" && pwd)
source "$here/lib.sh"

CHROMIUM=${CHROMIUM:-/usr/bin/chromium}
if [[ ! -x $CHROMIUM ]]; then
  if [[ ${VICINAL_ALLOW_NO_BROWSER:-} == 1 ]]; then
    echo "SKIP: $CHROMIUM not found (VICINAL_ALLOW_NO_BROWSER=1)"
    exit 0
  fi
  fail "$CHROMIUM not found; install it with tools/install-deps.sh or set VICINAL_ALLOW_NO_BROWSER=1"
fi

run 0 demo --out "$WORK/demo" --draws 100
page="file://$WORK/demo/report.html"
browser() {
  local profile; profile=$(mktemp -d)
  timeout 120 "$CHROMIUM" --headless --no-sandbox --disable-gpu --disable-quic --no-first-run \
    --disable-background-networking --disable-component-update --disable-sync --user-data-dir="$profile" \
    --enable-logging=stderr --v=0 "$@"
  local rc=$?
  rm -rf "$profile"
  return $rc
}
browser --screenshot="$WORK/shot.png" --window-size=1280,2400 "$page" >"$WORK/shot.log" 2>&1 ||
  { cat "$WORK/shot.log" >&2; fail "chromium could not take a screenshot"; }
browser --dump-dom "$page" >"$WORK/dom.html" 2>"$WORK/dom.log" || { cat "$WORK/dom.log" >&2; fail "chromium --dump-dom failed"; }

# Rendered: a PNG of the window's size with many distinct colours (text, plots, tints).
/usr/bin/python3 - "$WORK/shot.png" "$here" <<'PY' || fail "the screenshot looks blank or broken"
import sys
import numpy as np
sys.path.insert(0, sys.argv[2])
from png_pixels import read_png
pixels = read_png(sys.argv[1])[:, :, :3]
height, width = pixels.shape[:2]
colours = len(np.unique(pixels.reshape(-1, 3), axis=0))
dark = (pixels.astype(int).sum(axis=2) < 200).mean()
print(f"screenshot {width}x{height}, {colours} colours, {dark:.3%} dark pixels")
assert (width, height) == (1280, 2400), (width, height)
assert colours >= 200, colours          # a blank or error page has a handful
assert 0.002 < dark < 0.5, dark         # text is there, the page is not black
PY

# The page as the browser built it: title, sections, figures, no scripts, nothing fetched.
for heading in "Which diastereomer did cyclisation 7 give?" "Summary" "Compound" "Measured couplings" \
               "Allowed dihedral angles" "Candidate configurations" "Observed and back-calculated couplings" \
               "Conformer populations" "Multiplet of H-3" "Karplus parameter sets" "How this report was made" \
               "Confirm independently"; do
  contains "$WORK/dom.html" "$heading"
done
figures=$(grep -o "<figure" "$WORK/dom.html" | wc -l)
svgs=$(grep -o "<svg" "$WORK/dom.html" | wc -l)
(( figures >= 10 && svgs >= 10 )) || fail "expected at least 10 figures with SVG, found $figures figures, $svgs svg"
lacks "$WORK/dom.html" "<script"
lacks "$WORK/dom.html" "<img"
lacks "$WORK/dom.html" "<link"
for log in "$WORK/shot.log" "$WORK/dom.log"; do
  if grep -E "Failed to load resource|net::ERR_|Refused to (load|apply|execute)" "$log"; then
    fail "the page asked for a resource that failed ($log)"
  fi
done
echo "report renders in Chromium ($figures figures)"
