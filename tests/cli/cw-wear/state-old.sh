# States saved by older cw-wear (testdata/old-states/make.sh says which
# commit made each): version 2 is read, and reports what one pass over
# the same samples reports, byte for byte, by --merge and as a --state
# continued; version 1, whose damage is not split by cause, is refused
# (exit 1) with its version and what to do, through --state (left as it
# was) and --merge; a version this cw-wear does not know yet likewise.
# source: spec
f=testdata/wear-fleet.csv
o=testdata/old-states
d=$TMPDIR_CASE
cw-wear "$f" >"$d/one-pass.csv"
cw-wear --merge "$o/cw-wear-state-2.state" | cmp - "$d/one-pass.csv" &&
    echo "version 2 read: the report of one pass"
cp "$o/cw-wear-state-2.state" "$d/v2.state"
: >"$d/none.csv"
echo "device,time,voltage_v,current_a,temp_c,soc_pct" >"$d/none.csv"
cw-wear --state "$d/v2.state" "$d/none.csv" | cmp - "$d/one-pass.csv" &&
    echo "version 2 continued: the report of one pass"
cp "$o/cw-wear-state-1.state" "$d/v1.state"
cw-wear --state "$d/v1.state" "$f" >"$d/out" 2>"$d/err"
echo "rc $?"
sed "s|$d/||" "$d/err"
test -s "$d/out" || echo "no report"
cmp "$d/v1.state" "$o/cw-wear-state-1.state" && echo "state left as it was"
cw-wear --merge "$o/cw-wear-state-1.state" >/dev/null
echo "rc $?"
sed 's/cw-wear-state-2/cw-wear-state-7/g' "$o/cw-wear-state-2.state" \
    >"$d/v7.state"
cw-wear --merge "$d/v7.state" 2>&1 >/dev/null | sed "s|$d/||"
