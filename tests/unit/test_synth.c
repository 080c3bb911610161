/*
 * test_synth.c: the pieces of cw-synth's simulator and its line formats.
 *
 * References named beside each check:
 * - xoshiro256** and splitmix64: the algorithms as published by Blackman
 *   and Vigna (prng.di.unimi.it); the output values below are from memory
 *   of their usual test vectors and were checked against an independent
 *   Python implementation of the published algorithm (tests/ref/
 *   synth_rng.sh runs that comparison for seeded streams).
 * - Uniform and normal moments: mean 1/2 and variance 1/12 of U(0,1);
 *   mean 0, variance 1 of N(0,1); tolerances are 5 standard errors.
 * - Arrhenius: k(T)/k(Tref) = exp(-Ea/(R T)) / exp(-Ea/(R Tref)), the
 *   textbook form, R = 8.314462618 J/(mol K) (CODATA 2018); the value
 *   2.1400 at 45 C, 30 kJ/mol was worked out by hand.
 * - RC pair: the step response of a resistor-capacitor pair driven by a
 *   constant current, v(t) = I R1 (1 - exp(-t / tau)) (circuit theory).
 * - Newton's law of cooling: T(t) = Ta + (T0 - Ta) exp(-UA t / C).
 * - Charge: 1 Ah = 1 A for 3600 s (definition of the ampere-hour).
 * - Degrees Fahrenheit: F = C * 9/5 + 32; C = K - 273.15 (SI brochure).
 * - Number formatting: the C library's printf as the reference.
 * - The JEITA zone scheme 0, 10, 45, 60 C with half current when cool and
 *   4.10 V per cell when warm: from memory of the guideline as charger
 *   ICs implement it.
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "synth.h"
#include "ts.h"

struct sums;

static void near(double got, double want, double tol);
static void still_pack(struct synth_pack *p, double temp_c);
static void run_fleet(const struct synth_conf *c,
	    void (*check)(struct synth_dev *, const struct synth_sample *,
	    void *), void *ctx);
static void sum_sample(struct synth_dev *d, const struct synth_sample *s,
	    void *ctx);

static void
near(double got, double want, double tol)
{
	if (!(fabs(got - want) <= tol))
		fail_msg("got %.12g, want %.12g (tolerance %g)", got, want,
		    tol);
}

/* A pack whose temperature does not move: a huge heat capacity. */
static void
still_pack(struct synth_pack *p, double temp_c)
{
	synth_pack_init(p, 14.0, 0.1, 0.04, 30.0, temp_c);
	p->heat_cap = 1e15;
}

/* xoshiro256** from the state {1, 2, 3, 4}: the published test vector. */
static void
test_xoshiro_vector(void **state)
{
	static const uint64_t want[10] = {
		11520ULL, 0ULL, 1509978240ULL, 1215971899390074240ULL,
		1216172134540287360ULL, 607988272756665600ULL,
		16172922978634559625ULL, 8476171486693032832ULL,
		10595114339597558777ULL, 2904607092377533576ULL
	};
	struct synth_rng r;
	int i;

	(void)state;
	memset(&r, 0, sizeof(r));
	r.s[0] = 1;
	r.s[1] = 2;
	r.s[2] = 3;
	r.s[3] = 4;
	for (i = 0; i < 10; i++)
		assert_true(synth_rng_next(&r) == want[i]);
}

/* splitmix64 from 0: 0xe220a8397b1dcdaf, 0x6e789e6aa1b965f4, ... */
static void
test_splitmix_vector(void **state)
{
	uint64_t x = 0;

	(void)state;
	assert_true(synth_splitmix64(&x) == 0xe220a8397b1dcdafULL);
	assert_true(synth_splitmix64(&x) == 0x6e789e6aa1b965f4ULL);
	assert_true(synth_splitmix64(&x) == 0x06c45d188009454fULL);
}

static void
test_rng_streams(void **state)
{
	struct synth_rng a, b, c;
	int i, same = 0;

	(void)state;
	synth_rng_seed(&a, 42, 3);
	synth_rng_seed(&b, 42, 3);
	synth_rng_seed(&c, 42, 4);
	for (i = 0; i < 1000; i++) {
		uint64_t x = synth_rng_next(&a);

		assert_true(x == synth_rng_next(&b));
		same += x == synth_rng_next(&c);
	}
	assert_int_equal(same, 0);
	synth_rng_seed(&c, 43, 3);
	synth_rng_seed(&a, 42, 3);
	assert_true(synth_rng_next(&a) != synth_rng_next(&c));
}

static void
test_rng_moments(void **state)
{
	struct synth_rng r;
	const int n = 200000;
	double s = 0, s2 = 0, g = 0, g2 = 0, u, z;
	int i;

	(void)state;
	synth_rng_seed(&r, 7, 1);
	for (i = 0; i < n; i++) {
		u = synth_rng_unif(&r);
		assert_true(u >= 0 && u < 1);
		s += u;
		s2 += u * u;
		z = synth_rng_gauss(&r);
		g += z;
		g2 += z * z;
	}
	near(s / n, 0.5, 5 * sqrt(1.0 / 12 / n));
	near(s2 / n - (s / n) * (s / n), 1.0 / 12, 5 * 0.0745 / sqrt(n));
	near(g / n, 0.0, 5 / sqrt(n));
	near(g2 / n, 1.0, 5 * sqrt(2.0 / n));
}

static void
test_ocv_curve(void **state)
{
	double s, prev = 0, h = 1e-6, d;

	(void)state;
	near(synth_ocv_cell(0.0), SYNTH_VMIN_CELL, 1e-6);
	near(synth_ocv_cell(1.0), SYNTH_VMAX_CELL, 1e-6);
	for (s = 0; s <= 1.0 + 1e-9; s += 0.001) {
		double u = synth_ocv_cell(s);

		if (s > 0)
			assert_true(u > prev);
		prev = u;
		d = (synth_ocv_cell(s + h) - synth_ocv_cell(s - h)) / (2 * h);
		near(synth_docv_cell(s), d, 1e-5);
	}
	/* The middle is NMC-like: 3.6..3.8 V at 50 %. */
	assert_true(synth_ocv_cell(0.5) > 3.6 && synth_ocv_cell(0.5) < 3.8);
}

static void
test_arrhenius(void **state)
{
	double ea = 30000.0, rg = 8.314462618, t, want;

	(void)state;
	near(synth_arrhenius(ea, 25.0), 1.0, 1e-15);
	near(synth_arrhenius(ea, 45.0), 2.1400, 5e-4);
	for (t = -20; t <= 60; t += 5) {
		want = exp(-ea / (rg * (t + 273.15))) /
		    exp(-ea / (rg * 298.15));
		near(synth_arrhenius(ea, t), want, 1e-12 * want);
	}
	/* A pack's resistance falls by the same factor. */
	{
		struct synth_pack p;

		still_pack(&p, 0.0);
		near(synth_pack_r0(&p) * synth_arrhenius(SYNTH_EA_R, 0.0),
		    0.1, 1e-12);
	}
}

/* Constant current from rest: OCV + I R0 + I R1 (1 - exp(-t / tau)). */
static void
test_rc_step(void **state)
{
	struct synth_pack p;
	struct synth_env e = { 25.0, 1.0, 0.0 };
	double i = -7.0, t = 0, v, want;
	int k;

	(void)state;
	still_pack(&p, 25.0);
	p.soc = 0.6;
	for (k = 1; k <= 120; k++) {
		v = synth_pack_step(&p, i, 1.0, &e);
		t += 1.0;
		want = SYNTH_CELLS * synth_ocv_cell(p.soc) + i * 0.1 +
		    i * 0.04 * (1 - exp(-t / 30.0));
		near(v, want, 1e-9);
	}
	near(synth_pack_rstep25(&p, 10.0), 0.1 + 0.04 * (1 - exp(-1.0 / 3)),
	    1e-12);
}

static void
test_charge_balance(void **state)
{
	struct synth_pack p;
	struct synth_env e = { 20.0, 1.6, 0.0 };
	struct synth_rng r;
	double ah = 0, soc0, i;
	int k;

	(void)state;
	synth_pack_init(&p, 13.7, 0.11, 0.04, 35.0, 20.0);
	p.soc = 0.5;
	soc0 = p.soc;
	synth_rng_seed(&r, 1, 1);
	for (k = 0; k < 5000; k++) {
		i = synth_rng_range(&r, -10, 10);
		synth_pack_step(&p, i, 7.0, &e);
		ah += i * 7.0 / 3600.0;
	}
	near((p.soc - soc0) * 13.7, ah, 1e-9);
}

static void
test_cooling(void **state)
{
	struct synth_pack p;
	struct synth_env e = { -5.0, 1.6, 0.0 };
	double t = 0;
	int k;

	(void)state;
	synth_pack_init(&p, 14.0, 0.1, 0.04, 30.0, 20.0);
	for (k = 0; k < 500; k++) {
		synth_pack_step(&p, 0.0, 10.0, &e);
		t += 10.0;
		near(p.temp_c, -5.0 + 25.0 * exp(-1.6 * t / 3200.0), 1e-9);
	}
}

/* Self-heating settles where I^2 (R0 + R1) at that temperature leaves. */
static void
test_self_heating(void **state)
{
	struct synth_pack p;
	struct synth_env e = { 10.0, 2.0, 0.0 };
	double i = 5.0, tf, r;
	int k;

	(void)state;
	synth_pack_init(&p, 1e6, 0.1, 0.04, 30.0, 10.0);	/* SoC stays */
	p.soc = 0.5;
	for (k = 0; k < 20000; k++)
		synth_pack_step(&p, i, 10.0, &e);
	tf = p.temp_c;
	r = synth_pack_r0(&p) + synth_pack_r1(&p);
	near(tf, 10.0 + i * i * r / 2.0, 1e-6);
	assert_true(tf > 10.5);
}

static void
test_growth(void **state)
{
	struct synth_pack p;
	struct synth_env e = { 25.0, 1.0, 0.0 };
	int k;

	(void)state;
	still_pack(&p, 25.0);
	p.k_cal = 1e-8;
	for (k = 0; k < 1000; k++)
		synth_pack_step(&p, 0.0, 100.0, &e);
	near(p.growth, 1e-8 * 1e5, 1e-15);
	still_pack(&p, 45.0);
	p.k_cal = 1e-8;
	p.soc = 0.5;
	for (k = 0; k < 1000; k++)
		synth_pack_step(&p, 0.0, 100.0, &e);
	near(p.growth, 1e-3 * (0.3 + 0.7 * 0.25) * synth_arrhenius(50000,
	    45.0), 1e-12);
	/* One equivalent full cycle at 25 C: k_cyc. */
	still_pack(&p, 25.0);
	p.k_cyc = 0.001;
	p.soc = 0.9;
	for (k = 0; k < 360; k++)
		synth_pack_step(&p, -14.0, 10.0, &e);
	for (k = 0; k < 360; k++)
		synth_pack_step(&p, 14.0, 10.0, &e);
	near(p.growth, 0.001, 1e-12);
}

/* The current for a target voltage lands there within a millivolt. */
static void
test_current_for(void **state)
{
	struct synth_pack p;
	struct synth_env e = { 25.0, 1.6, 0.0 };
	double i, v;

	(void)state;
	synth_pack_init(&p, 14.0, 0.11, 0.04, 35.0, 25.0);
	p.soc = 0.9;
	p.v_rc = 0.2;
	i = synth_pack_current_for(&p, 42.0, 10.0);
	v = synth_pack_step(&p, i, 10.0, &e);
	near(v, 42.0, 1e-3);
	p.soc = 0.03;
	p.v_rc = -0.3;
	i = synth_pack_current_for(&p, SYNTH_VMIN, 10.0);
	assert_true(i < 0);
	v = synth_pack_step(&p, i, 10.0, &e);
	near(v, SYNTH_VMIN, 1e-3);
}

/* CC, then CV, termination below I_TERM, re-start below V_RESTART. */
static void
test_charger_cccv(void **state)
{
	static const struct synth_charger c = {
		"t", 2.8, 42.0, 0.7, 41.4, 1, 10.0, 0.0
	};
	struct synth_pack p;
	struct synth_env e = { 25.0, 50.0, 0.0 };	/* stays near 25 C */
	int st = SYNTH_CH_CHARGING, ev, k, cv = 0, term = -1, restart = -1;
	double i, vmax = 0;

	(void)state;
	synth_pack_init(&p, 14.0, 0.11, 0.04, 35.0, 25.0);
	p.soc = 0.2;
	p.v = SYNTH_CELLS * synth_ocv_cell(0.2);
	for (k = 0; k < 4 * 8640 && restart < 0; k++) {
		i = synth_charger_current(&c, &p, &st, 0.2, 10.0, &ev);
		if (st == SYNTH_CH_CHARGING && term < 0) {
			assert_true(i <= 2.8 - 0.2 + 1e-12);
			if (i < 2.6 - 1e-9)
				cv = 1;
		}
		if (ev == 1) {
			assert_int_equal(term, -1);
			term = k;
			assert_true(st == SYNTH_CH_DONE);
		}
		if (ev == 2) {
			assert_true(term >= 0);
			/* The pack came down to the re-start voltage. */
			assert_true(p.v < 41.4);
			restart = k;
		}
		if (st == SYNTH_CH_DONE && ev == 0)
			assert_true(p.v >= 41.4);
		synth_pack_step(&p, i, 10.0, &e);
		if (p.v > vmax)
			vmax = p.v;
	}
	assert_true(cv);
	assert_true(term > 0);
	assert_true(restart > term);
	assert_true(vmax <= 42.0 + 1e-3);
	/* Resting under 0.2 A, the pack had to lose charge first. */
	assert_true(restart - term > 100);
}

static void
test_charger_jeita(void **state)
{
	static const struct synth_charger j = {
		"j", 4.0, 42.0, 0.7, 41.4, 1, -273.15, 0.0
	};
	static const struct synth_charger held = {
		"h", 4.0, 42.0, 0.7, 41.4, 1, 10.0, 0.0
	};
	static const struct synth_charger open = {
		"o", 4.0, 42.0, 0.7, 41.4, 0, -273.15, 0.0
	};
	struct synth_pack p;
	int st, ev;
	double i;

	(void)state;
	synth_pack_init(&p, 14.0, 0.11, 0.04, 35.0, 5.0);
	p.soc = 0.3;
	st = SYNTH_CH_CHARGING;
	near(synth_charger_current(&j, &p, &st, 0.0, 10.0, &ev), 2.0, 1e-12);
	near(synth_charger_current(&held, &p, &st, 0.1, 10.0, &ev), -0.1,
	    1e-12);
	near(synth_charger_current(&open, &p, &st, 0.0, 10.0, &ev), 4.0,
	    1e-12);
	p.temp_c = -1.0;
	near(synth_charger_current(&j, &p, &st, 0.1, 10.0, &ev), -0.1, 1e-12);
	near(synth_charger_current(&open, &p, &st, 0.0, 10.0, &ev), 4.0,
	    1e-12);
	p.temp_c = 61.0;
	near(synth_charger_current(&j, &p, &st, 0.0, 10.0, &ev), 0.0, 1e-12);
	/* Warm: 4.10 V per cell; a pack resting at 41.53 V gets nothing. */
	p.temp_c = 50.0;
	p.soc = 0.97;
	p.v = SYNTH_CELLS * synth_ocv_cell(p.soc);
	assert_true(p.v > 41.0);
	i = synth_charger_current(&j, &p, &st, 0.0, 10.0, &ev);
	assert_true(st == SYNTH_CH_DONE && ev == 3 && i == 0.0);
	/* Nor does it start again: the re-start gap follows to 40.4 V. */
	i = synth_charger_current(&j, &p, &st, 0.0, 10.0, &ev);
	assert_true(st == SYNTH_CH_DONE && ev == 0);
	i = synth_charger_current(&open, &p, &st, 0.0, 10.0, &ev);
	assert_true(ev == 0);
	st = SYNTH_CH_CHARGING;
	i = synth_charger_current(&open, &p, &st, 0.0, 10.0, &ev);
	assert_true(i > 0.7);
}

static void
test_fmt_numbers(void **state)
{
	static const long v[] = {
		0, 1, -1, 9, 10, -10, 12345, -32768, 65535, 1768458600000L,
		-999, 5, -5, 100, 1000
	};
	char got[64], want[64];
	size_t k, n;

	(void)state;
	for (k = 0; k < sizeof(v) / sizeof(v[0]); k++) {
		n = synth_fmt_long(got, v[k]);
		got[n] = '\0';
		snprintf(want, sizeof(want), "%ld", v[k]);
		assert_string_equal(got, want);
		n = synth_fmt_fixed(got, v[k], 3, '.');
		got[n] = '\0';
		snprintf(want, sizeof(want), "%s%ld.%03ld", v[k] < 0 ? "-" : "",
		    labs(v[k]) / 1000, labs(v[k]) % 1000);
		assert_string_equal(got, want);
		n = synth_fmt_fixed(got, v[k], 2, ',');
		got[n] = '\0';
		snprintf(want, sizeof(want), "%.2f", (double)v[k] / 100);
		want[strlen(want) - 3] = ',';
		if (strcmp(want, "-0,00") == 0)
			strcpy(want, "0,00");
		assert_string_equal(got, want);
	}
	n = synth_fmt_fixed(got, -120, 3, ',');
	got[n] = '\0';
	assert_string_equal(got, "-0,120");
}

static void
test_fmt_local(void **state)
{
	char buf[64];
	cw_time t, back;
	size_t n;

	(void)state;
	/* The brief's example: 07:30 at +01:00 is 06:30 UTC. */
	assert_int_equal(ts_parse("2026-01-15T06:30:00Z", 20, TS_ISO, 0, &t),
	    0);
	n = synth_fmt_local(buf, t, 3600);
	buf[n] = '\0';
	assert_string_equal(buf, "2026-01-15T07:30:00+01:00");
	assert_int_equal(ts_parse(buf, n, TS_ISO, 0, &back), 0);
	assert_true(back == t);
	/* Day rollover, negative offsets, before 1970. */
	assert_int_equal(ts_parse("2026-12-31T23:30:00Z", 20, TS_ISO, 0, &t),
	    0);
	n = synth_fmt_local(buf, t, 5400);
	buf[n] = '\0';
	assert_string_equal(buf, "2027-01-01T01:00:00+01:30");
	n = synth_fmt_local(buf, t, -5 * 3600);
	buf[n] = '\0';
	assert_string_equal(buf, "2026-12-31T18:30:00-05:00");
	n = synth_fmt_local(buf, -1 * CW_US_PER_S, 0);
	buf[n] = '\0';
	assert_string_equal(buf, "1969-12-31T23:59:59+00:00");
}

static void
test_fmt_rows(void **state)
{
	struct synth_dev d;
	struct synth_sample s;
	char buf[SYNTH_LINEMAX + 1];
	size_t n;

	(void)state;
	memset(&d, 0, sizeof(d));
	memcpy(d.name, "EB-0042", 8);
	d.namelen = 7;
	assert_int_equal(ts_parse("2026-01-15T06:30:00Z", 20, TS_ISO, 0, &s.t),
	    0);
	s.mv = 39812;
	s.ma = 2350;	/* charging */
	s.dk = 2811;	/* 281.1 K = 7.95 C = 46.31 F */
	s.soc10 = 835;
	n = synth_fmt_a(buf, &d, &s, s.t, -1);
	buf[n] = '\0';
	assert_string_equal(buf, "1768458600000,EB-0042,39812,-2350,2811,83.5");
	n = synth_fmt_b(buf, &d, &s, s.t, 3600, -1);
	buf[n] = '\0';
	assert_string_equal(buf,
	    "2026-01-15T07:30:00+01:00;EB-0042;39,812;2,350;46,31;83,5");
	near((2811 / 10.0 - 273.15) * 9.0 / 5.0 + 32.0, 46.31, 1e-9);
	d.gauge_int = 1;
	s.soc10 = 830;
	s.dk = 2531;	/* -20.05 C = -4.09 F */
	s.ma = -120;
	n = synth_fmt_b(buf, &d, &s, s.t, 3600, -1);
	buf[n] = '\0';
	assert_string_equal(buf,
	    "2026-01-15T07:30:00+01:00;EB-0042;39,812;-0,120;-4,09;83");
	n = synth_fmt_a(buf, &d, &s, s.t, 1);
	buf[n] = '\0';
	assert_string_equal(buf, "1768458600000,EB-0042,39812,-32768,2531,83");
	n = synth_fmt_a(buf, &d, &s, s.t, 2);
	buf[n] = '\0';
	assert_string_equal(buf, "1768458600000,EB-0042,39812,120,65535,83");
	n = synth_fmt_b(buf, &d, &s, s.t, 3600, 3);
	buf[n] = '\0';
	assert_string_equal(buf,
	    "2026-01-15T07:30:00+01:00;EB-0042;39,812;-0,120;-4,09;255");
}

static void
test_faults_parse(void **state)
{
	double r[SYNTH_NFAULT];
	const char *err = NULL;
	int k;

	(void)state;
	assert_int_equal(synth_faults_parse("none", r, &err), 0);
	for (k = 0; k < SYNTH_NFAULT; k++)
		assert_true(r[k] == 0);
	assert_int_equal(synth_faults_parse("none,dup=0.01,gap=2", r, &err),
	    0);
	assert_true(r[SYNTH_F_DUP] == 0.01 && r[SYNTH_F_GAP] == 2 &&
	    r[SYNTH_F_LATE] == 0);
	assert_int_equal(synth_faults_parse("default,jump=0", r, &err), 0);
	assert_true(r[SYNTH_F_JUMP] == 0 &&
	    r[SYNTH_F_DUP] == synth_fault_default[SYNTH_F_DUP]);
	assert_int_equal(synth_faults_parse("dupe=0.1", r, &err), -1);
	assert_int_equal(synth_faults_parse("dup=x", r, &err), -1);
	assert_int_equal(synth_faults_parse("dup=1.5", r, &err), -1);
	assert_int_equal(synth_faults_parse("dup=-0.1", r, &err), -1);
	assert_int_equal(synth_faults_parse("dup", r, &err), -1);
	assert_int_equal(synth_faults_parse("dup=0.6,trunc=0.6", r, &err),
	    -1);
	assert_int_equal(synth_faults_parse("", r, &err), -1);
	assert_non_null(err);
}

/* Run a small fleet for DAYS and hand every sample to CHECK. */
static void
run_fleet(const struct synth_conf *c, void (*check)(struct synth_dev *,
    const struct synth_sample *, void *), void *ctx)
{
	struct synth_fleet *f = synth_fleet_new(c, NULL);
	struct synth_sample s;
	long day, slot, i;

	for (day = 0; day < c->ndays; day++) {
		synth_fleet_day(f, day);
		for (slot = 0; slot < synth_fleet_rows_per_day(f); slot++)
			for (i = 0; i < synth_fleet_ndev(f); i++) {
				struct synth_dev *d = synth_fleet_dev(f, i);

				synth_fleet_sample(f, d, slot, &s);
				check(d, &s, ctx);
			}
	}
	synth_fleet_finish(f);
	synth_fleet_free(f);
}

struct sums {
	uint64_t h;
	long n;
	double vmin, vmax, smin, smax;
	cw_time last[16];
};

static void
sum_sample(struct synth_dev *d, const struct synth_sample *s, void *ctx)
{
	struct sums *m = ctx;
	uint64_t x = (uint64_t)s->t ^ ((uint64_t)s->mv << 1) ^
	    ((uint64_t)s->ma << 17) ^ ((uint64_t)s->dk << 33) ^
	    ((uint64_t)s->soc10 << 49) ^ (uint64_t)d->idx;

	m->h = (m->h ^ x) * 0x100000001b3ULL;
	m->n++;
	if (d->pack.v < m->vmin)
		m->vmin = d->pack.v;
	if (d->pack.v > m->vmax)
		m->vmax = d->pack.v;
	if (d->pack.soc < m->smin)
		m->smin = d->pack.soc;
	if (d->pack.soc > m->smax)
		m->smax = d->pack.soc;
	/* Samples of a device come at its period, in time order. */
	if (m->last[d->idx] != 0)
		assert_true(s->t - m->last[d->idx] == 10 * CW_US_PER_S);
	m->last[d->idx] = s->t;
}

static void
test_fleet_deterministic(void **state)
{
	struct synth_conf c;
	struct sums a, b;

	(void)state;
	synth_conf_default(&c);
	c.ndev = 8;
	c.ndays = 2;
	memset(&a, 0, sizeof(a));
	memset(&b, 0, sizeof(b));
	a.vmin = b.vmin = a.smin = b.smin = 1e9;
	run_fleet(&c, sum_sample, &a);
	run_fleet(&c, sum_sample, &b);
	assert_true(a.h == b.h);
	assert_int_equal(a.n, 8 * 2 * 8640);
	/* Physical limits: 3.0..4.2 V per cell, SoC inside 0..1. */
	assert_true(a.vmin >= SYNTH_VMIN - 2e-3);
	assert_true(a.vmax <= SYNTH_VMAX + 2e-3);
	assert_true(a.smin > 0 && a.smax < 1.0);
	c.seed = 2;
	memset(&b, 0, sizeof(b));
	b.vmin = b.smin = 1e9;
	run_fleet(&c, sum_sample, &b);
	assert_true(a.h != b.h);
}

/* The mix 3,3,3,1 over 10 packs: 3, 3, 3 and 1, and truth that adds up. */
static void
test_fleet_mix_and_balance(void **state)
{
	struct synth_conf c;
	struct synth_fleet *f;
	struct synth_sample s;
	int count[SYNTH_NPROFILE] = { 0 };
	long i, slot, day;

	(void)state;
	synth_conf_default(&c);
	c.ndays = 2;
	f = synth_fleet_new(&c, NULL);
	for (day = 0; day < c.ndays; day++) {
		synth_fleet_day(f, day);
		for (slot = 0; slot < synth_fleet_rows_per_day(f); slot++)
			for (i = 0; i < synth_fleet_ndev(f); i++)
				synth_fleet_sample(f, synth_fleet_dev(f, i),
				    slot, &s);
	}
	for (i = 0; i < synth_fleet_ndev(f); i++) {
		struct synth_dev *d = synth_fleet_dev(f, i);
		const struct synth_truth *t = &d->tr;

		count[d->profile]++;
		if (i > 0)
			assert_true(synth_fleet_dev(f, i - 1)->phase_s <=
			    d->phase_s);
		/* Charge in minus charge out is the SoC change (Ah): each
		 * step's charge is its SoC change times the capacity then,
		 * which lies between the end's and the start's, so the
		 * balance at the end's capacity can miss by the throughput
		 * times the fade relative to the end. */
		near(t->charge_ah - t->discharge_ah, (t->soc_end -
		    t->soc_start) / 100.0 * d->pack.cap_ah, 1e-9 +
		    (t->charge_ah + t->discharge_ah) * d->pack.fade /
		    (1.0 - d->pack.fade));
		assert_true(d->pack.fade > 0 && d->pack.fade < 0.01);
		near(d->pack.cap_ah, d->pack.cap0_ah * (1.0 - d->pack.fade),
		    1e-12);
		assert_true(t->rows == 2 * 8640);
		assert_true(t->charge_ah > 0 && t->discharge_ah > 0);
		assert_true(d->pack.growth > 0);
	}
	assert_int_equal(count[SYNTH_DEEP], 3);
	assert_int_equal(count[SYNTH_TOPUP], 3);
	assert_int_equal(count[SYNTH_IDLE], 3);
	assert_int_equal(count[SYNTH_NOCUTOFF], 1);
	synth_fleet_finish(f);
	synth_fleet_free(f);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_xoshiro_vector),
		cmocka_unit_test(test_splitmix_vector),
		cmocka_unit_test(test_rng_streams),
		cmocka_unit_test(test_rng_moments),
		cmocka_unit_test(test_ocv_curve),
		cmocka_unit_test(test_arrhenius),
		cmocka_unit_test(test_rc_step),
		cmocka_unit_test(test_charge_balance),
		cmocka_unit_test(test_cooling),
		cmocka_unit_test(test_self_heating),
		cmocka_unit_test(test_growth),
		cmocka_unit_test(test_current_for),
		cmocka_unit_test(test_charger_cccv),
		cmocka_unit_test(test_charger_jeita),
		cmocka_unit_test(test_fmt_numbers),
		cmocka_unit_test(test_fmt_local),
		cmocka_unit_test(test_fmt_rows),
		cmocka_unit_test(test_faults_parse),
		cmocka_unit_test(test_fleet_deterministic),
		cmocka_unit_test(test_fleet_mix_and_balance),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
