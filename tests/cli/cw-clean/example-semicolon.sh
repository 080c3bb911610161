# cw-clean(1) EXAMPLES: a semicolon, decimal-comma depot log in local
# time at +01:00, its device from the file name, a 10-cell pack; output
# compared with the manual's.  By hand: 08:00 at +01:00 is 07:00Z;
# "38,25" is 38.25 V, inside 15..50 V for 10 cells.
# source: hand
cw-clean -d ';' --decimal-comma --tz +01:00 --cells 10 \
    --device @file testdata/depot/DEPOT-3.csv >"$TMPDIR_CASE/out.csv"
echo "rc=$?"
cat "$TMPDIR_CASE/out.csv"
sed -n '/^    --device @file testdata\/depot\/DEPOT-3.csv$/,/^\.Ed/p' man/cw-clean.1 |
    sed '1d;$d' | cmp - "$TMPDIR_CASE/out.csv" && echo "same as the manual"
echo '== without --cells 10 every row is out of range'
cw-clean -d ';' --decimal-comma --tz +01:00 --device @file \
    testdata/depot/DEPOT-3.csv
echo "rc=$?"
