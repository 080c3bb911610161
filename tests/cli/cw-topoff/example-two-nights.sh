# cw-topoff(1) EXAMPLES: two nights in two gzipped files, the example's
# own command line run in a scratch folder.  testdata/topoff-dock.csv is
# split at midnight into dock-mon.csv.gz and dock-tue.csv.gz (each with
# its header); TERM-31's and CART-02's holds cross midnight and must stay
# one hold each: the summary equals that of the whole file.
# source: spec (two nights equal the whole file; no number to derive)
top=$(pwd)
cd "$TMPDIR_CASE" || exit 1
f=$top/testdata/topoff-dock.csv
awk -F, 'NR == 1 || $2 < "2026-02-03"' "$f" | gzip >dock-mon.csv.gz
awk -F, 'NR == 1 || $2 >= "2026-02-03"' "$f" | gzip >dock-tue.csv.gz
cw-topoff -s -o dock.csv dock-mon.csv.gz dock-tue.csv.gz
echo "rc=$?"
cat dock.csv
cw-topoff -s "$f" | cmp - dock.csv && echo "same as the whole file"
ls
