# --since FILE: new is 1 for a (device, reason) the earlier --csv report
# did not hold (cw-report(1)).  Same inputs as the night before: every
# row new=0 and no [new] in the text.  A changed night: EB-11's
# under-voltage is gone from tonight's volt.csv and EB-18 now has one
# (v_cell_min 2.40 V, 2 events, 1.5 h), so only EB-18's reason is new;
# EB-11 is no longer listed.  An empty --since file holds nothing (every
# row new).  By hand from testdata/report (see ranking.sh), fleet file testdata/report-fleet.csv.
# source: hand
d=$PWD/testdata/report
cd "$TMPDIR_CASE" || exit 1
# rank,device,reason,new of a --csv report (the detail, quoted, dropped).
cols() {
	sed -E 's/^([^,]*),("[^"]*"|[^,]*),([^,]*),([^,]*),.*,([01]|new),([0-9]|tier)$/\1,\2,\4,\5/'
}
in="$d/wear.csv $d/thermal.csv $d/capacity.csv $d/dcir.csv"
cw-report --fleet "$d-fleet.csv" --csv -o last.csv $in "$d/volt.csv"
echo "exit $?"
echo "== same"
cw-report --fleet "$d-fleet.csv" --since last.csv --csv $in "$d/volt.csv" | cols
cw-report --fleet "$d-fleet.csv" --since last.csv $in "$d/volt.csv" |
    grep -c '\[new\]'
echo "== changed"
sed -e '/^EB-11,/s/,2.31,4.2,0,0,0,1,5,0,0,0,0,0,1,0$/,3.1,4.2,0,0,0,0,0,0,0,0,0,0,0,0/' \
    -e '/^EB-18,/s/,3.1,4.2,0,0,0,0,0,0,0,0,0,0,0,0$/,2.4,4.2,0,0,0,2,1.5,0,0,0,0,0,2,0/' \
    "$d/volt.csv" >volt.csv
cw-report --fleet "$d-fleet.csv" --since last.csv --csv $in volt.csv | cols
cw-report --fleet "$d-fleet.csv" --since last.csv $in volt.csv |
    grep -e '\[new\]'
echo "== by site"
cw-report --fleet "$d-fleet.csv" --since last.csv --by site $in volt.csv |
    grep -e 'cell-under' -e '^  *[0-9]'
echo "== empty"
: >empty.csv
cw-report --fleet "$d-fleet.csv" --since empty.csv --csv $in volt.csv | cols
