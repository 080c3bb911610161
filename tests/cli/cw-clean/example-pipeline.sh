# cw-clean(1) EXAMPLES: a night's gzipped logs, resampled to one row a
# minute, rejects kept aside, the result compressed.  The command is run
# as the manual writes it.  Two invented packs, one log each; EB-0043's
# log repeats a row (a duplicate) and holds a row out of range.
# By hand: EB-0042 charges 2 A from 00:00:20 to 00:02:20 in rows 20 s
# apart, so each full minute's mean current is 2 A and V rises 0.01 V a
# row (0.03 V a minute); the run is framed by 00:00:00 (the first row's
# values) and 00:03:00 (the last row's values, 20 s of 2 A over the
# minute: 0.667 A), and 00:01:00 carries 40 s of 2 A (1.333 A).
# source: hand
top=$(pwd)
cd "$TMPDIR_CASE" || exit 1
mkdir incoming
awk 'BEGIN { print "device,time,voltage_v,current_a,temp_c";
    for (k = 1; k <= 7; k++)
	printf "EB-0042,2026-03-01T00:%02d:%02dZ,%.2f,2,15\n",
	    int(k * 20 / 60), (k * 20) % 60, 3.80 + 0.01 * k }' |
    gzip >incoming/EB-0042.csv.gz
printf 'device,time,voltage_v,current_a,temp_c\nEB-0043,2026-03-01T00:00:00Z,3.70,-1,14\nEB-0043,2026-03-01T00:00:00Z,3.70,-1,14\nEB-0043,2026-03-01T00:00:30Z,37.0,-1,14\nEB-0043,2026-03-01T00:01:00Z,3.69,-1,14\nEB-0043,2026-03-01T00:02:00Z,3.68,-1,14\n' |
    gzip >incoming/EB-0043.csv.gz
cw-clean -v --step 1m --rejects rejects.csv incoming/*.csv.gz |
    gzip > clean.csv.gz
gzip -dc clean.csv.gz
cat rejects.csv
grep -q -F -- '--rejects rejects.csv incoming/*.csv.gz |' "$top/man/cw-clean.1" &&
    grep -q '^    gzip > clean.csv.gz$' "$top/man/cw-clean.1" &&
    echo "the command is the manual's"
