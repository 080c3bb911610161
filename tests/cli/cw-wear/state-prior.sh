# The prior from the fleet file travels in the state (cw-wear(1): nightly
# runs need the file once): day 1 with --fleet, day 2 without, gives byte
# for byte the report of one pass over both with --fleet; so does a merge
# of --state-out states made with --fleet, the earlier state's prior kept
# (day 2's own, taken at its first row, would differ for the packs by
# age).  A fleet file given later does not change a state's prior.  The
# C-rate columns, which need the capacities of the file, come only with
# --fleet or --capacity; the first 24 columns are compared.
# source: spec
f=testdata/wear-fleet.csv
r=testdata/wear-register.csv
d=$TMPDIR_CASE
awk -F, 'NR == 1 || $2 < "2026-03-03"' "$f" >"$d/day1.csv"
awk -F, 'NR == 1 || $2 >= "2026-03-03"' "$f" >"$d/day2.csv"
cw-wear --fleet "$r" "$f" | cut -d, -f1-24 >"$d/one.csv"
cw-wear --fleet "$r" --state "$d/s" "$d/day1.csv" 2>&1 >/dev/null | sed "s|$d/||" >&2
echo "rc $?"
cw-wear --state "$d/s" "$d/day2.csv" | cut -d, -f1-24 >"$d/nightly.csv"
echo "rc $?"
cmp "$d/one.csv" "$d/nightly.csv" && echo "fleet once, then nightly = one pass"
cw-wear --fleet "$r" --state-out "$d/day1.csv" >"$d/1.state"
cw-wear --fleet "$r" --state-out "$d/day2.csv" >"$d/2.state"
cw-wear --merge "$d/2.state" "$d/1.state" | cut -d, -f1-24 |
    cmp - "$d/one.csv" &&
    echo "merge = one pass"
printf 'device,soh_pct\nCART-11,50\n' >"$d/other.csv"
cw-wear --fleet "$d/other.csv" --state "$d/s" "$d/day2.csv" 2>/dev/null |
    cut -d, -f1-24 | cmp - "$d/one.csv" &&
    echo "a later fleet file leaves the prior"
cut -d, -f1,22,24 "$d/one.csv"
