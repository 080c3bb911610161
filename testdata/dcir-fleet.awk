# dcir-fleet.awk: writes testdata/dcir-fleet.csv, an invented fleet of
# three packs for cw-dcir(1): `awk -f testdata/dcir-fleet.awk`.
# Every device, model and number here is made up.
#
# Each event is 7 samples 10 s apart: 3 at a rest current I0, 3 at a load
# current I1, 1 back at I0, so it holds two steps (I0 -> I1 at the 4th
# sample, I1 -> I0 at the 7th), each with 3 steady samples before it.
# The open-circuit voltage does not change within an event, so
# V = OCV + I * R(T) exactly (printed to 6 decimals), and
# R(T) = R25 * exp((Ea / Rg) * (1 / T - 1 / 298.15 K)), Ea = 30 kJ/mol,
# Rg = 8.314462618 J/(mol K): the resistance of a cell whose R25 is what
# cw-dcir should find after its Arrhenius correction.
#
# CART-03  cart, every other day for 40 days, I0 = -1 A, I1 = -9 A,
#          R25 = 0.060 * (1 + 0.004 day) ohm (slope 0.00024 ohm/day,
#          12 % of r_start per 30 days, 200 % after 250 days); on day 18
#          the voltage of the first load sample reads 0.5 V low (a
#          contact glitch).
# EB-0042  e-bike on its charger, every other day, I0 = 0, I1 = +2 A,
#          R25 = 0.150 ohm flat, cell temperature 12..36 C; day 10 is at
#          5 C and day 20 at 92 % SoC, both outside the default windows.
# TERM-12  handheld terminal, days 0, 14 and 28 only, I0 = -0.1 A,
#          I1 = -1.2 A, R25 = 0.180 ohm: too few steps for a trend.
function civil(z,	era, doe, yoe, y, doy, mp, d, m) {
	z += 719468
	era = int((z >= 0 ? z : z - 146096) / 146097)
	doe = z - era * 146097
	yoe = int((doe - int(doe / 1460) + int(doe / 36524) - \
	    int(doe / 146096)) / 365)
	y = yoe + era * 400
	doy = doe - (365 * yoe + int(yoe / 4) - int(yoe / 100))
	mp = int((5 * doy + 2) / 153)
	d = doy - int((153 * mp + 2) / 5) + 1
	m = mp < 10 ? mp + 3 : mp - 9
	if (m <= 2)
		y++
	return sprintf("%04d-%02d-%02d", y, m, d)
}
function iso(t,	s) {
	s = t % 86400
	return sprintf("%sT%02d:%02d:%02dZ", civil(int(t / 86400)),
	    int(s / 3600), int(s % 3600 / 60), s % 60)
}
function rt(r25, tc) {
	return r25 * exp(30000 / 8.314462618 * (1 / (tc + 273.15) - \
	    1 / 298.15))
}
function event(dev, t, ocv, i0, i1, r, tc, soc, glitch,	k, i, v) {
	for (k = 0; k < 7; k++) {
		i = (k >= 3 && k <= 5) ? i1 : i0
		v = ocv + i * r
		if (k == 3)
			v -= glitch
		printf "%s,%s,%.6f,%.3f,%.1f,%.1f\n", dev, iso(t + 10 * k),
		    v, i, tc, soc
	}
}
BEGIN {
	t0 = 1772323200		# 2026-03-01T00:00:00Z
	print "device,time,voltage_v,current_a,temp_c,soc_pct"
	for (d = 0; d < 40; d += 2) {
		day = t0 + d * 86400
		tc = 22 + 6 * sin(d / 5)
		tc = int(tc * 10 + 0.5) / 10
		event("CART-03", day + 8 * 3600, 50.4, -1, -9,
		    rt(0.060 * (1 + 0.004 * d), tc), tc, 30 + d * 13 % 45,
		    d == 18 ? 0.5 : 0)
		tc = d == 10 ? 5 : 12 + d * 7 % 25
		soc = d == 20 ? 92 : 35 + d * 11 % 40
		event("EB-0042", day + 12 * 3600, 38.2, 0, 2,
		    rt(0.150, tc), tc, soc, 0)
		if (d % 14 == 0)
			event("TERM-12", day + 16 * 3600, 3.85, -0.1, -1.2,
			    rt(0.180, 25), 25, 60, 0)
	}
}
