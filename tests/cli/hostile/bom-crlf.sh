# A UTF-8 byte order mark and CRLF line ends, as spreadsheet exports
# write them, plain and gzipped: every tool gives the same output as for
# the plain file (cw-clean: --cells 10, the packs of that fleet).
# source: spec (every tool's output equals that of the plain file; no number
#   to derive)
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
src="$top/testdata/rainflow-fleet.csv"
{ printf '\357\273\277'; sed 's/$/\r/' "$src"; } >bom.csv
gzip -c bom.csv >bom.csv.gz
for t in $TOOLS; do
	args=
	[ "$t" = cw-clean ] && args="--cells 10"
	"$t" $args "$src" >plain.out 2>plain.err
	r1=$?
	"$t" $args bom.csv >bom.out 2>bom.err
	r2=$?
	"$t" $args bom.csv.gz >gz.out 2>gz.err
	r3=$?
	if cmp -s plain.out bom.out && cmp -s plain.out gz.out &&
	    cmp -s plain.err bom.err; then same=yes; else same=NO; fi
	echo "$t: exit $r1 $r2 $r3, $(wc -l <plain.out | tr -d ' ') lines, same output: $same"
done
