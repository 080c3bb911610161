# A ride inside a hold, worked by hand (testdata/topoff-ride.csv, rows
# every 10 min, SoC to 0.1 %, standby drain -0.2 A, defaults --full 95,
# --min-depth 0.5, --min-current 0.05, --standby-current 0.5,
# --standby-fall 5).  The hold runs 00:00 to 02:50 (03:00 is at 94 %):
# 10200 s.
#  1. Peak 100 at 00:00; drain to 99.4 at 00:20 (drop 0.6); the charger
#     takes it back to 100 at 00:30; the resting row at 00:40 ends it: a
#     top-off, 00:00 to 00:30, depth 0.6, charge 1.0 A * 600 s = 0.1667 Ah.
#  2. Peak 100 at 00:30; a ride at -4 and -5 A (00:50, 01:00, use rows:
#     below -0.5 A) down to 98.0, a pause at 0 A, back on the charger at
#     01:20 (2 A) and 01:30 (1 A) to 100: a use dip, 00:30 to 01:30,
#     depth 2.0, charge (2 + 1) A * 600 s = 0.5 Ah.
#  3. Peak 100 at 01:30; drain to 99.5 (01:50), then 99.3 at 02:00 with
#     no current: the fallback times the fall from the first row at 99.5
#     (01:50), 0.2 % in 10 min = 1.2 %/h, under 5: not use.  Recharge to
#     100 at 02:10: a top-off, 01:30 to 02:10, depth 0.7, 0.1667 Ah.
#  4. Peak 100 at 02:10; 99.9 at 02:20, then 99.0 at 02:30 with no
#     current: 0.9 % in 10 min from the first row at 99.9 = 5.4 %/h, over
#     5: a use row.  Recharge to 100 at 02:40: a use dip, 02:10 to 02:40,
#     depth 1.0, 0.1667 Ah.
# So 2 micro-cycles (mean depth 0.65, max 0.7) and 2 use dips; topoff_ah
# is every charging row after the first rest (00:10): 00:30, 01:20,
# 01:30, 02:10, 02:40 = (1 + 2 + 1 + 1 + 1) A * 600 s = 1.0 Ah.  Summary:
# span 3 h = 0.125 day, 2 / 0.125 = 16 micro-cycles per calendar day;
# 2 / 2.8333 h held = 0.7059 per held hour; share_at_100: the trapezoid
# over rows at 99.5 or more, 7 intervals with both ends there and 8 with
# one (half) of the 17: (7 + 4) / 17 = 0.647.
# source: hand
cw-topoff testdata/topoff-ride.csv
cw-topoff -e --use-dips testdata/topoff-ride.csv
cw-topoff -e testdata/topoff-ride.csv
cw-topoff -s testdata/topoff-ride.csv
# A standby level of 5 A takes the ride (-4 and -5 A, not below -5) for
# standby: dips 1 to 3 are top-offs, 3 in all (mean (0.6 + 2 + 0.7) / 3
# = 1.1, max 2), 3 / 0.125 = 24 a day; dip 4 stays use (fall rate).
cw-topoff -s --standby-current 5 testdata/topoff-ride.csv
# --standby-fall 6: dip 4's 5.4 %/h is standby now, a top-off.
cw-topoff -e --use-dips --standby-fall 6 testdata/topoff-ride.csv
# The fleet file gives R1 10 Ah: --standby-rate 0.02 is 0.2 A, and the
# fall rate 100 * 0.2 / 10 = 2 %/h: the drain (-0.2 A, not below -0.2)
# stays standby, 1.2 %/h too, 5.4 %/h is use: the same as the defaults.
# At 0.01 (0.1 A) the drain of -0.2 A is use: all 4 dips are use dips.
cw-topoff -s --fleet testdata/topoff-fleet.csv --standby-rate 0.02 \
    testdata/topoff-ride.csv
cw-topoff -s --fleet testdata/topoff-fleet.csv --standby-rate 0.01 \
    testdata/topoff-ride.csv
# --capacity does the same for every pack.
cw-topoff -s --capacity 10 --standby-rate 0.01 testdata/topoff-ride.csv
# Usage errors.
cw-topoff --use-dips testdata/topoff-ride.csv; echo "rc $?"
cw-topoff --standby-rate 0 testdata/topoff-ride.csv; echo "rc $?"
cw-topoff --standby-current x testdata/topoff-ride.csv; echo "rc $?"
cw-topoff --standby-fall -1 testdata/topoff-ride.csv; echo "rc $?"
