# Steps outside the SoC and temperature windows are rejected and counted
# (-v); a wider window takes them in.  One device, a 2 A discharge step
# with R = 0.05 ohm every 100 s (between steps 85 s of gap, so each
# return to rest is a 'gap'), at these (temp, SoC):
#   (25, 50) in   (25, 19.9) SoC low   (25, 80.1) SoC high
#   (9.9, 50) cold   (45.1, 50) hot   (10, 20) and (45, 80): on the edges,
#   in   (25, empty) SoC unknown   (empty, 50) temperature unknown
# So 3 accepted, 2 soc-outside, 2 temp-outside, 1 soc-unknown,
# 1 temp-unknown, and 8 gap: each return to rest comes 85 s after its
# step (more than --max-dt 15s), and the last step has none.
# source: hand
f=$TMPDIR_CASE/w.csv
echo device,time,voltage_v,current_a,temp_c,soc_pct >"$f"
t=0
for c in 25:50 25:19.9 25:80.1 9.9:50 45.1:50 10:20 45:80 25: :50; do
	tc=${c%%:*} soc=${c#*:}
	for k in 0 5 10; do echo "P,$((t + k)),3.700,-0.1,$tc,$soc"; done
	echo "P,$((t + 15)),3.605,-2.0,$tc,$soc"
	t=$((t + 100))
done >>"$f"
cw-dcir -v "$f" | cut -d, -f1-4,7
echo
# Wider windows, unknown SoC allowed: all but the unknown temperature.
cw-dcir -v --soc 0,100 --temp 0,50 --allow-no-soc "$f" | cut -d, -f1-4,7
