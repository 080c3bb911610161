# An interval longer than --max-gap (default 15m) ends an event and
# carries no charge.  Rows at 0, 60, 120 s, then after 16 min at 1080,
# 1140, 1200 s, all charging 1 A at 5 C: two events of 120 s, 120 As
# each.  With --max-gap 20m the 960 s interval counts: one event of
# 1200 s, 1200 As = 0.3333 Ah.  EDGE: a 15 min interval (not longer)
# does not end an event: 0..960 s, 900 + 60 As = 0.2667 Ah.  With
# --max-gap 10m it does: 0..0 (zero length, dropped by --min-duration)
# and 900..960 s, and --merge 1h does not join across the gap.
# source: hand
f=$TMPDIR_CASE/g.csv
echo device,time,current_a,temp_c >"$f"
for s in 0 60 120 1080 1140 1200; do echo "GAP,$s,1,5"; done >>"$f"
for s in 0 900 960; do echo "EDGE,$s,1,5"; done >>"$f"
echo "default:"
cw-thermal "$f" | cut -d, -f1,4-6,9
echo "--max-gap 20m:"
cw-thermal --max-gap 20m "$f" | cut -d, -f1,4-6,9
echo "--max-gap 10m --merge 1h (merging does not bridge a gap):"
cw-thermal --max-gap 10m --merge 1h "$f" | cut -d, -f1,4-6,9
