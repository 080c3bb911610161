# A hold spanning two input files: testdata/topoff-hand.csv (see
# handbuilt.sh) split at 00:20, in the second micro-cycle's drop, the
# second part with its own header as a second log would have.  The holds,
# micro-cycles and summary must be those of the whole file.
# source: spec (split input equals the whole file, worked in handbuilt.sh)
top=$(pwd)
cd "$TMPDIR_CASE" || exit 1
f=$top/testdata/topoff-hand.csv
awk -F, 'NR == 1 || $2 < "2026-01-01T00:20"' "$f" >a.csv
awk -F, 'NR == 1 || $2 >= "2026-01-01T00:20"' "$f" >b.csv
wc -l <a.csv; wc -l <b.csv
cw-topoff a.csv b.csv
for o in -e -s; do
	cw-topoff $o "$f" >one.csv
	cw-topoff $o a.csv b.csv | cmp - one.csv && echo "same as one file ($o)"
done
# The same through standard input as two gzip members.
cw-topoff -e "$f" >one.csv
{ gzip -c a.csv; gzip -c b.csv; } | cw-topoff -e | cmp - one.csv &&
    echo "same from two gzip members"
