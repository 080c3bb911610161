# A required column that cannot be found: exit 1, and the message names
# the field and every header seen, and says how to name it with -c.
# source: spec
cd "$TMPDIR_CASE" || exit 1
printf 'device,when,volts,amps\nX1,1772323200,3.9,1\n' >a.csv
cw-clean a.csv
echo "rc=$?"
printf 'time,voltage_v,current_a\n1772323200,3.9,1\n' >b.csv
cw-clean b.csv
echo "rc=$?"
echo '== with -c naming a header that is not there'
cw-clean -c time=Zeitpunkt a.csv
echo "rc=$?"
echo '== with -c the same log is read'
cw-clean -c time=when a.csv
