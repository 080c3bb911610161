# Constructed streams, checked by hand (a row's current stands for the
# interval ending at it, so an event starts at the row before its first
# row beyond a limit and ends at its last row; 1 Ah = 1 A for 3600 s).
# source: hand
f=$TMPDIR_CASE/a.csv
# P1, one cell, 10 s rows: 4.20, 4.24, 4.24, 4.26 at 30 s (over), 4.31,
# 4.27, 4.235 at 60 s (inside by less than the 0.02 V hysteresis: still
# in), 4.22 (out).  Charging 2 A throughout.  The event: start 20 s (the
# row before 4.26), end 60 s (4.235), 40 s, 4.235..4.31 V,
# 2 A * 40 s = 0.0222222 Ah, SoC 92 (the row at 20 s) to 96.
# P2, one cell, use at -5 A: 2.60, 2.55, 2.49 (under) at 20 s, 2.40,
# 2.45 at 40 s, then -5 A -> +1 A (regenerative braking) at 2.47 V (50 s,
# still under), 2.52 at 60 s (exit, >= 2.50 + 0.02).  The change of kind
# lasts 10 s (40..50 s), less than the 30 s minimum, so it stays in the
# use event: 10..50 s, 40 s, 2.40..2.49 V, -5 A * 30 s + 1 A * 10 s =
# -0.0388889 Ah.  With --min-duration 10s it lasts the minimum and splits
# the event: use 10..40 s (-5 A * 30 s = -0.0416667 Ah), charge 40..50 s
# (1 A * 10 s = 0.0027778 Ah, 2.47..2.47 V).
cat >"$f" <<'ROWS'
device,time,voltage_v,current_a,soc_pct
P1,0,4.20,2,90
P1,10,4.24,2,91
P1,20,4.24,2,92
P1,30,4.26,2,93
P1,40,4.31,2,94
P1,50,4.27,2,95
P1,60,4.235,2,96
P1,70,4.22,2,97
P2,0,2.60,-5,5
P2,10,2.55,-5,4
P2,20,2.49,-5,3
P2,30,2.40,-5,2
P2,40,2.45,-5,1
P2,50,2.47,1,1
P2,60,2.52,1,1
ROWS
cw-volt "$f"; echo "rc=$?"
cw-volt --min-duration 10s "$f"; echo "rc=$?"
# The same streams as 12-cell packs (every voltage times 12) with
# --cells 12: the per-cell division gives the same events, cells 12.
awk -F, 'BEGIN { OFS = "," } NR > 1 { $3 = sprintf("%.3f", $3 * 12) } 1' \
    "$f" >"$TMPDIR_CASE/b.csv"
cw-volt --cells 12 "$TMPDIR_CASE/b.csv" | sed 's/,12$/,1/' >"$TMPDIR_CASE/b.out"
cw-volt "$f" | cmp - "$TMPDIR_CASE/b.out" && echo "12 cells: same events"
# Without --cells the 12-cell pack is 29..52 V a cell: all over, from the
# first row (at its own time): P1 charge 0..70 s, 2 A * 70 s =
# 0.0388889 Ah; P2 use 0..60 s, the 20 s of charge (40..60 s, under the
# 30 s minimum) included: -5 A * 40 s + 1 A * 20 s = -0.05 Ah.
cw-volt "$TMPDIR_CASE/b.csv"; echo "rc=$?"
# Limits that leave no event: the highest reading is 4.31 and the lowest
# 2.40, and a voltage exactly at a limit is inside.
cw-volt --max 4.31 --min 2.40 "$f"; echo "rc=$?"
