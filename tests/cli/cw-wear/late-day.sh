# A day that comes late (issue 25, item 3): days 12 and 14 folded into a
# state, then day 13: exit 1 naming each pack, its rows' times and the end
# of its state, the state and report untouched (on main before the fix:
# exit 0, the day's rows skipped "already in it", the charge of 14.5 Ah
# instead of 21.2).  Then README's rebuild ("A day that comes late"): one
# state per day, merged in time order, gives the report of one pass over
# the three days, and the next night goes on from it.  The same day fed
# again is still skipped, with its message.
# source: hand: the check is an identity (rebuild = one pass over the
#   days in order, byte for byte); the messages are spec (issue 25)
cd "$TMPDIR_CASE" || exit 1
cw-synth -n 4 -d 4 -p 60 -s 3 -o in 2>/dev/null || exit 1
C='-c time=ts_ms:ms,device=dev_id,voltage=pack_mv:mV,current=pack_ma:mA,temp=temp_dk:dK --charge-negative --cells 10'
mkdir clean reports
for day in 2026-01-12 2026-01-13 2026-01-14 2026-01-15; do
	cw-clean $C -o clean/$day.csv in/$day.a.csv.gz 2>/dev/null || exit 1
done
cw-wear --state fleet.state clean/2026-01-12.csv >/dev/null 2>&1
cw-wear --state fleet.state clean/2026-01-14.csv >reports/2026-01-14.csv
echo "day 14: rc $?"
cp fleet.state before.state
cp reports/2026-01-14.csv before.csv
cw-wear --state fleet.state -o reports/2026-01-14.csv clean/2026-01-13.csv
echo "day 13 late: rc $?"
cmp before.state fleet.state && echo "state as it was"
cmp before.csv reports/2026-01-14.csv && echo "report as it was"
echo '== day 14 again: skipped, said so'
cw-wear --state fleet.state clean/2026-01-14.csv | cmp - before.csv &&
    echo "same report"
echo '== the rebuild of README'
# README: ### A day that comes late
mv clean/2026-01-15.csv day15.csv
mkdir -p map
for f in clean/*.csv; do
	cw-wear --state-out "$f" >"map/${f#clean/}.state" || exit
done
cw-wear --merge --state-out map/*.state >fleet.state.new &&
	mv fleet.state.new fleet.state
cw-wear --merge -o reports/2026-01-14.csv fleet.state
echo "rebuild: rc $?"
cw-wear clean/2026-01-12.csv clean/2026-01-13.csv clean/2026-01-14.csv |
    cmp - reports/2026-01-14.csv && echo "rebuilt report = one pass"
cw-wear --state fleet.state day15.csv >r15.csv
echo "day 15: rc $?"
cw-wear clean/*.csv day15.csv | cmp - r15.csv && echo "day 15 = one pass"
