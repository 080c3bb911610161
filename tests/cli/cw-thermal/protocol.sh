# The charge protocol of the JEITA scheme on constructed streams of a
# 14 Ah, 10-cell pack (the protocol's values 0.5 C and 4.10 V per cell
# are from memory of the guideline; the margins, 5 % and 0.02 V, are
# cw-thermal's).  Each device: a row at 20 C without current, then ten
# rows 60 s apart charging at current I, temperature T and pack voltage
# V, then a row at 20 C without current: one charge event of 600 s.
# Derivations: the cool limit is 0.5 * 14 A * 1.05 = 7.35 A; the warm
# limit 4.10 + 0.02 = 4.12 V per cell, 41.2 V for the pack.
#   COOL03  5 C, 4.2 A (0.3 C)          within
#   COOL1   5 C, 14 A (1 C)             over-current
#   COOLLO  5 C, 7.34 A (below 7.35)    within
#   COOLHI  5 C, 7.36 A (above 7.35)    over-current
#   WARM415 50 C, 41.5 V (4.15 V/cell)  over-voltage
#   WARM410 50 C, 41.0 V (4.10 V/cell)  within
#   WARM411 50 C, 41.1 V (4.11 V/cell)  within
#   WARM413 50 C, 41.3 V (4.13 V/cell)  over-voltage
#   COLD    -5 C, 0.2 A                 no-charge-allowed
#   HOT     65 C, 0.2 A, 40.0 V         no-charge-allowed
# A warm pack at 4.15 V per cell charged at 14 A in the warm zone is
# judged by the voltage only (the scheme reduces the voltage there).
# BAND: 5 rows at 50 C and 41.0 V, then 5 at 44.8 C (back inside the
# window by less than the 0.5 C hysteresis, so still in the event) at
# 42.0 V and 14 A: normal-zone rows, where 4.20 V and 1 C are allowed,
# so they count for neither maximum: 2 A, 4.10 V, within.
# source: hand
f=$TMPDIR_CASE/p.csv
echo device,time,voltage_v,current_a,temp_c >"$f"
row() {	# device I T V
	echo "$1,0,$4,0,20"
	k=1; while [ $k -le 10 ]; do
		echo "$1,$((k * 60)),$4,$2,$3"; k=$((k + 1))
	done
	echo "$1,660,$4,0,20"
}
{
	row COOL03 4.2 5 39.0
	row COOL1 14 5 39.0
	row COOLLO 7.34 5 39.0
	row COOLHI 7.36 5 39.0
	row WARM415 14 50 41.5
	row WARM410 2 50 41.0
	row WARM411 2 50 41.1
	row WARM413 2 50 41.3
	row COLD 0.2 -5 38.0
	row HOT 0.2 65 40.0
	echo "BAND,0,41.0,0,20"
	k=1; while [ $k -le 5 ]; do
		echo "BAND,$((k * 60)),41.0,2,50"; k=$((k + 1))
	done
	while [ $k -le 10 ]; do
		echo "BAND,$((k * 60)),42.0,14,44.8"; k=$((k + 1))
	done
	echo "BAND,660,42.0,0,20"
} >>"$f"
cw-thermal --capacity 14 --cells 10 "$f" | cut -d, -f1,3,12-
# Without --capacity the cool events are unknown, without --cells the
# warm ones (v_cell_max empty); below-min and above-max need neither.
cw-thermal "$f" | cut -d, -f1,3,12-
# The fleet file gives COOL1 a 40 Ah capacity (14 A is 0.35 C: within)
# and WARM410 5 cells (41.0 V is 8.2 V a cell: over-voltage); the others
# get the options' values.
printf 'device,capacity_ah,cells\nCOOL1,40,\nWARM410,,5\n' >"$TMPDIR_CASE/reg.csv"
cw-thermal --capacity 14 --cells 10 --fleet "$TMPDIR_CASE/reg.csv" "$f" |
    cut -d, -f1,3,12-
# --cool-rate 1 and --warm-voltage 4.20 (a cell whose data sheet allows
# them): COOL1 at exactly 1 C is within, WARM415 within.
cw-thermal --capacity 14 --cells 10 --cool-rate 1 --warm-voltage 4.2 "$f" |
    cut -d, -f1,3,12- | grep -e COOL1 -e WARM415
# No margins: COOLLO (7.34 A > 7 A) over-current, WARM411 over-voltage.
cw-thermal --capacity 14 --cells 10 --cool-margin 0 --warm-margin 0 "$f" |
    cut -d, -f1,3,12- | grep -e COOLLO -e WARM411
# The summary: 11 charge events, 5 within, 2 over-current, 2
# over-voltage, 2 no-charge-allowed, 0 unknown (the last five columns).
cw-thermal -s --capacity 14 --cells 10 "$f" |
    awk -F, '{ for (i = NF - 4; i <= NF; i++) { s[i] += $i } }
        NR == 1 { print $12 "," $(NF-4) "," $(NF-3) "," $(NF-2) "," \
            $(NF-1) "," $NF }
        END { print "all", s[NF-4] - 0, s[NF-3], s[NF-2], s[NF-1], s[NF] }'
