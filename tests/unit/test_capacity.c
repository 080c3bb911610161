/*
 * test_capacity.c: segments, the coulomb-counted estimate, what ends a
 * segment, and the trend (capacity.h).
 *
 * References.
 * - Coulomb counting: charge is the time integral of the current (the
 *   handbook definition of the ampere-hour), in the rectangle reading of
 *   lib/charge.h: row k carries I_k (t_k - t_(k-1)).  Each case works the
 *   sum out by hand in its comment.
 * - The trend cases use lines with a known slope; the expected fade, SoH
 *   and end-of-life date follow from the line, worked out in the comments.
 * The packs and their logs are invented.
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "capacity.h"
#include "cw.h"
#include "dcir.h"

#define S	(CW_US_PER_S)
#define DAY	(86400 * S)
#define NA	CW_MISSING
#define T0	(1767225600LL * S)	/* 2026-01-01T00:00:00Z */

struct run {
	struct cap_conf c;
	struct cap_dev d;
	struct cap_counts n;
	struct cap_est e[16];
	int ne;
	cw_time t;
};

static void	start(struct run *r, double rated);
static void	row(struct run *r, cw_time dt, double i, double temp,
		    double soc);
static void	finish(struct run *r);
static void	ramp(struct run *r, int n, cw_time dt, double i, double soc0,
		    double cap, double step);
static void	near(double got, double want, double tol);

static void
near(double got, double want, double tol)
{
	if (!(fabs(got - want) <= tol))
		fail_msg("got %.12g, want %.12g (tolerance %g)", got, want,
		    tol);
}

static void
start(struct run *r, double rated)
{
	memset(r, 0, sizeof *r);
	cap_conf_default(&r->c);
	cap_dev_init(&r->d, rated);
	r->t = T0;
}

static void
row(struct run *r, cw_time dt, double i, double temp, double soc)
{
	r->t += dt;
	assert_true(r->ne < 16);
	r->ne += cap_feed(&r->c, &r->d, r->t, i, temp, soc, &r->n,
	    &r->e[r->ne]);
}

static void
finish(struct run *r)
{
	r->ne += cap_finish(&r->c, &r->d, &r->n, &r->e[r->ne]);
}

/*
 * N rows DT apart at current I of a pack of CAP Ah, SoC from SOC0 moving
 * exactly with the charge and shown to the gauge's STEP (floor(x/step +
 * 0.5) * step).
 */
static void
ramp(struct run *r, int n, cw_time dt, double i, double soc0, double cap,
    double step)
{
	double soc = soc0;
	int k;

	for (k = 0; k < n; k++) {
		soc += 100 * i * ((double)dt / S) / 3600 / cap;
		row(r, dt, i, 25, floor(soc / step + 0.5) * step);
	}
}

/*
 * A discharge of 10 A for 1 h at 36 s rows (100 rows) of a 20 Ah pack from
 * 90 %: 0.1 Ah, 0.5 % a row, so the tenth-percent gauge steps every row:
 * the first step is row 1 (89.5), the last row 100 (40.0); the charge from
 * row 1 (exclusive) to 100 is 99 rows of -10 A x 36 s = -9.9 Ah, over 49.5
 * points: 20 Ah exactly.  A rest row 10 minutes later ends it (longer
 * than max_rest).
 */
static void
test_discharge(void **state)
{
	struct run r;

	(void)state;
	start(&r, NA);
	row(&r, 0, 0, 25, 90);
	ramp(&r, 100, 36 * S, -10, 90, 20, 0.1);
	assert_int_equal(r.ne, 0);
	row(&r, 600 * S, 0, 25, 40);
	assert_int_equal(r.ne, 1);
	assert_int_equal(r.e[0].reason, CAP_OK);
	assert_int_equal(r.e[0].dir, -1);
	near(r.e[0].soc_from, 89.5, 1e-9);
	near(r.e[0].soc_to, 40, 1e-9);
	near(r.e[0].charge_ah, -9.9, 1e-9);
	near(r.e[0].capacity_ah, 20, 1e-9);
	near(r.e[0].temp_c, 25, 1e-9);
	assert_true(r.e[0].start == T0 + 36 * S);
	assert_true(r.e[0].end == T0 + 100 * 36 * S);
	assert_int_equal(r.e[0].rows, 100);
	/* The step rows' charge, 2 x 0.1 Ah, over 9.9 Ah. */
	near(r.e[0].resolution_pct, 100 * 0.2 / 9.9, 1e-9);
	assert_int_equal(r.n.n[CAP_OK], 1);
}

/*
 * A whole-percent gauge: 5 A charging a 14 Ah pack at 10 s rows moves
 * 0.0992 % a row, and the shown value steps about every 10 rows where the
 * true SoC crosses k + 0.5.  Measured between steps, the estimate is 14
 * Ah within the charge of the two step rows (resolution_pct); measured
 * from the first row to the last it would be off by up to a point in 40.
 */
static void
test_integer_gauge(void **state)
{
	struct run r;

	(void)state;
	start(&r, NA);
	row(&r, 0, 0, 25, 30);
	ramp(&r, 650, 10 * S, 5, 30.2, 14, 1);
	finish(&r);
	assert_int_equal(r.ne, 1);
	assert_int_equal(r.e[0].reason, CAP_OK);
	assert_true(fabs(r.e[0].capacity_ah / 14 - 1) * 100 <=
	    r.e[0].resolution_pct);
	near(r.e[0].capacity_ah, 14, 0.02);
}

/*
 * A pause inside a discharge: 3 minutes at 0.02 A (below min_current,
 * shorter than max_rest 5m) is part of the segment and its charge counts:
 * 20 rows of -10 A x 36 s (2 Ah, 10 points of a 20 Ah pack), 6 rows of
 * -0.02 A x 30 s (0.001 Ah, no step), 20 rows more.  Steps from the first
 * row to the last: 19 + 20 active rows and the pause: -3.9 - 0.001 Ah over
 * 19.5 points.  Then the same with a pause of 6 minutes: two segments,
 * each too short (swing).
 */
static void
test_pause(void **state)
{
	struct run r;
	int k;

	(void)state;
	start(&r, NA);
	r.c.min_swing = 5;
	row(&r, 0, 0, 25, 90);
	ramp(&r, 20, 36 * S, -10, 90, 20, 0.1);
	for (k = 0; k < 6; k++)
		row(&r, 30 * S, -0.02, 25, 80);
	ramp(&r, 20, 36 * S, -10, 80, 20, 0.1);
	finish(&r);
	assert_int_equal(r.ne, 1);
	assert_int_equal(r.e[0].reason, CAP_OK);
	near(r.e[0].charge_ah, -3.9 - 0.001, 1e-9);
	near(r.e[0].soc_from, 89.5, 1e-9);
	near(r.e[0].soc_to, 70, 1e-9);
	assert_int_equal(r.e[0].rows, 46);

	start(&r, NA);
	row(&r, 0, 0, 25, 90);
	ramp(&r, 20, 36 * S, -10, 90, 20, 0.1);
	for (k = 0; k < 12; k++)
		row(&r, 30 * S, -0.02, 25, 80);
	ramp(&r, 20, 36 * S, -10, 80, 20, 0.1);
	finish(&r);
	assert_int_equal(r.ne, 2);
	assert_int_equal(r.e[0].reason, CAP_SWING);
	assert_int_equal(r.e[1].reason, CAP_SWING);
	/* The first ends at its last active row, not in the pause. */
	assert_true(r.e[0].end == T0 + 20 * 36 * S);
}

/*
 * What ends a segment: after 30 rows of a discharge at 0.5 points a row
 * (90 to 75; steps from 89.5, 14.5 points), a gap, a row without SoC, one
 * outside the temperature window, a jump of 5 points (the rated 20 Ah
 * explains 0.5 a row), a row without current, or a charge row.  Each
 * gives two segments too short for min_swing 20 (the second of 35 rows,
 * 17 or 17.5 points), the first counted under the event; with min_swing
 * 10 both give estimates of 20 Ah (the second starts at the event row,
 * its boundary, or after it).
 */
static void
test_ends(void **state)
{
	static const int kinds[] = { CAP_GAP, CAP_NO_SOC, CAP_TEMP, CAP_JUMP,
	    CAP_NO_I, CAP_SWING };
	struct run r;
	size_t k;
	double after;
	int swing;

	(void)state;
	for (swing = 20; swing >= 10; swing -= 10)
		for (k = 0; k < sizeof kinds / sizeof kinds[0]; k++) {
			start(&r, 20);
			r.c.min_swing = swing;
			row(&r, 0, 0, 25, 90);
			ramp(&r, 30, 36 * S, -10, 90, 20, 0.1);
			after = 74.5;
			switch (kinds[k]) {
			case CAP_GAP:
				row(&r, 3600 * S, -10, 25, 74.5);
				break;
			case CAP_NO_SOC:
				row(&r, 36 * S, -10, 25, NA);
				row(&r, 36 * S, -10, 25, 74.5);
				break;
			case CAP_TEMP:
				row(&r, 36 * S, -10, 50, 74.5);
				break;
			case CAP_JUMP:
				row(&r, 36 * S, -10, 25, 70);
				after = 70;
				break;
			case CAP_NO_I:
				row(&r, 36 * S, NA, 25, 74.5);
				break;
			default:
				/* A charge pulse and the discharge again. */
				row(&r, 36 * S, 10, 25, 75.5);
				row(&r, 36 * S, -10, 25, 75);
				after = 75;
				break;
			}
			ramp(&r, 35, 36 * S, -10, after, 20, 0.1);
			finish(&r);
			if (kinds[k] == CAP_SWING) {
				/* The pulse is a segment of its own. */
				assert_int_equal(r.ne, 3);
				assert_int_equal(r.e[1].dir, 1);
			} else
				assert_int_equal(r.ne, 2);
			if (swing == 20) {
				assert_int_equal(r.e[0].reason, kinds[k]);
				assert_int_equal(r.n.n[CAP_OK], 0);
				if (kinds[k] != CAP_SWING)
					assert_int_equal(r.n.cut[kinds[k]], 1);
			} else {
				assert_int_equal(r.e[0].reason, CAP_OK);
				near(r.e[0].capacity_ah, 20, 1e-9);
				assert_int_equal(r.e[r.ne - 1].reason, CAP_OK);
				near(r.e[r.ne - 1].capacity_ah, 20, 1e-9);
			}
		}
}

/*
 * A full-charge reset after the charge: 94 rows of 10 A x 36 s (0.5 points
 * each of 20 Ah) from 50 to 97, then the gauge shows 100 at the next row,
 * below min_current; the estimate (steps 50.5 to 97: 93 rows, 9.3 Ah over
 * 46.5 points, 20 Ah) ends at 97 and the reset does not enter it, but
 * is counted as what ended the segment.  A reset while the current still
 * flows (1 A, above min_current) is a jump too: the charge before it
 * stands, and what follows starts anew.
 */
static void
test_reset(void **state)
{
	struct run r;

	(void)state;
	start(&r, NA);
	row(&r, 0, 0, 25, 50);
	ramp(&r, 94, 36 * S, 10, 50, 20, 0.1);
	row(&r, 36 * S, 0.05, 25, 100);
	row(&r, 600 * S, 0, 25, 100);
	assert_int_equal(r.ne, 1);
	assert_int_equal(r.e[0].reason, CAP_OK);
	near(r.e[0].soc_to, 97, 1e-9);
	near(r.e[0].capacity_ah, 20, 1e-9);
	assert_int_equal(r.n.cut[CAP_JUMP], 1);

	start(&r, NA);
	row(&r, 0, 0, 25, 50);
	ramp(&r, 94, 36 * S, 10, 50, 20, 0.1);
	row(&r, 36 * S, 1, 25, 100);
	row(&r, 36 * S, 1, 25, 100);
	finish(&r);
	assert_int_equal(r.ne, 2);
	assert_int_equal(r.e[0].reason, CAP_OK);
	near(r.e[0].capacity_ah, 20, 1e-9);
	assert_int_equal(r.e[1].reason, CAP_SWING);
}

/* No reference capacity: a step against the current is still a jump. */
static void
test_jump_unrated(void **state)
{
	struct run r;

	(void)state;
	start(&r, NA);
	row(&r, 0, 0, 25, 90);
	ramp(&r, 10, 36 * S, -10, 90, 20, 0.1);
	row(&r, 36 * S, -10, 25, 89);	/* 85 to 89: up 4 while discharging */
	ramp(&r, 10, 36 * S, -10, 89, 20, 0.1);
	finish(&r);
	assert_int_equal(r.ne, 2);
	assert_int_equal(r.n.cut[CAP_JUMP], 1);
}

/*
 * The trend: estimates of 14 Ah falling 0.01 Ah a day, one a day for 40
 * days, exactly on the line: slope -0.01, start 14, end 14 - 0.39 = 13.61,
 * fade 100 x 0.39 / 14 = 2.7857 %, 0.3 / 14 = 2.1429 % per 30 days, SoH
 * 13.61 / 14 = 97.21 % of a 14 Ah rating, 80 % (11.2 Ah) reached after
 * 2.8 / 0.01 = 280 days: 2026-10-08.  Without a rating: no SoH, no date;
 * with 4 estimates: nothing; with a flat line: no date.
 */
static void
test_trend(void **state)
{
	struct dcir_series s;
	struct cap_trend_conf c;
	struct cap_trend tr;
	int k;

	(void)state;
	memset(&s, 0, sizeof s);
	cap_trend_conf_default(&c);
	for (k = 0; k < 40; k++)
		dcir_series_add(&s, T0 + k * DAY, 14 - 0.01 * k, CW_MISSING, 2048);
	cap_trend_fit(&s, 14, &c, &tr);
	assert_true(tr.fitted);
	near(tr.slope, -0.01, 1e-12);
	near(tr.cap_start, 14, 1e-9);
	near(tr.cap_end, 13.61, 1e-9);
	near(tr.fade_pct, 100 * 0.39 / 14, 1e-9);
	near(tr.fade_30d, 100 * 0.3 / 14, 1e-9);
	near(tr.soh_pct, 100 * 13.61 / 14, 1e-9);
	assert_true(tr.has_eol);
	assert_true(llabs(tr.eol_t - (T0 + 280 * DAY)) < S);
	cap_trend_fit(&s, NA, &c, &tr);
	assert_true(tr.fitted);
	assert_false(tr.has_eol);
	assert_false(tr.soh_pct == tr.soh_pct);
	dcir_series_free(&s);

	for (k = 0; k < 4; k++)
		dcir_series_add(&s, T0 + k * DAY, 14, CW_MISSING, 2048);
	cap_trend_fit(&s, 14, &c, &tr);
	assert_false(tr.fitted);
	assert_false(tr.cap_start == tr.cap_start);
	for (k = 4; k < 20; k++)
		dcir_series_add(&s, T0 + k * DAY, 14 + (k % 2 ? 0.1 : -0.1),
		    CW_MISSING, 2048);
	cap_trend_fit(&s, 14, &c, &tr);
	assert_true(tr.fitted);
	assert_false(tr.has_eol);
	dcir_series_free(&s);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_discharge),
		cmocka_unit_test(test_integer_gauge),
		cmocka_unit_test(test_pause),
		cmocka_unit_test(test_ends),
		cmocka_unit_test(test_reset),
		cmocka_unit_test(test_jump_unrated),
		cmocka_unit_test(test_trend),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
