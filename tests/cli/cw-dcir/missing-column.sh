# A stream without voltage_v or current_a is a data error (exit 1),
# named with its file and header line.
# source: spec
cd "$TMPDIR_CASE" || exit 2
printf 'device,time,current_a,temp_c\nA,0,1,25\n' >nov.csv
cw-dcir nov.csv
echo "rc=$?"
printf 'device,time,voltage_v,temp_c\nA,0,3.7,25\n' | cw-dcir -t
echo "rc=$?"
