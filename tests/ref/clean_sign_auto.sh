#!/bin/sh
# --charge-sign auto against the sign convention cw-synth wrote.  Both of
# its raw formats count charging current negative (cw-synth(1)); the
# convention of the sample stream (positive while charging) is the one
# the coulomb-counting rule needs: SoC rises with the integral of
# charging current (charge = integral of I dt, with SoC = charge over
# capacity).  Checks, on 6 packs over 2 days in both formats:
#  - without any sign option, every file is turned, the stderr line says
#    so for each file, and the stream equals, byte for byte, the one of
#    --charge-negative (so the charge per device is equal to 1e-9 and
#    more);
#  - the same files with their current turned by awk (a maker that
#    counts charging positive) are left as they are, with no message, and
#    again give the same stream;
#  - one day of each convention in one run (a log whose sign flips
#    between two files) is decided per file: the same stream again.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
cw-synth -n 6 -d 2 -s 41 -f a -F none -o "$tmp/in"
ls "$tmp"/in/*.a.csv.gz >"$tmp/files"
n=$(wc -l <"$tmp/files")
cw-clean --charge-negative --cells 10 $(cat "$tmp/files") >"$tmp/ref.csv"
cw-clean --cells 10 $(cat "$tmp/files") >"$tmp/auto.csv" 2>"$tmp/auto.err"
cmp "$tmp/ref.csv" "$tmp/auto.csv"
t=$(grep -c 'charging current counted negative.*: turned$' "$tmp/auto.err")
[ "$t" -eq "$n" ] || { echo "FAIL: $t of $n files turned"; exit 1; }
# The positive convention: current_ma is field 4 of format a (cw-synth(1)).
mkdir "$tmp/pos"
for f in $(cat "$tmp/files"); do
	b=${f##*/}
	gzip -dc "$f" | awk -F, 'BEGIN { OFS = "," }
	    NR == 1 || $4 !~ /^-?[0-9]/ || $4 == -32768 { print; next }
	    { $4 = -$4; print }' >"$tmp/pos/${b%.gz}"
done
cw-clean --cells 10 "$tmp"/pos/*.csv >"$tmp/pos.csv" 2>"$tmp/pos.err"
[ ! -s "$tmp/pos.err" ] || { echo "FAIL: messages:"; cat "$tmp/pos.err"; exit 1; }
cmp "$tmp/ref.csv" "$tmp/pos.csv"
# Day 1 as logged (negative), day 2 turned (positive): per file.
set -- $(grep '2026-01-12' "$tmp/files" || head -n 1 "$tmp/files")
d1=$1
b2=$(grep -v "${d1##*/}" "$tmp/files" | head -n 1)
b2=${b2##*/}
cw-clean --cells 10 "$d1" "$tmp/pos/${b2%.gz}" >"$tmp/mix.csv" 2>"$tmp/mix.err"
cw-clean --charge-negative --cells 10 "$d1" "${b2:+$tmp/in/$b2}" >"$tmp/mixref.csv"
cmp "$tmp/mixref.csv" "$tmp/mix.csv"
[ "$(grep -c ': turned$' "$tmp/mix.err")" -eq 1 ]
echo "ok: $n files turned, their positive twins left alone, a mixed pair per file"
