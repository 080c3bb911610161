# Gzip input is recognised by its magic bytes, not its name; concatenated
# gzip members are read through, their repeated header lines skipped;
# plain and gzip files mix; gzip on standard input too.
# source: spec
cd "$TMPDIR_CASE" || exit 1
printf 'device,time,voltage_v,current_a\nA,100,3.8,1\nA,110,3.8,1\n' >p1.csv
printf 'device,time,voltage_v,current_a\nA,120,3.8,1\nB,5,3.9,2\n' >p2.csv
printf 'device,time,voltage_v,current_a\nC,7,3.7,3\n' >p3.csv
printf 'device,time,voltage_v,current_a\nD,9,3.6,4\n' >p4.csv
gzip -c p1.csv >cat.log
gzip -c p2.csv >>cat.log
echo '== two members in one file named .log'
cw-clean -v cat.log
echo '== gzip, plain and gzip on stdin'
gzip -c p4.csv >p4.gz
cw-clean -v cat.log p3.csv - <p4.gz
echo '== state goes on across files: the same row in two files is a duplicate'
cw-clean -v --max-reject 1 p3.csv p3.csv
