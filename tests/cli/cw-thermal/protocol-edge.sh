# The protocol's limits are inclusive, exactly at their decimal values:
# with --capacity 10 --cells 10 and the defaults, the cool-zone limit is
# 0.5 C * 10 Ah * (1 + 5 %) = 5.25 A and the warm-zone limit 4.10 + 0.02
# = 4.12 V per cell.  A charge at 5.25 A at 5 C and one at 41.2 V (4.12 V
# per cell) at 50 C are within; 5.26 A and 41.21 V (4.121 V) are over.
# In binary floating point 41.2 / 10 > 4.10 + 0.02, which judged the first
# over-voltage once (a reviewer's find).
# source: hand: the limits above, from cw-thermal(1)'s rules
cd "$TMPDIR_CASE" || exit 2
for row in "C1 5 41.0 5.25" "C2 5 41.0 5.26" "W1 50 41.2 1" "W2 50 41.21 1"
do
	set -- $row
	for m in 0 1 2 3 4 5; do
		echo "$1,2026-03-01T08:0$m:00Z,$3,$4,$2"
	done
done | { echo device,time,voltage_v,current_a,temp_c; cat; } >log.csv
cw-thermal --capacity 10 --cells 10 log.csv | cut -d, -f1,3,12-14
