# Usage errors exit 2 with a message and a hint; nothing is read.
# source: spec
for a in "--histogram 0" "--histogram -5" "--histogram abc" "--matrix 5,0" \
    "--matrix ,5" "--hysteresis -1" "--hysteresis 1x" "--residue none" \
    "--signal time" "--signal device" "--signal=" "--summary --histogram 5" \
    "--matrix 5 --histogram 5" "--bogus" "-x" "--hysteresis"; do
	echo "-- $a"
	cw-rainflow $a </dev/null
	echo "rc=$?"
done
