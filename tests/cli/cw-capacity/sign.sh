# A stream whose current is positive while discharging (the sign flipped
# here by awk): every segment moves the SoC against its current, is
# rejected (sign) and cw-capacity says what to check; exit 0, no estimate.
# 60 segments of testdata/capacity-fleet.csv, one more cut by its jump.
awk -F, -v OFS=, 'NR > 1 { $4 = -$4 } { print }' \
    testdata/capacity-fleet.csv | cw-capacity -v
echo "rc=$?"
