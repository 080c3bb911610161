# cw-thermal(1) EXAMPLES: the fleet split in two files mid-event.  The
# events must be the same as from the whole file (CART-07 and TERM-12
# are in an event at the boundary, 05:10/05:11).
# source: spec (split input equals the whole file; no number to derive)
cw-thermal testdata/thermal-fleet-a.csv testdata/thermal-fleet-b.csv
cw-thermal testdata/thermal-fleet.csv >"$TMPDIR_CASE/whole.csv"
cw-thermal testdata/thermal-fleet-a.csv testdata/thermal-fleet-b.csv |
    cmp - "$TMPDIR_CASE/whole.csv" && echo same as the whole file
# The same through standard input, gzipped, as two gzip members.
{ gzip -c testdata/thermal-fleet-a.csv
  gzip -c testdata/thermal-fleet-b.csv; } |
    cw-thermal | cmp - "$TMPDIR_CASE/whole.csv" &&
    echo same from two gzip members
