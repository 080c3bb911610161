/* xu2018.c: the degradation model of Xu et al. 2018 (see xu2018.h). */
#include <math.h>

#include "xu2018.h"

/*
 * Xu et al. 2018, the parameter table of the LMO cell model: k_d1 = 1.40e5,
 * k_d2 = -0.501, k_d3 = -1.23e5, k_s = 1.04, s_ref = 0.5, k_T = 0.0693,
 * T_ref = 25 C, k_t = 4.14e-10 per second, alpha_sei = 0.0575,
 * beta_sei = 121.
 */
const struct xu2018_params xu2018_published = {
	.kd1 = 1.40e5, .kd2 = -0.501, .kd3 = -1.23e5,
	.ks = 1.04, .sref = 0.5,
	.kT = 0.0693, .Tref = 298.15,
	.kt = 4.14e-10,
	.a = 0.0575, .b = 121.0,
};

double
xu2018_s_dod(const struct xu2018_params *p, double d)
{
	/* No depth, no cycle; a range over 100 % cannot occur in SoC. */
	if (!(d > 0))
		return 0.0;
	if (d > 1)
		d = 1;
	return 1.0 / (p->kd1 * pow(d, p->kd2) + p->kd3);
}

double
xu2018_s_soc(const struct xu2018_params *p, double s)
{
	return exp(p->ks * (s - p->sref));
}

double
xu2018_s_temp(const struct xu2018_params *p, double temp_c)
{
	double k = temp_c + 273.15;

	return exp(p->kT * (k - p->Tref) * p->Tref / k);
}

double
xu2018_s_time(const struct xu2018_params *p, double seconds)
{
	return p->kt * seconds;
}

double
xu2018_cycle(const struct xu2018_params *p, double count, double d,
    double s, double temp_c)
{
	return count * xu2018_s_dod(p, d) * xu2018_s_soc(p, s) *
	    xu2018_s_temp(p, temp_c);
}

double
xu2018_calendar(const struct xu2018_params *p, double seconds, double s,
    double temp_c)
{
	return xu2018_s_time(p, seconds) * xu2018_s_soc(p, s) *
	    xu2018_s_temp(p, temp_c);
}

double
xu2018_fade(const struct xu2018_params *p, double f)
{
	/* expm1 keeps the small fades of short spans exact. */
	if (!(f > 0))
		return 0.0;
	return -p->a * expm1(-p->b * f) - (1 - p->a) * expm1(-f);
}

double
xu2018_damage_at(const struct xu2018_params *p, double l)
{
	double lo, hi, f, g, dg;
	int i;

	if (!(l > 0))
		return 0.0;
	if (l >= 1)
		return HUGE_VAL;
	/*
	 * L(f) >= 1 - exp(-f), so the root lies in [0, -log(1 - L)].
	 * Newton steps, falling back to bisection when one leaves the
	 * bracket; L is increasing, so the bracket always holds the root.
	 */
	lo = 0;
	hi = -log1p(-l);
	f = hi;
	for (i = 0; i < 200; i++) {
		g = xu2018_fade(p, f) - l;
		if (g == 0)
			break;
		if (g > 0)
			hi = f;
		else
			lo = f;
		if (hi - lo <= 4e-16 * hi)
			break;
		dg = p->a * p->b * exp(-p->b * f) + (1 - p->a) * exp(-f);
		f -= g / dg;
		if (!(f > lo && f < hi))
			f = lo + (hi - lo) / 2;
	}
	return f;
}
