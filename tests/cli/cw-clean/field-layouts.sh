# Layouts loggers write that cw-clean reads without -c: a date column
# beside a time of day, a single "Date" column holding the whole stamp,
# " UTC" after the time, YYYY/MM/DD dates, SoC with a percent sign, units
# in brackets.  By hand: each row's values pass through unchanged.
# source: hand
cd "$TMPDIR_CASE" || exit 1
printf 'Date,Time,Serial,Voltage (V),Current (A),Temp [C],SOC\n2026-03-01,00:01:00,X,3.7,1.5,20,50%%\n2026/03/01,00:01:10.5,X,3.71,1.5,20,51%%\n' >split.csv
printf 'Date,Serial,Voltage [mV],Current [mA]\n2026-03-01 00:01:00 UTC,Y,3700,-1500\n' >whole.csv
cw-clean -v split.csv whole.csv
echo "== no device column: the message says how to name one"
printf 'time,voltage_v,current_a\n1772323200,3.7,1\n' | cw-clean
echo "exit $?"
