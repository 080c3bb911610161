# 100,000 distinct devices, two rows each, interleaved: memory grows with
# devices (SPEC.md), every device gets its row, per-device rows come in
# name order.  Line counts and order only.  Too slow for memcheck (ASan
# covers it in make check SANITIZE=1):
# cli: no-valgrind
# source: spec
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
awk 'BEGIN { print "device,time,voltage_v,current_a,temp_c,soc_pct"
	for (r = 0; r < 2; r++)
		for (k = 0; k < 100000; k++)
			printf "P%06d,%d,%.2f,%d,%d,%d\n", (k * 7919) % 100000,
			    1772323200 + 60 * r, 3.6 + r / 10, 2 - 4 * r,
			    5 + k % 50, 50 + 30 * r }' >many.csv
run_one cw-clean many.csv
echo "cw-clean devices: $(sed 1d out.csv | cut -d, -f1 | sort -u | wc -l | tr -d ' ')"
for t in "cw-rainflow --summary" cw-thermal cw-topoff "cw-dcir --trend" \
    cw-wear; do
	run_one $t many.csv
	echo "${t%% *}: $(sed 1d out.csv | cut -d, -f1 | sort -u | wc -l | tr -d ' ') devices," \
	    "in name order: $(sed 1d out.csv | cut -d, -f1 | sort -c && echo yes)"
done
