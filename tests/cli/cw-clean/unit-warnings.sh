# Unit plausibility: the first rows of each file (up to 2000, at least
# 100) are looked at as a whole, and a warning says when their values
# only make sense in another unit or as a pack of cells, with the option
# that fixes it; a single odd row (a spike) warns of nothing, nor do the
# same data with the right option.
# By hand, 200 rows a file (k = 0..199):
#  cell.csv  3.70 + 0.002 k V (3.70..4.098), 1.500 + 0.001 k A, 25 C with
#            one row of 2950 (a spike): no warning.
#  ma.csv    the same with the current in whole mA (1500..1699) under
#            "current": median 1600 "A" at 3.9 V (the median ratio) is 410 A per
#            volt, above 25: milliamperes.
#  f.csv     temperatures 60..79.9 F under "temp": median 70, in 50..150:
#            Fahrenheit.  dk.csv 2950..2969.9: tenths of a kelvin.
#            k.csv 295..314.9: kelvin (or 0.1 C).
#  pack.csv  the voltages times 10 (37.0..40.98 V) without --cells: a pack;
#            cells from ceil(99th pct / 4.25) = ceil(40.94 / 4.25) = 10 to
#            floor(1st pct / 2.5) = floor(37.04 / 2.5) = 14 (rows rejected
#            as out of range, as before).
#  mv.csv    the voltages in mV (3700..4098) under "voltage": millivolts.
# source: hand (the thresholds are cw-clean's, documented in cw-clean(1)
#   as common practice; the medians and percentiles worked above)
cd "$TMPDIR_CASE" || exit 1
gen() {	# gen FILE VSCALE IMA TEMP0 TSTEP
	awk -v vs="$2" -v ma="$3" -v t0="$4" -v ts="$5" 'BEGIN {
	    print "device,time,voltage,current,temp,soc_pct"
	    for (k = 0; k < 200; k++) {
		v = (3.70 + 0.002 * k) * vs
		i = ma ? 1500 + k : 1.5 + 0.001 * k
		t = (k == 100 && t0 == 25) ? 2950 : t0 + ts * k
		printf "P,%d,%.6g,%.6g,%.6g,%.1f\n", 1772323200 + 60 * k, v, i,
		    t, 20 + 0.1 * k } }' >"$1"
}
gen cell.csv 1 0 25 0
gen ma.csv 1 1 25 0
gen f.csv 1 0 60 0.1
gen dk.csv 1 0 2950 0.1
gen k.csv 1 0 295 0.1
gen pack.csv 10 0 25 0
gen mv.csv 1000 0 25 0
for f in cell ma f dk k pack mv; do
	echo "== $f.csv"
	cw-clean --charge-sign positive --max-reject 1 $f.csv >/dev/null
	echo "rc=$?"
done
echo '== with the options the warnings give: silent'
cw-clean --charge-sign positive -c 'current=current:mA' ma.csv >/dev/null
cw-clean --charge-sign positive -c 'temp=temp:F' f.csv >/dev/null
cw-clean --charge-sign positive -c 'temp=temp:dK' dk.csv >/dev/null
cw-clean --charge-sign positive --cells 10 pack.csv >/dev/null
cw-clean --charge-sign positive -c 'voltage=voltage:mV' mv.csv >/dev/null
echo "rc=$?"
echo '== fewer than 100 rows: no judgement'
head -n 99 ma.csv >few.csv
cw-clean --charge-sign positive few.csv >/dev/null
echo "rc=$?"
