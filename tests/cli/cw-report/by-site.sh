# --by site rolls the reasons up per site of the fleet file: sites in the
# order of their most urgent pack (depot has EB-10, charged below 0 C, so
# it comes first; dock-03 next with its cool over-current; dock-05 last
# with capacity), each reason with its packs.  On testdata/report
# (ranking.sh has the packs): depot 4 packs (EB-10 and EB-17 short-life,
# EB-11 under-voltage, EB-16 resistance), dock-03 1, dock-05 2.  --by
# model: EB14 holds all but the pack of dock 3 (DK20).  Without a fleet
# file every pack is in the group of no site.  A bad --by is exit 2.
# source: hand
cd testdata/report || exit 1
in="wear.csv thermal.csv volt.csv capacity.csv dcir.csv topoff.csv"
cw-report --fleet ../report-fleet.csv --by site $in
echo "exit $?"
cw-report --fleet ../report-fleet.csv --by site --csv $in
cw-report --fleet ../report-fleet.csv --by model --csv $in
cw-report --by site --csv thermal.csv
cw-report --fleet ../report-fleet.csv --by site -n 1 $in | grep -e '^ *[0-9]*\.' -e more
cw-report --by pack $in
echo "exit $?"
