# Bad option values are usage errors (exit 2), never silently 0.
# source: spec
for o in "--min-step 0" "--min-step x" "--soc 80,20" "--soc 10" \
    "--soc -1,50" "--temp 45,10" "--eol 100" "--ea -1" "--ea 30kJ" \
    "--max-dt 0" "--steady 0" "--steady 33" "--confidence 1" \
    "--max-points 3" "--min-steps 1" "--ref-temp -300" "--bogus" "-x"; do
	# shellcheck disable=SC2086
	cw-dcir $o </dev/null
	echo "$o: rc=$?"
done
cw-dcir --ea </dev/null
echo "--ea without value: rc=$?"
