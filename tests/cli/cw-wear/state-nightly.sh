# --state night by night: the invented fleet's two days fed one at a time
# give, byte for byte, the report of one run over both (cycles and the
# interval across midnight counted once); the same day fed again is
# skipped with a warning and changes nothing.
# source: snapshot: the report is example-report.sh's (pinned there); what
#   this case checks is that night by night gives it byte for byte
f=testdata/wear-fleet.csv
d=$TMPDIR_CASE
awk -F, 'NR == 1 || $2 < "2026-03-03"' "$f" >"$d/day1.csv"
awk -F, 'NR == 1 || $2 >= "2026-03-03"' "$f" >"$d/day2.csv"
cw-wear --state "$d/fleet.state" "$d/day1.csv" 2>&1 >"$d/report1.csv" | sed "s|$d/||" >&2
echo "rc $?"
cw-wear --state "$d/fleet.state" "$d/day2.csv" >"$d/report2.csv"
echo "rc $?"
cw-wear "$f" | cmp - "$d/report2.csv" && echo "day by day = one pass"
cw-wear "$d/day1.csv" | cmp - "$d/report1.csv" && echo "first night = day 1"
cat "$d/report2.csv"
# The second day again: nothing new.
cp "$d/fleet.state" "$d/before.state"
cw-wear --state "$d/fleet.state" "$d/day2.csv" >"$d/again.csv" 2>"$d/err"
echo "rc $?"
sed "s|$d/||" "$d/err"
cmp "$d/report2.csv" "$d/again.csv" && echo "report unchanged"
cmp "$d/before.state" "$d/fleet.state" && echo "state unchanged"
# Only the new rows of a day partly seen are folded in.
awk -F, 'NR == 1 || $2 >= "2026-03-03T12"' "$f" >"$d/late.csv"
cw-wear --state "$d/fleet.state" "$d/late.csv" >/dev/null 2>"$d/err"
echo "rc $?"
sed "s|$d/||" "$d/err"
cmp "$d/before.state" "$d/fleet.state" && echo "state unchanged"
ls "$d"
