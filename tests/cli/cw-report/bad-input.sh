# Bad input and usage (cellwear(7) exit codes: 1 data error, 2 usage error):
# a value that is not a number or a time names FILE:LINE and the column;
# a device twice in one kind of output; a row without a device; unknown
# options and bad values.
# source: spec
cp -R testdata/report "$TMPDIR_CASE/d" || exit 1
cd "$TMPDIR_CASE" || exit 1
d=d
sed '3s/,700,cycling,/,seven,cycling,/' "$d/wear.csv" >num.csv
cw-report num.csv; echo "exit $?"
sed '3s/2026-03-01T00:00:00Z/yesterday/' "$d/wear.csv" >time.csv
cw-report time.csv; echo "exit $?"
cat "$d/dcir.csv" >twice.csv
tail -n 1 "$d/dcir.csv" >>twice.csv
cw-report twice.csv; echo "exit $?"
# The same device in two files of one kind is an error too.
cw-report "$d/dcir.csv" "$d/dcir.csv"; echo "exit $?"
sed '2s/^EB-16//' "$d/dcir.csv" >nodev.csv
cw-report nodev.csv; echo "exit $?"
{ head -n 1 "$d/wear.csv"; echo '"EB-1,2026-03-01T00:00:00Z'; } >quote.csv
cw-report quote.csv; echo "exit $?"
cw-report --soh 0 "$d/wear.csv"; echo "exit $?"
cw-report --horizon x "$d/wear.csv"; echo "exit $?"
cw-report --limits 0,10,45 "$d/wear.csv"; echo "exit $?"
cw-report --bogus; echo "exit $?"
cw-report -n -1 "$d/wear.csv"; echo "exit $?"
cw-report --version | sed 's/[0-9][0-9.]*$/VERSION/'
