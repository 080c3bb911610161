/*
 * test_rainflow.c: the rainflow core (lib/rainflow.c).
 *
 * Reference: ASTM E1049-85 (reapproved 2017), "Standard Practices for
 * Cycle Counting in Fatigue Analysis", section 5.4.4 (rainflow counting,
 * three-point rule) and its worked example, Fig. 6: the history -2, 1,
 * -3, 5, -1, 3, -4, 4, -2 gives ranges 3, 4, 6, 8, 9 with 0.5, 1.5, 0.5,
 * 1.0, 0.5 cycles.  The counts of the other cases below were worked out by
 * hand from the rules of section 5.4.4 (written out beside each), not
 * taken from the code under test.
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>
#include <cmocka.h>

#include "rainflow.h"

#define MAXCYC 4096
#define S CW_US_PER_S

struct got {
	struct rf_cycle c[MAXCYC];
	size_t n;
};

static struct got G;

static void
collect(void *ctx, const struct rf_cycle *c)
{
	struct got *g = ctx;

	assert_true(g->n < MAXCYC);
	g->c[g->n++] = *c;
}

/* Run X[0..N) (sample k at k seconds) through a fresh counter. */
static void
run(const double *x, size_t n, double h, int mode)
{
	struct rf_state s;
	size_t k;

	G.n = 0;
	rf_init(&s, h);
	for (k = 0; k < n; k++)
		rf_push(&s, (cw_time)k * S, x[k], NAN, collect, &G);
	rf_finish(&s, mode, collect, &G);
	rf_free(&s);
}

/* Cycles counted with range RANGE (to 1e-9). */
static double
cycles_of(double range)
{
	double sum = 0;
	size_t i;

	for (i = 0; i < G.n; i++)
		if (fabs(G.c[i].range - range) < 1e-9)
			sum += G.c[i].count;
	return sum;
}

static double
total(void)
{
	double sum = 0;
	size_t i;

	for (i = 0; i < G.n; i++)
		sum += G.c[i].count;
	return sum;
}

static void
near(double got, double want)
{
	if (!(fabs(got - want) <= 1e-9 * fmax(1.0, fabs(want)))) {
		print_error("got %.17g, want %.17g\n", got, want);
		fail();
	}
}

static const double fig6[] = { -2, 1, -3, 5, -1, 3, -4, 4, -2 };
#define NFIG6 (sizeof(fig6) / sizeof(fig6[0]))

/* ASTM E1049-85 Fig. 6: the counts of the standard's table, exactly. */
static void
test_astm_fig6(void **st)
{
	double h[] = { 0, 1, 2.9 };	/* every reversal there is >= 3 */
	size_t i;

	(void)st;
	for (i = 0; i < 3; i++) {
		run(fig6, NFIG6, h[i], RF_RESIDUE_HALF);
		assert_true(cycles_of(3) == 0.5);
		assert_true(cycles_of(4) == 1.5);
		assert_true(cycles_of(6) == 0.5);
		assert_true(cycles_of(8) == 1.0);
		assert_true(cycles_of(9) == 0.5);
		assert_true(total() == 4.0);
		assert_int_equal(G.n, 7);	/* 1 full, 6 half */
	}
}

/*
 * The same example event by event (points A..I at 0..8 s), as section
 * 5.4.4 counts it: E-F (-1, 3) closes as a full cycle when G arrives;
 * A-B, B-C, C-D are the start-point half cycles (step 5), D-G, G-H, H-I
 * the residue (step 6).  Means and times follow from the points.
 */
static void
test_astm_fig6_events(void **st)
{
	static const struct {
		double range, mean, count;
		int t0, t1;
	} want[] = {
		{ 4, 1, 1.0, 4, 5 },		/* E-F */
		{ 3, -0.5, 0.5, 0, 1 },		/* A-B */
		{ 4, -1, 0.5, 1, 2 },		/* B-C */
		{ 8, 1, 0.5, 2, 3 },		/* C-D */
		{ 9, 0.5, 0.5, 3, 6 },		/* D-G */
		{ 8, 0, 0.5, 6, 7 },		/* G-H */
		{ 6, 1, 0.5, 7, 8 },		/* H-I */
	};
	size_t i;

	(void)st;
	run(fig6, NFIG6, 1, RF_RESIDUE_HALF);
	assert_int_equal(G.n, 7);
	for (i = 0; i < 7; i++) {
		near(G.c[i].range, want[i].range);
		near(G.c[i].mean, want[i].mean);
		near(G.c[i].count, want[i].count);
		assert_true(G.c[i].start == want[i].t0 * S);
		assert_true(G.c[i].end == want[i].t1 * S);
	}
}

/*
 * Streaming: a turning point is used only once confirmed.  In Fig. 6, G
 * (-4) is confirmed when H (4) reverses from it; only then can X = F-G
 * (7) close Y = E-F (4).  So nothing is emitted through G, the full cycle
 * E-F right after H.
 */
static void
test_emit_when_confirmed(void **st)
{
	struct rf_state s;
	size_t k;

	(void)st;
	G.n = 0;
	rf_init(&s, 1);
	for (k = 0; k < 7; k++)			/* A..G */
		rf_push(&s, (cw_time)k * S, fig6[k], NAN, collect, &G);
	assert_int_equal(G.n, 0);
	rf_push(&s, 7 * S, fig6[7], NAN, collect, &G);	/* H */
	assert_int_equal(G.n, 1);
	near(G.c[0].range, 4);
	near(G.c[0].count, 1);
	rf_push(&s, 8 * S, fig6[8], NAN, collect, &G);	/* I */
	assert_int_equal(G.n, 1);
	rf_finish(&s, RF_RESIDUE_HALF, collect, &G);
	assert_true(total() == 4.0);
	rf_free(&s);
}

/*
 * A provisional extreme that moves on: 0, 10, 4, 3, 12, 0 (H 1).  The
 * valley is 3, not 4, so the closed cycle is 10-3: range 7, mean 6.5,
 * closed only when 12 is confirmed by the final 0.
 */
static void
test_provisional(void **st)
{
	static const double x[] = { 0, 10, 4, 3, 12, 0 };
	struct rf_state s;
	size_t k;

	(void)st;
	G.n = 0;
	rf_init(&s, 1);
	for (k = 0; k < 5; k++)
		rf_push(&s, (cw_time)k * S, x[k], NAN, collect, &G);
	assert_int_equal(G.n, 0);
	rf_push(&s, 5 * S, x[5], NAN, collect, &G);
	assert_int_equal(G.n, 1);
	near(G.c[0].range, 7);
	near(G.c[0].mean, 6.5);
	assert_true(G.c[0].start == 1 * S && G.c[0].end == 3 * S);
	rf_finish(&s, RF_RESIDUE_HALF, collect, &G);
	rf_free(&s);
	/* Residue 0, 12, 0: two half cycles of 12. */
	assert_true(cycles_of(12) == 1.0);
	assert_true(total() == 2.0);
}

/*
 * Flat runs are not turning points (ASTM E1049-85 counts peaks and
 * valleys): Fig. 6 with every value held for three samples counts the
 * same, and each turning point takes the time of its first sample.
 */
static void
test_plateau(void **st)
{
	double x[3 * NFIG6];
	size_t k;

	(void)st;
	for (k = 0; k < 3 * NFIG6; k++)
		x[k] = fig6[k / 3];
	run(x, 3 * NFIG6, 1, RF_RESIDUE_HALF);
	assert_int_equal(G.n, 7);
	assert_true(cycles_of(3) == 0.5 && cycles_of(4) == 1.5 &&
	    cycles_of(6) == 0.5 && cycles_of(8) == 1.0 &&
	    cycles_of(9) == 0.5);
	/* E-F: E is fig6[4], first held at sample 12; F at 15. */
	assert_true(G.c[0].start == 12 * S && G.c[0].end == 15 * S);
	/* The last half cycle H-I: H first at 21, I first at 24. */
	assert_true(G.c[6].start == 21 * S && G.c[6].end == 24 * S);

	/* A constant history has no cycle; a step is one half cycle. */
	{
		static const double flat[] = { 5, 5, 5, 5 };
		static const double step[] = { 5, 5, 7, 7 };

		run(flat, 4, 0, RF_RESIDUE_HALF);
		assert_int_equal(G.n, 0);
		run(step, 4, 0, RF_RESIDUE_HALF);
		assert_int_equal(G.n, 1);
		near(G.c[0].range, 2);
		near(G.c[0].count, 0.5);
		assert_true(G.c[0].start == 0 && G.c[0].end == 2 * S);
	}
}

/* Hysteresis: reversals smaller than H are ignored (cw-rainflow(1)). */
static void
test_hysteresis(void **st)
{
	static const double wiggle[] = { 0, 10, 9.5, 10.2, 0 };
	static const double exact[] = { 0, 10, 9, 11, 0 };
	static const double decimal[] = { 40, 50.3, 49.3, 60, 40 };
	static const double noisy_start[] = { 50, 49.5, 80, 20 };
	static const double within[] = { 50, 50.5, 50.2, 50.9 };
	static const double tail[] = { 0, 10, 9.5 };

	(void)st;
	/* H 1: 9.5 is noise; turning points 0, 10.2, 0: two halves. */
	run(wiggle, 5, 1, RF_RESIDUE_HALF);
	assert_int_equal(G.n, 2);
	assert_true(cycles_of(10.2) == 1.0);
	/* H 0.1: 10, 9.5 is a closed cycle (X = 0.7 >= Y = 0.5). */
	run(wiggle, 5, 0.1, RF_RESIDUE_HALF);
	assert_int_equal(G.n, 3);
	assert_true(cycles_of(0.5) == 1.0 && cycles_of(10.2) == 1.0);
	/* A reversal of exactly H is not smaller than H: it counts. */
	run(exact, 5, 1, RF_RESIDUE_HALF);
	assert_true(cycles_of(1) == 1.0);
	run(exact, 5, 1.5, RF_RESIDUE_HALF);
	assert_true(cycles_of(1) == 0.0);
	assert_true(cycles_of(11) == 1.0);
	/* 50.3 - 49.3 is 0.99999999999999289 in binary: still a move of 1. */
	run(decimal, 5, 1, RF_RESIDUE_HALF);
	assert_true(cycles_of(1) == 1.0);
	/* Noise at the start: the first turning point is the valley 49.5. */
	run(noisy_start, 4, 1, RF_RESIDUE_HALF);
	assert_int_equal(G.n, 2);
	near(G.c[0].range, 30.5);
	assert_true(G.c[0].start == 1 * S);
	near(G.c[1].range, 60);
	/* A history that never moves by H has no cycle. */
	run(within, 4, 1, RF_RESIDUE_HALF);
	assert_int_equal(G.n, 0);
	/* A final move back smaller than H: the last turning point is 10. */
	run(tail, 3, 1, RF_RESIDUE_HALF);
	assert_int_equal(G.n, 1);
	near(G.c[0].range, 10);
	assert_true(G.c[0].end == 1 * S);
}

/*
 * Residue modes on Fig. 6.  Full: the six open ranges count 1 each.
 * Repeat, by hand: the period -2, 1, -3, 5, -1, 3, -4, 4 (the last -2
 * meets the first), rotated to its maximum: 5, -1, 3, -4, 4, -2, 1, -3, 5
 * closes -1/3 (4), -2/1 (3), 4/-3 (7), 5/-4 (9): four full cycles, half
 * the eight turning points of a period.
 */
static void
test_residue_modes(void **st)
{
	static const double up[] = { 0, 100 };
	static const double updown[] = { 0, 100, 0 };

	(void)st;
	run(fig6, NFIG6, 1, RF_RESIDUE_FULL);
	assert_int_equal(G.n, 7);
	assert_true(cycles_of(3) == 1 && cycles_of(4) == 2 &&
	    cycles_of(6) == 1 && cycles_of(8) == 2 && cycles_of(9) == 1);
	run(fig6, NFIG6, 1, RF_RESIDUE_REPEAT);
	assert_int_equal(G.n, 4);
	assert_true(cycles_of(4) == 1 && cycles_of(3) == 1 &&
	    cycles_of(7) == 1 && cycles_of(9) == 1);
	assert_true(total() == 4.0);
	/* The repeat cycle 4/-3 joins H (7 s) and C (2 s): earlier first. */
	{
		size_t i;

		for (i = 0; i < G.n; i++)
			if (fabs(G.c[i].range - 7) < 1e-9)
				assert_true(G.c[i].start == 2 * S &&
				    G.c[i].end == 7 * S);
	}
	/* 0 -> 100 repeated is one full cycle of 100; so is 0, 100, 0. */
	run(up, 2, 1, RF_RESIDUE_REPEAT);
	assert_int_equal(G.n, 1);
	assert_true(cycles_of(100) == 1.0);
	run(updown, 3, 1, RF_RESIDUE_REPEAT);
	assert_int_equal(G.n, 1);
	assert_true(cycles_of(100) == 1.0);
}

/*
 * The --residue words: half, full and repeat, exactly (cw-rainflow(1) and
 * cw-rainflow(1)); "half" counts ASTM E1049-85 Fig. 6 as the standard
 * does, with ranges 3, 4, 6, 8, 9 at 0.5, 1.5, 0.5, 1.0, 0.5 cycles.
 */
static void
test_residue_parse(void **st)
{
	static const char *const bad[] = {
		"", "Half", "HALF", "halves", "hal", "full ", " full",
		"repeat\n", "0", "1", "2", "none"
	};
	size_t i;

	(void)st;
	assert_int_equal(rf_residue_parse("half"), RF_RESIDUE_HALF);
	assert_int_equal(rf_residue_parse("full"), RF_RESIDUE_FULL);
	assert_int_equal(rf_residue_parse("repeat"), RF_RESIDUE_REPEAT);
	for (i = 0; i < sizeof(bad) / sizeof(bad[0]); i++)
		assert_int_equal(rf_residue_parse(bad[i]), -1);
	run(fig6, NFIG6, 1, rf_residue_parse("half"));
	assert_true(cycles_of(3) == 0.5 && cycles_of(4) == 1.5 &&
	    cycles_of(6) == 0.5 && cycles_of(8) == 1.0 &&
	    cycles_of(9) == 0.5);
	assert_true(total() == 4.0);
}

/*
 * Equal start-side half cycles: 100, 20, 100, 20, 100.  Section 5.4.4
 * counts four half cycles of 80 (steps 5, 5, 5, 6), two cycles in all.
 * Here the first two, 100-20 and 20-100 with mean 60 both, are one full
 * cycle (the four-point method closes 20-100 between two ranges of 80),
 * and the residue 100, 20, 100 gives two halves: still two cycles of 80,
 * all with mean 60.
 */
static void
test_equal_halves(void **st)
{
	static const double x[] = { 100, 20, 100, 20, 100 };
	size_t i;

	(void)st;
	run(x, 5, 1, RF_RESIDUE_HALF);
	assert_true(cycles_of(80) == 2.0);
	assert_int_equal(G.n, 3);
	near(G.c[0].count, 1);
	assert_true(G.c[0].start == 1 * S && G.c[0].end == 2 * S);
	for (i = 0; i < G.n; i++)
		near(G.c[i].mean, 60);
	/* Repeated, the history is two cycles of 80 per period. */
	run(x, 5, 1, RF_RESIDUE_REPEAT);
	assert_true(cycles_of(80) == 2.0);
	assert_int_equal(G.n, 2);
}

/* The aux value: the mean of the two turning points' values. */
static void
test_aux(void **st)
{
	struct rf_state s;

	(void)st;
	G.n = 0;
	rf_init(&s, 1);
	rf_push(&s, 0, 0, 20, collect, &G);
	rf_push(&s, 1 * S, 5, 99, collect, &G);	/* not a turning point */
	rf_push(&s, 2 * S, 10, 30, collect, &G);
	rf_push(&s, 3 * S, 0, NAN, collect, &G);
	rf_finish(&s, RF_RESIDUE_HALF, collect, &G);
	rf_free(&s);
	assert_int_equal(G.n, 2);
	near(G.c[0].aux_mean, 25);
	near(G.c[1].aux_mean, 30);	/* the other one is unknown */
}

/* Non-numeric samples are ignored; a state is reusable after finish. */
static void
test_nan_and_reuse(void **st)
{
	struct rf_state s;
	size_t k, n1;

	(void)st;
	G.n = 0;
	rf_init(&s, 1);
	for (k = 0; k < NFIG6; k++) {
		rf_push(&s, (cw_time)(2 * k) * S, fig6[k], NAN, collect, &G);
		rf_push(&s, (cw_time)(2 * k + 1) * S, NAN, NAN, collect, &G);
		rf_push(&s, (cw_time)(2 * k + 1) * S, INFINITY, NAN, collect,
		    &G);
	}
	rf_finish(&s, RF_RESIDUE_HALF, collect, &G);
	n1 = G.n;
	assert_int_equal(n1, 7);
	assert_true(total() == 4.0);
	for (k = 0; k < NFIG6; k++)
		rf_push(&s, (cw_time)k * S, fig6[k], NAN, collect, &G);
	rf_finish(&s, RF_RESIDUE_HALF, collect, &G);
	assert_int_equal(G.n, 2 * n1);
	assert_true(total() == 8.0);
	rf_free(&s);
}

static void
add_sum(void *ctx, const struct rf_cycle *c)
{
	rf_sum_add(ctx, c);
}

static uint64_t lcg = 88172645463325252ull;

static unsigned
rnd(unsigned n)
{
	lcg ^= lcg << 13;
	lcg ^= lcg >> 7;
	lcg ^= lcg << 17;
	return (unsigned)(lcg % n);
}

/*
 * A million random whole numbers 0..100 (xorshift64).  Two facts that
 * follow from the definitions, not from the code:
 * - every turning point but the last opens one range, each closed
 *   range takes two turning points away and each residue range is half
 *   a cycle, so the counts add up to (turning points - 1) / 2, the
 *   turning points counted here independently (first, last, and every
 *   strict extreme of the history with flat runs merged; with whole
 *   numbers and H 1 no reversal is smaller than H);
 * - the residue's ranges rise then fall, strictly, each a whole number
 *   from 1 to 100, so it never holds more than 201 points: memory does
 *   not grow with the rows.
 */
static void
test_random_bounded(void **st)
{
	enum { N = 1000000 };
	struct rf_state s;
	struct rf_sum sum = { 0 };
	double prev = NAN, x;
	int dir = 0;
	unsigned long turns = 0;
	size_t k, maxres = 0;

	(void)st;
	rf_init(&s, 1);
	for (k = 0; k < N; k++) {
		x = rnd(101);
		if (k == 0)
			turns = 1;
		else if (x != prev) {
			int d = x > prev ? 1 : -1;

			if (dir != 0 && d != dir)
				turns++;	/* prev was an extreme */
			dir = d;
		}
		prev = x;
		rf_push(&s, (cw_time)k * S, x, NAN, add_sum,
		    &sum);
		if (rf_residue_len(&s) > maxres)
			maxres = rf_residue_len(&s);
	}
	if (dir != 0)
		turns++;		/* the last point */
	rf_finish(&s, RF_RESIDUE_HALF, add_sum, &sum);
	rf_free(&s);
	near(sum.cycles, (turns - 1) / 2.0);
	near(sum.full + sum.half / 2.0, sum.cycles);
	assert_true(maxres <= 201);
	assert_true(sum.max_range <= 100);
}

/* Bins: K*W < V <= (K+1)*W, edges decided as decimal numbers would be. */
static void
test_bins(void **st)
{
	struct rf_hist h;
	struct rf_cell *c;
	struct rf_cycle y = { 0 };
	size_t n;

	(void)st;
	assert_int_equal(rf_bin_index(30, 10), 2);	/* (20, 30] */
	assert_int_equal(rf_bin_index(30.5, 10), 3);
	assert_int_equal(rf_bin_index(0.001, 10), 0);
	assert_int_equal(rf_bin_index(0.3, 0.1), 2);	/* (0.2, 0.3] */
	/* 1.1 / 0.1 is 11.000000000000002: still (1.0, 1.1]. */
	assert_int_equal(rf_bin_index(1.1, 0.1), 10);
	assert_int_equal(rf_bin_index(-5, 10), -1);	/* (-10, 0] */
	assert_int_equal(rf_bin_index(-10, 10), -2);	/* (-20, -10] */
	assert_int_equal(rf_bin_index(0, 10), -1);

	/* A matrix with 10 x 10 bins, and enough cells to rehash. */
	rf_hist_init(&h, 10, 10);
	y.range = 30, y.mean = 55, y.count = 0.5;
	rf_hist_add(&h, &y);
	rf_hist_add(&h, &y);
	y.range = 5, y.mean = 95, y.count = 1;
	rf_hist_add(&h, &y);
	y.range = 5, y.mean = 45, y.count = 1;
	rf_hist_add(&h, &y);
	for (n = 0; n < 200; n++) {
		y.range = 1000 + 10.0 * (double)n;
		y.mean = 0;
		rf_hist_add(&h, &y);
	}
	c = rf_hist_sorted(&h, &n);
	assert_int_equal(n, 203);
	assert_true(c[0].ri == 0 && c[0].mi == 4 && c[0].cycles == 1);
	assert_true(c[1].ri == 0 && c[1].mi == 9 && c[1].cycles == 1);
	assert_true(c[2].ri == 2 && c[2].mi == 5 && c[2].cycles == 1.0);
	assert_true(c[3].ri == 99 && c[202].ri == 298);
	free(c);
	rf_hist_free(&h);
	rf_hist_init(&h, 10, 0);
	assert_null(rf_hist_sorted(&h, &n));
	assert_int_equal(n, 0);
	rf_hist_free(&h);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_astm_fig6),
		cmocka_unit_test(test_astm_fig6_events),
		cmocka_unit_test(test_emit_when_confirmed),
		cmocka_unit_test(test_provisional),
		cmocka_unit_test(test_plateau),
		cmocka_unit_test(test_hysteresis),
		cmocka_unit_test(test_residue_modes),
		cmocka_unit_test(test_residue_parse),
		cmocka_unit_test(test_equal_halves),
		cmocka_unit_test(test_aux),
		cmocka_unit_test(test_nan_and_reuse),
		cmocka_unit_test(test_random_bounded),
		cmocka_unit_test(test_bins),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
