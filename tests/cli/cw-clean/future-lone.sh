# A device's lone row is judged, at the end, against the newest row
# accepted before: (1) a "last seen" export, one row per pack, weeks
# apart, is all accepted whatever the order of the packs (the mark used
# to move as the end took rows in, so all but one pack could be lost);
# (2) beside packs with rows of their own in March 2026, a pack whose
# only row is stamped 2100 is rejected as future, and one 3 days later
# than the others is kept (--max-jump 7d).
# source: hand: the rows below against cw-clean(1)'s --max-jump rule
h=device,time,voltage_v,current_a
{ echo $h
  echo P1,2026-01-01T00:00:00Z,3.7,0
  echo P2,2026-02-10T00:00:00Z,3.7,0
  echo P3,2026-03-20T00:00:00Z,3.7,0
} >"$TMPDIR_CASE/seen.csv"
cw-clean --charge-sign positive --rejects "$TMPDIR_CASE/r1" \
    "$TMPDIR_CASE/seen.csv" | sort
cut -d, -f3 "$TMPDIR_CASE/r1"
{ echo $h
  echo A,2026-03-01T00:00:00Z,3.7,0
  echo A,2026-03-01T00:01:00Z,3.7,0
  echo B,2100-01-01T00:00:00Z,3.7,0
  echo C,2026-03-04T00:00:00Z,3.7,0
} >"$TMPDIR_CASE/mix.csv"
cw-clean --charge-sign positive --rejects "$TMPDIR_CASE/r2" \
    "$TMPDIR_CASE/mix.csv"
cut -d, -f2,3 "$TMPDIR_CASE/r2"
