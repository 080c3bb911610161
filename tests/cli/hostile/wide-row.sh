# A row of 100,000 columns (a logger that lost its line ends), and a
# header of 100,000 columns before normal rows.  The stream tools ignore
# columns they do not know; cw-clean rejects a row whose width is not the
# header's as malformed.  The message listing the headers seen stays
# short.
# source: spec
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
{
	echo device,time,voltage_v,current_a,temp_c,soc_pct
	echo "A,1772323200,3.7,1,20,50"
	awk 'BEGIN { printf "A,1772323210,3.7,1,20,50"
		for (k = 6; k < 100000; k++) printf ",%d", k; printf "\n" }'
	echo "A,1772323220,3.8,-2,21,40"
} >wide.csv
awk 'BEGIN { printf "x0"; for (k = 1; k < 100000; k++) printf ",x%d", k
	printf "\n1"; for (k = 1; k < 100000; k++) printf ",%d", k
	printf "\n" }' >wide-header.csv
run_all -v wide.csv
run_all wide-header.csv
