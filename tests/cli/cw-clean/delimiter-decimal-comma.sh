# -d ';' and tab with --decimal-comma, as spreadsheet exports in many
# locales write them; quoted fields keep their delimiter.
# source: hand (every value is the field read with a decimal comma: "3,812" is
#   3.812)
cd "$TMPDIR_CASE" || exit 1
printf 'Pack;Time;Voltage (V);Current (A);Temp (C);SoC (%%)\n"P;1";2026-03-01T00:00:00Z;3,812;-2,35;20,5;83,25\nP2;2026-03-01T00:00:00Z;3,9;1;-5,5;90\n' >semi.csv
cw-clean -d ';' --decimal-comma semi.csv
echo '== tab, given as a backslash-t and as the word tab'
printf 'Pack\tTime\tVoltage (V)\tCurrent (A)\tTemp (C)\tSoC (%%)\nP3\t2026-03-01T00:00:00Z\t3,812\t-2,35\t20,5\t83\n' >tab.tsv
cw-clean -d '\t' --decimal-comma tab.tsv
cw-clean -d tab --decimal-comma tab.tsv
echo '== a semicolon log with decimal points'
printf 'Pack;Time;Voltage (V);Current (A)\nP4;2026-03-01T00:00:00Z;3.812;-2.35\n' >dot.csv
cw-clean -d ';' dot.csv
echo '== a decimal point is a bad number with --decimal-comma'
cw-clean -d ';' --decimal-comma --rejects rej.csv --max-reject 1 dot.csv
cat rej.csv
echo '== --decimal-comma with the comma delimiter is a usage error'
cw-clean --decimal-comma semi.csv
echo "rc=$?"
cw-clean -d ',,' semi.csv
