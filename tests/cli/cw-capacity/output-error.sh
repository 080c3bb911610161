# -o FILE and --rejects FILE are written atomically: on a data error (here
# a second input without soc_pct) both keep their old contents and no
# temporary file is left beside them; on success they are replaced.
# source: spec
cd "$TMPDIR_CASE" || exit 2
top=$OLDPWD
echo old contents >out.csv
echo old rejects >rej.csv
printf 'device,time,current_a\nA,0,1\n' >bad.csv
cw-capacity -o out.csv --rejects rej.csv \
    "$top/testdata/capacity-fleet.csv" bad.csv
echo "rc=$?"
cat out.csv rej.csv
ls
cw-capacity -o out.csv --rejects rej.csv "$top/testdata/capacity-fleet.csv"
echo "rc=$?"
wc -l <out.csv
cat rej.csv
ls
