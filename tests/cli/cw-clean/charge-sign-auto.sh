# --charge-sign auto (the default) decides per file: pos.csv counts
# charging positive (current +5 A while its SoC rises, -5 A while it
# falls: 24 rows with the change, none against), neg.csv the other way
# (the same pack logged with the sign turned: 24 rows against); auto
# turns neg.csv alone and says so with the counts, and its stream equals
# the one of --charge-sign negative on that file.  An explicit sign the
# data contradict is warned about.  A file of 3 rows is undecided
# (fewer than 20 rows of evidence): positive, and -v says so.
# source: hand (the counts: 25 rows a file, the first has no previous
#   row; every later row moves the SoC by 1 point with the current)
cd "$TMPDIR_CASE" || exit 1
awk 'BEGIN { print "device,time,voltage_v,current_a,soc_pct"
	for (k = 0; k < 25; k++) {
		up = k < 13; soc = up ? 50 + k : 74 - k
		printf "P,%d,%.2f,%d,%d\n", 1772323200 + 60 * k,
		    up ? 3.9 : 3.7, up ? 5 : -5, soc } }' >pos.csv
awk -F, 'NR == 1 { print; next } { $4 = -$4; print }' OFS=, pos.csv |
    sed 's/^P,/Q,/' >neg.csv
cw-clean pos.csv neg.csv >both.csv
echo "rc=$?"
grep -c '^P,[^,]*,[^,]*,5,' both.csv
grep -c '^Q,[^,]*,[^,]*,5,' both.csv
cw-clean --charge-sign negative neg.csv >n1.csv
grep '^Q\|^device' both.csv | cmp - n1.csv && echo "neg.csv as with --charge-sign negative"
echo '== explicit signs the data contradict'
cw-clean --charge-sign positive neg.csv >/dev/null
cw-clean --charge-negative pos.csv >/dev/null
echo '== too little evidence'
head -n 4 pos.csv >few.csv
cw-clean -v few.csv >/dev/null
echo '== a FIFO is not read ahead (its rows would be lost): all 25 rows, sign as logged'
mkfifo fifo
cat neg.csv >fifo &
cw-clean -v fifo | sed 1d | awk -F, '$4 < 0' | wc -l
wait
