# cw-topoff(1) EXAMPLES: each micro-cycle, CART-02 (no SoC gauge) judged
# by voltage with --full-voltage 29.0.  Ground truth of
# testdata/topoff-dock.py: 3 charger restarts for CART-02, 18 for
# TERM-31.  CART-02's first micro-cycle: from the peak at the end of the
# charge, 29.460 V at 17:40 (under the 3 A current, 0.06 V above rest),
# down to 29.098 V at rest at 20:40, where the charger restarts (below
# 29.10 V): 0.362 V, 100 * 0.362 / 29.0 = 1.248 % of the full voltage.
# source: hand (CART-02's first micro-cycle and the restart counts; the charge
#   of each micro-cycle is snapshot, a sum over testdata/topoff-dock.py's rows
#   not worked here)
cw-topoff -e --full-voltage 29.0 testdata/topoff-dock.csv
echo
cw-topoff -e --full-voltage 29.0 testdata/topoff-dock.csv |
    awk -F, 'NR > 1 { n[$1]++ } END { for (d in n) print d, n[d] }' | sort
