# --incidents 1 on 6 packs for a winter day: the last four packs get the
# incidents in turn from the last down (cw-synth(1), Incidents), the
# first two are the packs of a run without the option, byte for byte;
# --incidents 0 is a run without it; 2 on 6 packs is a usage error.
# The truth rows are checked against their own columns and the stated
# rules: every truth-volt.csv row lies beyond its limit (over: v_cell_max
# above 4.25 V, under: v_cell_min below 2.50 V), lasts at least 30 s and
# belongs to an incident pack; every truth-charging.csv verdict follows
# from its zone, i_max_a and v_cell_max (cool: over-current above
# 0.5 C * 14 Ah * 1.05 = 7.35 A; warm: over-voltage above 4.12 V;
# below-min/above-max: no-charge-allowed).
# source: snapshot: the pack assignment and the chargers' names are the
#   manual's; the thresholds are hand derivations checked here; the event
#   rows are a snapshot of the seed's physics (tests/ref/synth_truth_volt.sh
#   checks the tools against them)
cd "$TMPDIR_CASE" || exit 1
cw-synth -n 6 -d 1 -F none -o plain
cw-synth -n 6 -d 1 -F none --incidents 0 -o zero
cw-synth -n 6 -d 1 -F none --incidents 1 -o inc
for f in plain/*; do
	cmp -s "$f" "zero/${f#plain/}" || echo "--incidents 0 differs: $f"
done
echo "chargers:"
cut -d, -f1-3 inc/truth-devices.csv
zcat plain/2026-01-12.a.csv.gz | grep -E 'EB-000[12]' >plain.12
zcat inc/2026-01-12.a.csv.gz | grep -E 'EB-000[12]' >inc.12
cmp -s plain.12 inc.12 && echo "EB-0001, EB-0002: same rows ($(wc -l <inc.12))"
echo "truth-volt.csv:"
cat inc/truth-volt.csv
awk -F, 'NR == 1 { next }
	{ ok = $3 == "over" ? $8 > 4.25 : $7 < 2.50 }
	!ok { print "not beyond the limit:", $0 }
	$6 < 30 || $10 == "" { print "bad row:", $0 }' inc/truth-volt.csv
echo "truth-charging.csv verdicts:"
awk -F, 'NR > 1 { print $1, $3, $16 }' inc/truth-charging.csv |
    sort | uniq -c
awk -F, 'NR == 1 { next }
	{ want = "within" }
	$3 == "below-min" || $3 == "above-max" { want = "no-charge-allowed" }
	$3 == "cool" && $14 > 7.35 { want = "over-current" }
	$3 == "warm" && $15 > 4.12 { want = "over-voltage" }
	want != $16 { print "verdict", $16, "should be", want ": " $0 }' \
    inc/truth-charging.csv
cw-synth -n 7 -d 1 --incidents 2 -o bad
echo "rc=$?"
ls
