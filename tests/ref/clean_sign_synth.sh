#!/bin/sh
# --charge-sign auto on raw logs cw-synth wrote with each sign convention
# (cw-synth --charge-sign), against two outside facts: the definition of
# charge as the integral of current over time, with the stream's
# convention (positive while charging; SoC rises with the integral, the
# coulomb-counting rule), and the truth cw-synth kept of the charge each
# pack took (truth-devices.csv charge_ah, the simulated pack's own
# integral, before the gauge's errors).  Checks:
#  - one run of cw-clean without a sign option over a fleet logged
#    negative and another logged positive (devices renamed EC-) finds
#    both: the negative files are turned and said so, the positive ones
#    not; per device the charge in and out equals, to 1e-9 Ah, that of
#    the run with the right explicit option on each fleet;
#  - the charge put in per device agrees with the truth to within the
#    gauge's current error (gain up to 1.5 %, offset, noise, and the
#    resolution of a 1 s average; 3 % allowed: common practice, no
#    source), and riding (the truth's rides) is discharge for every
#    pack in the stream of auto, charge with the wrong explicit sign;
#  - a log whose sign flips halfway (day 1 negative, day 2 positive, two
#    files of the same packs) is decided per file: the same charge per
#    device as the fleet logged negative throughout with
#    --charge-sign negative.
set -eu
tmp=$(mktemp -d)
trap 'rm -rf "$tmp"' EXIT
for s in negative positive; do
	cw-synth -n 6 -d 2 -s 43 -f a -F none --charge-sign $s -o "$tmp/$s"
done
mkdir "$tmp/pos"
for f in "$tmp"/positive/*.a.csv.gz; do
	gzip -dc "$f" | sed 's/,EB-/,EC-/' >"$tmp/pos/${f##*/}"
	gzip -q "$tmp/pos/${f##*/}"
done
# The charge in and out per device, Ah, by charge.h's rule (a row's
# current holds over the interval since the device's previous row).
charge() {
	awk -F, 'NR > 1 { split($2, a, /[-T:Z]/)
	    t = ((a[3] * 24 + a[4]) * 60 + a[5]) * 60 + a[6]
	    if ($1 in p && t - p[$1] <= 900) {
		q = $4 * (t - p[$1]) / 3600
		if (q > 0) cin[$1] += q; else cout[$1] -= q }
	    p[$1] = t }
	    END { for (d in p) printf "%s %.12f %.12f\n", d, cin[d], cout[d] }' |
	    sort
}
cw-clean --cells 10 "$tmp"/negative/*.gz "$tmp"/pos/*.gz >"$tmp/auto.csv" \
    2>"$tmp/auto.err"
nt=$(grep -c 'charging current counted negative.*: turned$' "$tmp/auto.err")
[ "$nt" -eq 2 ] || { echo "FAIL: $nt files turned, 2 expected"; cat "$tmp/auto.err"; exit 1; }
if grep -q '/pos/' "$tmp/auto.err"; then
	echo "FAIL: a positive file was turned"; exit 1
fi
{
	cw-clean --cells 10 --charge-sign negative "$tmp"/negative/*.gz
	cw-clean --cells 10 --charge-sign positive "$tmp"/pos/*.gz | sed 1d
} >"$tmp/explicit.csv"
charge <"$tmp/auto.csv" >"$tmp/auto.q"
charge <"$tmp/explicit.csv" >"$tmp/explicit.q"
[ "$(wc -l <"$tmp/auto.q")" -eq 12 ] || { echo "FAIL: not 12 devices"; exit 1; }
join "$tmp/auto.q" "$tmp/explicit.q" | awk '
    function abs(x) { return x < 0 ? -x : x }
    abs($2 - $4) > 1e-9 || abs($3 - $5) > 1e-9 { bad++; print "FAIL:", $0 }
    END { exit bad > 0 }'
# Against the truth (charge_ah is field 19 of truth-devices.csv).
for s in negative positive; do
	awk -F, -v s=$s 'NR > 1 { d = $1; if (s == "positive") sub(/^EB-/, "EC-", d)
	    print d, $19 }' "$tmp/$s/truth-devices.csv"
done | sort >"$tmp/truth.q"
join "$tmp/auto.q" "$tmp/truth.q" | awk '
    { e = ($2 - $4) / $4; if (e < 0) e = -e; if (e > m) m = e
      if (e > 0.03) { bad++; print "FAIL: charge in off the truth:", $0 } }
    END { printf "charge in per device against the truth: worst %.2f %%\n", 100 * m
      exit bad > 0 }'
# The sign against the truth: riding is discharge, so the charge over
# the rows inside the truth's rides (truth-rides.csv) is negative for
# every device, and positive with the wrong explicit sign.
rides() {
	awk -F, 'FNR == 1 { f++; next }
	    f == 1 { n[$1]++; s[$1, n[$1]] = $2; e[$1, n[$1]] = $3; next }
	    { for (k = 1; k <= n[$1]; k++)
		if ($2 > s[$1, k] && $2 <= e[$1, k]) { q[$1] += $4; break } }
	    END { for (d in q) print d, (q[d] < 0 ? "discharge" : "charge") }' \
	    "$1" - | sort | uniq -c -f 1 | awk '{ print $3, $1 }'
}
cw-clean --cells 10 --charge-sign negative "$tmp"/negative/*.gz |
    rides "$tmp/negative/truth-rides.csv" >"$tmp/rides.right"
cw-clean --cells 10 --charge-sign positive "$tmp"/negative/*.gz 2>/dev/null |
    rides "$tmp/negative/truth-rides.csv" >"$tmp/rides.wrong"
cw-clean --cells 10 "$tmp"/negative/*.gz 2>/dev/null |
    rides "$tmp/negative/truth-rides.csv" >"$tmp/rides.auto"
echo "rides by sign: right $(cat "$tmp/rides.right"), wrong $(cat "$tmp/rides.wrong"), auto $(cat "$tmp/rides.auto")"
[ "$(cat "$tmp/rides.right")" = "discharge 6" ] &&
    [ "$(cat "$tmp/rides.wrong")" = "charge 6" ] &&
    cmp -s "$tmp/rides.right" "$tmp/rides.auto" ||
    { echo "FAIL: riding is not discharge in the stream"; exit 1; }
# A sign flipped halfway: day 1 negative, day 2 positive.
set -- "$tmp"/negative/*.a.csv.gz
d1=$1 d2=${2##*/}
cw-clean --cells 10 "$d1" "$tmp/positive/$d2" >"$tmp/flip.csv" 2>"$tmp/flip.err"
[ "$(grep -c ': turned$' "$tmp/flip.err")" -eq 1 ] ||
    { echo "FAIL: not one file of the flipped log turned"; exit 1; }
grep -q "${d1##*/}: charging current counted negative" "$tmp/flip.err" ||
    { echo "FAIL: the wrong file turned"; exit 1; }
cw-clean --cells 10 --charge-sign negative "$tmp"/negative/*.gz |
    charge >"$tmp/neg.q"
charge <"$tmp/flip.csv" | join - "$tmp/neg.q" | awk '
    function abs(x) { return x < 0 ? -x : x }
    abs($2 - $4) > 1e-9 || abs($3 - $5) > 1e-9 { bad++; print "FAIL:", $0 }
    END { exit bad > 0 }'
echo "ok: 2 negative and 2 positive files in one run decided per file, charge per device as with the explicit signs (1e-9 Ah), a log flipped halfway per file"
