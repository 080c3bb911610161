/*
 * test_wear.c: the per-device accumulation of cw-wear (lib/wear.c).
 * Expected values are worked out by hand from the definitions named in
 * each test: lib/charge.h for charge, linear interpolation for time at a
 * level, the Xu et al. 2018 equations (IEEE Trans. Smart Grid 9(2)) for
 * damage, SPEC.md for shares and dominant.
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <string.h>
#include <cmocka.h>

#include "wear.h"
#include "xu2018.h"

#define T0 ((cw_time)1767225600 * CW_US_PER_S)	/* 2026-01-01 */
#define MIN(m) ((cw_time)(m) * 60 * CW_US_PER_S)
#define NAN_ CW_MISSING

static void
near(double got, double want, double rel)
{
	double tol = rel * fabs(want);

	if (!(fabs(got - want) <= tol)) {
		print_error("got %.17g, want %.17g\n", got, want);
		fail();
	}
}

/* SoC 90 -> 100 % in 10 minutes: linearly, 95 % is crossed half way, so
 * 5 minutes count at >= 95 %; then 10 more minutes at 100 %. */
static void
test_time_at_high_soc(void **st)
{
	struct wear_conf c;
	struct wear_dev d;
	struct wear_result r;

	(void)st;
	wear_conf_default(&c);
	wear_init(&d, &c);
	wear_push(&d, &c, T0, 4.0, 0, 25, 90);
	wear_push(&d, &c, T0 + MIN(10), 4.1, 0, 25, 100);
	wear_push(&d, &c, T0 + MIN(20), 4.2, 0, 25, 100);
	wear_finish(&d, &c);
	wear_report(&c, &d.acc, NULL, 0, &r);
	near(r.hours_near_full, 15.0 / 60, 1e-12);
	wear_free(&d);
	/* Temperature 40 -> 50 C: 45 C crossed half way, likewise. */
	wear_init(&d, &c);
	wear_push(&d, &c, T0, 4.0, 0, 40, 50);
	wear_push(&d, &c, T0 + MIN(10), 4.0, 0, 50, 50);
	wear_finish(&d, &c);
	wear_report(&c, &d.acc, NULL, 0, &r);
	near(r.hours_hot, 5.0 / 60, 1e-12);
	near(r.hours_near_full, 0, 0);
	wear_free(&d);
	/* Both follow the settings: --full 90 and T3 = 42 C (--limits);
	 * 42 C is crossed at 2/10 of the way from 40 to 50. */
	c.topoff.full_pct = 90;
	c.lim.t[2] = 42;
	wear_init(&d, &c);
	wear_push(&d, &c, T0, 4.0, 0, 40, 90);
	wear_push(&d, &c, T0 + MIN(10), 4.0, 0, 50, 100);
	wear_finish(&d, &c);
	wear_report(&c, &d.acc, NULL, 0, &r);
	near(r.hours_near_full, 10.0 / 60, 1e-12);
	near(r.hours_hot, 8.0 / 60, 1e-12);
	wear_free(&d);
}

/* A gap of 2 h (over the 15 min default) holds the state before it: the
 * pack sat at 96 % and 30 C, so 2 h count at high SoC and the calendar
 * damage is k_t S_s(0.96) S_T(30) * 7200 s (Xu et al. 2018), not the
 * trapezoid towards the row after the gap.  No charge crosses it. */
static void
test_gap_held(void **st)
{
	const struct xu2018_params *p = &xu2018_published;
	struct wear_conf c;
	struct wear_dev d;
	struct wear_result r;

	(void)st;
	wear_conf_default(&c);
	wear_init(&d, &c);
	wear_push(&d, &c, T0, 4.1, 0, 30, 96);
	wear_push(&d, &c, T0 + MIN(120), 3.7, 2.0, 20, 50);
	wear_finish(&d, &c);
	wear_report(&c, &d.acc, NULL, 0, &r);
	near(r.hours_near_full, 2.0, 1e-12);
	near(d.acc.cal[WEAR_FULL], xu2018_calendar(p, 7200, 0.96, 30), 1e-12);
	near(d.acc.gap_s, 7200, 1e-12);
	assert_int_equal(d.acc.gaps, 1);
	near(r.charge_ah, 0, 0);
	wear_free(&d);
}

/* Charge (lib/charge.h): 2 A over the minute ending at a row is 1/30 Ah;
 * at -5 C it is cold (below T1 = 0 C), at 5 C cool (T1 to T2 = 10 C), at
 * 50 C hot (above T3 = 45 C); discharge and current at or below 0.05 A
 * are not charge. */
static void
test_charge_zones(void **st)
{
	struct wear_conf c;
	struct wear_dev d;
	struct wear_result r;

	(void)st;
	wear_conf_default(&c);
	wear_init(&d, &c);
	wear_push(&d, &c, T0, 3.7, 0, 5, 40);
	wear_push(&d, &c, T0 + MIN(1), 3.7, 2, 5, 41);
	wear_push(&d, &c, T0 + MIN(2), 3.7, 2, 25, 42);
	wear_push(&d, &c, T0 + MIN(3), 3.7, 2, 50, 43);
	wear_push(&d, &c, T0 + MIN(4), 3.7, 0.05, 50, 43);
	wear_push(&d, &c, T0 + MIN(5), 3.7, -3, 50, 42);
	wear_push(&d, &c, T0 + MIN(6), 3.7, 2, NAN_, 43);
	wear_push(&d, &c, T0 + MIN(7), 3.7, 2, -5, 44);
	wear_finish(&d, &c);
	wear_report(&c, &d.acc, NULL, 4.0, &r);
	near(r.charge_ah, 5.0 / 30, 1e-12);
	near(r.cold_charge_ah, 1.0 / 30, 1e-12);
	near(r.cool_charge_ah, 1.0 / 30, 1e-12);
	near(r.hot_charge_ah, 1.0 / 30, 1e-12);
	near(d.acc.zone_ah.no_temp, 1.0 / 30, 1e-12);
	/* C-rates on a 4 Ah pack: 2 A is 0.5 C, peak and mean. */
	near(r.max_charge_c, 0.5, 1e-12);
	near(r.mean_charge_c, 0.5, 1e-12);
	/* 1/30 of 5/30 is 20 %, far over 1 %: cold charge dominates, and
	 * the model, which has no plating term, tells no life. */
	assert_string_equal(r.dominant, "cold-charge");
	assert_false(cw_isnum(r.days_to_eol));
	assert_int_equal(d.acc.rows_no_temp, 1);
	wear_free(&d);
}

/*
 * The rules of SPEC.md at their edges: cold-charge at >= 1 % of all
 * charge below T1 (charge from T1 to T2 does not count); a cause
 * dominates at a share >= 0.25.  The shares by hand: a day at the
 * reference, calendar k_t * 86400, is all age; adding an excess x to the
 * heat part makes share_heat x / (1 + x).
 */
static void
test_cold_share_edge(void **st)
{
	struct wear_conf c;
	struct wear_acc a;
	struct wear_result r;
	double f = 4.14e-10 * 86400;

	(void)st;
	wear_conf_default(&c);
	memset(&a, 0, sizeof(a));
	a.have = 1;
	a.rows = 10;
	a.first = T0;
	a.last = T0 + MIN(60 * 24);
	a.model_s = 86400;
	a.charge_ah = 100;
	a.zone_ah.zone[THERMAL_COOL] = 50;
	a.zone_ah.zone[THERMAL_BELOW_MIN] = 1;
	a.cal[WEAR_FULL] = a.cal[WEAR_REF] = f;
	wear_report(&c, &a, NULL, 0, &r);
	assert_string_equal(r.dominant, "cold-charge");
	a.zone_ah.zone[THERMAL_BELOW_MIN] = 0.99;
	wear_report(&c, &a, NULL, 0, &r);
	/* 0.99 %: not cold; ageing exactly as rest at the reference. */
	assert_string_equal(r.dominant, "none");
	near(r.share_age, 1, 1e-15);
	near(r.share_heat, 0, 0);
	assert_true(cw_isnum(r.days_to_eol));
	/* Heat excess of 1/3: share_heat 0.25 exactly, dominant. */
	a.cal[WEAR_TEMP] = f / 3;
	a.cal[WEAR_FULL] = f * 4 / 3;
	wear_report(&c, &a, NULL, 0, &r);
	near(r.share_heat, 0.25, 1e-12);
	near(r.share_age, 0.75, 1e-12);
	assert_string_equal(r.dominant, r.share_heat >= 0.25 ? "heat" :
	    "none");
	/* A little less: no cause reaches 0.25. */
	a.cal[WEAR_TEMP] = f * 0.33;
	a.cal[WEAR_FULL] = f * 1.33;
	wear_report(&c, &a, NULL, 0, &r);
	assert_string_equal(r.dominant, "none");
	/* A cool pack saves: a negative heat share, still adding to 1. */
	a.cal[WEAR_TEMP] = -f / 2;
	a.cal[WEAR_SOC] = f / 4;
	a.cal[WEAR_FULL] = f * 3 / 4;
	wear_report(&c, &a, NULL, 0, &r);
	near(r.share_age, 4.0 / 3, 1e-12);
	near(r.share_heat, -2.0 / 3, 1e-12);
	near(r.share_high_soc, 1.0 / 3, 1e-12);
	near(r.share_age + r.share_cycling + r.share_high_soc + r.share_heat,
	    1, 1e-12);
	assert_string_equal(r.dominant, "high-soc");
}

/* --cycle-life N: N full cycles at 50 % and 25 C reach 20 % fade
 * (SPEC.md); --calendar-life DAYS likewise for rest there. */
static void
test_life_scales(void **st)
{
	const struct xu2018_params *p = &xu2018_published;
	struct wear_conf c;
	double f20;

	(void)st;
	wear_conf_default(&c);
	f20 = xu2018_damage_at(p, 0.20);
	wear_set_cycle_life(&c, 500);
	near(c.cycle_scale * 500 / 17000, f20, 1e-12);
	near(xu2018_fade(p, c.cycle_scale * 500 * xu2018_s_dod(p, 1)), 0.20,
	    1e-12);
	wear_set_calendar_life(&c, 3650);
	near(c.cal_scale * 4.14e-10 * 3650 * 86400, f20, 1e-12);
}

/* Unknown is empty: a device without temperature has no fade, no zones,
 * no dominant; one without SoC has no efc or hours at high SoC. */
static void
test_unknown_empty(void **st)
{
	struct wear_conf c;
	struct wear_dev d;
	struct wear_result r;

	(void)st;
	wear_conf_default(&c);
	wear_init(&d, &c);
	wear_push(&d, &c, T0, 3.7, 1, NAN_, 40);
	wear_push(&d, &c, T0 + MIN(1), 3.7, 1, NAN_, 60);
	wear_push(&d, &c, T0 + MIN(2), 3.7, 1, NAN_, 40);
	wear_finish(&d, &c);
	wear_report(&c, &d.acc, NULL, 0, &r);
	assert_false(cw_isnum(r.fade_pct));
	assert_false(cw_isnum(r.cold_charge_ah));
	assert_false(cw_isnum(r.hours_hot));
	assert_false(cw_isnum(r.share_cycling));
	assert_string_equal(r.dominant, "");
	/* 40 -> 60 -> 40: two half cycles of range 20 (ASTM E1049-85 residue),
	 * efc 0.2; still counted in efc, left out of the damage. */
	near(r.efc, 0.2, 1e-12);
	near(d.acc.cycles_no_temp, 1, 0);
	wear_free(&d);

	wear_init(&d, &c);
	wear_push(&d, &c, T0, 3.7, 1, 20, NAN_);
	wear_push(&d, &c, T0 + MIN(1), 3.7, 1, 20, NAN_);
	wear_finish(&d, &c);
	wear_report(&c, &d.acc, NULL, 0, &r);
	assert_false(cw_isnum(r.efc));
	assert_false(cw_isnum(r.hours_near_full));
	assert_false(cw_isnum(r.fade_pct));
	near(r.cold_charge_ah, 0, 0);
	near(r.charge_ah, 1.0 / 60, 1e-12);
	wear_free(&d);
}

/*
 * Packs in service (SPEC.md): a measured SoH of 90 % is the damage f0
 * with L(f0) = 0.10 (Xu et al. 2018's L, inverted); the fade of the span
 * is L(f0 + f) - L(f0), the SoH at the end 90 less it, the end of life
 * where L = 0.20.  By age: 100 days at rest and 50 full cycles at the
 * reference, k_t 86400 100 + 50 / 17000 unscaled.
 */
static void
test_prior(void **st)
{
	const struct xu2018_params *p = &xu2018_published;
	struct wear_conf c;
	struct wear_acc a;
	struct wear_prior pr;
	struct wear_result r;
	double f = 4.14e-10 * 86400 * 30, f0;

	(void)st;
	wear_conf_default(&c);
	memset(&a, 0, sizeof(a));
	a.have = 1;
	a.rows = 10;
	a.first = T0;
	a.last = T0 + MIN(60 * 24 * 30);
	a.model_s = 86400 * 30;
	a.cal[WEAR_FULL] = a.cal[WEAR_REF] = f;
	memset(&pr, 0, sizeof(pr));
	pr.kind = WEAR_PRIOR_SOH;
	pr.soh_pct = 90;
	wear_report(&c, &a, &pr, 0, &r);
	f0 = r.damage_prior;
	near(xu2018_fade(p, f0), 0.10, 1e-12);
	near(r.fade_pct, 100 * (xu2018_fade(p, f0 + f) - 0.10), 1e-9);
	near(r.soh_pct, 90 - r.fade_pct, 1e-12);
	near(r.days_to_eol, (xu2018_damage_at(p, 0.20) - f0 - f) / f * 30,
	    1e-9);
	assert_string_equal(r.prior, "soh");
	/* Far less than a new pack's fade over the same month. */
	wear_report(&c, &a, NULL, 0, &r);
	assert_true(r.fade_pct > 3 * 100 * (xu2018_fade(p, f0 + f) - 0.10));
	assert_string_equal(r.prior, "new");
	near(r.damage_prior, 0, 0);
	/* By age. */
	memset(&pr, 0, sizeof(pr));
	pr.kind = WEAR_PRIOR_AGE;
	pr.age_s = 86400 * 100;
	pr.efc = 50;
	wear_report(&c, &a, &pr, 0, &r);
	near(r.damage_prior, 4.14e-10 * 86400 * 100 + 50.0 / 17000, 1e-9);
	assert_string_equal(r.prior, "age");
	/* Above its rating: new, the soh_pct column from the measured one. */
	memset(&pr, 0, sizeof(pr));
	pr.kind = WEAR_PRIOR_SOH;
	pr.soh_pct = 103;
	wear_report(&c, &a, &pr, 0, &r);
	near(r.damage_prior, 0, 0);
	near(r.soh_pct, 103 - r.fade_pct, 1e-12);
	/* The inverse of L across its range, robust near 0 and 1. */
	for (f0 = 1e-9; f0 < 30; f0 *= 3)
		near(xu2018_damage_at(p, xu2018_fade(p, f0)), f0, 1e-9 * f0 +
		    1e-15);
}

/* Merging the totals of two devices adds them (issue 11 will save and
 * merge states; the sums must stay plain). */
static void
test_merge(void **st)
{
	struct wear_conf c;
	struct wear_dev a, b;
	struct wear_acc m;
	int k;

	(void)st;
	wear_conf_default(&c);
	wear_init(&a, &c);
	wear_init(&b, &c);
	for (k = 0; k <= 60; k++) {
		wear_push(&a, &c, T0 + MIN(k), 3.7, 1, 20 + k % 7,
		    30 + (k % 20));
		wear_push(&b, &c, T0 + MIN(100 + k), 3.9, 2, 30, 60 + k % 9);
	}
	wear_finish(&a, &c);
	wear_finish(&b, &c);
	m = a.acc;
	wear_acc_merge(&m, &b.acc);
	assert_true(m.first == T0 && m.last == T0 + MIN(160));
	assert_int_equal(m.rows, 122);
	near(m.charge_ah, a.acc.charge_ah + b.acc.charge_ah, 1e-15);
	near(m.cal[WEAR_FULL], a.acc.cal[WEAR_FULL] + b.acc.cal[WEAR_FULL],
	    1e-15);
	near(m.cyc[WEAR_FULL], a.acc.cyc[WEAR_FULL] + b.acc.cyc[WEAR_FULL],
	    1e-15);
	near(m.rf.range_sum, a.acc.rf.range_sum + b.acc.rf.range_sum, 1e-15);
	near(m.model_s, 120 * 60, 1e-12);
	wear_free(&a);
	wear_free(&b);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_time_at_high_soc),
		cmocka_unit_test(test_gap_held),
		cmocka_unit_test(test_charge_zones),
		cmocka_unit_test(test_cold_share_edge),
		cmocka_unit_test(test_life_scales),
		cmocka_unit_test(test_unknown_empty),
		cmocka_unit_test(test_merge),
		cmocka_unit_test(test_prior),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
