# A missing input file is exit 1, with the file named; a missing --since
# or --fleet file too.  A missing kind of input only leaves its reasons
# out: with cw-wear's output alone, only the short-life reasons of
# testdata/report are left (EB-17, 200 days, then EB-10, 300 days; see
# ranking.sh), and with cw-thermal's alone only the charging ones (EB-10
# below-min, then the pack of dock 3 over the cool current).  Nothing but
# cw-dcir's: only EB-16's resistance.
# source: hand
cd testdata/report || exit 1
cw-report wear.csv none.csv
echo "exit $?"
cw-report --since none.csv wear.csv
echo "exit $?"
cw-report --fleet none.csv wear.csv
echo "exit $?"
cw-report --csv wear.csv
echo "exit $?"
cw-report --csv thermal.csv
echo "exit $?"
cw-report --csv <dcir.csv
echo "exit $?"
# Gzip is told by its first bytes, not the name (cellwear(7)): cw-wear's output
# gzipped under a plain name gives the same two short-life rows.
gzip -c wear.csv >"$TMPDIR_CASE/wear.csv"
cw-report --csv "$TMPDIR_CASE/wear.csv" | cut -d, -f1,2,4
