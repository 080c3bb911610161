# cw-rainflow(1) EXAMPLES: every cycle of the invented fleet.  Full cycles
# come as they close (SC-0203's 58-66 once its next valley, 52, is
# confirmed by the rise to 54), the residues at the end in device order.  CT-0305 is held at 100 % from
# 08:30 to 08:50: its 40-100 cycle ends at 08:30, the first row of the
# hold.  SC-0203's 52-64 cycle closes only at the end, when the last
# valley (50) is no longer provisional.
# source: hand (the turning points of testdata/rainflow-fleet.py through ASTM
#   E1049-85 5.4.4; the ranges and counts are those of
#   example-summary-pipeline.sh and example-histogram.sh, worked there; the
#   cycle's temp_c, the mean of its rows' readings, is snapshot)
cw-rainflow testdata/rainflow-fleet.csv
