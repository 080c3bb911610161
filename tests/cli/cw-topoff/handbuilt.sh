# A hand-built hold with micro-cycles of depth 1, 2 and 3 %
# (testdata/topoff-hand.csv).  Invented 1 Ah pack, a row every 60 s from
# 2026-01-01T00:00Z, so 0.6 A moves the SoC by 1 % a row (0.6 A * 60 s =
# 0.01 Ah) and -0.3 A by -0.5 %: charge 90 -> 100 (00:01..00:10), rest 3
# rows; drop 1 % (2 rows), recharge 1 row; rest 3; drop 2 % (4 rows),
# recharge 2; rest 3; drop 3 % (6 rows), recharge 3; rest 3; unplugged,
# -0.5 % a row down to 90.
# Worked by hand: the hold runs from the first row at 95 % (00:05) to the
# last (00:50), 2700 s; micro-cycles of 1, 2, 3 % (mean 2), each from the
# last resting row at 100 (00:13, 00:19, 00:28) to its last charging row
# (00:16, 00:25, 00:37), charge 0.01, 0.02, 0.03 Ah, 0.06 Ah in the hold.
# Summary: 0.75 h held of 1 h logged; 3 per 0.75 h = 96 a day.  At the
# top (SoC >= 99.5, so the 99.5 rows count) by the trapezoid rule: whole
# intervals 00:10..00:14, 00:16..00:20, 00:25..00:29, 00:37..00:41
# (4 * 240 s) and half of the 8 intervals with one end there (00:09-10,
# 14-15, 15-16, 20-21, 24-25, 29-30, 36-37, 41-42: 8 * 30 s): 1200 s of
# 2700 s = 0.4444444444.
# source: hand
cw-topoff testdata/topoff-hand.csv
echo
cw-topoff -e testdata/topoff-hand.csv
echo
cw-topoff -s testdata/topoff-hand.csv
