/*
 * test_dwell.c: hours by SoC band and temperature band (lib/dwell.c).
 * Expected values are worked out by hand from linear interpolation
 * between rows (dwell.h) and the band edges of SPEC.md (cw-wear --dwell).
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <string.h>
#include <cmocka.h>

#include "dwell.h"

#define T0 ((cw_time)1767225600 * CW_US_PER_S)	/* 2026-01-01 */
#define MIN(m) ((cw_time)(m) * 60 * CW_US_PER_S)

static void
near(double got, double want, double tol)
{
	if (!(fabs(got - want) <= tol)) {
		print_error("got %.17g, want %.17g\n", got, want);
		fail();
	}
}

/* The temperature edges: T1, T2, 25, 35, T3 sorted, a repeat once. */
static void
test_edges(void **st)
{
	struct thermal_limits l;
	struct dwell_conf c;

	(void)st;
	thermal_limits_default(&l);
	dwell_conf_set(&c, &l, 0.05, MIN(15));
	assert_int_equal(c.ntemp, 6);
	near(c.temp_edge[0], 0, 0);
	near(c.temp_edge[4], 45, 0);
	assert_true(isnan(dwell_temp_lo(&c, 0)));
	assert_true(isnan(dwell_temp_hi(&c, 5)));
	near(dwell_temp_lo(&c, 3), 25, 0);
	/* T2 at 25 and T3 below 35: edges 0, 25, 30, 35. */
	l.t[1] = 25;
	l.t[2] = 30;
	dwell_conf_set(&c, &l, 0.05, MIN(15));
	assert_int_equal(c.ntemp, 5);
	near(c.temp_edge[1], 25, 0);
	near(c.temp_edge[2], 30, 0);
	near(c.temp_edge[3], 35, 0);
}

/*
 * 60 -> 100 % SoC at a steady 20 C in 40 minutes, charging: 80 % is
 * crossed half way, 95 % at 7/8; then a row without SoC, passed over,
 * then 20 min at 100 % resting but across it, a row charging (not idle);
 * then a 2 h gap (over the 45 min max_gap) held at 100 %, idle.  Edges:
 * a value on one belongs to the band above, 100 % to the top band.
 */
static void
test_split(void **st)
{
	struct thermal_limits l;
	struct dwell_conf c;
	struct dwell_dev d;

	(void)st;
	thermal_limits_default(&l);
	dwell_conf_set(&c, &l, 0.05, MIN(45));
	memset(&d, 0, sizeof(d));
	dwell_push(&d, &c, T0, 2, 20, 60);
	dwell_push(&d, &c, T0 + MIN(40), 2, 20, 100);
	dwell_push(&d, &c, T0 + MIN(50), 1, 20, CW_MISSING);
	dwell_push(&d, &c, T0 + MIN(60), 0, 20, 100);
	dwell_push(&d, &c, T0 + MIN(180), 0, 20, 100);
	/* SoC bands 3 (60-80), 4 (80-95), 5 (95-100); 10-25 C is band 2. */
	near(d.hours[3][2], 20.0 / 60, 1e-12);
	near(d.hours[4][2], 15.0 / 60, 1e-12);
	near(d.hours[5][2], (5.0 + 20 + 120) / 60, 1e-12);
	near(d.idle_hours[5][2], 2, 1e-12);
	near(d.covered_h, 3, 1e-12);
	assert_int_equal(d.rows_skipped, 1);
	/* At rest exactly on the 20 % edge, -10 C: band 1 and below T1. */
	memset(&d, 0, sizeof(d));
	dwell_push(&d, &c, T0, 0, -10, 20);
	dwell_push(&d, &c, T0 + MIN(6), 0.01, -10, 20);
	near(d.hours[1][0], 0.1, 1e-12);
	near(d.idle_hours[1][0], 0.1, 1e-12);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_edges),
		cmocka_unit_test(test_split),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
