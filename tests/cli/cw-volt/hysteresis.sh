# Noise at the limit.  One cell, charging 1 A, 10 s rows, alternating
# 4.251 (over) and 4.249 (inside by 0.001 V) for 2 minutes, then 4.20.
# With the default hysteresis (0.02 V) this is one event, 0..120 s (the
# first row at its own time): 1 A * 120 s = 0.0333333 Ah.  With
# --hysteresis 0 each 4.251 row is an event of its own, 10 s long (the
# interval before it), but for the first row of the device, which stands
# for its own instant (0 s): with --min-duration 10s six are kept (the
# rows at 20, 40, ..., 120 s), with the default 30 s none.
# source: hand
f=$TMPDIR_CASE/n.csv
echo device,time,voltage_v,current_a >"$f"
s=0; while [ $s -le 12 ]; do
	if [ $((s % 2)) -eq 0 ]; then v=4.251; else v=4.249; fi
	echo "N,$((s * 10)),$v,1"; s=$((s + 1))
done >>"$f"
echo N,130,4.20,1 >>"$f"
cw-volt "$f"; echo "rc=$?"
cw-volt --hysteresis 0 --min-duration 10s "$f"; echo "rc=$?"
cw-volt --hysteresis 0 "$f"; echo "rc=$?"
