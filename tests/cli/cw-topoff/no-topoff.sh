# No micro-cycles where no charger tops anything off (invented packs, a
# row every 60 s, 1 %/row at the currents shown on a notional 1 Ah scale):
#   U1 charged 80 -> 100, the charger stops, unplugged and used at once;
#   U2 the same, pulled off the charger before it stopped;
#   D1 ordinary deep cycling, three times 20 -> 100 -> 20 %, the use with
#      a regenerative pulse (+1 %) after every fourth row (-1 % each):
#      in the band 100 -> 96 -> 97, back a quarter of the drop, not half.
# Worked by hand: U1, U2 one hold each, from 95 % (00:15) to the last row
# at 95 or more (U1 00:23, U2 00:22); D1 three, from 95 % to 95 % again
# (100, 99, 98, 97, 96, 97, 96, 95); no micro-cycle.  topoff_ah is 0 for
# U1 and U2; for D1 it holds the one regenerative pulse in each hold,
# 0.6 A * 60 s = 0.01 Ah (charge after a rest counts, as documented).
# source: hand
f=$TMPDIR_CASE/n.csv
awk 'BEGIN {
	print "device,time,current_a,soc_pct"
	t = 1767225600; s = 80
	printf "U1,%d,0,%d\nU2,%d,0,%d\n", t, s, t, s
	for (k = 0; k < 20; k++) { t += 60; s++; printf "U1,%d,0.6,%d\nU2,%d,0.6,%d\n", t, s, t, s }
	t += 60; printf "U1,%d,0,%d\nU2,%d,-1.2,%d\n", t, s, t, s - 2
	for (k = 1; k <= 20; k++) { t += 60; printf "U1,%d,-1.2,%d\nU2,%d,-1.2,%d\n", t, s - 2 * k, t, s - 2 - 2 * k }
	t = 1767225600; s = 20
	printf "D1,%d,0,%d\n", t, s
	for (c = 0; c < 3; c++) {
		while (s < 100) { t += 60; s++; printf "D1,%d,0.6,%d\n", t, s }
		k = 0
		while (s > 20) {
			t += 60
			if (++k % 5 == 0) { s += 1; printf "D1,%d,0.6,%d\n", t, s }
			else { s -= 1; printf "D1,%d,-0.6,%d\n", t, s }
		}
	}
}' | sort -t, -k2,2n -s >"$f"
cw-topoff "$f"
cw-topoff -e "$f"
