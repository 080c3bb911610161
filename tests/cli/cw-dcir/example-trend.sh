# cw-dcir(1) EXAMPLES: the trend per pack, with -v counts.
# From how testdata/dcir-fleet.awk made the log: CART-03 has R25 =
# 0.060 * (1 + 0.004 day), so slope 0.00024 ohm/day, r_start 0.060,
# growth_pct_per_30d = 100 * 0.00024 * 30 / 0.060 = 12, r_end at day 38
# (plus 30 s) 0.06912, growth 15.2 %, 200 % of r_start after
# 0.060 / 0.00024 = 250 days: 2026-03-01 + 250 d = 2026-11-06.  The
# glitch of one step in 40 does not move it.  EB-0042 is flat at 0.150
# (its slope is rounding noise, no end of life before year 9999) with 36
# steps: 4 rejected, 2 at 5 C, 2 at SoC 92.  TERM-12 has 6 steps, fewer
# than 10: empty estimates.  86 steps in all, 82 accepted.
# source: hand
cw-dcir -t -v testdata/dcir-fleet.csv
