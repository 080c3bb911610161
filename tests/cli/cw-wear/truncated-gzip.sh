# A truncated gzip input is a data error: exit 1, no rows written.
# source: spec
gzip -c testdata/wear-fleet.csv | head -c 3000 >"$TMPDIR_CASE/t.csv.gz"
cd "$TMPDIR_CASE" || exit 9
cw-wear t.csv.gz
echo "rc $?"
