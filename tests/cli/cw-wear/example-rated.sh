# cw-wear(1) EXAMPLES: rated to 500 full cycles and 3650 days at rest,
# 10 Ah for C-rates.  EB-0044 charges 60 % of 14 Ah in 4 h: 8.4 Ah at
# 2.1 A, 0.21 C on 10 Ah.
cw-wear --cycle-life 500 --calendar-life 3650 --capacity 10 \
    testdata/wear-fleet.csv
