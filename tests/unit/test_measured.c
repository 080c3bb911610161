/*
 * test_measured.c: the measured fade and the scale fit (lib/measured.c).
 *
 * The measured fade is -slope * days / R * 100 over cw-wear's span
 * (derived by hand below); the fit must find scales it was built from,
 * the model's own fade at known scales taken as the measurement.  The
 * file reader's error paths exit the process and are CLI cases
 * (tests/cli/cw-wear/measured.sh).
 */
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <math.h>
#include <string.h>
#include <cmocka.h>

#include "measured.h"

#define DAY (86400 * CW_US_PER_S)

static void
pack(struct meas_pack *p, int days0, int days1, double slope, double lo,
    double hi)
{
	memset(p, 0, sizeof(*p));
	p->have_slope = 1;
	p->first = days0 * DAY;
	p->last = days1 * DAY;
	p->cap_start_ah = 10;
	p->rated_ah = 20;
	p->slope = slope;
	p->slope_lo = lo;
	p->slope_hi = hi;
}

static void
test_fade(void **state)
{
	struct meas_pack p;
	double x;

	(void)state;
	/* 0.02 Ah a day over 10 days of 14 Ah: 1.428571 points. */
	pack(&p, 1, 9, -0.02, -0.025, -0.015);
	assert_int_equal(meas_fade(&p, 0, 10 * DAY, 14, &x), MEAS_OK);
	assert_true(fabs(x - 0.02 * 10 / 14 * 100) < 1e-12);
	/* No rated capacity given: the file's rated_ah, then its start. */
	assert_int_equal(meas_fade(&p, 0, 10 * DAY, 0, &x), MEAS_OK);
	assert_true(fabs(x - 1.0) < 1e-12);
	p.rated_ah = CW_MISSING;
	assert_int_equal(meas_fade(&p, 0, 10 * DAY, 0, &x), MEAS_OK);
	assert_true(fabs(x - 2.0) < 1e-12);
	/* A rising capacity with a sure slope is a negative fade. */
	pack(&p, 1, 9, 0.02, 0.01, 0.03);
	assert_int_equal(meas_fade(&p, 0, 10 * DAY, 14, &x), MEAS_OK);
	assert_true(x < 0);
}

static void
test_not_known(void **state)
{
	struct meas_pack p;
	double x;

	(void)state;
	assert_int_equal(meas_fade(NULL, 0, DAY, 14, &x), MEAS_NOROW);
	assert_false(cw_isnum(x));
	pack(&p, 0, 10, -0.02, -0.03, 0.0);
	assert_int_equal(meas_fade(&p, 0, 10 * DAY, 14, &x), MEAS_UNSURE);
	pack(&p, 0, 10, -0.02, -0.03, -0.01);
	p.have_slope = 0;
	assert_int_equal(meas_fade(&p, 0, 10 * DAY, 14, &x), MEAS_NOSLOPE);
	/* Cover: exactly half is enough, less is not. */
	pack(&p, 0, 5, -0.02, -0.03, -0.01);
	assert_int_equal(meas_fade(&p, 0, 10 * DAY, 14, &x), MEAS_OK);
	p.last = 5 * DAY - 1;
	assert_int_equal(meas_fade(&p, 0, 10 * DAY, 14, &x), MEAS_SPAN);
	/* Estimates wholly outside the span. */
	pack(&p, 20, 30, -0.02, -0.03, -0.01);
	assert_int_equal(meas_fade(&p, 0, 10 * DAY, 14, &x), MEAS_SPAN);
}

static void
test_fit_recovers(void **state)
{
	struct wear_conf c, t;
	struct wear_acc acc[4];
	struct meas_obs o[4];
	struct meas_fit f;
	struct wear_result x;
	/* Unscaled cycle and calendar damage of four packs. */
	static const double cyc[4] = { 2e-3, 1e-4, 8e-4, 3e-3 };
	static const double cal[4] = { 1e-4, 1.5e-3, 6e-4, 2e-4 };
	int k;

	(void)state;
	wear_conf_default(&c);
	t = c;
	t.cycle_scale = 3.0;
	t.cal_scale = 0.4;
	memset(acc, 0, sizeof(acc));
	for (k = 0; k < 4; k++) {
		acc[k].have = 1;
		acc[k].rows = 2;
		acc[k].last = 30 * DAY;
		acc[k].model_s = 30 * 86400.0;
		acc[k].cyc[WEAR_FULL] = acc[k].cyc[WEAR_REF] = cyc[k];
		acc[k].cal[WEAR_FULL] = acc[k].cal[WEAR_REF] = cal[k];
		o[k].acc = &acc[k];
		o[k].prior = NULL;
		o[k].capacity_ah = 0;
		wear_report(&t, &acc[k], NULL, 0, &x);
		o[k].measured_pct = x.fade_pct;
	}
	assert_int_equal(meas_fit_scales(&c, o, 4, &f), 0);
	assert_int_equal(f.common, 0);
	assert_true(fabs(f.scale[1][0] / 3.0 - 1) < 1e-6);
	assert_true(fabs(f.scale[1][1] / 0.4 - 1) < 1e-6);
	assert_true(f.rms[1] < 1e-9);
	assert_true(f.rms[0] > 0.1);
	/* One pack is no fit. */
	assert_int_equal(meas_fit_scales(&c, o, 1, &f), -1);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_fade),
		cmocka_unit_test(test_not_known),
		cmocka_unit_test(test_fit_recovers),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
