# --max-reject: exit 1 when more than the fraction of data lines is
# rejected (exactly the fraction passes).  The output still goes to
# standard output, an -o file is left as it was, the rejects file is
# written.  4 data lines, 2 rejected: 0.5 of them.
# source: hand
cd "$TMPDIR_CASE" || exit 1
printf 'device,time,voltage_v,current_a\nA,1,3.8,1\nA,2,38,1\nA,3,3.8,1\nA,4,38,1\n' >a.csv
echo '== default 0.5: 2 of 4 is not more than half'
cw-clean a.csv >/dev/null
echo "rc=$?"
echo '== 0.49: fails'
cw-clean --max-reject 0.49 --rejects rej.csv a.csv
echo "rc=$?"
cat rej.csv
echo '== with -o the old file stays'
echo previous >out.csv
cw-clean --max-reject 0.25 -o out.csv a.csv
echo "rc=$?"
cat out.csv
ls
echo '== 0: any reject fails; 1: none does'
cw-clean --max-reject 0 a.csv >/dev/null
echo "rc=$?"
printf 'device,time,voltage_v,current_a\nA,1,38,1\n' >b.csv
cw-clean --max-reject 1 b.csv
echo "rc=$?"
echo '== usage errors'
cw-clean --max-reject 1.5 a.csv
echo "rc=$?"
cw-clean --max-reject half a.csv
