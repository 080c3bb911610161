# 50F is 10C and 113F is 45C (C = (F - 32) * 5 / 9, the definition of the
# Fahrenheit scale).  The window 50..113 F is the common rule of thumb
# that cells be charged only between 10 and 45 C (common practice, no
# source).  Readings exactly at 10 and 45 C are inside with limits in
# either unit; 9.9 and 45.1 are outside in both.  Kelvin too:
# 283.15K = 10C, 318.15K = 45C (K = C + 273.15, SI).
# source: hand
f=$TMPDIR_CASE/f.csv
echo device,time,current_a,temp_c >"$f"
for t in 10 45 9.9 45.1; do
	for s in 0 60 120; do echo "D$t,$s,1,$t"; done
done >>"$f"
cw-thermal --limits 32F,50F,113F,140F "$f"
cw-thermal --limits 0,10,45,60 "$f" >"$TMPDIR_CASE/c.csv"
cw-thermal --limits 32F,50F,113F,140F "$f" | cmp - "$TMPDIR_CASE/c.csv" &&
    echo F same as C
cw-thermal --limits 273.15K,283.15K,318.15K,333.15K "$f" |
    cmp - "$TMPDIR_CASE/c.csv" && echo K same as C
cw-thermal --limits 0C,50F,318.15K,60 "$f" | cmp - "$TMPDIR_CASE/c.csv" &&
    echo mixed units same as C
# 26.6F is exactly -3C ((26.6 - 32) * 5 / 9 = -5.4 * 5 / 9), but in
# binary floating point the conversion gives -2.999999999999999; the
# limit is rounded to 1e-9 C, so a reading of -3 is at T1 (cool), not
# below it.
for s in 0 60 120; do echo "M3,$s,1,-3"; done >"$TMPDIR_CASE/m3.csv"
sed -i '1i device,time,current_a,temp_c' "$TMPDIR_CASE/m3.csv"
cw-thermal -s --limits 26.6F,10,45,60 "$TMPDIR_CASE/m3.csv" | cut -d, -f1,5,6
