# cw-wear(1) EXAMPLES: map and reduce by device, the shuffle done by sort:
# the report of one run over both days.
# source: spec (the sorted map and reduce equals one run; no number shown)
cd "$TMPDIR_CASE" || exit 1
f=$OLDPWD/testdata/wear-fleet.csv
awk -F, 'NR == 1 || $2 < "2026-03-03"' "$f" >day1.csv
awk -F, 'NR == 1 || $2 >= "2026-03-03"' "$f" >day2.csv
for f in day*.csv; do cw-wear --state-out "$f"; done |
    sort -t, -k1,1 | cw-wear --merge > report.csv
echo "rc $?"
cw-wear day1.csv day2.csv | cmp - report.csv && echo same
