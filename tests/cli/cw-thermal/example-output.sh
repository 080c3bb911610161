# cw-thermal(1) EXAMPLES: at least 10 minutes, pauses up to 5 min joined,
# into a file.  Run in a scratch folder holding a copy of testdata so the
# example's own command line is used.  EB-0042's use event lasts 8 min
# and is dropped; CART-07 (20 min) and TERM-12 (12 min) remain.
# source: hand
top=$(pwd)
cd "$TMPDIR_CASE" && mkdir testdata &&
    cp "$top/testdata/thermal-fleet.csv" testdata/
cw-thermal --min-duration 10m --merge 5m -o long.csv \
    testdata/thermal-fleet.csv
echo "rc=$?"
cat long.csv
ls
