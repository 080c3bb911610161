# cw-dcir(1) EXAMPLES: the steps of the invented fleet, one row per step.
# testdata/dcir-fleet.awk made the log with V = OCV + I * R(T) exactly
# (6 decimals) and R(T) = R25 * exp((30000 / 8.314462618) * (1 / T -
# 1 / 298.15)), so by hand: TERM-12 at 25 C has R = r_ref = 0.180 ohm
# (delta_v -0.198 V over delta_i -1.1 A); CART-03 on day 0 at 22 C has
# R25 = 0.060, r_ref within 1e-6 of it; EB-0042 is at 12 C on day 0, so
# r_ohm = 0.150 * exp(3608.1 * (1/285.15 - 1/298.15)) = 0.26044 and
# r_ref 0.150.  The glitch on CART-03 2026-03-19 08:00:30 reads 0.114
# ohm; EB-0042 on day 10 (5 C) and day 20 (SoC 92) is missing.
# source: hand
cw-dcir testdata/dcir-fleet.csv
