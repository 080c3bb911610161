# cw-wear(1) EXAMPLES: the days on four cores with GNU parallel, each to
# its states, then merged: the report of one run over both days.
# source: spec (the merged states equal one run; no number shown)
cd "$TMPDIR_CASE" || exit 1
f=$OLDPWD/testdata/wear-fleet.csv
awk -F, 'NR == 1 || $2 < "2026-03-03"' "$f" >day1.csv
awk -F, 'NR == 1 || $2 >= "2026-03-03"' "$f" >day2.csv
ls day*.csv | parallel -j4 'cw-wear --state-out {} > {.}.state'
cw-wear --merge day*.state > report.csv
echo "rc $?"
cw-wear day1.csv day2.csv | cmp - report.csv && echo same
ls
