# cw-volt(1) EXAMPLES: a 4-cell LFP pack on a lead-acid charger.  Checked
# by hand: 14.5 V / 4 = 3.625 V (inside 3.65) at 05:03, 14.7 V / 4 =
# 3.675 V at 05:04, so the event starts at 05:03; 14.8 V = 3.70 V to
# 05:07, 13.6 V = 3.40 V at 05:08 ends it; charge (5 + 3 + 2 + 1) A *
# 60 s / 3600 = 0.1833333 Ah; SoC 98 at the start, 100 at the end.
# source: hand (the manual's examples over hand-made testdata; the derivation in the comments)
cw-volt --cells 4 --max 3.65 --min 2.50 testdata/volt-lfp.csv
# The same pack judged with the NMC defaults (4.25 V): 3.70 V is far
# below it, and 3.30 V (13.2 V / 4) far above 2.50 V: no event.
cw-volt --cells 4 testdata/volt-lfp.csv
