# Usage errors exit 2 with a message; bad numbers are never taken as 0.
# source: spec
for a in "--cycle-life abc" "--cycle-life 0" "--calendar-life -5" \
    "--capacity 2Ah" "--model nosuch" "--residue none" "--limits 0,10,45" \
    "--limits 10,0,45,60" "--max-gap 5x" "--hysteresis -1" "--bogus" "-x" \
    "--cycle-life"; do
	cw-wear $a </dev/null
	echo "rc $?"
done
