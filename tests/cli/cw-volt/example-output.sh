# cw-volt(1) EXAMPLES: events of at least 5 minutes to a file.  Of the
# four events of example-events.sh (240, 120, 240 and 420 s) only
# EB-0102's rest event (420 s) is kept.  -o is atomic: on a data error
# (a missing file after a good one) the old contents stay and no
# temporary is left.
cd "$TMPDIR_CASE" || exit 1
top=$OLDPWD
cw-volt --min-duration 5m --fleet "$top/testdata/volt-register.csv" \
    -o long.csv "$top/testdata/volt-fleet.csv"
echo "rc=$?"
cat long.csv
echo old >long.csv
cw-volt -o long.csv "$top/testdata/volt-fleet.csv" nosuch.csv
echo "rc=$?"
cat long.csv
ls
