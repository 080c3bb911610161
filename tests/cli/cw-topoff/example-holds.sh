# cw-topoff(1) EXAMPLES: the holds of the invented night in
# testdata/topoff-dock.csv (made by testdata/topoff-dock.py, which
# printed its ground truth: TERM-31 18 charger restarts, EB-0107 none,
# CART-02 3).  Checked against that: TERM-31 one hold of 14 h (its first
# row at 95 % is 17:10, it is taken out at 07:00 and falls below 95 after
# 07:10), 18 micro-cycles, each 3 whole percent (100 -> 97, the charger's
# restart point); EB-0107 one hold, unplugged when full: no micro-cycle,
# no top-off charge.  CART-02 has no SoC: not judged without
# --full-voltage.
# source: hand
cw-topoff testdata/topoff-dock.csv
