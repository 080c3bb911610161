# Hysteresis both ways (default 0.5 C).  Cold side: 9.9, 10.3, 9.8, 10.4
# stay one event, 10.5 (= T2 + 0.5) ends it.  Hot side: 45.1, 44.6, 45.2
# stay one event, 44.5 (= T3 - 0.5) ends it; then 44.9 is inside the
# window and starts nothing.  --merge 0 so that only hysteresis joins.
# source: hand
f=$TMPDIR_CASE/h.csv
echo device,time,current_a,temp_c >"$f"
s=0
for t in 12 9.9 10.3 9.8 10.4 10.5 12 12 12 12; do
	echo "COLD,$s,2,$t"; s=$((s + 60))
done >>"$f"
s=0
for t in 40 45.1 44.6 45.2 44.5 44.9 40; do
	echo "HOT,$s,2,$t"; s=$((s + 60))
done >>"$f"
echo "default:"
cw-thermal --merge 0 "$f" | cut -d, -f1-8
echo "--hysteresis 0 (each dip back inside splits; 60 s runs survive):"
cw-thermal --merge 0 --hysteresis 0 "$f" | cut -d, -f1-8
echo "--hysteresis 0.9F is 0.5 C (a difference: 0.9 * 5 / 9):"
cw-thermal --merge 0 --hysteresis 0.9F "$f" >"$TMPDIR_CASE/f.csv"
cw-thermal --merge 0 "$f" | cmp - "$TMPDIR_CASE/f.csv" && echo same
