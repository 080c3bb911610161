# The fleet split in two files mid-event (inside a CART-03 event), and
# the same through standard input as two gzip members: the same steps.
# source: spec (the steps of a split fleet equal those of the whole file; no
#   number to derive)
f=testdata/dcir-fleet.csv
head -n 100 "$f" >"$TMPDIR_CASE/a.csv"
{ head -n 1 "$f"; tail -n +101 "$f"; } >"$TMPDIR_CASE/b.csv"
sed -n 100,101p "$f"
cw-dcir "$f" >"$TMPDIR_CASE/whole.csv"
cw-dcir "$TMPDIR_CASE/a.csv" "$TMPDIR_CASE/b.csv" |
    cmp - "$TMPDIR_CASE/whole.csv" && echo same as the whole file
{ gzip -c "$TMPDIR_CASE/a.csv"; gzip -c "$TMPDIR_CASE/b.csv"; } |
    cw-dcir | cmp - "$TMPDIR_CASE/whole.csv" && echo same from two gzip members
cw-dcir -t "$f" >"$TMPDIR_CASE/trend.csv"
cw-dcir -t "$TMPDIR_CASE/a.csv" - <"$TMPDIR_CASE/b.csv" |
    cmp - "$TMPDIR_CASE/trend.csv" && echo trend the same with stdin as -
