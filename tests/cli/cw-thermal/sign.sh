# Sign convention (SPEC.md): current_a is positive while charging.
# +1 A at 5 C is a charge event; -1 A at 5 C is discharge inside the use
# window, nothing; -1 A at -25 C is a use event with negative charge;
# +1 A at -25 C is a below-min charge event.  Each 2 intervals of 60 s:
# 120 As = 0.03333333333 Ah.
# source: hand
f=$TMPDIR_CASE/s.csv
echo device,time,current_a,temp_c >"$f"
for d in "P5 1 5" "N5 -1 5" "N-25 -1 -25" "P-25 1 -25"; do
	set -- $d
	for s in 0 60 120; do echo "$1,$s,$2,$3"; done
done >>"$f"
cw-thermal "$f"
cw-thermal -s "$f" | cut -d, -f1,4,5,6,12,17
