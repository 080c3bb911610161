# The d.c. internal resistance test of IEC 61960: discharge at 0.2 C for
# 10 s, then at 1 C for 1 s; R = (U1 - U2) / (I2 - I1).  An invented
# ideal cell, 2.5 Ah, OCV 3.8 V, R = 0.038 ohm, logged once a second:
# I1 = 0.5 A (0.2 C), I2 = 2.5 A (1 C), so U1 = 3.8 - 0.5 * 0.038 =
# 3.781 V, U2 = 3.8 - 2.5 * 0.038 = 3.705 V and by the formula
# R = (3.781 - 3.705) / (2.5 - 0.5) = 0.076 / 2 = 0.038 ohm.
# The start of the 0.2 C period (0.5 A) is a step of exactly --min-step
# from rest, so it is found too: (3.781 - 3.8) / (-0.5 - 0) = 0.038.  The
# return to rest after the 1 s pulse is not steady before it (-v: 1
# unsteady).
# source: standard IEC 61960 (d.c. internal resistance: R = (U1 - U2) / (I2 -
#   I1)), values worked by hand below
f=$TMPDIR_CASE/iec.csv
echo device,time,voltage_v,current_a,temp_c,soc_pct >"$f"
t=0
while [ $t -lt 30 ]; do
	if [ $t -ge 10 ] && [ $t -lt 20 ]; then v=3.781 i=-0.5
	elif [ $t -eq 20 ]; then v=3.705 i=-2.5
	else v=3.800 i=0; fi
	echo "CELL-1,$t,$v,$i,25,50"
	t=$((t + 1))
done >>"$f"
cw-dcir -v "$f"
echo
# With --min-step above 0.5 A only the 1 C pulse is left.
cw-dcir --min-step 1 "$f" | cut -d, -f1,2,5-8
