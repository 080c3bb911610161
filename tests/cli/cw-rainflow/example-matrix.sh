# cw-rainflow(1) EXAMPLES: the range-mean matrix, ranges by 20 %, means by
# 25 %.  By hand: CT-0305 60@70 in 40..60 x 50..75, 65@67.5 (2 halves) in
# 60..80 x 50..75; EB-0101 50@55, 70@55 (half), 75@57.5 (half);
# SC-0203 8@62, 12@58, 20@60 (half).
# source: hand
cw-rainflow --matrix 20,25 testdata/rainflow-fleet.csv
