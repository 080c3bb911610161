# cw-wear(1) EXAMPLES: where each pack spent its time, by SoC and
# temperature band.  Snapshot; tests/cli/cw-wear/dwell.sh derives the
# bands by hand.  Each pack's hours add up to its 48 h span, as the
# check below shows (every row has SoC and temperature, none is a gap).
# source: snapshot: bands derived by hand in dwell.sh; here the sum per pack is checked
cw-wear --dwell testdata/wear-fleet.csv >"$TMPDIR_CASE/out.csv"
echo "rc $?"
cat "$TMPDIR_CASE/out.csv"
awk -F, 'NR > 1 { h[$1] += $6 }
    END { for (d in h) printf "%s %.9g h\n", d, h[d] }' \
    "$TMPDIR_CASE/out.csv" | sort
