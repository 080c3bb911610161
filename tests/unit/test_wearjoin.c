/*
 * test_wearjoin.c: how cw-wear orders and joins saved states and judges
 * rows that come at or before a state's end (lib/wearjoin.c).  The
 * expected decisions follow the rules written in lib/wearjoin.h and
 * cw-wear(1) ("A day that comes late", --merge); charges are worked out
 * by hand from lib/charge.h (a row's current holds over the interval
 * ending at it), and a join must give what one pass over the same rows
 * gives (lib/wear.h, wear_join()).
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "wear.h"
#include "wearjoin.h"

#define T0 ((cw_time)1767225600 * CW_US_PER_S)	/* 2026-01-01 */
#define MIN(m) ((cw_time)(m) * 60 * CW_US_PER_S)
#define DAY(d) ((cw_time)(d) * 86400 * CW_US_PER_S)

/*
 * Row K of the test pack: every 10 minutes, charging at 2 A on even
 * rows, discharging at 1 A on odd ones, SoC swinging 40..60 %, 25 C.
 */
static void
push_rows(struct wear_dev *w, const struct wear_conf *c, int from, int to)
{
	int k;

	for (k = from; k < to; k++)
		wear_push(w, c, T0 + MIN(10 * k), 3.7, k % 2 == 0 ? 2.0 : -1.0,
		    25, k % 2 == 0 ? 60 : 40);
}

/* A state of rows FROM..TO, handed to the join as wstate_read() would. */
static void
add_state(struct wjoin *j, const struct wear_conf *c, const char *name,
    int from, int to, unsigned long line)
{
	struct wear_dev w;

	wear_init(&w, c);
	push_rows(&w, c, from, to);
	assert_int_equal(wjoin_state(j, "states.csv", line, name,
	    strlen(name), &w), 0);
}

static struct wjoin_dev *
dev_named(struct wjoin *j, const char *name)
{
	return devtab_get(j->devs, name, strlen(name), NULL);
}

/* The five places, boundaries included: touching ends are after or
 * before (wear_join() takes B's first row not before A's last). */
static void
test_place(void **st)
{
	(void)st;
	assert_int_equal(wjoin_place(10, 20, 0, 10), WJOIN_AFTER);
	assert_int_equal(wjoin_place(11, 20, 0, 10), WJOIN_AFTER);
	assert_int_equal(wjoin_place(0, 10, 10, 20), WJOIN_BEFORE);
	assert_int_equal(wjoin_place(5, 15, 0, 10), WJOIN_ENDS);
	assert_int_equal(wjoin_place(0, 15, 5, 20), WJOIN_BEGINS);
	/* The same span, one within, one around, one sharing a start. */
	assert_int_equal(wjoin_place(0, 10, 0, 10), WJOIN_OVERLAP);
	assert_int_equal(wjoin_place(2, 8, 0, 10), WJOIN_OVERLAP);
	assert_int_equal(wjoin_place(0, 30, 5, 20), WJOIN_OVERLAP);
	assert_int_equal(wjoin_place(0, 15, 0, 10), WJOIN_OVERLAP);
}

/* By first row, then last row, then line in the input. */
static void
test_order(void **st)
{
	static const unsigned long want[4] = { 3, 4, 2, 1 };
	struct wjoin_piece p[4];
	int k;

	(void)st;
	memset(p, 0, sizeof(p));
	p[0].w.acc.first = 20, p[0].w.acc.last = 30, p[0].line = 1;
	p[1].w.acc.first = 10, p[1].w.acc.last = 40, p[1].line = 2;
	p[2].w.acc.first = 10, p[2].w.acc.last = 15, p[2].line = 4;
	p[3].w.acc.first = 10, p[3].w.acc.last = 15, p[3].line = 3;
	qsort(p, 4, sizeof(p[0]), wjoin_piece_cmp);
	for (k = 0; k < 4; k++)
		assert_int_equal(p[k].line, want[k]);
}

/*
 * Three days of one pack coming last, first, middle: joined in time
 * order into what one pass over rows 0..29 gives.  By hand: rows 2, 4,
 * ..., 28 (14 rows; row 0 has no interval before it) charge 2 A for 10
 * minutes, 1/3 Ah each: 14/3 Ah.
 */
static void
test_join_any_order(void **st)
{
	struct wear_conf c;
	struct wear_dev one;
	struct wjoin j;
	struct wjoin_dev *d;

	(void)st;
	wear_conf_default(&c);
	wjoin_init(&j, &c);
	add_state(&j, &c, "bike-07", 20, 30, 3);
	add_state(&j, &c, "bike-07", 0, 10, 4);
	add_state(&j, &c, "bike-07", 10, 20, 5);
	/* Another device comes: bike-07's states are joined. */
	add_state(&j, &c, "bike-08", 0, 10, 6);
	d = dev_named(&j, "bike-07");
	assert_int_equal(j.joins, 2);
	assert_true(d->started);
	assert_true(d->w.acc.first == T0);
	assert_true(d->w.acc.last == T0 + MIN(290));
	assert_true(d->e.last_t == d->w.acc.last);
	assert_int_equal(d->w.acc.rows, 30);
	assert_true(d->w.acc.charge_ah > 14.0 / 3 - 1e-12 &&
	    d->w.acc.charge_ah < 14.0 / 3 + 1e-12);
	wear_init(&one, &c);
	push_rows(&one, &c, 0, 30);
	/* The same sums, added in another order: equal to rounding. */
	assert_true(fabs(d->w.acc.charge_ah - one.acc.charge_ah) < 1e-12);
	assert_true(fabs(d->w.acc.rf.range_sum - one.acc.rf.range_sum) <
	    1e-9);
	assert_true(d->w.acc.rf.range_sum > 0);
	assert_int_equal(wjoin_flush(&j), 0);
	assert_int_equal(j.joins, 2);
	assert_true(dev_named(&j, "bike-08")->w.acc.last == T0 + MIN(90));
	wear_free(&one);
	wear_free(&d->w);
	wear_free(&dev_named(&j, "bike-08")->w);
	wjoin_free(&j);
}

/* A state that begins 20 minutes before the end of the one before it (a
 * clock gone back) is joined all the same and counted; one that starts
 * before the first and ends before its end, likewise, at the beginning. */
static void
test_straddle(void **st)
{
	struct wear_conf c;
	struct wjoin j;
	struct wjoin_dev *d;

	(void)st;
	wear_conf_default(&c);
	wjoin_init(&j, &c);
	add_state(&j, &c, "bike-11", 10, 20, 1);
	add_state(&j, &c, "bike-11", 18, 30, 2);
	assert_int_equal(wjoin_flush(&j), 0);
	d = dev_named(&j, "bike-11");
	assert_int_equal(j.straddles, 1);
	assert_int_equal(j.joins, 1);
	assert_true(d->w.acc.first == T0 + MIN(100));
	assert_true(d->w.acc.last == T0 + MIN(290));
	add_state(&j, &c, "bike-11", 5, 12, 3);
	assert_int_equal(wjoin_flush(&j), 0);
	assert_int_equal(j.straddles, 2);
	assert_true(d->w.acc.first == T0 + MIN(50));
	assert_true(d->w.acc.last == T0 + MIN(290));
	wear_free(&d->w);
	wjoin_free(&j);
}

/* The same day twice is an error; so is a state that falls between two
 * joined before it. */
static void
test_overlap(void **st)
{
	struct wear_conf c;
	struct wjoin j;

	(void)st;
	wear_conf_default(&c);
	wjoin_init(&j, &c);
	add_state(&j, &c, "bike-12", 0, 10, 1);
	add_state(&j, &c, "bike-12", 0, 10, 2);
	assert_int_equal(wjoin_flush(&j), CW_EXIT_DATA);
	assert_int_equal(j.npiece, 0);
	wear_free(&dev_named(&j, "bike-12")->w);
	wjoin_free(&j);

	wjoin_init(&j, &c);
	add_state(&j, &c, "bike-13", 0, 10, 1);
	add_state(&j, &c, "bike-13", 20, 30, 2);
	add_state(&j, &c, "bike-13", 10, 20, 3);
	/* In order: 0..9, 10..19 after it, 20..29 after that: no error. */
	assert_int_equal(wjoin_flush(&j), 0);
	add_state(&j, &c, "bike-13", 12, 16, 4);
	assert_int_equal(wjoin_flush(&j), CW_EXIT_DATA);
	wear_free(&dev_named(&j, "bike-13")->w);
	wjoin_free(&j);
}

/* A loaded state ending at END, and rows at the times T[0..N). */
static enum wjoin_stale
judge(const cw_time *t, int n, int *skipped)
{
	struct wear_conf c;
	struct wjoin j;
	struct wjoin_dev *d;
	enum wjoin_stale s;
	int k;

	wear_conf_default(&c);
	wjoin_init(&j, &c);
	add_state(&j, &c, "bike-20", 0, 10, 1);
	assert_int_equal(wjoin_flush(&j), 0);
	wjoin_go_on(&j);
	d = dev_named(&j, "bike-20");
	assert_true(d->upto == T0 + MIN(90));
	*skipped = 0;
	for (k = 0; k < n; k++)
		*skipped += wjoin_row(&j, d, t[k]);
	s = wjoin_stale_of(d, c.max_gap);
	wear_free(&d->w);
	wjoin_free(&j);
	return s;
}

/*
 * The state ends at row 9 (T0 + 90 min); --max-gap is 15 minutes by
 * default (cw-wear(1)).  Rows after the end are for the model; rows at
 * or before it are skipped and judged: with its last row, the same day
 * again; within --max-gap of the end and newer rows after, a clock gone
 * back; otherwise a day that came late.
 */
static void
test_stale(void **st)
{
	const cw_time end = T0 + MIN(90);
	const cw_time fresh[] = { end + MIN(10), end + MIN(20) };
	const cw_time again[] = { end - MIN(10), end, end + MIN(10) };
	const cw_time back[] = { end - MIN(5), end + MIN(10) };
	const cw_time late[] = { end - DAY(2), end - DAY(2) + MIN(10),
	    end + MIN(10) };
	const cw_time late_gap[] = { end - MIN(20), end + MIN(10) };
	const cw_time late_end[] = { end - MIN(5) };
	int skipped;

	(void)st;
	assert_int_equal(judge(fresh, 2, &skipped), WJOIN_FRESH);
	assert_int_equal(skipped, 0);
	assert_int_equal(judge(again, 3, &skipped), WJOIN_AGAIN);
	assert_int_equal(skipped, 2);
	assert_int_equal(judge(back, 2, &skipped), WJOIN_BACK);
	assert_int_equal(skipped, 1);
	assert_int_equal(judge(late, 3, &skipped), WJOIN_LATE);
	assert_int_equal(skipped, 2);
	/* 20 minutes back is past --max-gap: late, not a clock. */
	assert_int_equal(judge(late_gap, 2, &skipped), WJOIN_LATE);
	/* No newer row after it: nothing says the clock went back. */
	assert_int_equal(judge(late_end, 1, &skipped), WJOIN_LATE);
	assert_int_equal(skipped, 1);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_place),
		cmocka_unit_test(test_order),
		cmocka_unit_test(test_join_any_order),
		cmocka_unit_test(test_straddle),
		cmocka_unit_test(test_overlap),
		cmocka_unit_test(test_stale),
	};

	cw_setprog("test_wearjoin");
	return cmocka_run_group_tests(tests, NULL, NULL);
}
