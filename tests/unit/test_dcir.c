/*
 * test_dcir.c: step detection, resistance, Arrhenius correction and the
 * trend per device (dcir.h).
 *
 * References.
 * - IEC 61960 (secondary lithium cells and batteries for portable
 *   applications), d.c. internal resistance: discharge at 0.2 C for 10 s,
 *   then at 1 C for 1 s; R = (U1 - U2) / (I2 - I1), U1 and U2 the voltages
 *   at the end of each period, I1 and I2 the two discharge currents.  The
 *   log below does exactly that to an invented cell of known resistance.
 * - The Arrhenius law k = A exp(-Ea / (R T)), here as the ratio of a
 *   resistance at T to that at T_ref, written out in this file with the
 *   molar gas constant 8.314462618 J/(mol K) (CODATA 2018) and 0 C =
 *   273.15 K; tests/ref/dcir-arrhenius.sh checks the tool against
 *   scipy.constants as well.
 * - The trend cases use lines with a known slope: the expected growth and
 *   end-of-life date follow from the line, worked out in the comments.
 * The cell, its capacity and its resistance are invented.
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "cw.h"
#include "dcir.h"

#define S	(CW_US_PER_S)
#define DAY	(86400 * S)
#define NA	CW_MISSING

struct run {
	struct dcir_conf c;
	struct dcir_dev d;
	struct dcir_counts n;
	struct dcir_step st[64];
	int ns;
};

static void
run_init(struct run *r)
{
	memset(r, 0, sizeof *r);
	dcir_conf_default(&r->c);
}

static void
feed(struct run *r, double t_s, double v, double i, double temp, double soc)
{
	struct dcir_pt p;

	p.t = (cw_time)(t_s * S);
	p.v = v;
	p.i = i;
	p.temp = temp;
	p.soc = soc;
	if (dcir_feed(&r->c, &r->d, &p, &r->n, &r->st[r->ns]) == 1)
		r->ns++;
	assert_true(r->ns < 64);
}

/* Sum of all counts but "accepted". */
static unsigned long
rejected(const struct run *r)
{
	unsigned long s = 0;
	int k;

	for (k = 1; k < DCIR_NREASON; k++)
		s += r->n.n[k];
	return s;
}

/*
 * IEC 61960 d.c. resistance on an ideal cell: OCV 3.700 V, R = 45 mOhm,
 * capacity 2.0 Ah, so 0.2 C = 0.4 A and 1 C = 2.0 A (discharge, negative
 * in the sample stream).  Logged once a second: rest, 10 s at 0.2 C, 1 s
 * at 1 C, rest.  U1 = 3.700 - 0.4 * 0.045 = 3.682 V, U2 = 3.700 - 2.0 *
 * 0.045 = 3.610 V.
 */
static void
test_iec61960_pulse(void **state)
{
	struct run r;
	double u1 = 3.682, u2 = 3.610, i1 = 0.4, i2 = 2.0, iec;
	int t;

	(void)state;
	run_init(&r);
	for (t = 0; t < 5; t++)
		feed(&r, t, 3.700, 0, 25, 50);
	for (; t < 15; t++)
		feed(&r, t, u1, -i1, 25, 50);
	feed(&r, t++, u2, -i2, 25, 50);
	for (; t < 20; t++)
		feed(&r, t, 3.700, 0, 25, 50);

	iec = (u1 - u2) / (i2 - i1);	/* the standard's formula */
	assert_int_equal(r.ns, 1);
	assert_true(r.st[0].r == iec);
	assert_true(fabs(r.st[0].r - 0.045) < 1e-12);
	assert_true(r.st[0].t == 15 * S);
	assert_true(r.st[0].di == -1.6);
	assert_true(r.st[0].dv == u2 - u1);
	/* At the reference temperature the correction is 1. */
	assert_true(r.st[0].r_ref == r.st[0].r);
	/* The 0.2 C start (0.4 A) is below --min-step; the return to rest
	 * after a 1 s pulse is not steady before it. */
	assert_int_equal(r.n.n[DCIR_OK], 1);
	assert_int_equal(r.n.n[DCIR_UNSTEADY], 1);
	assert_int_equal(rejected(&r), 1);
}

/* The same pulse at 5 C cell temperature but a wider window, and again
 * with the IEC currents for a 10 Ah cell. */
static void
test_iec61960_scaled(void **state)
{
	struct run r;
	double cap = 10, rr = 0.012, u1, u2;
	int t;

	(void)state;
	run_init(&r);
	u1 = 3.65 - 0.2 * cap * rr;
	u2 = 3.65 - 1.0 * cap * rr;
	for (t = 0; t < 10; t++)
		feed(&r, t, u1, -0.2 * cap, 25, 60);
	feed(&r, t, u2, -1.0 * cap, 25, 60);
	assert_int_equal(r.ns, 1);
	assert_true(fabs(r.st[0].r - (u1 - u2) / (cap - 0.2 * cap)) < 1e-15);
	assert_true(fabs(r.st[0].r - rr) < 1e-12);
}

/* A plug-in: rest, then charging at 1.5 A; the voltage rises by I R. */
static void
test_charge_step(void **state)
{
	struct run r;

	(void)state;
	run_init(&r);
	feed(&r, 0, 3.80, 0.0, 20, 40);
	feed(&r, 10, 3.80, 0.0, 20, 40);
	feed(&r, 20, 3.80, 0.0, 20, 40);
	feed(&r, 30, 3.80 + 1.5 * 0.06, 1.5, 20, 40);
	assert_int_equal(r.ns, 1);
	assert_true(fabs(r.st[0].r - 0.06) < 1e-12);
	assert_true(r.st[0].di == 1.5);
}

/* Arrhenius: R_ref = R exp(-(Ea / Rg) (1 / T - 1 / T_ref)). */
static double
arrhenius_by_hand(double r, double tc, double refc, double ea_kj)
{
	double rg = 8.314462618, t = tc + 273.15, tr = refc + 273.15;

	return r * exp(-(ea_kj * 1e3 / rg) * (1 / t - 1 / tr));
}

static void
test_arrhenius(void **state)
{
	double tc, ea;

	(void)state;
	for (ea = 10; ea <= 60; ea += 10)
		for (tc = -20; tc <= 60; tc += 2.5)
			assert_true(fabs(dcir_arrhenius(0.05, tc, 25, ea) -
			    arrhenius_by_hand(0.05, tc, 25, ea)) < 1e-15);
	/* Cold cells read high, so the correction lowers them; warm ones
	 * read low and are raised. */
	assert_true(dcir_arrhenius(0.05, 10, 25, 30) < 0.05);
	assert_true(dcir_arrhenius(0.05, 40, 25, 30) > 0.05);
	assert_true(dcir_arrhenius(0.05, 25, 25, 30) == 0.05);
	/* Ea = 0: no temperature dependence. */
	assert_true(dcir_arrhenius(0.05, 0, 25, 0) == 0.05);
	/* Round trip: corrected to 10 C, then back to 25 C. */
	assert_true(fabs(dcir_arrhenius(dcir_arrhenius(0.05, 25, 10, 30),
	    10, 25, 30) - 0.05) < 1e-15);
}

/* Three steady samples, then a step of -2 A with R = 50 mOhm, with the
 * temperature and SoC given, then a long rest. */
static void
one_step(struct run *r, double t0, double temp, double soc)
{
	feed(r, t0, 3.70, -0.2, temp, soc);
	feed(r, t0 + 5, 3.70, -0.2, temp, soc);
	feed(r, t0 + 10, 3.70, -0.2, temp, soc);
	feed(r, t0 + 15, 3.70 - 2.0 * 0.05, -2.2, temp, soc);
	feed(r, t0 + 1000, 3.70, -0.2, temp, soc);	/* a gap: rest */
}

static void
test_windows(void **state)
{
	struct run r;

	(void)state;
	run_init(&r);
	one_step(&r, 0, 25, 50);	/* inside */
	one_step(&r, 2000, 25, 85);	/* SoC above 80 */
	one_step(&r, 4000, 25, 19.9);	/* SoC below 20 */
	one_step(&r, 6000, 5, 50);	/* 5 C, below 10 */
	one_step(&r, 8000, 45.5, 50);	/* above 45 */
	one_step(&r, 10000, NA, 50);	/* no temperature */
	one_step(&r, 12000, 25, NA);	/* no SoC */
	one_step(&r, 14000, 10, 20);	/* on the edges: inside */
	one_step(&r, 16000, 45, 80);	/* on the edges: inside */
	assert_int_equal(r.ns, 3);
	assert_int_equal(r.n.n[DCIR_OK], 3);
	assert_int_equal(r.n.n[DCIR_SOC_OUT], 2);
	assert_int_equal(r.n.n[DCIR_TEMP_OUT], 2);
	assert_int_equal(r.n.n[DCIR_TEMP_UNKNOWN], 1);
	assert_int_equal(r.n.n[DCIR_SOC_UNKNOWN], 1);
	/* The step back up after each one is across a gap of 985 s. */
	assert_int_equal(r.n.n[DCIR_GAP], 9);
	assert_int_equal(rejected(&r), 15);

	/* With unknown SoC allowed, the SoC-less step is kept. */
	run_init(&r);
	r.c.unknown_soc_ok = 1;
	one_step(&r, 0, 25, NA);
	one_step(&r, 2000, 25, 90);
	assert_int_equal(r.ns, 1);
	assert_false(cw_isnum(r.st[0].soc));
	assert_int_equal(r.n.n[DCIR_SOC_OUT], 1);
}

/* The SoC and temperature of a step are those of the pre sample, or of
 * the post sample when pre has none. */
static void
test_step_conditions(void **state)
{
	struct run r;

	(void)state;
	run_init(&r);
	feed(&r, 0, 3.7, 0, 30, 50);
	feed(&r, 1, 3.7, 0, 30, 50);
	feed(&r, 2, 3.7, 0, NA, NA);
	feed(&r, 3, 3.6, -1, 31, 49);
	assert_int_equal(r.ns, 1);
	assert_true(r.st[0].temp == 31 && r.st[0].soc == 49);
	feed(&r, 4, 3.6, -1, 32, 48);
	feed(&r, 5, 3.6, -1, 33, 47);
	feed(&r, 6, 3.7, 0, 34, 46);
	assert_int_equal(r.ns, 2);
	assert_true(r.st[1].temp == 33 && r.st[1].soc == 47);
	assert_true(fabs(r.st[1].r_ref - arrhenius_by_hand(0.1, 33, 25, 30))
	    < 1e-15);
}

/* Missing voltage or current around a step: no estimate, counted. */
static void
test_missing(void **state)
{
	struct run r;

	(void)state;
	run_init(&r);
	feed(&r, 0, 3.7, 0, 25, 50);
	feed(&r, 1, 3.7, 0, 25, 50);
	feed(&r, 2, 3.7, 0, 25, 50);
	feed(&r, 3, NA, -2, 25, 50);	/* voltage missing after the step */
	assert_int_equal(r.ns, 0);
	assert_int_equal(r.n.n[DCIR_NO_V], 1);

	run_init(&r);
	feed(&r, 0, 3.7, 0, 25, 50);
	feed(&r, 1, 3.7, 0, 25, 50);
	feed(&r, 2, NA, 0, 25, 50);	/* voltage missing before it */
	feed(&r, 3, 3.6, -2, 25, 50);
	assert_int_equal(r.ns, 0);
	assert_int_equal(r.n.n[DCIR_NO_V], 1);

	run_init(&r);
	feed(&r, 0, 3.7, 0, 25, 50);
	feed(&r, 1, 3.7, 0, 25, 50);
	feed(&r, 2, 3.7, 0, 25, 50);
	feed(&r, 3, 3.6, NA, 25, 50);	/* current missing: untestable */
	feed(&r, 4, 3.6, -2, 25, 50);	/* and so is the next pair */
	feed(&r, 5, 3.6, -2, 25, 50);
	assert_int_equal(r.ns, 0);
	assert_int_equal(r.n.n[DCIR_NO_I], 2);
	/* A missing current inside the steady span makes it unsteady. */
	feed(&r, 6, 3.7, 0, 25, 50);
	assert_int_equal(r.ns, 0);
	assert_int_equal(r.n.n[DCIR_UNSTEADY], 1);
}

static void
test_gap_and_unsteady(void **state)
{
	struct run r;

	(void)state;
	run_init(&r);
	feed(&r, 0, 3.7, 0, 25, 50);
	feed(&r, 10, 3.7, 0, 25, 50);
	feed(&r, 20, 3.7, 0, 25, 50);
	feed(&r, 35.5, 3.6, -2, 25, 50);	/* 15.5 s after: too far */
	assert_int_equal(r.n.n[DCIR_GAP], 1);
	feed(&r, 50.5, 3.7, 0, 25, 50);	/* exactly 15 s: allowed, but the
					 * current before was not steady */
	assert_int_equal(r.n.n[DCIR_UNSTEADY], 1);
	assert_int_equal(r.ns, 0);

	/* Spread 0.25 A before a 2 A step: more than 10 %. */
	run_init(&r);
	feed(&r, 0, 3.7, 0.0, 25, 50);
	feed(&r, 1, 3.7, -0.25, 25, 50);
	feed(&r, 2, 3.7, 0.0, 25, 50);
	feed(&r, 3, 3.6, -2.0, 25, 50);
	assert_int_equal(r.n.n[DCIR_UNSTEADY], 1);
	/* Spread 0.2 A: exactly 10 %, steady. */
	run_init(&r);
	feed(&r, 0, 3.7, 0.0, 25, 50);
	feed(&r, 1, 3.7, -0.2, 25, 50);
	feed(&r, 2, 3.7, 0.0, 25, 50);
	feed(&r, 3, 3.6, -2.0, 25, 50);
	assert_int_equal(r.ns, 1);
	/* Too little history: only two samples before the step. */
	run_init(&r);
	feed(&r, 1, 3.7, 0.0, 25, 50);
	feed(&r, 2, 3.7, 0.0, 25, 50);
	feed(&r, 3, 3.6, -2.0, 25, 50);
	assert_int_equal(r.n.n[DCIR_UNSTEADY], 1);
	/* A smaller step than --min-step is no candidate at all. */
	run_init(&r);
	feed(&r, 1, 3.7, 0.0, 25, 50);
	feed(&r, 2, 3.7, 0.0, 25, 50);
	feed(&r, 3, 3.7, 0.0, 25, 50);
	feed(&r, 4, 3.68, -0.49, 25, 50);
	assert_int_equal(r.ns, 0);
	assert_int_equal(rejected(&r), 0);
}

/* The voltage moves the wrong way: not a resistance. */
static void
test_nonpositive(void **state)
{
	struct run r;

	(void)state;
	run_init(&r);
	feed(&r, 0, 3.7, 0, 25, 50);
	feed(&r, 1, 3.7, 0, 25, 50);
	feed(&r, 2, 3.7, 0, 25, 50);
	feed(&r, 3, 3.71, -2, 25, 50);
	feed(&r, 4, 3.71, -2, 25, 50);
	feed(&r, 5, 3.71, -2, 25, 50);
	feed(&r, 6, 3.71, 0, 25, 50);	/* no change: R = 0 */
	assert_int_equal(r.ns, 0);
	assert_int_equal(r.n.n[DCIR_NONPOS], 2);
}

/*
 * Beyond the cap, buckets double: 1000 steps a second apart, cap 64: at
 * buckets of 16 s, 1000 / 16 = 62.5, so 63 points, the first of each
 * bucket (t = 16 j s); at 8 s there would be 125.
 */
static void
test_series_thinning(void **state)
{
	struct dcir_series s;
	unsigned long k;
	size_t i;

	(void)state;
	memset(&s, 0, sizeof s);
	for (k = 0; k < 1000; k++)
		dcir_series_add(&s, (cw_time)k * S, (double)k, CW_MISSING, 64);
	assert_true(s.steps == 1000);
	assert_int_equal(s.n, 63);
	assert_int_equal(s.level, 4);
	for (i = 0; i < s.n; i++)
		assert_true(s.pt[i].t == (cw_time)(i * 16) * S &&
		    s.pt[i].r == (double)(i * 16));
	assert_true(s.first == 0 && s.last == 999 * S);
	assert_true(s.bin[DCIR_NBIN].n == 1000);
	dcir_series_free(&s);
}

/* A deterministic pseudo-random source (the C standard's rand()). */
static unsigned long lcg = 1;

static unsigned
rnd(unsigned n)
{
	lcg = lcg * 1103515245UL + 12345UL;
	return (unsigned)((lcg / 65536UL) % 32768UL) % n;
}

/*
 * Split-invariant: 3000 steps at irregular times and SoC, cap 100, cut
 * into two at 40 places and into five pieces once, joined: always the
 * same points, counts and times as one pass.
 */
static void
test_series_split(void **state)
{
	static cw_time t[3000];
	static double soc[3000];
	struct dcir_series one, a, b, p[5];
	size_t k, i, cut;
	int j;

	(void)state;
	for (k = 0, t[0] = 0; k < 3000; k++) {
		t[k] = (k ? t[k - 1] : 0) + (cw_time)(rnd(4) == 0 ? 0 :
		    rnd(20000)) * S / 10;
		soc[k] = rnd(8) == 0 ? CW_MISSING : 60 + rnd(400) / 10.0;
	}
	memset(&one, 0, sizeof one);
	for (k = 0; k < 3000; k++)
		dcir_series_add(&one, t[k], (double)k, soc[k], 100);
	assert_true(one.n <= 100 && one.n > 50);
	for (j = 0; j < 41; j++) {
		cut = j < 40 ? (size_t)j * 75 : 2999;
		memset(&a, 0, sizeof a);
		memset(&b, 0, sizeof b);
		for (k = 0; k < 3000; k++)
			dcir_series_add(k < cut ? &a : &b, t[k], (double)k,
			    soc[k], 100);
		dcir_series_join(&a, &b, 100);
		assert_int_equal(a.n, one.n);
		assert_int_equal(a.level, one.level);
		assert_true(a.steps == one.steps && a.first == one.first &&
		    a.last == one.last);
		for (i = 0; i < one.n; i++)
			assert_true(a.pt[i].t == one.pt[i].t &&
			    a.pt[i].r == one.pt[i].r &&
			    a.pt[i].bin == one.pt[i].bin);
		for (i = 0; i <= DCIR_NBIN; i++)
			assert_true(a.bin[i].n == one.bin[i].n &&
			    (a.bin[i].n == 0 || (a.bin[i].first ==
			    one.bin[i].first && a.bin[i].last ==
			    one.bin[i].last)));
		dcir_series_free(&a);
	}
	memset(p, 0, sizeof p);
	for (k = 0; k < 3000; k++)
		dcir_series_add(&p[k * 5 / 3000], t[k], (double)k, soc[k],
		    100);
	for (j = 4; j > 0; j--)
		dcir_series_join(&p[j - 1], &p[j], 100);
	assert_int_equal(p[0].n, one.n);
	for (i = 0; i < one.n; i++)
		assert_true(p[0].pt[i].t == one.pt[i].t &&
		    p[0].pt[i].r == one.pt[i].r);
	dcir_series_free(&p[0]);
	dcir_series_free(&one);
}

/*
 * The --soc auto window: steps at SoC 72 to 98 (20 of them) and 5 at 30:
 * every window from 69 to 72 holds the 20; the one whose middle is
 * nearest 50 is 69 (69..99).  With 30 more steps at 40, the windows
 * from 11 to 30 hold 35 (those and the 5 at 30): the one whose middle is
 * nearest 50 is 30 (30..60).  A fit over the window leaves the other
 * steps out.
 */
static void
test_series_window(void **state)
{
	struct dcir_series s;
	struct dcir_trend_conf c;
	struct dcir_trend tr;
	int k;

	(void)state;
	memset(&s, 0, sizeof s);
	dcir_trend_conf_default(&c);
	assert_int_equal(dcir_series_window(&s), -1);
	for (k = 0; k < 20; k++)
		dcir_series_add(&s, k * DAY, 0.05, k % 2 ? 72.0 : 98.9, 2048);
	for (k = 0; k < 5; k++)
		dcir_series_add(&s, (20 + k) * DAY, 0.5, 30.5, 2048);
	assert_int_equal(dcir_series_window(&s), 69);
	dcir_trend_fit_window(&s, &c, 69, &tr);
	assert_true(tr.fitted && tr.steps == 20 && tr.used == 20);
	assert_true(tr.last == 19 * DAY);
	assert_true(fabs(tr.slope) < 1e-15);
	dcir_trend_fit(&s, &c, &tr);
	assert_true(tr.steps == 25);
	for (k = 0; k < 30; k++)
		dcir_series_add(&s, (25 + k) * DAY, 0.05, 40.0, 2048);
	assert_int_equal(dcir_series_window(&s), 30);
	assert_int_equal(dcir_soc_bin(100.0), 99);
	assert_int_equal(dcir_soc_bin(-1.0), 0);
	assert_int_equal(dcir_soc_bin(CW_MISSING), DCIR_NBIN);
	dcir_series_free(&s);
}

/*
 * End of life only on a sure slope: a flat line of 0.05 ohm with a tiny
 * tilt of 1e-6 ohm a day under +-0.005 ohm of scatter (pseudo-random):
 * over 30 days the pairwise slopes spread about +-3e-4, so Sen's interval
 * includes zero: growth and its bounds are given, the lower one below
 * zero, and no eol_date.
 */
static void
test_trend_unsure(void **state)
{
	struct dcir_series s;
	struct dcir_trend_conf c;
	struct dcir_trend tr;
	int d;

	(void)state;
	memset(&s, 0, sizeof s);
	dcir_trend_conf_default(&c);
	for (d = 0; d < 30; d++)
		dcir_series_add(&s, d * DAY, 0.05 + (rnd(1001) - 500.0) * 1e-5 +
		    1e-6 * d, 50.0, 2048);
	dcir_trend_fit(&s, &c, &tr);
	assert_true(tr.fitted);
	assert_true(tr.slope_lo < 0 && tr.slope_hi > 0);
	assert_true(tr.growth_lo_30d < 0 && tr.growth_hi_30d > 0);
	assert_false(tr.has_eol);
	dcir_series_free(&s);
}

/*
 * r(day) = 0.040 + 0.0001 day, one step a day for 100 days: slope 1e-4
 * ohm/day, r_start 0.040, r_end 0.040 + 0.0099, growth 24.75 %, per 30
 * days 100 * 0.003 / 0.040 = 7.5 %.  End of life at 200 %: r = 0.080 after
 * 400 days, 1970-01-01 + 400 days = 1971-02-05.
 */
static void
test_trend_line(void **state)
{
	struct dcir_series s;
	struct dcir_trend_conf c;
	struct dcir_trend tr;
	int d;

	(void)state;
	memset(&s, 0, sizeof s);
	dcir_trend_conf_default(&c);
	for (d = 0; d < 100; d++)
		dcir_series_add(&s, d * DAY, 0.040 + 0.0001 * d, 50.0,
		    2048);
	/* Glitches: a contact that read ten times the resistance, and one
	 * that read nearly nothing. */
	s.pt[30].r = 0.4;
	s.pt[70].r = 0.001;
	dcir_trend_fit(&s, &c, &tr);
	assert_true(tr.fitted);
	assert_true(tr.used == 100);
	assert_true(fabs(tr.slope - 0.0001) < 1e-15);
	assert_true(fabs(tr.r_start - 0.040) < 1e-15);
	assert_true(fabs(tr.r_end - 0.0499) < 1e-15);
	assert_true(fabs(tr.growth_pct - 24.75) < 1e-9);
	assert_true(fabs(tr.growth_30d - 7.5) < 1e-9);
	assert_true(tr.has_eol);
	assert_true(llabs(tr.eol_t - 400 * DAY) < S);
	assert_true(tr.slope_lo <= tr.slope && tr.slope <= tr.slope_hi);

	/* End of life at 150 %: after 200 days. */
	c.eol_pct = 150;
	dcir_trend_fit(&s, &c, &tr);
	assert_true(llabs(tr.eol_t - 200 * DAY) < S);
	dcir_series_free(&s);
}

static void
test_trend_gates(void **state)
{
	struct dcir_series s;
	struct dcir_trend_conf c;
	struct dcir_trend tr;
	int d;

	(void)state;
	dcir_trend_conf_default(&c);
	/* Nine steps: fewer than ten. */
	memset(&s, 0, sizeof s);
	for (d = 0; d < 9; d++)
		dcir_series_add(&s, d * DAY, 0.05, 50.0, 2048);
	dcir_trend_fit(&s, &c, &tr);
	assert_false(tr.fitted);
	assert_false(cw_isnum(tr.r_start));
	/* Ten: enough. */
	dcir_series_add(&s, 9 * DAY, 0.05, 50.0, 2048);
	dcir_trend_fit(&s, &c, &tr);
	assert_true(tr.fitted);
	/* Flat: no growth, no end of life. */
	assert_true(tr.slope == 0 && tr.growth_pct == 0);
	assert_false(tr.has_eol);
	dcir_series_free(&s);

	/* Ten steps within six days: shorter than seven. */
	memset(&s, 0, sizeof s);
	for (d = 0; d < 10; d++)
		dcir_series_add(&s, d * DAY * 6 / 9, 0.05, 50.0, 2048);
	dcir_trend_fit(&s, &c, &tr);
	assert_false(tr.fitted);
	dcir_series_free(&s);

	/* Falling resistance: growth negative, no end of life. */
	memset(&s, 0, sizeof s);
	for (d = 0; d < 20; d++)
		dcir_series_add(&s, d * DAY, 0.05 - 0.0001 * d, 50.0, 2048);
	dcir_trend_fit(&s, &c, &tr);
	assert_true(tr.fitted && tr.growth_pct < 0 && !tr.has_eol);
	dcir_series_free(&s);

	/* Empty. */
	memset(&s, 0, sizeof s);
	dcir_trend_fit(&s, &c, &tr);
	assert_false(tr.fitted);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_iec61960_pulse),
		cmocka_unit_test(test_iec61960_scaled),
		cmocka_unit_test(test_charge_step),
		cmocka_unit_test(test_arrhenius),
		cmocka_unit_test(test_windows),
		cmocka_unit_test(test_step_conditions),
		cmocka_unit_test(test_missing),
		cmocka_unit_test(test_gap_and_unsteady),
		cmocka_unit_test(test_nonpositive),
		cmocka_unit_test(test_series_thinning),
		cmocka_unit_test(test_series_split),
		cmocka_unit_test(test_series_window),
		cmocka_unit_test(test_trend_unsure),
		cmocka_unit_test(test_trend_line),
		cmocka_unit_test(test_trend_gates),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
