# The smaller state checks of issue 25, item 9: a sorted stream of whole
# states on standard input is checked for its row counts (a deleted row is
# an error; --partition, a reducer's share, checks only each row); --state
# ./s -o s is one file (caught, exit 2); a --state that does not exist is
# said to start a new history; a FIFO as --state is refused.  On main
# before the fix the deleted row passed (exit 0), ./s and s passed the
# same-file check, and a missing state was silent.
# source: spec: exit codes and messages only, no number to derive
cd "$TMPDIR_CASE" || exit 1
f=$OLDPWD/testdata/wear-fleet.csv
awk -F, 'NR == 1 || $2 < "2026-03-03"' "$f" | cw-wear --state-out >1.state
awk -F, 'NR == 1 || $2 >= "2026-03-03"' "$f" | cw-wear --state-out >2.state
# lost_row: the sorted stream of both states without its first EB- row.
lost_row() {
	cat 1.state 2.state | sort -t, -k1,1 | awk '/^EB-/ && !n++ { next } 1'
}
echo '== sorted whole states on stdin: = the files'
cw-wear --merge 1.state 2.state >files.csv
cat 1.state 2.state | sort -t, -k1,1 | cw-wear --merge | cmp - files.csv &&
    echo same
echo '== one device row deleted from the stream'
lost_row | cw-wear --merge >/dev/null
echo "rc $?"
echo '== the same with --partition: each row checked, the count not'
lost_row | cw-wear --merge --partition | wc -l
cw-wear --partition 1.state
echo "rc $?"
echo '== --state ./s -o s: the same file'
cw-wear --state ./s -o s "$f"
echo "rc $?"
ln -s s link
cw-wear --state link -o s "$f"
echo "rc $?"
echo '== a missing state: said'
cw-wear --state new.state "$f" >/dev/null
echo "rc $?"
echo '== a FIFO as state'
mkfifo fifo.state
cw-wear --state fifo.state "$f" >/dev/null
echo "rc $?"
