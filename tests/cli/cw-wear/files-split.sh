# The fleet split in two files mid-way (the second with its own header):
# each device goes on across the boundary, so the report is the same as
# from one file.
# source: spec (split input equals the whole file; no number shown)
f=testdata/wear-fleet.csv
head -n 500 "$f" >"$TMPDIR_CASE/a.csv"
{ head -n 1 "$f"; tail -n +501 "$f"; } >"$TMPDIR_CASE/b.csv"
cw-wear "$TMPDIR_CASE/a.csv" "$TMPDIR_CASE/b.csv" >"$TMPDIR_CASE/two.csv"
cw-wear "$f" | cmp - "$TMPDIR_CASE/two.csv" && echo same
