# --fleet: the fleet file's capacity_ah is the rating of the packs it
# names (over --rated), so soh_pct and eol_date follow it; a pack it does
# not name keeps --rated, and without --rated has none (empty soh_pct and
# eol_date).  A fleet file with a bad value, a repeated device or no
# device column is a data error named FILE:LINE, exit 1, before any
# output.  By hand from testdata/capacity-fleet.py: EB-0102's last
# estimate, 108 days after its first, is of 12.6 - 0.012 x 108 = 11.30 Ah,
# 80.7 % of 14 Ah and 90.4 % of 12.5 Ah (the fitted line: 11.29 Ah).
# source: hand
cd "$TMPDIR_CASE" || exit 2
top=$OLDPWD
printf 'device,site,capacity_ah\nEB-0102,dock-02,12.5\nEB-0999,x,10\n' \
    >fleet.csv
cw-capacity -t --fleet fleet.csv --rated 14 \
    "$top/testdata/capacity-fleet.csv" | cut -d, -f1,9,10,15
echo "rc=$?"
cw-capacity -t --fleet fleet.csv "$top/testdata/capacity-fleet.csv" |
    cut -d, -f1,9,10,15
printf 'device,capacity_ah\nEB-0101,14\nEB-0102,-3\n' >bad.csv
cw-capacity -t --fleet bad.csv "$top/testdata/capacity-fleet.csv"
echo "rc=$?"
printf 'device,capacity_ah\nEB-0101,14\nEB-0101,13\n' >twice.csv
cw-capacity --fleet twice.csv "$top/testdata/capacity-fleet.csv"
echo "rc=$?"
printf 'pack,capacity_ah\nEB-0101,14\n' >nodev.csv
cw-capacity --fleet nodev.csv "$top/testdata/capacity-fleet.csv"
echo "rc=$?"
cw-capacity --fleet missing.csv "$top/testdata/capacity-fleet.csv"
echo "rc=$?"
