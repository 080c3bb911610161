# A healthy fleet gets an empty report and exit 0 (cw-report(1)).
# 1. The invented fleet of cold-charged.sh without its dock-07 pack
#    (cw-synth -n 3): every tool's output, nothing to act on.
# 2. The healthy packs of testdata/report alone, by hand:
#    EB-12 charged 30 Ah cool in 12 events, all within the protocol
#    (events_over_current 0): cool-zone charging is no reason;
#    EB-15 SoH 84 % losing 0.02 Ah a day, but Sen's interval (-0.04 to
#    +0.005 Ah/day) holds zero: no sure slope, no projection;
#    EB-18 SoH 100.4 %, resistance +2 %, modelled life 1500 days (over
#    the 365 of --life).
#    With --csv: the header only.
# source: hand (the three packs of 2, worked above); snapshot for 1 (a
#   simulated fleet the tools find healthy)
top=$PWD
cd "$TMPDIR_CASE" || exit 1
cw-synth -n 3 -d 2 -F none -o in || exit 1
cw-clean --charge-negative --cells 10 -o s.csv in/*.a.csv.gz || exit 1
cw-wear -o wear.csv s.csv || exit 1
cw-thermal -s --capacity 14 --cells 10 -o thermal.csv s.csv || exit 1
cw-topoff -s -o topoff.csv s.csv || exit 1
cw-dcir -t -o dcir.csv s.csv || exit 1
cw-capacity -t --rated 14 -o capacity.csv s.csv || exit 1
cw-volt -s --cells 10 -o volt.csv s.csv || exit 1
cw-report wear.csv thermal.csv topoff.csv dcir.csv capacity.csv volt.csv
echo "synth: exit $?"
d=$top/testdata/report
for f in wear thermal volt capacity dcir topoff; do
	awk -F, 'NR == 1 || /^EB-1[258],/' "$d/$f.csv" >"h-$f.csv"
done
cw-report --fleet "$d-fleet.csv" h-*.csv
echo "hand: exit $?"
cw-report --fleet "$d-fleet.csv" --csv h-*.csv
echo "hand --csv: exit $?"
cw-report --fleet "$d-fleet.csv" --by site --csv h-*.csv
echo "hand --by site --csv: exit $?"
