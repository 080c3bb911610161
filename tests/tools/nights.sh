# nights.sh, sourced by the state tests (killstate.sh, fullstate.sh):
# gen DAY H writes night DAY (of March 2026) of $n invented packs, H
# hourly rows each, a sample stream with SoC swings, charge and use.
gen() {
	awk -v day="$1" -v nh="$2" -v n="$n" 'BEGIN {
		print "device,time,voltage_v,current_a,temp_c,soc_pct"
		for (k = 0; k < n; k++)
			for (h = 0; h < nh; h++) {
				soc = 50 + 40 * sin(h * 0.9 + k + day)
				printf "PACK-%04d,2026-03-%02dT%02d:00:00Z," \
				    "%.3f,%.2f,%.1f,%.1f\n", k, day, h,
				    3.6 + soc / 200, h % 3 == 0 ? 2.5 : -1.5,
				    20 + k % 20, soc
			}
	}'
}
