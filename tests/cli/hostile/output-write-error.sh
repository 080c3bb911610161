# Write errors exit 1 with a message and never leave a partial file:
# standard output on /dev/full, -o /dev/full (a device is written in
# place), and -o FILE on a file system that refuses to grow the file
# (ulimit -f, with SIGXFSZ ignored so that write(2) fails with EFBIG):
# the old FILE is kept and the temporary removed.
# The ulimit would make valgrind itself fail to write, so:
# cli: no-valgrind
# source: spec
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
# Forty renamed copies of the invented fleets: every tool writes well
# over the limit.
for c in $(seq 10 49); do
	for f in wear-fleet dcir-fleet thermal-fleet topoff-dock; do
		sed -e 1d -e "s/^/C$c-$f-/" "$top/testdata/$f.csv"
	done
done | sed '1i device,time,voltage_v,current_a,temp_c,soc_pct' >big.csv
for t in $TOOLS; do
	args=
	[ "$t" = cw-clean ] && args="--bounds voltage=1:100"
	echo "== $t" >&2
	printf '%s writes %s\n' "$t" "$("$t" $args big.csv | wc -c |
	    awk '{ print ($1 > 16384) ? "more than 16 KiB" : $1 " bytes" }')"
	echo "== $t >/dev/full" >&2
	"$t" $args big.csv >/dev/full
	echo "$t >/dev/full: exit $?"
	echo "== $t -o /dev/full" >&2
	"$t" $args -o /dev/full big.csv
	echo "$t -o /dev/full: exit $?"
	echo "the result of an earlier good run" >res.csv
	echo "== $t -o res.csv, file size limit 8 KiB" >&2
	( trap '' XFSZ; ulimit -f 16; exec "$t" $args -o res.csv big.csv )
	rc=$?
	echo "$t -o res.csv (limit): exit $rc, old file kept:" \
	    "$(echo "the result of an earlier good run" | cmp -s - res.csv &&
	    echo yes || echo NO), temporaries left:" \
	    "$(ls -a | grep -c '^\.res\.csv\.tmp')"
done
