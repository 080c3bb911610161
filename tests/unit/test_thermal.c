/*
 * test_thermal.c: charge zones and the thermal event detector.
 *
 * References named beside each check:
 * - Zone scheme T1..T4 = 0, 10, 45, 60 C: the JEITA guideline for charging
 *   lithium-ion cells in portable equipment, as charger ICs commonly
 *   implement it (the four values from memory of that scheme).
 * - Which zone a value exactly at a threshold belongs to is this project's
 *   documented rule (thermal.h, cw-thermal(1)), not the guideline's.
 * - Charge: 1 Ah = 1 A for 3600 s (definition of the ampere-hour); the
 *   values in comments were integrated by hand, rectangle by rectangle,
 *   with the row's current standing for the interval ending at the row
 *   (charge.h).
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <string.h>
#include <cmocka.h>

#include "opt.h"
#include "thermal.h"

#define S CW_US_PER_S
#define MAXEV 16
#define NA CW_MISSING

static struct thermal_event got[MAXEV];
static int ngot;

static void	collect(void *ctx, struct thermal_dev *dev,
		    const struct thermal_event *ev);
static void	setup_conf(struct thermal_conf *c);
static void	feed(struct thermal_dev *d, const struct thermal_conf *c,
		    const double (*rows)[4], size_t n);
static void	near(double got_v, double want, double tol);

static void
collect(void *ctx, struct thermal_dev *dev, const struct thermal_event *ev)
{
	(void)ctx;
	(void)dev;
	if (ngot < MAXEV)
		got[ngot] = *ev;
	ngot++;
}

static void
setup_conf(struct thermal_conf *c)
{
	thermal_conf_default(c);
	c->emit = collect;
	ngot = 0;
}

/* Rows are {time s, current A, temperature C, SoC %}. */
static void
feed(struct thermal_dev *d, const struct thermal_conf *c,
    const double (*rows)[4], size_t n)
{
	size_t k;

	for (k = 0; k < n; k++)
		thermal_push(d, c, (cw_time)(rows[k][0] * S), rows[k][1],
		    rows[k][2], rows[k][3]);
	thermal_finish(d, c);
}

static void
near(double got_v, double want, double tol)
{
	if (!(fabs(got_v - want) <= tol)) {
		print_error("got %.17g, want %.17g\n", got_v, want);
		fail();
	}
}

/* JEITA zone scheme, default thresholds; exact thresholds per thermal.h. */
static void
test_zones_and_boundaries(void **st)
{
	struct thermal_limits l;

	(void)st;
	thermal_limits_default(&l);
	assert_int_equal(thermal_zone_of(&l, -10.0), THERMAL_BELOW_MIN);
	assert_int_equal(thermal_zone_of(&l, -0.001), THERMAL_BELOW_MIN);
	assert_int_equal(thermal_zone_of(&l, 0.0), THERMAL_COOL);
	assert_int_equal(thermal_zone_of(&l, 5.0), THERMAL_COOL);
	assert_int_equal(thermal_zone_of(&l, 9.999), THERMAL_COOL);
	assert_int_equal(thermal_zone_of(&l, 10.0), THERMAL_NORMAL);
	assert_int_equal(thermal_zone_of(&l, 25.0), THERMAL_NORMAL);
	assert_int_equal(thermal_zone_of(&l, 45.0), THERMAL_NORMAL);
	assert_int_equal(thermal_zone_of(&l, 45.001), THERMAL_WARM);
	assert_int_equal(thermal_zone_of(&l, 60.0), THERMAL_WARM);
	assert_int_equal(thermal_zone_of(&l, 60.001), THERMAL_ABOVE_MAX);
	assert_int_equal(thermal_zone_of(&l, 80.0), THERMAL_ABOVE_MAX);
	assert_int_equal(thermal_zone_of(&l, NA), THERMAL_NORMAL);
	assert_string_equal(thermal_zone_name(THERMAL_BELOW_MIN), "below-min");
	assert_string_equal(thermal_zone_name(THERMAL_COOL), "cool");
	assert_string_equal(thermal_zone_name(THERMAL_NORMAL), "normal");
	assert_string_equal(thermal_zone_name(THERMAL_WARM), "warm");
	assert_string_equal(thermal_zone_name(THERMAL_ABOVE_MAX), "above-max");
	assert_string_equal(thermal_zone_name(7), "?");
	assert_string_equal(thermal_kind_name(THERMAL_USE), "use");
}

/*
 * Limits given in F land on their decimal value in C as the option
 * parsers leave them (opt.h: rounded to 1e-9 C), as cw-thermal and
 * cw-wear parse --limits and --hysteresis: C = (F - 32) * 5 / 9
 * (definition of the scale), so 26.6F = -3C and 30.2F = -1C exactly,
 * which plain binary arithmetic misses by one unit in the last place; a
 * difference of 0.9F is 0.5 C.
 */
static void
test_limits_in_f(void **st)
{
	struct thermal_limits l;

	(void)st;
	thermal_limits_default(&l);
	assert_true((26.6 - 32.0) * 5.0 / 9.0 != -3.0);	/* binary is off */
	opt_list_arg("--limits", "26.6F,30.2F,45,60", l.t, 4, 1, 1);
	l.hyst = opt_tempdiff_arg("--hysteresis", "0.9F");
	assert_true(l.t[0] == -3.0);
	assert_true(l.t[1] == -1.0);
	assert_true(l.t[2] == 45.0 && l.t[3] == 60.0);
	assert_true(l.hyst == 0.5);
	assert_int_equal(thermal_zone_of(&l, -3.0), THERMAL_COOL);
}

/* Degenerate limits: T1 = T2 leaves no cool zone, T3 = T4 no warm zone. */
static void
test_equal_thresholds(void **st)
{
	struct thermal_limits l;

	(void)st;
	thermal_limits_default(&l);
	l.t[0] = l.t[1] = 5.0;
	l.t[2] = l.t[3] = 40.0;
	assert_int_equal(thermal_zone_of(&l, 4.9), THERMAL_BELOW_MIN);
	assert_int_equal(thermal_zone_of(&l, 5.0), THERMAL_NORMAL);
	assert_int_equal(thermal_zone_of(&l, 40.0), THERMAL_NORMAL);
	assert_int_equal(thermal_zone_of(&l, 40.1), THERMAL_ABOVE_MAX);
}

/*
 * A cold charge: rows every 60 s, 2 A from t = 60 to 600 at 5 C.  The
 * event covers the intervals of rows 60..600, i.e. 0..600 s, and carries
 * 10 rectangles of 2 A x 60 s = 1200 As = 1200 / 3600 Ah = 0.333333 Ah.
 */
static void
test_cold_charge_ah(void **st)
{
	static const double rows[][4] = {
		{ 0, 0.0, 20, 40 },
		{ 60, 2.0, 5, 41 }, { 120, 2.0, 5, 42 }, { 180, 2.0, 5, 43 },
		{ 240, 2.0, 5, 44 }, { 300, 2.0, 5, 45 }, { 360, 2.0, 4, 46 },
		{ 420, 2.0, 5, 47 }, { 480, 2.0, 5, 48 }, { 540, 2.0, 6, 49 },
		{ 600, 2.0, 5, 50 },
		{ 660, 0.0, 20, 50 },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 1);
	assert_int_equal(got[0].kind, THERMAL_CHARGE);
	assert_int_equal(got[0].zone, THERMAL_COOL);
	assert_true(got[0].start == 0);
	assert_true(got[0].end == 600 * S);
	near(got[0].charge_ah, 1200.0 / 3600.0, 1e-12);
	near(got[0].temp_min, 4.0, 0);
	near(got[0].temp_max, 6.0, 0);
	near(got[0].soc_start, 40.0, 0);
	near(got[0].soc_end, 50.0, 0);
	assert_int_equal(got[0].rows, 10);
	/* Per-zone Ah: the same 0.3333 Ah, all cool; nothing else charged. */
	near(d.ah.zone[THERMAL_COOL], 1200.0 / 3600.0, 1e-12);
	near(d.ah.zone[THERMAL_NORMAL], 0.0, 0);
	assert_int_equal(d.events[THERMAL_CHARGE][THERMAL_COOL], 1);
}

/*
 * Uneven steps and currents, hand-integrated: rows at 0 (25 C), then at
 * 30 s 1.5 A, 90 s 3 A, 100 s 0.6 A, all at 50 C (warm), then 400 s 0 A
 * at 30 C.  Ah = (1.5*30 + 3*60 + 0.6*10) / 3600 = 231 / 3600.
 */
static void
test_warm_charge_uneven(void **st)
{
	static const double rows[][4] = {
		{ 0, 0.0, 25, NA }, { 30, 1.5, 50, NA }, { 90, 3.0, 51, 60 },
		{ 100, 0.6, 50.5, 61 }, { 400, 0.0, 30, 61 },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 1);
	assert_int_equal(got[0].zone, THERMAL_WARM);
	near(got[0].charge_ah, 231.0 / 3600.0, 1e-12);
	assert_true(got[0].end - got[0].start == 100 * S);
	/* SoC unknown at the start: the first known inside the event. */
	near(got[0].soc_start, 60.0, 0);
	near(got[0].soc_end, 61.0, 0);
}

/* Charging exactly at T2 = 10 C and T3 = 45 C is normal: no event. */
static void
test_exactly_at_threshold(void **st)
{
	static const double rows[][4] = {
		{ 0, 2.0, 10.0, 50 }, { 60, 2.0, 10.0, 51 },
		{ 120, 2.0, 10.0, 52 }, { 180, 2.0, 45.0, 53 },
		{ 240, 2.0, 45.0, 54 }, { 300, 2.0, 45.0, 55 },
		{ 360, 2.0, 10.0, 56 },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 0);
	near(d.ah.zone[THERMAL_NORMAL], 2.0 * 360 / 3600, 1e-12);
}

/*
 * Hysteresis 0.5 C on the cold side: readings 9.9, 10.3, 9.8, 10.4 stay
 * one event (back inside by less than 0.5); 10.5 = T2 + 0.5 ends it.
 */
static void
test_hysteresis_cold(void **st)
{
	static const double rows[][4] = {
		{ 0, 2.0, 12, NA }, { 60, 2.0, 9.9, NA },
		{ 120, 2.0, 10.3, NA },
		{ 180, 2.0, 9.8, NA }, { 240, 2.0, 10.4, NA },
		{ 300, 2.0, 10.5, NA }, { 360, 2.0, 12, NA },
		{ 420, 2.0, 12, NA }, { 480, 2.0, 12, NA },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	c.merge = 0;
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 1);
	assert_true(got[0].start == 0);
	assert_true(got[0].end == 240 * S);
	near(got[0].temp_max, 10.4, 0);
	assert_int_equal(got[0].zone, THERMAL_COOL);
	assert_int_equal(d.merges, 0);

	/* Without hysteresis the same rows make two events (9.9 and 9.8). */
	setup_conf(&c);
	c.merge = 0;
	c.min_duration = 0;
	c.lim.hyst = 0;
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 2);
}

/* Hot side, the other way: 45.1, 44.6, 45.2 one event; 44.5 ends it. */
static void
test_hysteresis_hot(void **st)
{
	static const double rows[][4] = {
		{ 0, 2.0, 40, NA }, { 60, 2.0, 45.1, NA },
		{ 120, 2.0, 44.6, NA },
		{ 180, 2.0, 45.2, NA }, { 240, 2.0, 44.5, NA },
		{ 300, 2.0, 44.9, NA }, { 360, 2.0, 40, NA },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	c.merge = 0;
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	/* 44.9 after the end is inside: hysteresis does not start events. */
	assert_int_equal(ngot, 1);
	assert_true(got[0].start == 0);
	assert_true(got[0].end == 180 * S);
	near(got[0].temp_min, 44.6, 0);
	assert_int_equal(got[0].zone, THERMAL_WARM);
}

/* Cool escalates to below-min; the event keeps the most severe zone. */
static void
test_escalation(void **st)
{
	static const double rows[][4] = {
		{ 0, 1.0, 20, NA }, { 60, 1.0, 5, NA }, { 120, 1.0, -1, NA },
		{ 180, 1.0, 3, NA }, { 240, 1.0, 20, NA },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 1);
	assert_int_equal(got[0].zone, THERMAL_BELOW_MIN);
	near(got[0].temp_min, -1, 0);
	assert_int_equal(d.events[THERMAL_CHARGE][THERMAL_BELOW_MIN], 1);
	/* Per zone Ah, hand-sorted: 60 s cool, 60 s below-min, 60 s cool,
	 * 60 s normal, each 1 A x 60 s = 1/60 Ah. */
	near(d.ah.zone[THERMAL_COOL], 2.0 / 60, 1e-12);
	near(d.ah.zone[THERMAL_BELOW_MIN], 1.0 / 60, 1e-12);
	near(d.ah.zone[THERMAL_NORMAL], 1.0 / 60, 1e-12);
}

/* A jump from cold to hot ends the cold event and starts a hot one. */
static void
test_side_switch(void **st)
{
	static const double rows[][4] = {
		{ 0, 1.0, 5, NA }, { 60, 1.0, 5, NA }, { 120, 1.0, 5, NA },
		{ 180, 1.0, 50, NA }, { 240, 1.0, 50, NA },
		{ 300, 1.0, 25, NA },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 2);
	assert_int_equal(got[0].zone, THERMAL_COOL);
	assert_true(got[0].start == 0 && got[0].end == 120 * S);
	assert_int_equal(got[1].zone, THERMAL_WARM);
	assert_true(got[1].start == 120 * S && got[1].end == 240 * S);
}

/*
 * Sign convention (SPEC.md: current positive while charging): cold
 * discharge is no charge event; discharge below the use limit (-20 C) is
 * a use event with negative charge: -3 A x 120 s = -0.1 Ah.
 */
static void
test_sign_and_use(void **st)
{
	static const double rows[][4] = {
		{ 0, -3.0, 5, 80 }, { 60, -3.0, 5, 79 }, { 120, -3.0, 5, 78 },
		{ 180, -3.0, -25, 77 }, { 240, -3.0, -26, 76 },
		{ 300, 0.0, -26, 76 },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 1);
	assert_int_equal(got[0].kind, THERMAL_USE);
	assert_int_equal(got[0].zone, THERMAL_BELOW_MIN);
	near(got[0].charge_ah, -0.1, 1e-12);
	near(got[0].soc_start, 78, 0);
	near(got[0].soc_end, 76, 0);
	/* Nothing charged: every per-zone Ah stays zero. */
	near(d.ah.zone[THERMAL_COOL] + d.ah.zone[THERMAL_NORMAL], 0, 0);
}

/* Current at or below --min-current is not charging. */
static void
test_min_current(void **st)
{
	static const double rows[][4] = {
		{ 0, 0.05, 2, NA }, { 60, 0.05, 2, NA }, { 120, 0.05, 2, NA },
		{ 180, 0.06, 2, NA }, { 240, 0.06, 2, NA },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 1);
	assert_true(got[0].start == 120 * S && got[0].end == 240 * S);
	near(got[0].charge_ah, 0.06 * 120 / 3600, 1e-12);
}

/*
 * Merge (default 2 min): cold runs separated by one normal row 60 s long
 * are joined, and the charge in between counts; separated by 180 s they
 * stay apart.  Runs of 60 s survive --min-duration 60 s (not shorter).
 */
static void
test_merge(void **st)
{
	static const double near_rows[][4] = {
		{ 0, 1.0, 5, NA }, { 60, 1.0, 5, NA }, { 120, 1.0, 20, NA },
		{ 180, 1.0, 5, NA }, { 240, 1.0, 5, NA }, { 300, 1.0, 20, NA },
	};
	static const double far_rows[][4] = {
		{ 0, 1.0, 5, NA }, { 60, 1.0, 5, NA }, { 120, 1.0, 20, NA },
		{ 180, 1.0, 20, NA }, { 240, 1.0, 20, NA }, { 300, 1.0, 5, NA },
		{ 360, 1.0, 5, NA }, { 420, 1.0, 20, NA },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	thermal_init(&d);
	feed(&d, &c, near_rows, sizeof(near_rows) / sizeof(near_rows[0]));
	assert_int_equal(ngot, 1);
	assert_true(got[0].start == 0 && got[0].end == 240 * S);
	assert_int_equal(got[0].parts, 2);
	near(got[0].temp_max, 20, 0);
	/* 0..240 s at 1 A: 240 As, the normal row's 60 As included. */
	near(got[0].charge_ah, 240.0 / 3600, 1e-12);
	assert_int_equal(d.merges, 1);

	setup_conf(&c);
	thermal_init(&d);
	feed(&d, &c, far_rows, sizeof(far_rows) / sizeof(far_rows[0]));
	assert_int_equal(ngot, 2);
	assert_true(got[0].start == 0 && got[0].end == 60 * S);
	assert_true(got[1].start == 240 * S && got[1].end == 360 * S);
	near(got[0].charge_ah, 60.0 / 3600, 1e-12);
	near(got[1].charge_ah, 120.0 / 3600, 1e-12);
}

/* --min-duration drops short events and counts them. */
static void
test_min_duration(void **st)
{
	static const double rows[][4] = {
		{ 0, 1.0, 20, NA }, { 30, 1.0, 5, NA }, { 60, 1.0, 20, NA },
		{ 600, 1.0, 20, NA }, { 630, 1.0, 5, NA }, { 660, 1.0, 5, NA },
		{ 690, 1.0, 20, NA },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	/* 30 s dropped, 60 s kept (the rule is "shorter than" drops). */
	assert_int_equal(ngot, 1);
	assert_true(got[0].start == 600 * S && got[0].end == 660 * S);
	assert_int_equal(d.short_dropped, 1);
}

/*
 * An interval longer than --max-gap (default 15 min) ends an event: the
 * row after a 16 min gap starts a new event at its own time and carries
 * no charge.
 */
static void
test_max_gap(void **st)
{
	static const double rows[][4] = {
		{ 0, 1.0, 5, NA }, { 60, 1.0, 5, NA }, { 120, 1.0, 5, NA },
		{ 1080, 1.0, 5, NA }, { 1140, 1.0, 5, NA },
		{ 1200, 1.0, 5, NA },
		{ 1260, 1.0, 20, NA },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	c.merge = 30 * 60 * S;	/* Merge does not bridge a gap either. */
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 2);
	assert_true(got[0].start == 0 && got[0].end == 120 * S);
	assert_true(got[1].start == 1080 * S && got[1].end == 1200 * S);
	near(got[0].charge_ah, 120.0 / 3600, 1e-12);
	near(got[1].charge_ah, 120.0 / 3600, 1e-12);

	/* A 15 min interval (not longer) keeps the event whole. */
	setup_conf(&c);
	thermal_init(&d);
	thermal_push(&d, &c, 0, 1.0, 5, NA);
	thermal_push(&d, &c, 900 * S, 1.0, 5, NA);
	thermal_push(&d, &c, 960 * S, 1.0, 20, NA);
	thermal_finish(&d, &c);
	assert_int_equal(ngot, 1);
	near(got[0].charge_ah, 900.0 / 3600, 1e-12);
}

/*
 * Rows without temperature are not judged: counted, part of no event.
 * One such row ends the run, and merge joins the parts again.
 */
static void
test_unjudged(void **st)
{
	static const double rows[][4] = {
		{ 0, 1.0, 5, NA }, { 60, 1.0, 5, NA }, { 120, 1.0, NA, NA },
		{ 180, 1.0, 5, NA }, { 240, NA, 5, NA }, { 300, 1.0, 20, NA },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(d.unjudged, 2);
	assert_int_equal(ngot, 1);
	assert_true(got[0].start == 0 && got[0].end == 180 * S);
	near(got[0].charge_ah, 180.0 / 3600, 1e-12);
	/* The row without temperature charged 60 As of unknown zone. */
	near(d.ah.no_temp, 60.0 / 3600, 1e-12);
}

/*
 * SoC at the start of a merged event whose first part knows none: the
 * first SoC known inside the event, a row between the parts included
 * (found by tests/ref/thermal_events.sh).
 */
static void
test_merge_soc(void **st)
{
	static const double rows[][4] = {
		{ 0, 0.0, 20, NA }, { 60, 1.0, 5, NA }, { 120, 1.0, NA, 31.2 },
		{ 180, 1.0, 5, 31.3 }, { 240, 1.0, 5, 31.4 },
		{ 300, 0.0, 20, 31.4 },
	};
	struct thermal_conf c;
	struct thermal_dev d;

	(void)st;
	setup_conf(&c);
	thermal_init(&d);
	feed(&d, &c, rows, sizeof(rows) / sizeof(rows[0]));
	assert_int_equal(ngot, 1);
	assert_int_equal(got[0].parts, 2);
	near(got[0].soc_start, 31.2, 0);
	near(got[0].soc_end, 31.4, 0);
}

/*
 * The charge protocol of the JEITA scheme (values from memory of the
 * guideline: 0.5 C in the cool zone, 4.10 V per cell in the warm zone;
 * margins 5 % and 0.02 V are this project's, thermal.h).  A 14 Ah,
 * 10-cell pack: the cool limit is 0.5 * 14 * 1.05 = 7.35 A, the warm
 * limit 41.2 V.  Rows {t, I, T, SoC} with the voltage fed beside them.
 */
static void
test_protocol(void **state)
{
	static const double cool[][4] = {
		{ 0, 0, 20, NA }, { 60, 4.2, 5, NA }, { 120, 4.2, 5, NA },
		{ 180, 4.2, 5, NA }, { 240, 0, 20, NA },
	};
	struct thermal_conf c;
	struct thermal_dev d;
	struct thermal_event ev;
	size_t k;

	(void)state;
	setup_conf(&c);
	/* 0.3 C in the cool zone: within; the event keeps i_max, v_max. */
	thermal_init(&d);
	assert_false(cw_isnum(d.cap_ah));
	d.cap_ah = 14;
	d.cells = 10;
	for (k = 0; k < 5; k++)
		thermal_push_v(&d, &c, (cw_time)(cool[k][0] * S), cool[k][1],
		    cool[k][2], cool[k][3], 39.0 + (double)k / 10);
	thermal_finish(&d, &c);
	assert_int_equal(ngot, 1);
	near(got[0].i_max, 4.2, 0);
	near(got[0].v_max, 39.3, 1e-12);
	assert_int_equal(got[0].protocol, THERMAL_P_WITHIN);
	assert_int_equal(d.protocol[THERMAL_P_WITHIN], 1);
	/* The verdicts on events built by hand. */
	memset(&ev, 0, sizeof(ev));
	ev.kind = THERMAL_CHARGE;
	ev.zone = THERMAL_COOL;
	ev.i_max = 14;		/* 1 C */
	ev.v_max = 39;
	assert_int_equal(thermal_protocol(&c, &ev, 14, 10),
	    THERMAL_P_OVER_CURRENT);
	ev.i_max = 7.34;
	assert_int_equal(thermal_protocol(&c, &ev, 14, 10), THERMAL_P_WITHIN);
	ev.i_max = 7.36;
	assert_int_equal(thermal_protocol(&c, &ev, 14, 10),
	    THERMAL_P_OVER_CURRENT);
	assert_int_equal(thermal_protocol(&c, &ev, NA, 10), THERMAL_P_UNKNOWN);
	assert_int_equal(thermal_protocol(&c, &ev, 0, 10), THERMAL_P_UNKNOWN);
	/* Warm: 4.15 V per cell over, 4.11 within, cells unknown unknown. */
	ev.zone = THERMAL_WARM;
	ev.i_max = 14;
	ev.v_max = 41.5;
	assert_int_equal(thermal_protocol(&c, &ev, 14, 10),
	    THERMAL_P_OVER_VOLTAGE);
	ev.v_max = 41.1;
	assert_int_equal(thermal_protocol(&c, &ev, 14, 10), THERMAL_P_WITHIN);
	assert_int_equal(thermal_protocol(&c, &ev, 14, 0), THERMAL_P_UNKNOWN);
	ev.v_max = NA;
	assert_int_equal(thermal_protocol(&c, &ev, 14, 10), THERMAL_P_UNKNOWN);
	/* No charging at all below T1 and above T4, known pack or not. */
	ev.zone = THERMAL_BELOW_MIN;
	ev.i_max = 0.1;
	assert_int_equal(thermal_protocol(&c, &ev, NA, 0),
	    THERMAL_P_NO_CHARGE);
	ev.zone = THERMAL_ABOVE_MAX;
	assert_int_equal(thermal_protocol(&c, &ev, 14, 10),
	    THERMAL_P_NO_CHARGE);
	assert_string_equal(thermal_protocol_name(THERMAL_P_NO_CHARGE),
	    "no-charge-allowed");
	assert_string_equal(thermal_protocol_name(THERMAL_P_OVER_CURRENT),
	    "over-current");
	assert_string_equal(thermal_protocol_name(THERMAL_NPROTO), "?");
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_zones_and_boundaries),
		cmocka_unit_test(test_equal_thresholds),
		cmocka_unit_test(test_limits_in_f),
		cmocka_unit_test(test_cold_charge_ah),
		cmocka_unit_test(test_warm_charge_uneven),
		cmocka_unit_test(test_exactly_at_threshold),
		cmocka_unit_test(test_hysteresis_cold),
		cmocka_unit_test(test_hysteresis_hot),
		cmocka_unit_test(test_escalation),
		cmocka_unit_test(test_side_switch),
		cmocka_unit_test(test_sign_and_use),
		cmocka_unit_test(test_min_current),
		cmocka_unit_test(test_merge),
		cmocka_unit_test(test_min_duration),
		cmocka_unit_test(test_max_gap),
		cmocka_unit_test(test_unjudged),
		cmocka_unit_test(test_merge_soc),
		cmocka_unit_test(test_protocol),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
