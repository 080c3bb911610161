# --sentinel: raw values meaning "no reading" are rejected as out-of-range,
# compared before unit conversion.  By hand: -32768 mA and 65535 mV rows go
# (default list); -32.768 A in a V/A log is a reading; --sentinel none
# keeps all; a list of our own rejects 0 mA.
# source: hand
cd "$TMPDIR_CASE" || exit 1
printf 'device,time,voltage_mv,current_ma\nX,1772323200,3700,-32768\nX,1772323210,65535,100\nX,1772323220,3700,0\nX,1772323230,3701,100\n' >ma.csv
printf 'device,time,voltage_v,current_a\nY,1772323200,3.7,-32.768\n' >a.csv
cw-clean -v --max-reject 1 --rejects rej.csv ma.csv a.csv
cat rej.csv
echo "== none"
cw-clean --sentinel none --bounds voltage=0:100 ma.csv
echo "== 0"
cw-clean --sentinel 0 ma.csv
echo "== bad list"
cw-clean --sentinel 1,x ma.csv
echo "exit $?"
