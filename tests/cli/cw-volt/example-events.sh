# cw-volt(1) EXAMPLES: the events of the invented fleet, cells from the
# fleet file (EB-0101 and EB-0102 10 cells, TERM-12 2).  Checked by hand
# (rows 60 s apart; a row's current stands for the interval ending at it):
# EB-0101 is over from 05:03 (42.60 V / 10 = 4.26 V > 4.25), so the event
# starts at the row before, 05:02; it charges at 3, 3, 1.5, 0.8 A until
# 05:06: (3 + 3 + 1.5 + 0.8) A * 60 s / 3600 = 0.1383333 Ah, peak 4.30 V.
# At 05:07 the current is 0 (rest) at 4.28 V: the charge event ends at
# 05:06 and a rest event starts there; 4.24 V at 05:10 is still inside the
# 0.02 V hysteresis (exit at <= 4.23), 4.225 V at 05:11 ends it, so it
# ends at 05:10.  EB-0102 rides (-6 A) to 2.48 V at 05:04 (start 05:03),
# 2.42 V at 05:05, use: -6 A * 120 s = -0.2 Ah; then parked (-0.02 A,
# rest) at 2.46..2.51 V (< 2.52, still under) to the end, 05:12:
# -0.02 A * 420 s = -0.0023333 Ah.  TERM-12 stays at 3.95..4.10 V per
# cell: no event (it would be all under with --cells 10).
# source: hand (the manual's examples over hand-made testdata; the derivation in the comments)
cw-volt --fleet testdata/volt-register.csv testdata/volt-fleet.csv
