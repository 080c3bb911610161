# A cycle whose turning points lie in different input files is counted
# once.  The fleet is cut after 09:00: EB-0101's 30-80 cycle has its
# valley (30, 08:10) in the first file and its peak (80, 09:50) in the
# second.  Two files, two gzip members on stdin, and a gzip file plus a
# plain one all give the rows of the whole file.
# source: spec (split input equals the whole file; no number to derive)
f=testdata/rainflow-fleet.csv
a=$TMPDIR_CASE/a.csv
b=$TMPDIR_CASE/b.csv
n=$(grep -n 'T09:00:00Z' "$f" | head -n 1 | cut -d: -f1)
head -n $((n - 1)) "$f" >"$a"
{ head -n 1 "$f"; tail -n +"$n" "$f"; } >"$b"
grep -c 'EB-0101,.*T08:10:00Z,.*,30$' "$a"
grep -c 'EB-0101,.*T09:50:00Z,.*,80$' "$b"
cw-rainflow "$f" >"$TMPDIR_CASE/whole.csv"
cw-rainflow "$a" "$b" | cmp - "$TMPDIR_CASE/whole.csv" &&
    echo "two files: same as the whole file"
{ gzip -c "$a"; gzip -c "$b"; } | cw-rainflow |
    cmp - "$TMPDIR_CASE/whole.csv" && echo "two gzip members: same"
gzip -c "$a" >"$a.gz"
cw-rainflow "$a.gz" - <"$b" | cmp - "$TMPDIR_CASE/whole.csv" &&
    echo "gzip file and stdin: same"
echo "EB-0101 30-80 cycle rows:"
cw-rainflow "$a" "$b" | grep '^EB-0101,50,'
echo "first file alone (the cycle is not closed there):"
cw-rainflow "$a" | grep '^EB-0101,'
