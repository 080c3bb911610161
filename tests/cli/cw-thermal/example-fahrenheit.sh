# cw-thermal(1) EXAMPLES: limits in Fahrenheit.  By the definition of the
# scale, C = (F - 32) * 5 / 9: 32F = 0C, 50F = 10C, 113F = 45C,
# 140F = 60C, so the output must equal that of the default limits.
# source: hand
cw-thermal --limits 32F,50F,113F,140F testdata/thermal-fleet.csv
cw-thermal testdata/thermal-fleet.csv >"$TMPDIR_CASE/c.csv"
cw-thermal --limits 32F,50F,113F,140F testdata/thermal-fleet.csv |
    cmp - "$TMPDIR_CASE/c.csv" && echo same as 0,10,45,60 C
