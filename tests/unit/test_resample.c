/*
 * test_resample.c: the grid of lib/resample.h.  Expected values are
 * worked by hand from the rules in resample.h: linear interpolation of
 * voltage, temperature and SoC at a grid point; current the mean over
 * (g - step, g] of the stream's piecewise-constant current (a row's
 * current holds over the interval ending at it); the charge of the grid
 * equal to the charge of the input (the rectangle rule of coulomb
 * counting, charge = sum of I dt, both sides).
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
#include "resample.h"

#define S(x) ((cw_time)(x) * CW_US_PER_S)
#define MAXPTS 16384

struct sink {
	struct rs_point p[MAXPTS];
	size_t n;
};

static void
collect(void *ctx, const struct rs_point *p)
{
	struct sink *k = ctx;

	assert_true(k->n < MAXPTS);
	k->p[k->n++] = *p;
}

static void
push(struct rs_state *s, struct sink *k, double t, double v, double i,
    cw_time step, cw_time gap)
{
	struct rs_point p;

	p.t = S(0) + (cw_time)llround(t * CW_US_PER_S);
	p.v = v;
	p.i = i;
	p.temp = 20 + t / 100;
	p.soc = 50 + t / 60;
	rs_push(s, &p, step, gap, collect, k);
}

/*
 * 2 A from 5 s to 595 s every 10 s onto a 60 s grid: points at 0 (the
 * first sample's values and current), 60, ..., 540 and 600 (the last
 * sample's values).  (0, 60] holds charge over (5, 60] only: 2 * 55 / 60
 * A; (540, 600] over (540, 595]: likewise; the others 2 A.  The voltage
 * 3 + t/1000 is linear, so the grid's voltage is exactly 3 + g/1000.
 */
static void
test_grid(void **state)
{
	static struct sink k;
	struct rs_state s;
	double t, q = 0;
	size_t j;

	(void)state;
	memset(&s, 0, sizeof(s));
	k.n = 0;
	for (t = 5; t <= 595; t += 10)
		push(&s, &k, t, 3 + t / 1000, 2, S(60), S(900));
	rs_flush(&s, S(60), collect, &k);
	assert_int_equal(k.n, 11);
	assert_true(k.p[0].t == S(0));
	assert_float_equal(k.p[0].v, 3.005, 1e-12);
	assert_float_equal(k.p[0].i, 2, 1e-12);
	assert_float_equal(k.p[1].i, 2.0 * 55 / 60, 1e-12);
	for (j = 1; j < 10; j++) {
		assert_true(k.p[j].t == S(60 * j));
		assert_float_equal(k.p[j].v, 3 + 60.0 * j / 1000, 1e-12);
		assert_float_equal(k.p[j].temp, 20 + 60.0 * j / 100, 1e-12);
		assert_float_equal(k.p[j].soc, 50 + 60.0 * j / 60, 1e-12);
		if (j > 1)
			assert_float_equal(k.p[j].i, 2, 1e-12);
	}
	assert_true(k.p[10].t == S(600));
	assert_float_equal(k.p[10].v, 3.595, 1e-12);
	assert_float_equal(k.p[10].i, 2.0 * 55 / 60, 1e-12);
	/* 59 intervals of 10 s at 2 A: 1180 As, and so on the grid. */
	for (j = 1; j < k.n; j++)
		q += k.p[j].i * 60;
	assert_float_equal(q, 1180, 1e-9);
}

/* A sample on a grid point is that point: nothing is interpolated. */
static void
test_on_grid(void **state)
{
	static struct sink k;
	struct rs_state s;

	(void)state;
	memset(&s, 0, sizeof(s));
	k.n = 0;
	push(&s, &k, 0, 3.7, 1, S(60), S(900));
	push(&s, &k, 60, 3.9, 1, S(60), S(900));
	push(&s, &k, 120, 3.8, -1, S(60), S(900));
	rs_flush(&s, S(60), collect, &k);
	assert_int_equal(k.n, 3);
	assert_float_equal(k.p[1].v, 3.9, 1e-12);
	assert_float_equal(k.p[1].i, 1, 1e-12);
	assert_float_equal(k.p[2].v, 3.8, 1e-12);
	assert_float_equal(k.p[2].i, -1, 1e-12);
}

/*
 * A gap longer than max_gap: no point inside it, and the grid starts
 * again at the point at or before the first sample after it (1980 s for
 * 2000 s), with that sample's values.
 */
static void
test_gap(void **state)
{
	static struct sink k;
	struct rs_state s;
	double t;
	size_t j, nafter = 0;

	(void)state;
	memset(&s, 0, sizeof(s));
	k.n = 0;
	for (t = 0; t <= 300; t += 10)
		push(&s, &k, t, 3.7, 1, S(60), S(900));
	for (t = 2000; t <= 2300; t += 10)
		push(&s, &k, t, 3.6, 1, S(60), S(900));
	rs_flush(&s, S(60), collect, &k);
	for (j = 0; j < k.n; j++) {
		assert_false(k.p[j].t > S(300) && k.p[j].t < S(1980));
		if (k.p[j].t >= S(1980))
			nafter++;
	}
	/* 1980, 2040, ..., 2280 and 2340 (at or after 2300). */
	assert_int_equal(nafter, 7);
	for (j = 0; j < k.n && k.p[j].t != S(1980); j++)
		;
	assert_true(j < k.n);
	assert_float_equal(k.p[j].v, 3.6, 1e-12);
}

/*
 * Irregular times and currents (a fixed pseudo-random sequence): the
 * grid's charge equals the input's to rounding, on any step.
 */
static void
test_charge_kept(void **state)
{
	static struct sink k;
	static const cw_time steps[] = { S(1), S(7), S(60), S(3600) };
	struct rs_state s;
	unsigned long x = 12345;
	double t, tprev, i, qin, qout;
	size_t j, m;

	(void)state;
	for (m = 0; m < sizeof(steps) / sizeof(steps[0]); m++) {
		memset(&s, 0, sizeof(s));
		k.n = 0;
		qin = 0;
		t = tprev = 3.25;
		x = 12345;
		for (j = 0; j < 400; j++) {
			x = x * 1103515245UL + 12345UL;
			i = (double)((x >> 8) % 2001) / 100 - 10;
			if (j > 0)
				qin += i * (t - tprev);
			push(&s, &k, t, 3.7, i, steps[m], S(900));
			tprev = t;
			x = x * 1103515245UL + 12345UL;
			t += 0.5 + (double)((x >> 8) % 300) / 10;
		}
		rs_flush(&s, steps[m], collect, &k);
		qout = 0;
		for (j = 1; j < k.n; j++)
			qout += k.p[j].i * (double)steps[m] / CW_US_PER_S;
		assert_float_equal(qout, qin, 1e-9 * (fabs(qin) + 1));
	}
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_grid),
		cmocka_unit_test(test_on_grid),
		cmocka_unit_test(test_gap),
		cmocka_unit_test(test_charge_kept),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
