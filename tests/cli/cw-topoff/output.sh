# -o writes atomically: on success the file appears whole; on a data
# error an existing file keeps its contents and no temporary is left.
# source: spec
cd "$TMPDIR_CASE" || exit 1
top=$OLDPWD
cw-topoff -o out.csv "$top/testdata/topoff-hand.csv"; echo "rc=$?"
cat out.csv
printf 'device,time\nA,0\n' >bad.csv
cw-topoff -o out.csv bad.csv; echo "rc=$?"
cat out.csv
ls
# A write error (Linux's always-full device) is a data error: exit 1.
cw-topoff "$top/testdata/topoff-hand.csv" >/dev/full
echo "full: rc=$?"
