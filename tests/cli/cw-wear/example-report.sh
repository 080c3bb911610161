# cw-wear(1) EXAMPLES: the morning report of the invented fleet
# (testdata/wear-fleet.py says what each pack was built to show).
cw-wear testdata/wear-fleet.csv
