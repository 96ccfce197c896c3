#!/usr/bin/env bash
# vicinal karplus sets|curve|angles: tables, JSON keys, plot files and bad input.
source "$(dirname "$0")/lib.sh"

# --- sets -------------------------------------------------------------------
run 0 karplus sets
for id in hh-karplus-1959 hh-karplus-1963 hh-haasnoot-1980-general hn-ha-pardi-1984 hn-ha-vuister-bax-1993 \
          hn-ha-wang-bax-1996 hn-ha-hu-bax-1997 hn-ha-schmidt-1999 hn-ha-vogeli-2007 ch-wasylishen-schaefer-1972 \
          ch-coch-tvaroska-1989 hp-lankhorst-1984 cp-lankhorst-1984 ha-hb-perez-2001-ch2; do contains out "$id"; done
contains out "Hu & Bax 1997"
run 0 --json karplus sets
[[ $(json_get 'len(d["sets"])') -ge 30 ]] || fail "fewer than 30 sets"
json_get 'sorted(d["sets"][0].keys())' | grep -q "'citation', 'coefficients', 'coupling'" || fail "set keys"
[[ $(json_get '[s for s in d["sets"] if s["id"]=="hn-ha-hu-bax-1997"][0]["rms_hz"]') == 0.39 ]] || fail "rms"
run 0 karplus sets --coupling "3J(HN,C')"
contains out hn-co-hu-bax-1997; lacks out hn-ha-hu-bax-1997
run 0 karplus sets --set hh-haasnoot-1980-general
contains out "P7=0.14"; contains out "Tetrahedron 36, 2783"

# --- curve ------------------------------------------------------------------
# Hu & Bax 1997: 7.09 cos^2(phi-60) - 1.42 cos(phi-60) + 1.55; at phi = -120,
# cos = -1: 10.06 Hz; at phi = 60: 7.22 Hz. Source: Hu & Bax, J. Am. Chem. Soc. 119, 6360 (1997).
run 0 --json karplus curve --set hn-ha-hu-bax-1997 --step 30
[[ $(json_get 'd["set"]') == hn-ha-hu-bax-1997 ]] || fail "curve set"
[[ $(json_get 'len(d["points"])') == 13 ]] || fail "13 points from -180 to 180 by 30"
[[ $(json_get '[round(p["j_hz"],4) for p in d["points"] if p["dihedral_deg"]==-120][0]') == 10.06 ]] || fail "J(-120)"
[[ $(json_get '[round(p["j_hz"],4) for p in d["points"] if p["dihedral_deg"]==60][0]') == 7.22 ]] || fail "J(60)"
run 0 --json karplus curve --set hn-ha-pardi-1984 --set hn-ha-vogeli-2007 --svg two.svg --pdf two.pdf --png two.png
[[ $(json_get 'len(d["curves"])') == 2 ]] || fail "two curves"
[[ $(json_get 'd["curves"][1]["set"]') == hn-ha-vogeli-2007 ]] || fail "second curve"
[[ $(json_get 'd["set"]') == hn-ha-pardi-1984 ]] || fail "first curve repeated as set/points"
for f in two.svg two.pdf two.png; do [[ -s $f ]] || fail "$f not written"; done
head -c 100 two.svg | grep -qE '^<\?xml|^<svg' || fail "two.svg is not SVG"
head -c 4 two.pdf | grep -q '%PDF' || fail "two.pdf is not PDF"
run 0 karplus curve --set hn-ha-hu-bax-1997 --step 90
contains out "-90.0"; contains out "dihedral deg"
# A Haasnoot set without substituents says so; with them the curve changes.
run 0 karplus curve --set hh-haasnoot-1980-general --step 90
contains err "no --substituent was given"
run 0 --json karplus curve --set hh-haasnoot-1980-general --step 90 --substituent 1.26:+1 --substituent 0.4:-1
[[ $(json_get 'len(d["curves"][0]["substituents"])') == 2 ]] || fail "substituents echoed"
lacks err "no --substituent"

# --- angles -----------------------------------------------------------------
run 0 --json karplus angles --set hn-ha-hu-bax-1997 --j 7.4 --sigma 0.3 --svg angles.svg
for key in set j_hz sigma_hz tolerance_hz intervals exact_deg range; do
  json_get "d['$key']" >/dev/null || fail "angles JSON lacks $key"
done
json_get 'sorted(d["intervals"][0].keys())' | grep -q "'best_deg', 'from_deg'" || fail "interval keys"
# tolerance = 2 * sqrt(0.3^2 + 0.39^2) = 0.984 Hz (set rms 0.39 Hz). Common practice, no source.
[[ $(json_get 'round(d["tolerance_hz"], 3)') == 0.984 ]] || fail "tolerance"
[[ $(json_get 'len(d["exact_deg"])') == 2 ]] || fail "7.4 Hz: two exact phi"
[[ -s angles.svg ]] && head -c 100 angles.svg | grep -qE '^<\?xml|^<svg' || fail "angles.svg"
run 0 karplus angles --set hh-karplus-1963 --j 12.8 --sigma 0.15
contains out "continues across +-180"

# --- bad input: one line, exit 2, no plot written ---------------------------
rm -f bad.svg
run 2 karplus angles --set no-such-set --j 7.4 --sigma 0.3 --svg bad.svg; one_line_error; contains err "unknown Karplus set"
run 2 karplus curve --set hn-ha-hu-bax-1998 --svg bad.svg; one_line_error; contains err "hn-ha-hu-bax-1997"
run 2 karplus angles --set hn-ha-hu-bax-1997 --j 14 --sigma 0.3 --svg bad.svg; one_line_error
contains err "outside the curve"; contains err "nearest attainable J is 10.06 Hz"
run 2 karplus angles --set hn-ha-hu-bax-1997 --j 7.4 --sigma -0.3 --svg bad.svg; one_line_error; contains err "--sigma"
run 2 karplus angles --set hn-ha-hu-bax-1997 --j nan --sigma 0.3 --svg bad.svg; one_line_error; contains err "--j"
run 2 karplus angles --set hn-ha-hu-bax-1997 --j 7.4Hz --sigma 0.3 --svg bad.svg; one_line_error; contains err "7.4Hz"
run 2 karplus angles --set hn-ha-hu-bax-1997 --j 7.4 --k 0 --svg bad.svg; one_line_error; contains err "--k"
run 2 karplus angles --j 7.4 --sigma 0.3 --svg bad.svg; one_line_error; contains err "--set"
run 2 karplus curve --svg bad.svg; one_line_error; contains err "--set"
run 2 karplus curve --set hn-ha-hu-bax-1997 --svg bad.pdf; one_line_error; contains err "does not end in .svg"
run 2 karplus curve --set hn-ha-hu-bax-1997 --step 0 --svg bad.svg; one_line_error
run 2 karplus curve --set hn-ha-hu-bax-1997 --substituent 1.26:+1 --svg bad.svg; one_line_error; contains err "Haasnoot"
run 2 karplus curve --set hh-haasnoot-1980-general --substituent 1.26 --svg bad.svg; one_line_error
run 2 karplus curve --set hh-haasnoot-1980-general --substituent 1.26:2 --svg bad.svg; one_line_error
[[ ! -e bad.svg && ! -e bad.pdf ]] || fail "a plot was written despite bad input"
ls -a | grep -q '\.tmp' && fail "temporary file left behind"

# A malformed user set is an error naming the file and the key.
mkdir -p user_sets
echo '{"id": "mine", "form": "three-term"}' >user_sets/mine.json
VICINAL_KARPLUS_DIR=$WORK/user_sets run 2 karplus sets; one_line_error; contains err "mine.json"
echo "karplus: ok"
