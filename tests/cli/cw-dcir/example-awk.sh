# cw-dcir(1) EXAMPLES: packs growing by more than 10 % a month.  Only
# CART-03 (12 % per 30 days by construction, see example-trend.sh);
# EB-0042 is flat and TERM-12 has no estimate (empty field 8).
# source: hand (the 12 % of example-trend.sh, worked there)
cw-dcir -t testdata/dcir-fleet.csv |
    awk -F, 'NR > 1 && $8 != "" && $8 > 10 { print $1, $9 }'
