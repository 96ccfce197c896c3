#!/usr/bin/env bash
# vicinal multiplet simulate|analyse: outputs, files written, bad input.
source "$(dirname "$0")/lib.sh"
EX="${VICINAL_DATA_DIR:-$(dirname "$0")/../..}/examples/multiplets"

# --- simulate ---------------------------------------------------------------
run 0 multiplet simulate "$EX/vinyl.json"
contains out "1H spectrum at 400.00 MHz"
run 0 --json multiplet simulate "$EX/vinyl.json"
json_get 'all(set(l) == {"hz", "ppm", "intensity"} for l in d["lines"])' | grep -qx True || fail "line keys"
# Six observed protons: intensities sum to 6; hz = ppm x 400.
json_get 'round(sum(l["intensity"] for l in d["lines"]), 3)' | grep -qx 6.0 || fail "intensity sum"
json_get 'max(abs(l["hz"] - 400 * l["ppm"]) for l in d["lines"]) < 1e-6' | grep -qx True || fail "hz = ppm x field"

# A proton next to CD2 (spin-1 deuterons): 1:2:3:2:1 quintet; decoupled: a singlet.
run 0 --json multiplet simulate "$EX/deuterated.json"
json_get 'len(d["lines"])' | grep -qx 5 || fail "CHD2 quintet"
json_get '[round(l["intensity"] * 9, 3) for l in d["lines"]]' | grep -qF "[1.0, 2.0, 3.0, 2.0, 1.0]" || fail "1:2:3:2:1"
run 0 --json multiplet simulate "$EX/deuterated.json" --decouple 2H
json_get 'len(d["lines"])' | grep -qx 1 || fail "decoupled singlet"

# Files: line list, lineshape, plot.
run 0 multiplet simulate "$EX/vinyl.json" --csv lines.csv --spectrum trace.csv --linewidth-hz 0.8 --shape gaussian --svg plot.svg
head -1 lines.csv | grep -qx "hz,ppm,intensity" || fail "lines.csv header"
head -1 trace.csv | grep -qx "hz,ppm,intensity" || fail "trace.csv header"
[[ $(wc -l <trace.csv) -gt 100 ]] || fail "trace.csv too short"
grep -q "<svg" plot.svg || fail "plot.svg is not SVG"
run 0 multiplet simulate --help; contains out "Example"

# Bad input: one line, exit 2, no file left behind.
printf '{"field_mhz": 400, "observe": "1H", "spins": [{"label": "A", "isotope": "1H", "shift_ppm": 1}],\n "couplings": [{"between": ["A", "X"], "j_hz": 3}]}' >bad_label.json
run 2 multiplet simulate bad_label.json --csv never.csv; one_line_error
contains err "bad_label.json: 'couplings[0].between': unknown label 'X'"
[[ ! -e never.csv ]] || fail "file written despite the error"
sed 's/"1H", "shift/"9Q", "shift/' bad_label.json >bad_iso.json
run 2 multiplet simulate bad_iso.json; one_line_error; contains err "unknown isotope"
run 2 multiplet simulate "$EX/vinyl.json" --linewidth-hz -1 --spectrum never.csv; one_line_error
[[ ! -e never.csv ]] || fail "file written despite the negative width"
run 2 multiplet simulate "$EX/vinyl.json" --decouple 1H; one_line_error
run 2 multiplet simulate "$EX/vinyl.json" --svg plot.txt; one_line_error
run 2 multiplet simulate no-such-file.json; one_line_error
echo '{"field_mhz": 400,' >broken.json
run 2 multiplet simulate broken.json; one_line_error; contains err "broken.json:"

# --- analyse ----------------------------------------------------------------
run 0 --json multiplet analyse "$EX/ddd_peaks.csv" --field-mhz 400
for key in notation center_hz center_ppm couplings_hz residual_hz alternatives ambiguous peaks \
           simulated_residual_hz second_order_check; do
  json_get "'$key' in d" | grep -qx True || fail "analyse JSON lacks $key"
done
json_get 'd["notation"]' | grep -qx "ddd, J = 11.8, 4.9, 2.1 Hz" || fail "ddd reading: $(json_get 'd["notation"]')"
run 0 multiplet analyse "$EX/ddd_peaks.csv" --field-mhz 400 --svg tree.svg
contains out "ddd, J = 11.8, 4.9, 2.1 Hz"
grep -q "<svg" tree.svg || fail "tree.svg"

# Four equal spacings without intensities: dd (J1 = 2 J2) or q, both reported.
run 0 --json multiplet analyse "$EX/dd_or_q_peaks.csv" --field-mhz 400
json_get 'd["ambiguous"]' | grep -qx True || fail "dd/q should be ambiguous"
json_get 'd["multiplicity"] + " " + d["alternatives"][0]["multiplicity"]' | grep -qx "dd q" || fail "dd then q"
run 0 --json multiplet analyse --peaks 1006,1002,998,994 --intensities 1,3,3,1
json_get 'd["notation"]' | grep -qx "q, J = 4.0 Hz" || fail "1:3:3:1 is a quartet"

# Partner shifts: delta-nu/J check and the exact fit.
run 0 --json multiplet analyse --peaks 1009.4,1006.4,1001.4,998.4 --field-mhz 400 --partner 2.56 --partner 5.0
json_get '"second_order_fit" in d and len(d["second_order_check"]["partners"]) == 2' | grep -qx True || fail "partner check"

# A second-order multiplet: the roof effect is noted; the exact fit finds the true centre (2.5000 ppm).
run 0 multiplet analyse "$EX/strong_peaks.csv" --field-mhz 400
contains err "roof effect"
run 0 --json multiplet analyse "$EX/strong_peaks.csv" --field-mhz 400 --partner 2.575 --partner 5.0
json_get 'd["second_order_check"]["second_order"]' | grep -qx True || fail "delta-nu/J 3.8 is second order"
json_get 'round(d["second_order_fit"]["center_ppm"], 4)' | grep -qx 2.5 || fail "fitted centre"

# Bad input.
run 2 multiplet analyse --peaks 1000; one_line_error; contains err "singlet"
run 2 multiplet analyse --peaks ""; one_line_error
printf 'position_hz,intensity\n' >empty.csv
run 2 multiplet analyse empty.csv; one_line_error; contains err "no peaks"
printf 'position_hz,intensity\n1000,1\n1007,abc\n' >badnum.csv
run 2 multiplet analyse badnum.csv; one_line_error; contains err "badnum.csv:3"
printf 'where,intensity\n1000,1\n' >nocol.csv
run 2 multiplet analyse nocol.csv; one_line_error; contains err "position_hz"
run 2 multiplet analyse "$EX/dd_or_q_peaks.csv"; one_line_error; contains err "--field-mhz"
run 2 multiplet analyse --peaks 1000,1007,1010.5; one_line_error; contains err "no first-order"
run 2 multiplet analyse "$EX/ddd_peaks.csv" --field-mhz 400 --partner 3.0; one_line_error; contains err "partner"
run 2 multiplet analyse --peaks 1000,1007 --intensities 1,-1; one_line_error

# --store: the reading goes into the library under a stored compound, one row
# per partner; a wrong partner count or unknown compound stores nothing.
DEMO="$VICINAL_DATA_DIR/examples/demo"
LIB="$WORK/store.sqlite"
run 0 --library "$LIB" library init
run 0 --library "$LIB" library import "$DEMO/couplings.csv"
run 2 --library "$LIB" multiplet analyse "$DEMO/h3-peaks.csv" --field-mhz 500 --store "cyclisation product 7" \
  --nucleus H-3 --partners 'H-2,H-4b'; one_line_error; contains err "3 couplings"
run 2 --library "$LIB" multiplet analyse "$DEMO/h3-peaks.csv" --field-mhz 500 --store "no such compound" \
  --nucleus H-3 --partners 'H-4a|H-4b,H-2,H-4b|H-4a'; one_line_error
run 0 --library "$LIB" --json library show "cyclisation product 7"
[[ $(json_get 'sum(len(s["couplings"]) for s in d["sets"])') == 5 ]] || fail "a refused store changed the library"
run 0 --library "$LIB" multiplet analyse "$DEMO/h3-peaks.csv" --field-mhz 500 --store "cyclisation product 7" \
  --nucleus H-3 --partners 'H-4a|H-4b,H-2,H-4b|H-4a' --solvent CD3OD --temperature-k 298
contains err "3 coupling(s) added"
run 0 --library "$LIB" --json library show "cyclisation product 7"
[[ $(json_get 'sum(len(s["couplings"]) for s in d["sets"])') == 8 ]] || fail "multiplet couplings not stored"
[[ $(json_get '[c["j_hz"] for s in d["sets"] for c in s["couplings"] if c["nuclei"] == "H-3,H-2"][0]') == 9.125 ]] \
  || fail "stored J(H-3,H-2) is not the reading's 9.125 Hz"
echo "multiplet: ok"
