# The first rows of a day in both formats, and the truth's header lines.
# By hand, the first row of each: 1768172402000 ms =
# 2026-01-11T23:00:02Z = 2026-01-12T00:00:02+01:00; 41822 mV = 41,822 V;
# format A's 121 mA, charge-negative, is a discharge: -0,121 A in B;
# 2659 dK = 265.9 K = -7.25 C = 18.95 F (K = C + 273.15, F = C * 9/5 +
# 32); EB-0001 sits in the 18 C depot: 2911 dK = 17.95 C = 64.31 F.
# source: hand
t=$TMPDIR_CASE
cw-synth -n 3 -d 1 -f both -o "$t"
zcat "$t/2026-01-12.a.csv.gz" | head -n 4
zcat "$t/2026-01-12.b.csv.gz" | head -n 4
for f in devices charging topoff faults days run; do
	head -n 1 "$t/truth-$f.csv"
done
cat "$t/truth-run.csv"
