# A device name holding a comma, quoted as RFC 4180 has it, is one device
# across the inputs (cw-thermal's, cw-wear's and cw-topoff's rows of
# "Dock 3, bay 2" meet), keeps its site from the fleet file, is written
# quoted in --csv, and is matched by --since.  Its reason: 4 cool events
# over the protocol's current (testdata/report, see ranking.sh); its
# modelled life, 1200 days, is no reason; its 12 top-off micro-cycles a
# day are shown.  A quote inside a name ("bay ""B""") is doubled.
# source: hand
d=$PWD/testdata/report
cd "$TMPDIR_CASE" || exit 1
grep -h '^"Dock 3' "$d/thermal.csv" "$d/wear.csv" "$d/topoff.csv" | wc -l
cw-report --fleet "$d-fleet.csv" "$d/thermal.csv" "$d/wear.csv" \
    "$d/topoff.csv" | sed -n '/Dock/,/^$/p'
cw-report --fleet "$d-fleet.csv" --csv -o last.csv "$d/thermal.csv"
grep Dock last.csv
cw-report --fleet "$d-fleet.csv" --since last.csv --csv "$d/thermal.csv" |
    grep Dock
sed 's/"Dock 3, bay 2"/"bay ""B"", 3"/' "$d/thermal.csv" >q.csv
cw-report --csv q.csv | grep bay
