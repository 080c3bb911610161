# --state-out and --merge: the states of the two days, however they come
# (sorted by device, in either order, merged in two stages, from sets of
# devices apart), merge to the report of one pass, byte for byte.
# source: snapshot: the one-pass report is example-report.sh's; the
#   differences of the days-apart run (rows across midnight counted on one
#   side) are pinned as written, not worked by hand
f=testdata/wear-fleet.csv
d=$TMPDIR_CASE
awk -F, 'NR == 1 || $2 < "2026-03-03"' "$f" >"$d/day1.csv"
awk -F, 'NR == 1 || $2 >= "2026-03-03"' "$f" >"$d/day2.csv"
cw-wear "$f" >"$d/one.csv"
cw-wear --state-out "$d/day1.csv" >"$d/day1.state"
cw-wear --state-out "$d/day2.csv" >"$d/day2.state"
cat "$d/day2.state" "$d/day1.state" | sort -t, -k1,1 | cw-wear --merge |
    cmp - "$d/one.csv" && echo "sorted stream = one pass"
cw-wear --merge "$d/day1.state" "$d/day2.state" | cmp - "$d/one.csv" &&
    echo "files in order = one pass"
cw-wear --merge "$d/day2.state" "$d/day1.state" | cmp - "$d/one.csv" &&
    echo "files in reverse = one pass"
cw-wear --merge --state-out "$d/day1.state" "$d/day2.state" \
    >"$d/both.state"
cw-wear --merge "$d/both.state" | cmp - "$d/one.csv" &&
    echo "two stages = one pass"
# Devices apart: carts and e-bikes on one side, the rest on the other.
awk -F, 'NR == 1 || $1 ~ /^(CART|EB)/' "$f" | cw-wear --state-out \
    >"$d/a.state"
awk -F, 'NR == 1 || $1 !~ /^(CART|EB)/' "$f" | cw-wear --state-out \
    >"$d/b.state"
cw-wear --merge "$d/a.state" "$d/b.state" | cmp - "$d/one.csv" &&
    echo "disjoint devices = one pass"
# States merged into a --state file, a day at a time.
cw-wear --merge --state "$d/fleet.state" "$d/day1.state" 2>&1 >/dev/null | sed "s|$d/||" >&2
cw-wear --merge --state "$d/fleet.state" "$d/day2.state" |
    cmp - "$d/one.csv" && echo "merged into --state = one pass"
# Options that only shape the report apply at the merge.
cw-wear --cycle-life 500 --capacity 10 "$f" >"$d/rated.csv"
cw-wear --merge --cycle-life 500 --capacity 10 "$d/both.state" |
    cmp - "$d/rated.csv" && echo "rated at the merge = rated one pass"
cw-wear -v --merge "$d/day1.state" "$d/day2.state" 2>&1 >/dev/null |
    grep -E 'state rows|joined'
# What the joins are for: the reports of the days apart do not add up to
# one pass (efc, hours at >= 95 % SoC, damage: the rainflow cycle and the
# intervals across midnight).
cw-wear "$d/day1.csv" >"$d/r1.csv"
cw-wear "$d/day2.csv" >"$d/r2.csv"
for c in 6 8 23; do
	awk -F, -v c=$c -v one="$d/one.csv" '
	    FNR > 1 && FILENAME != one { s[$1] += $c }
	    FNR > 1 && FILENAME == one { o[$1] = $c }
	    END { for (d in o) if (s[d] != o[d]) printf "column %d %s: " \
	        "days apart %.10g, one pass %.10g\n", c, d, s[d], o[d] }' \
	    "$d/r1.csv" "$d/r2.csv" "$d/one.csv" | sort
done
# A clock gone back across midnight: the second file begins two hours
# before the first ends.  --merge joins them with a warning, the rows on
# the other side counted; one pass over the rows skips those that go back
# in time, and so does --state.
awk -F, 'NR == 1 || $2 < "2026-03-03T01"' "$f" >"$d/early.csv"
awk -F, 'NR == 1 || $2 >= "2026-03-02T23"' "$f" >"$d/late.csv"
cw-wear --state-out "$d/early.csv" >"$d/early.state"
cw-wear --state-out "$d/late.csv" >"$d/late.state"
cw-wear --merge "$d/early.state" "$d/late.state" >"$d/straddle.csv" \
    2>"$d/err"
echo "rc $?"
sed "s|$d/||" "$d/err" | head -n 2
tail -n 1 "$d/err"
cw-wear "$d/early.csv" "$d/late.csv" >"$d/onepass.csv" 2>/dev/null
cw-wear --state "$d/s.state" "$d/early.csv" 2>&1 >/dev/null | sed "s|$d/||" >&2
cw-wear --state "$d/s.state" "$d/late.csv" 2>"$d/err" |
    cmp - "$d/onepass.csv" && echo "--state = one pass over the rows"
sed "s|$d/||" "$d/err"
awk -F, 'FNR == 1 { k++ } FNR > 1 && k == 1 { h[$1] = $8 }
    FNR > 1 && k == 2 && h[$1] != $8 { print $1 ": hours at >= 95 % " \
    h[$1] " one pass, " $8 " merged across the overlap" }' \
    "$d/onepass.csv" "$d/straddle.csv"
