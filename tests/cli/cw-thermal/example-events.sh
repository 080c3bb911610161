# cw-thermal(1) EXAMPLES: the events of the invented demo fleet.
# Checked by hand: CART-07 charges 8 A for 20 rows of 60 s, so
# 20 * 8 * 60 / 3600 = 2.666667 Ah (1 Ah = 1 A for 3600 s); TERM-12 is
# warm from 05:02 (45.3 C) and stays in the event at 44.8 C (hysteresis
# 0.5 C); EB-0042 discharges at -21..-23 C, below the use limit -20 C.
cw-thermal testdata/thermal-fleet.csv
