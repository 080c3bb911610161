# A stream whose current is positive while discharging (the sign flipped
# here by awk): the SoC steps against the current on every row that
# moves it, no segment gives an estimate and cw-capacity says what to
# check; exit 0.
# testdata/capacity-fleet.csv has 10-minute rows of 3.3 points, each a
# jump against the current (cw-capacity(1), Jumps and resets).
# source: hand
awk -F, -v OFS=, 'NR > 1 { $4 = -$4 } { print }' \
    testdata/capacity-fleet.csv | cw-capacity -v
echo "rc=$?"
