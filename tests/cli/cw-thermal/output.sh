# -o FILE is atomic: written on success; on a data error (a missing
# file after a good one) the old contents stay and no temporary is left.
# source: spec
o=$TMPDIR_CASE/out.csv
echo old >"$o"
cw-thermal -o "$o" testdata/thermal-fleet.csv nosuch.csv
echo "rc=$?"
cat "$o"
cw-thermal -o "$o" testdata/thermal-fleet.csv
echo "rc=$?"
wc -l <"$o"
ls "$TMPDIR_CASE"
