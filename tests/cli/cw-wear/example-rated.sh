# cw-wear(1) EXAMPLES: rated to 500 full cycles and 3650 days at rest,
# 10 Ah for C-rates.  EB-0044 charges 60 % of 14 Ah in 4 h: 8.4 Ah at
# 2.1 A, 0.21 C on 10 Ah.
# source: snapshot: the report of testdata/wear-fleet.csv with --cycle-life
#   and --calendar-life, Xu et al. 2018 rescaled over 2 days of 5 invented
#   packs, is pinned as written; by hand only the C-rates (EB-0044: 8.4 Ah in
#   4 h is 2.1 A, 0.21 C of 10 Ah) and charge_ah
cw-wear --cycle-life 500 --calendar-life 3650 --capacity 10 \
    testdata/wear-fleet.csv
