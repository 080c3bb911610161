# -o FILE is written atomically: on a data error (here a second input
# without current_a) FILE keeps its old contents and no temporary file is
# left beside it; on success it is replaced.
# source: spec
cd "$TMPDIR_CASE" || exit 2
top=$OLDPWD
echo old contents >out.csv
printf 'device,time,voltage_v\nA,0,3.7\n' >bad.csv
cw-dcir -o out.csv "$top/testdata/dcir-fleet.csv" bad.csv
echo "rc=$?"
cat out.csv
ls
cw-dcir -t -o out.csv "$top/testdata/dcir-fleet.csv"
echo "rc=$?"
cut -d, -f1,2 out.csv
ls
