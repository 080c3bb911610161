# cw-rainflow(1) EXAMPLES: thermal cycling.  The fleet's temperatures
# repeat base + 0, 0.3, 0.6, 0.9, 1.2 C over every 5 rows: with
# hysteresis 0.5 each swing of 1.2 C counts; efc is empty (not SoC).
# By hand, CT-0305 (34 rows): turning points at rows 0, 4, 5, 9, 10, ...,
# 29, 30 and the last, 33 (0.9 C up): 14 in all, (14 - 1) / 2 = 6.5
# cycles; 12 half ranges of 1.2 and one of 0.9, so the mean range is
# (12 * 1.2 + 0.9) / 2 / 6.5 = 1.176923077.
# source: hand
cw-rainflow --signal temp_c --hysteresis 0.5 -s \
    testdata/rainflow-fleet.csv
