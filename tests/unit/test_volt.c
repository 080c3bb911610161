/*
 * test_volt.c: the cell voltage window and its event detector
 * (lib/volt.c).
 *
 * References named beside each check:
 * - The limits 4.25 V and 2.50 V per cell are the tool's defaults, typical
 *   of NMC and LCO cells, from memory (volt.h); the tests use them as
 *   given values, not as facts about any cell.
 * - Which side a value exactly at a limit is on, the hysteresis and the
 *   span of an event are this project's documented rules (volt.h,
 *   cw-volt(1)).
 * - Charge: 1 Ah = 1 A for 3600 s (definition of the ampere-hour); the
 *   values in comments were integrated by hand, with the row's current
 *   standing for the interval ending at the row (charge.h).
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <cmocka.h>

#include "volt.h"

#define S CW_US_PER_S
#define MAXEV 16
#define NA CW_MISSING

static struct volt_event got[MAXEV];
static int ngot;

static void	collect(void *ctx, struct volt_dev *dev,
		    const struct volt_event *ev);
static void	setup(struct volt_conf *c, struct volt_dev *d, int cells);
static void	feed(struct volt_dev *d, const struct volt_conf *c,
		    const double (*rows)[4], size_t n);
static void	near(double got_v, double want, double tol);

static void
collect(void *ctx, struct volt_dev *dev, const struct volt_event *ev)
{
	(void)ctx;
	(void)dev;
	if (ngot < MAXEV)
		got[ngot] = *ev;
	ngot++;
}

static void
setup(struct volt_conf *c, struct volt_dev *d, int cells)
{
	volt_conf_default(c);
	c->emit = collect;
	volt_init(d, cells);
	ngot = 0;
}

/* Rows are {time s, pack voltage V, current A, SoC %}. */
static void
feed(struct volt_dev *d, const struct volt_conf *c, const double (*rows)[4],
    size_t n)
{
	size_t k;

	for (k = 0; k < n; k++)
		volt_push(d, c, (cw_time)(rows[k][0] * S), rows[k][1],
		    rows[k][2], rows[k][3]);
	volt_finish(d, c);
}

static void
near(double got_v, double want, double tol)
{
	if (!(fabs(got_v - want) <= tol)) {
		print_error("got %.17g, want %.17g\n", got_v, want);
		fail();
	}
}

/* The defaults of volt.h and the names. */
static void
test_defaults_and_names(void **state)
{
	struct volt_conf c;

	(void)state;
	volt_conf_default(&c);
	near(c.vmax, 4.25, 0);
	near(c.vmin, 2.50, 0);
	near(c.hyst, 0.02, 0);
	assert_true(c.min_duration == 30 * S);
	assert_string_equal(volt_limit_name(VOLT_OVER), "over");
	assert_string_equal(volt_limit_name(VOLT_UNDER), "under");
	assert_string_equal(volt_limit_name(7), "?");
	assert_string_equal(volt_kind_name(VOLT_CHARGE), "charge");
	assert_string_equal(volt_kind_name(VOLT_USE), "use");
	assert_string_equal(volt_kind_name(VOLT_REST), "rest");
	assert_string_equal(volt_kind_name(-1), "?");
}

/*
 * A 10-cell pack charged at 3 A over the maximum: the cell voltage is the
 * pack voltage over 10.  42.5 V (exactly 4.25 V) is inside; 42.6 V at
 * 30 s is over, so the event starts at 20 s; it ends at 60 s, the last
 * row above 4.23 V; 3 A * 40 s = 0.0333333 Ah; highest 4.32 V.
 */
static void
test_per_cell_over(void **state)
{
	static const double rows[][4] = {
		{ 0, 41.0, 3, 80 }, { 10, 42.0, 3, 81 }, { 20, 42.5, 3, 82 },
		{ 30, 42.6, 3, 83 }, { 40, 43.2, 3, 84 }, { 50, 42.8, 3, 85 },
		{ 60, 42.31, 3, 86 }, { 70, 42.3, 3, 87 }, { 80, 42.0, 3, 88 },
	};
	struct volt_conf c;
	struct volt_dev d;

	(void)state;
	setup(&c, &d, 10);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 1);
	assert_int_equal(got[0].limit, VOLT_OVER);
	assert_int_equal(got[0].kind, VOLT_CHARGE);
	assert_true(got[0].start == 20 * S);
	assert_true(got[0].end == 60 * S);
	near(got[0].v_max, 4.32, 1e-12);
	near(got[0].v_min, 4.231, 1e-12);
	near(got[0].charge_ah, 3.0 * 40 / 3600, 1e-12);
	near(got[0].ah_in, 3.0 * 40 / 3600, 1e-12);
	near(got[0].soc_start, 82, 0);
	near(got[0].soc_end, 86, 0);
	assert_int_equal(got[0].rows, 4);
	/* The summary's totals and extremes of all rows. */
	assert_int_equal(d.events[VOLT_OVER][VOLT_CHARGE], 1);
	assert_true(d.time[VOLT_OVER] == 40 * S);
	near(d.v_max, 4.32, 1e-12);
	near(d.v_min, 4.1, 1e-12);
	/* The same pack read as one cell: every row over, none inside. */
	setup(&c, &d, 1);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 1);
	assert_true(got[0].start == 0);
	assert_true(got[0].end == 80 * S);
}

/*
 * Use, rest and charge below the minimum, in one cell: a change of kind
 * that lasts the minimum duration splits the event at the row before the
 * change.  -4 A at 2.45 V from 10 s (start 0 s; the first row stands for
 * its own instant), until 40 s; then rest (0.01 A, below --min-current)
 * at 2.46..2.47 V until 100 s; then charge at 1 A, 2.50 V (inside, but
 * within 0.02 V: still under) at 110 and 120 s, 2.53 V at 130 s ends it.
 * Use 0..40 s, -4 A * 40 s = -0.0444444 Ah; the charge, 100..120 s, lasts
 * 20 s, less than 30 s: it stays in the rest event, 40..120 s,
 * 0.01 A * 60 s + 1 A * 20 s.
 */
static void
test_kinds(void **state)
{
	static const double rows[][4] = {
		{ 0, 2.45, -4, 3 }, { 10, 2.45, -4, 2 }, { 20, 2.44, -4, 1 },
		{ 30, 2.43, -4, 0 }, { 40, 2.42, -4, 0 }, { 50, 2.46, 0.01, 0 },
		{ 60, 2.46, 0.01, 0 }, { 70, 2.47, 0.01, 0 },
		{ 80, 2.47, 0.01, 0 }, { 90, 2.47, 0.01, 0 },
		{ 100, 2.47, 0.01, 0 }, { 110, 2.50, 1, 0 },
		{ 120, 2.50, 1, 0 }, { 130, 2.53, 1, 1 },
	};
	struct volt_conf c;
	struct volt_dev d;

	(void)state;
	setup(&c, &d, 1);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 2);
	assert_int_equal(got[0].limit, VOLT_UNDER);
	assert_int_equal(got[0].kind, VOLT_USE);
	assert_true(got[0].start == 0);
	assert_true(got[0].end == 40 * S);
	near(got[0].v_min, 2.42, 0);
	near(got[0].charge_ah, -4.0 * 40 / 3600, 1e-12);
	near(got[0].ah_in, 0, 0);
	assert_int_equal(got[1].kind, VOLT_REST);
	assert_true(got[1].start == 40 * S);
	assert_true(got[1].end == 120 * S);
	near(got[1].charge_ah, (0.01 * 60 + 20) / 3600, 1e-12);
	/* The charging rows' charge counts as charged, whatever the kind. */
	near(got[1].ah_in, 20.0 / 3600, 1e-12);
	assert_int_equal(d.short_dropped, 0);
	assert_int_equal(d.events[VOLT_UNDER][VOLT_USE], 1);
	assert_int_equal(d.events[VOLT_UNDER][VOLT_REST], 1);
	/*
	 * With a 10 s minimum the charge part splits the rest event at
	 * 100 s (rest 40..100 s) and is kept: 1 A * 20 s.  A one-row
	 * change of kind (10 s) now lasts the minimum too.
	 */
	setup(&c, &d, 1);
	c.min_duration = 10 * S;
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 3);
	assert_true(got[1].end == 100 * S);
	assert_int_equal(got[2].kind, VOLT_CHARGE);
	assert_true(got[2].start == 100 * S);
	assert_true(got[2].end == 120 * S);
	near(got[2].ah_in, 20.0 / 3600, 1e-12);
	near(d.ah_in[VOLT_UNDER], 20.0 / 3600, 1e-12);
}

/*
 * A storage event with a noisy standby current: single rows above
 * --min-current (0.06 A, "use") inside a run of 0.02 A rows ("rest")
 * are shorter than the minimum duration and do not split it.  One cell at
 * 2.30 V, rows 10 s apart from 0 to 300 s, the rows at 100 and 200 s at
 * -0.06 A: one rest event 0..300 s; net charge (-0.02 * 280 - 0.06 *
 * 20) / 3600 Ah.
 */
static void
test_kind_noise(void **state)
{
	struct volt_conf c;
	struct volt_dev d;
	int k;

	(void)state;
	setup(&c, &d, 1);
	for (k = 0; k <= 30; k++)
		volt_push(&d, &c, (cw_time)k * 10 * S, 2.30,
		    k == 10 || k == 20 ? -0.06 : -0.02, NA);
	volt_finish(&d, &c);
	assert_int_equal(ngot, 1);
	assert_int_equal(got[0].kind, VOLT_REST);
	assert_true(got[0].start == 0 && got[0].end == 300 * S);
	near(got[0].charge_ah, (-0.02 * 280 - 0.06 * 20) / 3600, 1e-12);
	assert_int_equal(got[0].rows, 31);
}

/*
 * Exactly at the limits is inside; limits beyond the extremes leave no
 * event; hysteresis 0 ends an event at the first row inside.
 */
static void
test_limits_and_hysteresis(void **state)
{
	static const double rows[][4] = {
		{ 0, 4.25, 0, NA }, { 10, 4.25, 0, NA }, { 20, 4.25, 0, NA },
		{ 30, 2.50, 0, NA }, { 40, 2.50, 0, NA }, { 50, 2.50, 0, NA },
		{ 60, 4.25, 0, NA }, { 70, 4.25, 0, NA }, { 80, 4.25, 0, NA },
		{ 90, 4.25, 0, NA },
	};
	static const double noisy[][4] = {
		{ 0, 4.20, 0, NA }, { 10, 4.26, 0, NA }, { 20, 4.24, 0, NA },
		{ 30, 4.26, 0, NA }, { 40, 4.24, 0, NA }, { 50, 4.26, 0, NA },
		{ 60, 4.20, 0, NA },
	};
	struct volt_conf c;
	struct volt_dev d;

	(void)state;
	setup(&c, &d, 1);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 0);
	assert_int_equal(d.short_dropped, 0);
	/* Noise: one rest event 0..50 s with the default 0.02 V. */
	setup(&c, &d, 1);
	feed(&d, &c, noisy, sizeof(noisy) / sizeof(noisy[0]));
	assert_int_equal(ngot, 1);
	assert_true(got[0].start == 0);
	assert_true(got[0].end == 50 * S);
	near(got[0].v_min, 4.24, 0);
	/* Without hysteresis: three 10 s events, all below 30 s. */
	setup(&c, &d, 1);
	c.hyst = 0;
	feed(&d, &c, noisy, sizeof(noisy) / sizeof(noisy[0]));
	assert_int_equal(ngot, 0);
	assert_int_equal(d.short_dropped, 3);
	/* Limits beyond the extremes (4.26 is the highest): none. */
	setup(&c, &d, 1);
	c.vmax = 4.26;
	feed(&d, &c, noisy, sizeof(noisy) / sizeof(noisy[0]));
	assert_int_equal(ngot, 0);
	assert_int_equal(d.short_dropped, 0);
}

/*
 * A gap longer than max_gap ends an event and carries no charge; the row
 * after it starts at its own time.  A row without voltage or current is
 * not judged and ends the event.
 */
static void
test_gap_and_unjudged(void **state)
{
	static const double rows[][4] = {
		{ 0, 2.0, 0, NA }, { 60, 2.0, 0, NA }, { 1060, 2.0, 0, NA },
		{ 1120, 2.0, 0, NA }, { 1180, 2.0, NA, NA },
		{ 1240, 2.0, 0, NA }, { 1300, 2.0, 0, NA },
		{ 1360, NA, 0, NA }, { 1420, 2.0, 0, NA },
	};
	struct volt_conf c;
	struct volt_dev d;

	(void)state;
	setup(&c, &d, 1);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 4);
	assert_true(got[0].start == 0 && got[0].end == 60 * S);
	assert_true(got[1].start == 1060 * S && got[1].end == 1120 * S);
	/* After an unjudged row the next event starts at that row. */
	assert_true(got[2].start == 1180 * S && got[2].end == 1300 * S);
	assert_true(got[3].start == 1360 * S && got[3].end == 1420 * S);
	near(got[1].charge_ah, 0, 0);
	assert_int_equal(d.unjudged, 2);
	assert_int_equal(d.short_dropped, 0);
	assert_int_equal(d.rows, 9);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_defaults_and_names),
		cmocka_unit_test(test_per_cell_over),
		cmocka_unit_test(test_kinds),
		cmocka_unit_test(test_kind_noise),
		cmocka_unit_test(test_limits_and_hysteresis),
		cmocka_unit_test(test_gap_and_unjudged),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
