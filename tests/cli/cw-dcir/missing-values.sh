# Missing voltage or current around a step gives no estimate, and -v
# counts it.  Four devices, each rest (3 rows, 10 s apart) then a 2 A
# discharge step with R = 0.05 ohm:
#   V-POST  voltage empty after the step        -> no-voltage
#   V-PRE   voltage empty just before it        -> no-voltage
#   I-POST  current empty after it: no step can be seen; that pair and
#           the next (empty, then -2 A) are untestable -> 2 pairs
#   GOOD    complete                            -> accepted, 0.05
# The rows stay in the stream (sampin counts the empty values).
# source: hand
{
echo device,time,voltage_v,current_a,temp_c,soc_pct
for d in V-POST V-PRE I-POST GOOD; do
	echo "$d,0,3.700,0,25,50"
	echo "$d,10,3.700,0,25,50"
	case $d in
	V-PRE) echo "$d,20,,0,25,50" ;;
	*) echo "$d,20,3.700,0,25,50" ;;
	esac
	case $d in
	V-POST) echo "$d,30,,-2,25,50" ;;
	I-POST) echo "$d,30,3.600,,25,50"; echo "$d,40,3.600,-2,25,50" ;;
	*) echo "$d,30,3.600,-2,25,50" ;;
	esac
done
} >"$TMPDIR_CASE/m.csv"
cw-dcir -v "$TMPDIR_CASE/m.csv"
