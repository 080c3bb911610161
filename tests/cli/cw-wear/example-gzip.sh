# cw-wear(1) EXAMPLES: gzip on standard input, written with -o (here
# into the case's scratch folder); the file equals the plain run.
# source: spec (the gzip run equals the plain one; no number shown)
gzip -c testdata/wear-fleet.csv | cw-wear -o "$TMPDIR_CASE/report.csv"
echo "rc $?"
cw-wear testdata/wear-fleet.csv | cmp - "$TMPDIR_CASE/report.csv" && echo same
ls "$TMPDIR_CASE"
