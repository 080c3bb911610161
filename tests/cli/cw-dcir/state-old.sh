# A state saved by an older cw-dcir (testdata/old-states/make.sh says
# which commit made it) is read: its trend is that of one pass over the
# same samples, byte for byte.  A version this cw-dcir does not know is
# refused (exit 1) with its version and what to do, and a --state file
# of it is left as it was.
# source: spec
f=testdata/dcir-fleet.csv
o=testdata/old-states
d=$TMPDIR_CASE
cw-dcir -t "$f" >"$d/one-pass.csv"
cw-dcir -t --merge "$o/cw-dcir-state-1.state" | cmp - "$d/one-pass.csv" &&
    echo "version 1 read: the trend of one pass"
sed 's/cw-dcir-state-1/cw-dcir-state-2/g' "$o/cw-dcir-state-1.state" \
    >"$d/v2.state"
cp "$d/v2.state" "$d/v2.copy"
cw-dcir --state "$d/v2.state" "$f" >/dev/null 2>"$d/err"
echo "rc $?"
sed "s|$d/||" "$d/err"
cmp "$d/v2.state" "$d/v2.copy" && echo "state left as it was"
