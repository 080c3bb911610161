# A voltage-only log (no soc_pct column): an invented 10-cell pack held at
# 42.0 V at the end of its charge relaxes at rest to 41.6 V over 40 min,
# the charger comes back (0.6 A, then 0.3 A for a minute each) and brings
# it to 42.0 V again; three times, then it is used and falls below 41.0 V.
# With --full-voltage 41.0, worked by hand: one hold from the first row
# at 41.0 V or more (41.5 V at 00:01) to the last (41.2 V at 02:13), three
# micro-cycles of depth 100 * (42.0 - 41.6) / 41.0 = 0.9756097561 % of the
# full voltage, each (0.6 + 0.3) A * 60 s = 0.015 Ah.
# source: hand
cd "$TMPDIR_CASE" || exit 1
f=v.csv
awk 'BEGIN {
	print "device,time,voltage_v,current_a"
	t = 1767225600
	printf "C3,%d,40.5,2.0\n", t
	t += 60; printf "C3,%d,41.5,2.0\n", t
	t += 60; printf "C3,%d,42.0,1.0\n", t
	for (c = 0; c < 3; c++) {
		t += 60; printf "C3,%d,42.0,0\n", t
		split("41.9 41.8 41.7 41.6", v, " ")
		for (k = 1; k <= 4; k++) { t += 600; printf "C3,%d,%s,0\n", t, v[k] }
		t += 60; printf "C3,%d,42.0,0.6\n", t
		t += 60; printf "C3,%d,42.0,0.3\n", t
	}
	t += 60; printf "C3,%d,42.0,0\n", t
	t += 60; printf "C3,%d,41.2,-3.0\n", t
	t += 60; printf "C3,%d,40.8,-3.0\n", t
}' >"$f"
cw-topoff --full-voltage 41.0 "$f"
cw-topoff --full-voltage 41.0 -e "$f"
cw-topoff --full-voltage 41.0 -s "$f"
# Without --full-voltage a log without soc_pct cannot be judged: exit 1.
cw-topoff "$f"
echo "rc=$?"
