# A modelled life is a reason only from at least --min-days (default 7)
# of log: HOT1's 237 days come from 10 minutes at 50 C (0.0069 days), a
# pace that says nothing about years (a reviewer's find); LONG's 300 days
# from 30.9 days are listed.  With --min-days 0 both are.
# source: hand: the two rows below against the rule of cw-report(1)
h=$(head -n 1 testdata/report/wear.csv)
{
	echo "$h"
	echo "HOT1,2026-03-01T08:00:00Z,2026-03-01T08:10:00Z,0.006944,1,0.01,2,0,0.17,0,0,0.17,0,0.5,0.1,0,0.4,0.004,99.996,237,heat,new,0.00004,0"
	echo "LONG,2026-03-01T00:00:00Z,2026-03-31T22:30:00Z,30.9375,300,21,90,40,0,0,10,0,0,0.2,0.7,0.1,0,1.9,98.1,300,cycling,new,0.002,0"
} >"$TMPDIR_CASE/wear.csv"
cw-report --csv "$TMPDIR_CASE/wear.csv"; echo "rc=$?"
cw-report --csv --min-days 0 "$TMPDIR_CASE/wear.csv" >"$TMPDIR_CASE/all"
echo "rc=$?"
cut -d, -f1-4 "$TMPDIR_CASE/all"
