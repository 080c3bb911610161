/*
 * test_xu2018.c: the Xu et al. 2018 model and the model table.
 * Reference: Xu, Oudalov, Ulbig, Andersson, Kirschen, IEEE Trans. Smart
 * Grid 9(2):1131-1140, 2018, its equations with the published constants,
 * evaluated by hand here (the values in comments were worked out on paper
 * from those equations, not taken from the code under test).
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <cmocka.h>

#include "model.h"
#include "xu2018.h"

#define P (&xu2018_published)

static void
near(double got, double want, double rel)
{
	double tol = rel * fabs(want);

	if (!(fabs(got - want) <= tol)) {
		print_error("got %.17g, want %.17g (rel %g)\n", got, want, rel);
		fail();
	}
}

/* Xu 2018, DoD stress at d = 1: 1 / (k_d1 + k_d3) = 1 / (1.4e5 - 1.23e5). */
static void
test_full_cycle(void **st)
{
	(void)st;
	near(xu2018_s_dod(P, 1.0), 1.0 / (1.4e5 - 1.23e5), 1e-14);
	near(xu2018_cycle(P, 1, 1.0, 0.5, 25.0), 1.0 / 17000.0, 1e-12);
	/* A half cycle counts half (rainflow count 0.5, ASTM E1049-85). */
	near(xu2018_cycle(P, 0.5, 1.0, 0.5, 25.0), 0.5 / 17000.0, 1e-12);
}

/* Xu 2018: d = 0.25 gives 1 / (1.4e5 * 0.25^-0.501 - 1.23e5);
 * 0.25^-0.501 = 2^1.002 = 2.0027742..., so about 1 / 157388.4. */
static void
test_dod_value(void **st)
{
	(void)st;
	near(xu2018_s_dod(P, 0.25), 1.0 / (1.4e5 * pow(2.0, 1.002) - 1.23e5),
	    1e-13);
	near(1.0 / xu2018_s_dod(P, 0.25), 157388.4, 1e-6);
	assert_true(xu2018_s_dod(P, 0.0) == 0.0);
	assert_true(xu2018_s_dod(P, -0.1) == 0.0);
}

/* Xu 2018: both stresses are 1 at their references (50 %, 25 C). */
static void
test_reference_point(void **st)
{
	(void)st;
	near(xu2018_s_soc(P, 0.5), 1.0, 1e-15);
	near(xu2018_s_temp(P, 25.0), 1.0, 1e-15);
	/* S_s(1) = exp(1.04 * 0.5) = exp(0.52) = 1.6820276... */
	near(xu2018_s_soc(P, 1.0), 1.6820276496988864, 1e-12);
	/* S_T(35 C) = exp(0.0693 * 10 * 298.15 / 308.15) = exp(0.670511)
	 * = 1.9552361 */
	near(xu2018_s_temp(P, 35.0), exp(0.0693 * 10 * 298.15 / 308.15),
	    1e-14);
	near(xu2018_s_temp(P, 35.0), 1.9552361, 1e-7);
	/* k_t over a 365-day year: 4.14e-10 * 31536000 = 0.01305590 */
	near(xu2018_s_time(P, 365 * 86400.0), 0.0130559040, 1e-9);
}

/* Monotonicity: deeper, fuller, hotter never give less stress. */
static void
test_monotone(void **st)
{
	double x, prev;

	(void)st;
	prev = 0;
	for (x = 0.001; x <= 1.0; x += 0.001) {
		assert_true(xu2018_s_dod(P, x) > prev);
		prev = xu2018_s_dod(P, x);
	}
	prev = 0;
	for (x = 0; x <= 1.0; x += 0.01) {
		assert_true(xu2018_s_soc(P, x) > prev);
		prev = xu2018_s_soc(P, x);
	}
	prev = 0;
	for (x = -40; x <= 80; x += 0.5) {
		assert_true(xu2018_s_temp(P, x) > prev);
		prev = xu2018_s_temp(P, x);
	}
	prev = -1;
	for (x = 0; x <= 3; x += 0.001) {
		assert_true(xu2018_fade(P, x) > prev);
		prev = xu2018_fade(P, x);
	}
}

/* Fade: L(0) = 0; L(f) for f = 0.1639 by hand from the equation:
 * 1 - 0.0575 exp(-19.83) - 0.9425 exp(-0.1639) = 0.2000 (4 digits). */
static void
test_fade(void **st)
{
	double f;

	(void)st;
	assert_true(xu2018_fade(P, 0.0) == 0.0);
	near(xu2018_fade(P, 0.1639), 0.2000, 2e-4);
	/* Small damage: L ~ (a b + 1 - a) f, the slope at 0. */
	near(xu2018_fade(P, 1e-9), (0.0575 * 121 + 0.9425) * 1e-9, 1e-6);
	/* The inverse, across the range a user meets. */
	for (f = 1e-6; f < 2.5; f *= 1.7)
		near(xu2018_damage_at(P, xu2018_fade(P, f)), f, 1e-10);
	near(xu2018_damage_at(P, 0.2), log(0.9425 / 0.8), 1e-6);
	assert_true(xu2018_damage_at(P, 0.0) == 0.0);
}

/* The table: xu2018 first and found by name; its split by cause. */
static void
test_table(void **st)
{
	const struct model *m;
	struct model_eval e;

	(void)st;
	assert_ptr_equal(model_table[0], model_find("xu2018"));
	assert_null(model_find("no-such-model"));
	m = model_find("xu2018");
	m->cycle(1.0, 1.0, 35.0, &e);
	near(e.full, 1.6820276496988864 * 1.9552361 / 17000, 1e-6);
	/* The Shapley split of model.h, by hand: s = 1.6820276 (SoC 100 %),
	 * tau = 1.9552361 (35 C), A = 1 / 17000 (a full cycle). */
	near(e.ref, 1.0 / 17000, 1e-12);
	near(e.soc, (0.6820276496988864 + 0.6820276496988864 * 0.9552361 /
	    2) / 17000, 1e-6);
	near(e.temp, (0.9552361 + 0.6820276496988864 * 0.9552361 / 2) /
	    17000, 1e-6);
	near(e.ref + e.soc + e.temp, e.full, 1e-14);
	/* Emptier and cooler than reference: both excesses negative. */
	m->calendar(0.2, 10.0, &e);
	assert_true(e.soc < 0 && e.temp < 0);
	assert_true(e.ref == xu2018_published.kt);
	near(e.ref + e.soc + e.temp, e.full, 1e-14);
	near(m->damage_at(m->fade(0.05)), 0.05, 1e-10);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_full_cycle),
		cmocka_unit_test(test_dod_value),
		cmocka_unit_test(test_reference_point),
		cmocka_unit_test(test_monotone),
		cmocka_unit_test(test_fade),
		cmocka_unit_test(test_table),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
