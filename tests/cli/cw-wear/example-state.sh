# cw-wear(1) EXAMPLES: night by night with --state; the second report is
# that of one run over both days.
# source: spec (night by night equals one run; no number shown)
cd "$TMPDIR_CASE" || exit 1
f=$OLDPWD/testdata/wear-fleet.csv
awk -F, 'NR == 1 || $2 < "2026-03-03"' "$f" >day1.csv
awk -F, 'NR == 1 || $2 >= "2026-03-03"' "$f" >day2.csv
cw-wear --state fleet.state day1.csv > report1.csv
cw-wear --state fleet.state day2.csv > report2.csv
echo "rc $?"
cw-wear day1.csv day2.csv | cmp - report2.csv && echo same
ls
