# Impossible dates and times must be refused, never wrapped into a valid
# one: month 13, day 0, Feb 30, Feb 29 of a common year, Apr 31, hour 24,
# minute 60, second 61, a year without a day, garbage.  Feb 29 of a leap
# year and 9999-12-31 are valid.  A leap second (23:59:60) is read as the
# first instant of the next minute (ts.h), so a row stamped 00:00:00 right
# after it is a duplicate for cw-clean.
# source: standard ISO 8601 and the Gregorian calendar (month lengths, leap
#   years); the leap second rule is ts.h's
. tests/cli/hostile/common.inc
cd "$TMPDIR_CASE" || exit 1
{
	echo device,time,voltage_v,current_a,temp_c,soc_pct
	for d in 2026-13-01T00:00:00Z 2026-01-00T00:00:00Z \
	    2026-02-30T00:00:00Z 2025-02-29T00:00:00Z 2026-04-31T00:00:00Z \
	    2026-05-01T24:00:00Z 2026-05-01T10:60:00Z 2026-05-01T10:00:61Z \
	    2026-05T10:00:00Z 2026-05-01T10:00:00+25:00 yesterday \
	    2028-02-29T12:00:00Z 9999-12-31T23:59:59Z; do
		echo "A,$d,3.7,1,20,50"
	done
	echo "B,2016-12-31T23:59:59Z,3.7,1,20,50"
	echo "B,2016-12-31T23:59:60Z,3.7,1,20,50"
	echo "B,2017-01-01T00:00:00Z,3.7,1,20,50"
	echo "B,2017-01-01T00:00:01Z,3.7,1,20,50"
} >dates.csv
run_all -v dates.csv
cw-clean --rejects rej.csv dates.csv >clean.csv 2>/dev/null
cat clean.csv
echo "cw-clean rejects:"
cat rej.csv
