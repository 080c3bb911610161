# Logs concatenated with their headers (cat day1.csv day2.csv): the
# repeated header line is skipped and counted, not rejected; a header of
# another form in the middle is data, and rejected.
# source: spec
cd "$TMPDIR_CASE" || exit 1
printf 'device,time,voltage_v,current_a\nA,1,3.8,1\n' >d1.csv
printf 'device,time,voltage_v,current_a\nA,2,3.8,1\n' >d2.csv
printf 'device;time;voltage_v;current_a\nA;3;3.8;1\n' >d3.csv
cat d1.csv d2.csv d1.csv >all.csv
cw-clean -v --max-reject 1 --rejects rej.csv all.csv
cat rej.csv
cat d1.csv d3.csv >mixed.csv
cw-clean -v --max-reject 1 --rejects rej.csv mixed.csv
cat rej.csv
