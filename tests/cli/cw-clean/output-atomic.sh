# -o FILE: written atomically.  A good run replaces the file; a failed
# run (a truncated gzip, a missing column) leaves the old file as it was
# and no temporary behind.  -o - is standard output.
# source: spec
cd "$TMPDIR_CASE" || exit 1
mkdir out
printf 'device,time,voltage_v,current_a\nA,1,3.8,1\nA,2,3.8,1\n' >good.csv
printf 'device,when,voltage_v,current_a\nA,1,3.8,1\n' >nocol.csv
awk 'BEGIN { print "device,time,voltage_v,current_a";
    for (i = 0; i < 20000; i++) print "A," 100 + i ",3.8,1" }' | gzip >big.gz
head -c 20000 big.gz >cut.csv.gz
cw-clean -o out/clean.csv good.csv
echo "rc=$?"
cat out/clean.csv
cw-clean -o out/clean.csv good.csv cut.csv.gz 2>err.txt
echo "rc=$?"
cat err.txt
cat out/clean.csv
cw-clean -o out/clean.csv nocol.csv
echo "rc=$?"
cat out/clean.csv
ls -a out
echo '== -o - is standard output'
cw-clean -o - good.csv
echo '== a directory that is not there'
cw-clean -o nodir/clean.csv good.csv
