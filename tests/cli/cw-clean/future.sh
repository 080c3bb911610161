# Impossible stamps (issue 25, item 2): one row of a pack stamped 2100 (a
# gauge clock reset) is rejected alone as "future"; the pack's later rows
# pass, and the next night's cw-wear --state still takes the pack's rows.
# On main before the fix the 2100 row passed, the pack's three later rows
# were rejected out-of-order, and night 2 skipped every row of the pack.
# source: hand: each row's fate follows from the rules in the comments
# below (--max-jump 7 d past the device's newest accepted time, unless
# the device's next row is within 7 d of it; --max-time a fixed bound).
cd "$TMPDIR_CASE" || exit 1
t0=1772323200	# 2026-03-01T00:00:00Z
{
	echo device,time,voltage_v,current_a,soc_pct
	# EB-1: 4 rows a minute apart, one at 2100, 3 more in line.
	for k in 0 1 2 3; do echo "EB-1,$((t0 + 60 * k)),3.8,1,$((50 + k))"; done
	echo "EB-1,4102444800,3.8,1,54"
	for k in 5 6 7; do echo "EB-1,$((t0 + 60 * k)),3.8,1,$((50 + k))"; done
	# EB-3: a real gap of 10 d, confirmed by the row after it: kept.
	echo "EB-3,$t0,3.8,1,50"
	echo "EB-3,$((t0 + 10 * 86400)),3.8,1,60"
	echo "EB-3,$((t0 + 10 * 86400 + 60)),3.8,1,61"
	# EB-9: its first row at 2100, then rows in line: only the first goes.
	echo "EB-9,4102444800,3.8,1,54"
	echo "EB-9,$t0,3.8,1,50"
	echo "EB-9,$((t0 + 60)),3.8,1,51"
	# EB-4: a lone row 30 d past the newest of the run (10 d + 60 s):
	# nothing confirms it, so it is future too.
	echo "EB-4,$((t0 + 30 * 86400)),3.8,1,61"
} >day1.csv
echo '== default: 3 rows future (EB-1 2100, EB-9 2100, EB-4 lone), 12 kept'
cw-clean -v --rejects rej.csv day1.csv | cut -d, -f1,2
cat rej.csv
echo '== --max-jump 0: only --max-time bounds; 2100 passes, EB-1 5..7 late'
cw-clean --max-jump 0 --max-reject 1 --rejects rej.csv day1.csv | cut -d, -f1,2
cat rej.csv
echo '== --max-time 2026-03-05: also rejects the EB-3 rows of 03-11 as future'
cw-clean --max-time 2026-03-05T00:00:00Z --rejects rej.csv day1.csv |
    cut -d, -f1,2
cat rej.csv
echo '== --now: the run'"'"'s clock bounds it (2100 is after it)'
cw-clean --now --max-jump 0 --rejects rej.csv day1.csv >/dev/null
cut -d, -f3 rej.csv | sort | uniq -c
echo '== night 2 of EB-1 is not skipped by cw-wear --state'
awk -v t0=$t0 'BEGIN { print "device,time,voltage_v,current_a,soc_pct"
	for (k = 0; k < 4; k++)
		printf "EB-1,%d,3.8,1,%d\n", t0 + 86400 + 60 * k, 60 + k }' \
    >day2.csv
cw-clean day1.csv 2>/dev/null | cw-wear --state s >/dev/null 2>&1
cw-clean day2.csv 2>/dev/null | cw-wear --state s | cut -d, -f1-4
echo "rc $?"
cw-clean --max-time soon day1.csv
echo "rc $?"
