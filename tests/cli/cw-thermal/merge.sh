# --merge and --min-duration.  Two cold runs (0..120 s and 300..420 s,
# 1 A at 5 C) with normal rows between; a 30 s cold blip at 1000 s.
# Default --merge 2m: the runs are 180 s apart, so two events; the blip
# is shorter than --min-duration 60s and dropped.  --merge 3m joins them
# into one spanning 0..420 s with the charge between (7 intervals of
# 60 s = 420 As).  --min-duration 0 keeps the blip.  -v counts both.
# source: hand
f=$TMPDIR_CASE/m.csv
echo device,time,current_a,temp_c >"$f"
for r in 0:5 60:5 120:5 180:20 240:20 300:20 360:5 420:5 480:20 \
    970:20 1000:5 1030:20; do
	echo "M,${r%%:*},1,${r##*:}"
done >>"$f"
echo "default:"
cw-thermal -v "$f" | cut -d, -f1,4-9
echo "--merge 3m:"
cw-thermal -v --merge 3m "$f" | cut -d, -f1,4-9
echo "--min-duration 0:"
cw-thermal --min-duration 0 "$f" | cut -d, -f1,4-9
