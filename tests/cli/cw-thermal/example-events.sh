# cw-thermal(1) EXAMPLES: the events of the invented demo fleet.
# Checked by hand: CART-07 charges 8 A for 20 rows of 60 s, so
# 20 * 8 * 60 / 3600 = 2.666667 Ah (1 Ah = 1 A for 3600 s); TERM-12's
# first warm row is 05:02 (45.3 C), so the event starts at 05:01, the
# start of the interval that row closes (a row's reading and current hold
# over the interval ending at it), and stays in the event at 44.8 C
# (05:13; hysteresis 0.5 C): 12 rows of 1.5 A for 60 s, 0.3 Ah;
# EB-0042 discharges at -21..-23 C, below the use limit -20 C.
# source: hand
cw-thermal testdata/thermal-fleet.csv
