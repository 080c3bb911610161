# --rejects: every data line not passed on, with every reason, as
# source,line,reason,record (the record exactly as read, line numbers of
# the physical line where a record starts), and -v counts that add up:
# data lines = accepted + rejected.  The repeated header is skipped and
# not written.  Both checks are recomputed here from the files.
# source: spec (the counts are recomputed by the case from the files it
#   writes)
cd "$TMPDIR_CASE" || exit 1
cat >a.csv <<'CSV'
device,time,voltage_v,current_a,temp_c,soc_pct
A,2026-03-01T00:00:00Z,3.8,-1.5,20,50
A,2026-03-01T00:00:10Z,3.79,-1.5,20.1,49.9
A,2026-03-01T00:00:10Z,3.79,-1.5,20.1,49.9

A,2026-03-01T00:01:30Z,3.7,-1,20,49
A,2026-03-01T00:00:20Z,3.7,-1,20,49
A,not a time,3.7,1,1,1
A,2026-03-01T00:02:00Z,3.7x,1,1,1
A,2026-03-01T00:02:10Z,9,1,1,1
A,2026-03-01T00:02:20Z,,1,1,1
,2026-03-01T00:02:30Z,3.7,1,1,1
A,2026-03-01T00:02:40Z,3.7
A,2026-03-01T00:02:50Z,3.7,1,1,1,extra
device,time,voltage_v,current_a,temp_c,soc_pct
"B
C",2026-03-01T00:03:00Z,3.7,1,20,50
B,2026-03-01T00:03:10Z,3.7,1,20,50
B,"2026-03-01T00:03:20Z,3.7,1,20,50
B,2026-03-01T00:03:30Z,3.7,1,20,50
CSV
cw-clean -v --max-reject 1 --rejects rej.csv a.csv 2>err.txt >out.csv
echo "rc=$?"
cat out.csv
cat rej.csv
cat err.txt
echo '== recounted from the files'
# Data lines: records after the header, less the repeated header; the
# quoted "B\nC" record spans two physical lines.  An unbalanced quote
# runs to the end of the file: the last two lines are one record.
data=$(($(wc -l <a.csv) - 1 - 1 - 1 - 1))
acc=$(($(wc -l <out.csv) - 1 - 1))
rej=$(/usr/bin/python3 -c 'import csv,sys; print(sum(1 for _ in csv.reader(open(sys.argv[1], newline=""))) - 1)' rej.csv)
echo "data lines $data, rows written $acc, rejects $rej"
grep -q "^cw-clean: $data data lines: $acc accepted, $rej rejected" err.txt &&
    [ $((acc + rej)) -eq "$data" ] && echo "counts add up"
echo '== with --step the counts are still of input lines'
cw-clean -v --step 30s --max-reject 1 --rejects rej2.csv a.csv 2>err2.txt >out2.csv
cat err2.txt
grep -q "^cw-clean: $data data lines: $acc accepted, $rej rejected" err2.txt &&
    cmp -s rej.csv rej2.csv && echo "same counts and rejects as without --step"
