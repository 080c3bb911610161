# cw-volt(1) EXAMPLES: the packs charged above the maximum (field 9 is
# ah_charged_over).  Only EB-0101: its charge event took 0.1383333 Ah
# (example-events.sh); its rest event adds nothing; 2 over events of
# 240 s each = 0.1333333 h; cell voltages 4.15 (41.50 V / 10) to 4.30.
# source: hand (the manual's examples over hand-made testdata; the derivation in the comments)
cw-volt -s --fleet testdata/volt-register.csv testdata/volt-fleet.csv |
    awk -F, 'NR > 1 && $9 > 0'
# The whole summary, for the columns (the header names them).
cw-volt -s --fleet testdata/volt-register.csv testdata/volt-fleet.csv
