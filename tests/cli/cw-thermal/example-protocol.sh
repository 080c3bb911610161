# cw-thermal(1) EXAMPLES: the events judged by the charge protocol, with
# capacity and cells from testdata/thermal-register.csv.  Checked by hand:
# CART-07 charged below 0 C: no-charge-allowed whatever the current; its
# highest voltage 25.8 V over 7 cells is 3.6857143 V.  TERM-12 (2 cells)
# charged above 45 C up to 8.02 V (05:12, 45.2 C; the row at 05:13, 44.8 C,
# is in the hysteresis band and not judged), 4.01 V a cell, within
# 4.10 + 0.02 V.  The
# use event of EB-0042 has no protocol.
# source: hand
cw-thermal --fleet testdata/thermal-register.csv testdata/thermal-fleet.csv
