# A field of 1 MiB: a device name, a number of a million digits, and a
# quoted field holding line ends.  Nothing may be cut silently: a row is
# used whole or skipped and counted.  The output is summarised (line
# counts and the widest line), not shown.  A million-digit number takes
# minutes under memcheck (ASan covers this case in SANITIZE=1):
# cli: no-valgrind
# source: spec
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
big=$(awk 'BEGIN { while (n++ < 1048576) printf "7" }')
{
	echo device,time,voltage_v,current_a,temp_c,soc_pct
	echo "A,1772323200,3.7,1,20,50"
	echo "$big,1772323210,3.7,1,20,50"
	echo "A,1772323220,$big,1,20,50"
	printf 'A,1772323230,3.7,1,20,"%s\n%s"\n' "$big" "$big"
	echo "A,1772323240,3.8,-2,21,40"
} >big.csv
echo "input: $(wc -c <big.csv | tr -d ' ') bytes"
for t in $TOOLS; do
	run_one "$t" -v big.csv
	echo "$t: widest output line $(awk '{ if (length > n) n = length }
	    END { print n + 0 }' out.csv) bytes"
done
