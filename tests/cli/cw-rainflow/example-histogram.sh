# cw-rainflow(1) EXAMPLES: cycles in bins of 10 %, lo < range <= hi.
# By hand: CT-0305 60 (1 cycle: two halves) in 50..60, 65 (1) in 60..70;
# EB-0101 50 in 40..50, 70 (0.5) in 60..70, 75 (0.5) in 70..80;
# SC-0203 8 in 0..10, 12 in 10..20, 20 (0.5) in 10..20.
# source: hand
cw-rainflow --histogram 10 testdata/rainflow-fleet.csv
