# cw-rainflow(1) EXAMPLES: a summary straight from a raw gauge log.
# By hand (testdata/rainflow-fleet.py has the turning points), ASTM
# E1049-85 5.4.4 with the residue as halves:
#   CT-0305  halves 60, 60, 65, 65: 2 cycles, efc (60+65)/100 = 1.25,
#            mean range 125 / 2 = 62.5
#   EB-0101  cycle 50, halves 70, 75: 2 cycles, efc 1.225, mean 61.25
#   SC-0203  cycles 8, 12, half 20: 2.5 cycles, efc 0.3, mean 12
# source: hand
cw-clean --cells 10 testdata/rainflow-raw.csv | cw-rainflow --summary
