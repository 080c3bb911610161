/*
 * xu2018.h: the semi-empirical Li-ion degradation model of Xu, Oudalov,
 * Ulbig, Andersson and Kirschen, "Modeling of Lithium-Ion Battery
 * Degradation for Cell Life Assessment", IEEE Trans. Smart Grid 9(2),
 * 1131-1140, 2018.  The constants are the published ones, fitted on LMO
 * (lithium manganese oxide) cells; other chemistries age differently.
 *
 *   DoD stress         S_d(d) = 1 / (k_d1 * d^k_d2 + k_d3), d in 0..1
 *   SoC stress         S_s(s) = exp(k_s * (s - s_ref)), s in 0..1
 *   temperature stress S_T(T) = exp(k_T * (T - T_ref) * T_ref / T), kelvin
 *   time stress        S_t(t) = k_t * t, t in seconds
 *   cycle damage       count * S_d * S_s * S_T per rainflow cycle
 *   calendar damage    integral of k_t * S_s * S_T over time
 *   fade               L(f) = 1 - a * exp(-b * f) - (1 - a) * exp(-f)
 *
 * a and b describe the fast early loss to SEI film formation.  These are
 * pure functions of their arguments and the constants.
 */
#ifndef XU2018_H
#define XU2018_H

struct xu2018_params {
	double kd1, kd2, kd3;	/* DoD stress */
	double ks, sref;	/* SoC stress; sref as a fraction */
	double kT, Tref;	/* temperature stress; Tref in kelvin */
	double kt;		/* time stress, per second */
	double a, b;		/* SEI film: alpha_sei, beta_sei */
};

/* The published constants. */
extern const struct xu2018_params xu2018_published;

/* Stress factors.  D and S are fractions (0..1), TEMP_C degrees Celsius. */
double	xu2018_s_dod(const struct xu2018_params *p, double d);
double	xu2018_s_soc(const struct xu2018_params *p, double s);
double	xu2018_s_temp(const struct xu2018_params *p, double temp_c);
double	xu2018_s_time(const struct xu2018_params *p, double seconds);

/* Damage of COUNT cycles of depth D at mean SoC S and mean TEMP_C. */
double	xu2018_cycle(const struct xu2018_params *p, double count, double d,
	    double s, double temp_c);
/* Calendar damage of SECONDS at constant S and TEMP_C. */
double	xu2018_calendar(const struct xu2018_params *p, double seconds,
	    double s, double temp_c);

/* Fade (fraction of capacity lost, 0..1) after damage F >= 0. */
double	xu2018_fade(const struct xu2018_params *p, double f);
/* The damage at which the fade reaches L (0 <= L < 1): the inverse. */
double	xu2018_damage_at(const struct xu2018_params *p, double l);

#endif
