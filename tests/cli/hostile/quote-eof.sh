# A quote opened and never closed before the end of the file (a log cut
# in the middle of a quoted field), after good rows; and a stray quote in
# the middle of a field.  The good rows are used; the broken record is
# reported with the line it starts on and counted (cw-clean: rejected as
# malformed, its text kept in the rejects file).
# source: spec
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
{
	echo device,time,voltage_v,current_a,temp_c,soc_pct
	echo 'A,1772323200,3.7,1,20,50'
	echo 'A,1772323210,3.7,1,20,5"0'
	echo 'A,1772323220,3.8,-2,21,40'
	printf '"A,1772323230,3.8,-2,21,40\nA,1772323240,3.8,-2,21,40\n'
} >quote.csv
run_all -v quote.csv
cw-clean --rejects rej.csv quote.csv >/dev/null 2>&1
echo "cw-clean rejects:"
cat rej.csv
