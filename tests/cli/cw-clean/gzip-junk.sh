# Bytes after a gzip member that do not start another member (issue 25
# item 4): a logger's zero-filled tail, then a new member; text after the
# last member.  Reference: RFC 1952 2.2 (a gzip file is a series of
# members, nothing else) and gzip -t, which calls such bytes trailing
# garbage (exit 2, a warning) and stops there, as gzip -dc does.  Without
# --skip-junk: exit 1, the offset (the size of the first member, computed
# here) and the length named, every row of the first member written.
# With it: the second member read too, the stretch counted.  The row
# counts are checked against gzip -dc of each member alone.
# source: standard RFC 1952 2.2 (and gzip -t as the reference)
cd "$TMPDIR_CASE" || exit 1
awk 'BEGIN { print "device,time,voltage_v,current_a";
    for (i = 0; i < 3000; i++) print "A," 1000 + 10 * i ",3.8,1" }' >a.csv
awk 'BEGIN { print "device,time,voltage_v,current_a";
    for (i = 0; i < 2000; i++) print "A," 31000 + 10 * i ",3.9,-1" }' >b.csv
gzip -n -c a.csv >a.gz
gzip -n -c b.csv >b.gz
sa=$(wc -c <a.gz)
head -c 4096 /dev/zero >zeros
cat a.gz zeros b.gz >tail.gz
# Messages with the first member's size shown by name, not by its value
# (which depends on how gzip compressed).
norm() { sed "s/offset $sa\([ )]\)/offset <size of a.gz>\1/"; }
want_a=$(gzip -dc a.gz | sed 1d | wc -l)
want_ab=$((want_a + $(gzip -dc b.gz | sed 1d | wc -l)))
echo '== gzip -t on the zero-filled tail then a member'
gzip -t tail.gz 2>/dev/null
echo "gzip -t: exit $?"
echo '== cw-clean: an error after the first member'
cw-clean tail.gz >out.csv 2>err.txt
echo "rc=$?"
norm <err.txt
got=$(($(wc -l <out.csv) - 1))
echo "rows written: $got, rows of the first member: $want_a"
echo '== cw-clean --skip-junk: both members, the stretch counted'
cw-clean --skip-junk tail.gz >out.csv 2>err.txt
echo "rc=$?"
norm <err.txt
got=$(($(wc -l <out.csv) - 1))
echo "rows written: $got, rows of both members: $want_ab"
echo '== text after the last member'
{ cat a.gz; printf 'garbage\n'; } >text.gz
gzip -t text.gz 2>/dev/null
echo "gzip -t: exit $?"
cw-clean text.gz 2>err.txt >/dev/null
echo "rc=$?"
norm <err.txt
cw-clean --skip-junk text.gz 2>&1 >out.csv | norm
echo "rows written: $(($(wc -l <out.csv) - 1)), rows of the first member: $want_a"
echo '== two members back to back are no junk'
cat a.gz b.gz | cw-clean | sed 1d | wc -l
