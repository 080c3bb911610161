/*
 * test_theilsen.c: the Theil-Sen line (theilsen.h).
 *
 * References.  The slope is by definition the median of the pairwise
 * slopes (y_j - y_i) / (x_j - x_i) over pairs with x_i < x_j (Theil
 * 1950; Sen 1968, JASA 63); the hand-worked example below lists
 * them.  The confidence interval follows Sen (1968) eq. 2.6; it is checked
 * against scipy.stats.theilslopes in tests/ref/dcir-theilsen.sh, not here.
 * The counting path (inversions of y - t x) is checked against listing
 * every pair, which is the definition itself.  The normal quantile is
 * checked against the standard normal table value 1.959963984540054 for
 * p = 0.975 (as scipy.stats.norm.ppf(0.975) prints it) and against its
 * own inverse, erfc from libm.
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>
#include <cmocka.h>

#include "cw.h"
#include "theilsen.h"

static uint64_t rng = 88172645463325252ULL;

/* Uniform in [0, 1), xorshift64: deterministic invented noise. */
static double
unif(void)
{
	rng ^= rng << 13;
	rng ^= rng >> 7;
	rng ^= rng << 17;
	return (double)(rng >> 11) / 9007199254740992.0;
}

static int
cmpd(const void *a, const void *b)
{
	double p = *(const double *)a, q = *(const double *)b;

	return (p > q) - (p < q);
}

/* Worked by hand: the ten slopes of five points, sorted, are
 * -1, -1, 1/3, 1/2, 3/4, 1, 1, 4/3, 2, 3; the median is (3/4 + 1) / 2. */
static void
test_hand_example(void **state)
{
	double x[] = { 1, 2, 3, 4, 5 }, y[] = { 1, 3, 2, 5, 4 };
	struct theil_fit f;
	struct theil_pts p;

	(void)state;
	assert_int_equal(theil_fit(x, y, 5, 0.95, &f), 0);
	assert_true(f.npairs == 10);
	assert_true(fabs(f.slope - 0.875) < 1e-15);
	/* Intercept: median of y - 0.875 x = {0.125, 1.25, -0.625, 1.5,
	 * -0.375} is 0.125. */
	assert_true(fabs(f.intercept - 0.125) < 1e-15);
	assert_int_equal(theil_prep(&p, x, y, 5), 0);
	assert_true(theil_kth(&p, 0) == -1);
	assert_true(fabs(theil_kth(&p, 2) - 1.0 / 3) < 1e-15);
	assert_true(theil_kth(&p, 9) == 3);
	assert_true(theil_count_below(&p, 1) == 5);
	assert_true(theil_count_below(&p, 1.0000001) == 7);
	theil_free(&p);
}

/* Pairs with equal x have no slope and are left out. */
static void
test_ties_in_x(void **state)
{
	double x[] = { 0, 0, 1, 1 }, y[] = { 0, 5, 1, 2 };
	struct theil_fit f;

	(void)state;
	/* Pairs: (0,0)-(1,1): 1, (0,0)-(1,2): 2, (0,5)-(1,1): -4,
	 * (0,5)-(1,2): -3; sorted -4 -3 1 2, median -1. */
	assert_int_equal(theil_fit(x, y, 4, 0.95, &f), 0);
	assert_true(f.npairs == 4);
	assert_true(fabs(f.slope - -1) < 1e-15);
}

static void
test_degenerate(void **state)
{
	double x[] = { 3, 3, 3 }, y[] = { 1, 2, 3 };
	struct theil_fit f;

	(void)state;
	assert_int_equal(theil_fit(x, y, 3, 0.95, &f), -1);
	assert_false(cw_isnum(f.slope));
	assert_int_equal(theil_fit(x, y, 1, 0.95, &f), -1);
	assert_int_equal(theil_fit(x, y, 0, 0.95, &f), -1);
}

/* The counting path selects the same slope as listing all pairs, for
 * every rank tried, on noisy data with ties and heavy-tailed outliers. */
static void
test_counting_matches_listing(void **state)
{
	enum { N = 600 };
	static double x[N], y[N], all[N * (N - 1) / 2];
	struct theil_pts p;
	unsigned long long k, na = 0;
	size_t i, j;

	(void)state;
	for (i = 0; i < N; i++) {
		x[i] = floor(unif() * 400) / 4;		/* ties in x */
		y[i] = 0.05 + 2e-5 * x[i] + 1e-3 * (unif() - 0.5);
		if (i % 37 == 0)
			y[i] += 1 / (unif() + 1e-3) * 1e-3;	/* glitches */
	}
	for (i = 0; i < N; i++)
		for (j = 0; j < N; j++)
			if (x[i] < x[j])
				all[na++] = (y[j] - y[i]) / (x[j] - x[i]);
	qsort(all, na, sizeof *all, cmpd);
	assert_int_equal(theil_prep(&p, x, y, N), 0);
	assert_true(p.npairs == na);
	p.brute_max = 0;	/* force counting, bracketing and bisection */
	for (k = 0; k < na; k += na / 97)
		assert_true(fabs(theil_kth(&p, k) - all[k]) <=
		    1e-12 * fabs(all[k]) + 1e-18);
	assert_true(fabs(theil_kth(&p, na - 1) - all[na - 1]) <=
	    1e-12 * fabs(all[na - 1]));
	/* Counting agrees with the list at a value between two slopes. */
	k = na / 3;
	assert_true(theil_count_below(&p, all[k]) <= k);
	theil_free(&p);
}

/* All slopes equal: the run of equal slopes is handled. */
static void
test_exact_line_counting(void **state)
{
	enum { N = 400 };
	static double x[N], y[N];
	struct theil_pts p;
	size_t i;

	(void)state;
	for (i = 0; i < N; i++) {
		x[i] = (double)i;
		y[i] = 3 + 2 * x[i];
	}
	assert_int_equal(theil_prep(&p, x, y, N), 0);
	p.brute_max = 0;
	assert_true(theil_kth(&p, p.npairs / 2) == 2);
	assert_true(theil_kth(&p, 0) == 2);
	theil_free(&p);
}

/*
 * A glitch does not move the slope: points on a line, then one point
 * multiplied by 20.  Only the n - 1 pairs through it change, fewer than
 * half, so the median stays the line's slope; a least-squares slope on
 * the same points moves a lot, which shows the data can tell the two
 * apart.
 */
static void
test_glitch(void **state)
{
	enum { N = 61 };
	double x[N], y[N], sx = 0, sy = 0, sxx = 0, sxy = 0, ols;
	struct theil_fit f;
	size_t i;

	(void)state;
	for (i = 0; i < N; i++) {
		x[i] = (double)i;
		y[i] = 0.05 * (1 + 0.002 * x[i]);
	}
	y[45] *= 20;
	assert_int_equal(theil_fit(x, y, N, 0.95, &f), 0);
	assert_true(fabs(f.slope - 0.0001) < 1e-15);
	assert_true(fabs(f.intercept - 0.05) < 1e-15);
	for (i = 0; i < N; i++) {
		sx += x[i];
		sy += y[i];
		sxx += x[i] * x[i];
		sxy += x[i] * y[i];
	}
	ols = (N * sxy - sx * sy) / (N * sxx - sx * sx);
	assert_true(ols > 0.0002);
}

static void
test_ci_brackets_slope(void **state)
{
	enum { N = 200 };
	double x[N], y[N];
	struct theil_fit f, g;
	size_t i;

	(void)state;
	for (i = 0; i < N; i++) {
		x[i] = (double)i;
		y[i] = 1 + 0.01 * x[i] + (unif() - 0.5);
	}
	assert_int_equal(theil_fit(x, y, N, 0.95, &f), 0);
	assert_true(f.slope_lo < f.slope && f.slope < f.slope_hi);
	assert_true(f.slope_lo < 0.01 && 0.01 < f.slope_hi);
	/* A higher confidence level gives a wider interval. */
	assert_int_equal(theil_fit(x, y, N, 0.99, &g), 0);
	assert_true(g.slope_lo < f.slope_lo && g.slope_hi > f.slope_hi);
}

static void
test_norm_quantile(void **state)
{
	double p, z;

	(void)state;
	assert_true(fabs(theil_norm_quantile(0.975) - 1.959963984540054) <
	    1e-13);
	assert_true(fabs(theil_norm_quantile(0.025) + 1.959963984540054) <
	    1e-13);
	assert_true(theil_norm_quantile(0.5) == 0);
	for (p = 1e-6; p < 1; p *= 3) {
		z = theil_norm_quantile(p);
		assert_true(fabs(0.5 * erfc(-z / sqrt(2.0)) - p) < 1e-14 * p +
		    1e-16);
	}
	assert_false(cw_isnum(theil_norm_quantile(0)));
	assert_false(cw_isnum(theil_norm_quantile(1)));
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_hand_example),
		cmocka_unit_test(test_ties_in_x),
		cmocka_unit_test(test_degenerate),
		cmocka_unit_test(test_counting_matches_listing),
		cmocka_unit_test(test_exact_line_counting),
		cmocka_unit_test(test_glitch),
		cmocka_unit_test(test_ci_brackets_slope),
		cmocka_unit_test(test_norm_quantile),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
