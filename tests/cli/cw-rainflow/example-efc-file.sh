# cw-rainflow(1) EXAMPLES: packs above one equivalent full cycle, through
# a file written with -o.  CT-0305 (1.25) and EB-0101 (1.225), not
# SC-0203 (0.3).  Nothing but efc.csv is left in the folder.
# source: hand (the efc of example-summary-pipeline.sh, worked there)
top=$(pwd)
cd "$TMPDIR_CASE" && mkdir testdata &&
    cp "$top/testdata/rainflow-fleet.csv" testdata/
cw-rainflow -s -o efc.csv testdata/rainflow-fleet.csv
echo "rc=$?"
awk -F, 'NR > 1 && $3 > 1 { print $1 }' efc.csv
ls
