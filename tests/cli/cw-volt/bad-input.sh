# Bad input (SPEC.md exit codes: 1 data error, 2 usage error).
# source: spec
cd "$TMPDIR_CASE" || exit 1
# No voltage_v, no current_a: exit 1, named in the message.
printf 'device,time,current_a\nA,0,0\n' >nov.csv
cw-volt nov.csv; echo "rc=$?"
printf 'device,time,voltage_v\nA,0,4\n' >noi.csv
cw-volt noi.csv; echo "rc=$?"
# A non-numeric voltage is counted and not judged; the rest is used.
printf 'device,time,voltage_v,current_a\nA,0,4.3,0\nA,30,x,0\nA,60,4.3,0\nA,90,4.3,0\nA,120,4.3,0\n' >bad.csv
cw-volt -v bad.csv; echo "rc=$?"
# A missing file: exit 1.
cw-volt missing.csv; echo "rc=$?"
