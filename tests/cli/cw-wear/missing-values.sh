# Rows without SoC or temperature are left out of the terms that need
# them and counted with -v; a row whose SoC is "x" is counted as not a
# number.  Device B never has a temperature: its model fields are empty.
# source: hand.  A: 4 intervals of 60 s at 1 A = 0.06666666667 Ah; SoC
# 50 -> 51 -> 53 is a half cycle of 3 %: efc 0.015.  The model sees the
# rows with both SoC and temperature, 0 s (50 %) and 240 s (53 %), all at
# 25 C; in /usr/bin/python3 (Xu et al. 2018, lib/xu2018.c's constants):
#   Ss = lambda s: math.exp(1.04 * (s - 0.5))
#   cyc = 0.5 / (1.4e5 * 0.03 ** -0.501 - 1.23e5)
#   cal = 4.14e-10 * 240 * (Ss(.5) + Ss(.53)) / 2
#   f = cyc * Ss(0.515) + cal = 8.389656384e-07 (damage)
#   cyc / f = 0.8660750898, (f - cyc - 4.14e-10 * 240) / f = 0.01549336132
#   100 * L(f) = 0.0006627531945, L(f) = 1 - 0.0575 e^(-121 f) - 0.9425 e^-f
#   days_to_eol = (f_eol - f) / (f / 240) / 86400 = 542.7429039, f_eol the
#   root of L = 0.2 (scipy brentq).
cat >"$TMPDIR_CASE/in.csv" <<'CSV'
device,time,current_a,temp_c,soc_pct
A,2026-03-01T00:00:00Z,1,25,50
A,2026-03-01T00:01:00Z,1,,51
A,2026-03-01T00:02:00Z,1,25,
A,2026-03-01T00:03:00Z,1,25,x
A,2026-03-01T00:04:00Z,1,25,53
B,2026-03-01T00:00:00Z,-1,,80
B,2026-03-01T00:01:00Z,-1,,79
CSV
cw-wear -v "$TMPDIR_CASE/in.csv"
