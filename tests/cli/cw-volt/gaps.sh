# Gaps and rows that cannot be judged.  One cell at rest (0 A), 60 s rows
# at 2.40 V (under) from 0 to 180 s, then 20 minutes without rows (over
# --max-gap 15m), then 2.40 V again from 1380 to 1500 s.  The first event
# is 0..180 s (the first row at its own time); the gap ends it, and the
# row after it starts the next at its own time: 1380..1500 s.  With
# --max-gap 30m the gap is bridged: one event 0..1500 s.
# Then a row without voltage at 1560 s: it ends the event (1500 s), is
# counted as unjudged, and the event after it starts at that row's time
# (the interval before the next row): 1560..1680 s.
# source: hand
f=$TMPDIR_CASE/g.csv
cat >"$f" <<'ROWS'
device,time,voltage_v,current_a,soc_pct
G,0,2.40,0,0
G,60,2.40,0,0
G,120,2.40,0,0
G,180,2.40,0,0
G,1380,2.40,0,0
G,1440,2.40,0,0
G,1500,2.40,0,0
G,1560,,0,0
G,1620,2.40,0,0
G,1680,2.40,0,0
ROWS
cw-volt "$f"; echo "rc=$?"
cw-volt --max-gap 30m "$f"; echo "rc=$?"
cw-volt -s "$f"; echo "rc=$?"
