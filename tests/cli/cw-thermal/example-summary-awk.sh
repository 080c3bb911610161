# cw-thermal(1) EXAMPLES: devices that took charge below T1 (field 5 is
# ah_below_min).  Only CART-07 charged below 0 C: rows at -1.7..-0.2 C,
# 6 rows of 8 A for 60 s = 0.8 Ah.
# source: hand
cw-thermal -s testdata/thermal-fleet.csv | awk -F, 'NR > 1 && $5 > 0'
