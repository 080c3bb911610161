# The order of the list on testdata/report, an invented fleet made by hand
# with one pack for each kind of reason (T1..T4 the default 0,10,45,60 C;
# every file's last row 2026-03-31T22:30:00Z):
#  1. EB-10: 2 charge events below 0 C, 3.5 Ah (tier 1, charge-below-min);
#     also a modelled life of 300 days < 365: short-life, listed under it;
#     300 days after 2026-03-31T22:30Z is 2027-01-25;
#  2. EB-11: 1 event under the cell voltage minimum, 5 h, 2.31 V (tier 1,
#     cell-under-voltage, after charge-below-min);
#  3. "Dock 3, bay 2": 4 cool events over the protocol's current (tier 2);
#     its 12 top-off micro-cycles a day are shown (at least --topoff 10);
#  4. EB-13: measured SoH 76 % < 80 (tier 3, capacity-low);
#  5. EB-14: SoH 84 %, slope -0.02 Ah/day of 14 Ah = -0.142857 points a
#     day (4.29 per 30 days), Sen interval -0.03..-0.01 Ah/day (6.43 to
#     2.14 points per 30 days), all below zero: (84 - 80) / 0.142857 = 28
#     days <= 90, 80 % by 2026-04-28 (tier 3, capacity-fading);
#  6. EB-16: resistance 0.10 -> 0.16 ohm (+60 %), slope 0.001 ohm/day
#     (+30 % per 30 days), interval 0.0008..0.0012 all above zero:
#     (0.20 - 0.16) / 0.001 = 40 days <= 90, by 2026-05-10
#     (resistance-rising);
#  7. EB-17: modelled life 200.4 days (short-life), by 2026-10-18
#     (2026-03-31T22:30Z + 200.4 d = 2026-10-18T08:06Z); its resistance
#     interval -0.0002..0.002 holds zero: no resistance reason.
# Not listed: EB-12 (cool within the protocol), EB-15 (no sure slope),
# EB-18 (healthy).  The inputs in another order give the same list.
# source: hand
cd testdata/report || exit 1
cw-report --fleet ../report-fleet.csv wear.csv thermal.csv volt.csv capacity.csv \
    dcir.csv topoff.csv
echo "exit $?"
cw-report --fleet ../report-fleet.csv --csv topoff.csv dcir.csv capacity.csv \
    volt.csv thermal.csv wear.csv
echo "exit $?"
# -n 2: the two most urgent packs only; still exit 3.
cw-report -n 2 --fleet ../report-fleet.csv wear.csv thermal.csv volt.csv \
    capacity.csv dcir.csv topoff.csv >"$TMPDIR_CASE/top2"
echo "exit $?"
sed -n '/^  2\./,/^$/p;/^  3\./p;/more packs/p' "$TMPDIR_CASE/top2"
