# --tz: dates at a fixed offset.  The invented fleet of cw-synth starts at
# local midnight of 2026-01-12 at UTC+01:00, its first rows at
# 2026-01-11T23:00Z: in UTC the span reads 2026-01-11, at --tz +01:00
# 2026-01-12.  In testdata/report the last rows are at 2026-03-31T22:30Z:
# EB-14's 80 % SoH 28 days later is 2026-04-28T22:30Z, which is
# 2026-04-29 at +02:00 and still 2026-04-28 at -05:00; EB-16's +100 %
# resistance 40 days later, 2026-05-10T22:30Z, is 2026-05-11 at +02:00.
# The header names the offset.  A bad offset is exit 2.
# source: hand
top=$PWD
cd "$TMPDIR_CASE" || exit 1
cw-synth -n 4 -d 1 -F none -o in || exit 1
cw-clean --charge-negative --cells 10 -o s.csv in/*.a.csv.gz || exit 1
cw-thermal -s -o thermal.csv s.csv || exit 1
head -n 2 thermal.csv | cut -d, -f1-3
cw-report thermal.csv | head -n 1
cw-report --tz +01:00 --csv thermal.csv | cut -d, -f1-4
cw-report --tz +01:00 thermal.csv | sed -n '1p;/below-min/p'
d=$top/testdata/report
for z in +02:00 -0500; do
	cw-report --tz $z "$d/capacity.csv" "$d/dcir.csv" | sed -n '1p;/ by /p'
done
cw-report --tz 1h "$d/wear.csv"
echo "exit $?"
