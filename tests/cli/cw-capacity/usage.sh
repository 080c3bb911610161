# Bad option values are usage errors (exit 2), never silently 0; so is
# --rejects to standard output (which holds the estimates).
# source: spec
for o in "--min-current 0" "--min-current x" "--min-swing 0" \
    "--min-swing 101" "--temp 45,10" "--temp 10" "--temp cold" \
    "--eol 0" "--eol 100" "--rated 0" "--rated -1" "--rated 14Ah" \
    "--max-gap 0" "--max-rest 0" "--max-rest 5x" "--jump -1" \
    "--confidence 1" "--max-points 3" "--min-estimates 1" \
    "--rejects -" "--bogus" "-x"; do
	# shellcheck disable=SC2086
	cw-capacity $o </dev/null
	echo "$o: rc=$?"
done
cw-capacity --rated </dev/null
echo "--rated without value: rc=$?"
