/*
 * test_dcirjoin.c: how cw-dcir orders and joins saved states and passes
 * over rows a loaded state holds already (lib/dcirjoin.c).  The expected
 * decisions follow the rules written in lib/dcirjoin.h and cw-dcir(1)
 * (--state, --merge); the steps are counted by hand from the definition
 * of a step in lib/dcir.h, and a join must give what one pass over the
 * same rows gives (lib/dcirstate.h, dstate_join()).
 */
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "dcir.h"
#include "dcirjoin.h"
#include "dcirstate.h"

#define T0 ((cw_time)1767225600 * CW_US_PER_S)	/* 2026-01-01 */
#define SEC(s) ((cw_time)(s) * CW_US_PER_S)

/*
 * Row K of the test pack: every 10 s, at rest (0 A) for five rows, then
 * discharging at 2 A for five, and so on; 3.7 V plus 0.05 ohm times the
 * current, 50 % SoC, 25 C.  By lib/dcir.h each change of current, at
 * rows 5, 10, 15, ..., is a step (|dI| = 2 A >= 0.5 A, 10 s <= 15 s,
 * the three rows before it at one current) of R = 0.1 V / 2 A = 0.05
 * ohm, inside the default SoC and temperature windows.
 */
static void
feed_rows(struct dstate_dev *d, const struct dstate_conf *sc, int from,
    int to)
{
	struct dcir_counts cnt;
	struct dcir_step st;
	struct dcir_pt p;
	int k;

	memset(&cnt, 0, sizeof(cnt));
	for (k = from; k < to; k++) {
		p.t = T0 + SEC(10 * k);
		p.i = (k / 5) % 2 == 0 ? 0.0 : -2.0;
		p.v = 3.7 + 0.05 * p.i;
		p.temp = 25;
		p.soc = 50;
		if (dstate_feed(d, sc->c, &p, &cnt, &st) == 1)
			dcir_series_add(&d->ser, st.t, st.r_ref, st.soc,
			    sc->max_points);
	}
}

/* A state of rows FROM..TO, handed to the join as dstate_read() would. */
static void
add_state(struct djoin *j, const char *name, int from, int to,
    unsigned long line)
{
	struct dstate_dev w;

	memset(&w, 0, sizeof(w));
	feed_rows(&w, j->sc, from, to);
	assert_int_equal(djoin_state(j, "states.csv", line, name,
	    strlen(name), &w), 0);
}

static struct djoin_dev *
dev_named(struct djoin *j, const char *name)
{
	return devtab_get(j->devs, name, strlen(name), NULL);
}

/* A join on the default settings, for each test (cmocka's state). */
struct fix {
	struct dcir_conf c;
	struct dstate_conf sc;
	struct djoin j;
};

static int
setup(void **state)
{
	struct fix *f = calloc(1, sizeof(*f));

	if (f == NULL)
		return -1;
	dcir_conf_default(&f->c);
	f->sc.c = &f->c;
	f->sc.max_points = DCIR_MAX_POINTS;
	djoin_init(&f->j, &f->sc);
	*state = f;
	return 0;
}

static int
teardown(void **state)
{
	struct fix *f = *state;

	djoin_free(&f->j);
	free(f);
	return 0;
}

/*
 * The three places, boundaries included: a state must begin after the
 * last row held or end before the first; a shared time is an overlap
 * (the same row twice), unlike cw-wear's forgiving join.
 */
static void
test_place(void **st)
{
	(void)st;
	assert_int_equal(djoin_place(11, 20, 0, 10), DJOIN_AFTER);
	assert_int_equal(djoin_place(0, 9, 10, 20), DJOIN_BEFORE);
	assert_int_equal(djoin_place(10, 20, 0, 10), DJOIN_OVERLAP);
	assert_int_equal(djoin_place(0, 10, 10, 20), DJOIN_OVERLAP);
	/* The same span, one within, one around, one across an end. */
	assert_int_equal(djoin_place(0, 10, 0, 10), DJOIN_OVERLAP);
	assert_int_equal(djoin_place(2, 8, 0, 10), DJOIN_OVERLAP);
	assert_int_equal(djoin_place(0, 30, 5, 20), DJOIN_OVERLAP);
	assert_int_equal(djoin_place(5, 15, 0, 10), DJOIN_OVERLAP);
}

/*
 * By device name (bytes, a shorter name first when it is the other's
 * start, as devtab_sorted()), then by first row, then by line.
 */
static void
test_order(void **st)
{
	static const unsigned long want[5] = { 5, 3, 4, 1, 2 };
	struct djoin *j = &((struct fix *)*st)->j;
	size_t k;

	/* Added out of every order, so that none holds by chance. */
	add_state(j, "bike-10", 0, 5, 2);
	add_state(j, "bike-10", 0, 5, 1);
	add_state(j, "bike-1", 10, 15, 4);
	add_state(j, "bike-1", 10, 15, 3);
	add_state(j, "bike-1", 0, 5, 5);
	assert_int_equal(j->npiece, 5);
	qsort(j->piece, j->npiece, sizeof(j->piece[0]), djoin_piece_cmp);
	for (k = 0; k < 5; k++)
		assert_int_equal(j->piece[k].line, want[k]);
	djoin_free(j);
}

/*
 * Three pieces of one pack coming last, first, middle, between those of
 * another: joined in time order into what one pass over rows 0..59
 * gives.  By hand: steps at rows 5, 10, ..., 55, 11 of them; a piece
 * alone finds 3 (rows 20 and 40 begin a piece and have no row before
 * them), and the two joins find the steps at rows 20 and 40, whose
 * steady rows are in the piece before.
 */
static void
test_join_any_order(void **st)
{
	struct djoin *j = &((struct fix *)*st)->j;
	struct dstate_dev one;
	struct djoin_dev *d;
	size_t k;

	add_state(j, "bike-07", 40, 60, 3);
	add_state(j, "bike-08", 0, 10, 4);
	add_state(j, "bike-07", 0, 20, 5);
	add_state(j, "bike-07", 20, 40, 6);
	/* Nothing is joined before the flush. */
	assert_int_equal(dev_named(j, "bike-07")->ds.rows, 0);
	assert_int_equal(djoin_flush(j), 0);
	assert_int_equal(j->npiece, 0);
	assert_int_equal(j->joined, 2);
	d = dev_named(j, "bike-07");
	assert_int_equal(d->ds.rows, 60);
	assert_true(d->ds.first == T0);
	assert_true(d->ds.last == T0 + SEC(590));
	assert_true(d->e.last_t == d->ds.last);
	assert_int_equal(d->ds.ser.steps, 11);
	assert_int_equal(dev_named(j, "bike-08")->ds.ser.steps, 1);
	memset(&one, 0, sizeof(one));
	feed_rows(&one, j->sc, 0, 60);
	assert_int_equal(one.ser.steps, 11);
	assert_int_equal(d->ds.ser.n, one.ser.n);
	for (k = 0; k < one.ser.n; k++) {
		assert_true(d->ds.ser.pt[k].t == one.ser.pt[k].t);
		assert_true(d->ds.ser.pt[k].r == one.ser.pt[k].r);
	}
	/* The detector goes on as one pass's would. */
	assert_int_equal(d->ds.det.n, one.det.n);
	assert_int_equal(d->ds.det.head, one.det.head);
	dstate_free(&one);
	djoin_free(j);
}

/*
 * A state joined before what the device holds (a later flush, as a
 * --merge of an older state) takes its place at the front.
 */
static void
test_join_before(void **st)
{
	struct djoin *j = &((struct fix *)*st)->j;
	struct djoin_dev *d;

	add_state(j, "bike-09", 20, 40, 1);
	assert_int_equal(djoin_flush(j), 0);
	add_state(j, "bike-09", 0, 20, 2);
	assert_int_equal(djoin_flush(j), 0);
	d = dev_named(j, "bike-09");
	assert_int_equal(j->joined, 1);
	assert_int_equal(d->ds.rows, 40);
	assert_true(d->ds.first == T0);
	assert_true(d->ds.last == T0 + SEC(390));
	assert_int_equal(d->ds.ser.steps, 7);
	djoin_free(j);
}

/*
 * The same rows twice are an error, and so is a state that falls between
 * two joined before it; the states not joined are freed, what the device
 * held stays.
 */
static void
test_overlap(void **st)
{
	struct djoin *j = &((struct fix *)*st)->j;
	struct djoin_dev *d;

	add_state(j, "bike-12", 0, 20, 1);
	add_state(j, "bike-12", 19, 30, 2);
	add_state(j, "bike-12", 40, 50, 3);
	assert_int_equal(djoin_flush(j), CW_EXIT_DATA);
	assert_int_equal(j->npiece, 0);
	d = dev_named(j, "bike-12");
	assert_int_equal(d->ds.rows, 20);
	assert_true(d->ds.last == T0 + SEC(190));
	/* Rows 0..19 and 40..49 held: 20..29 falls between them. */
	add_state(j, "bike-12", 40, 50, 4);
	assert_int_equal(djoin_flush(j), 0);
	add_state(j, "bike-12", 20, 30, 5);
	assert_int_equal(djoin_flush(j), CW_EXIT_DATA);
	assert_int_equal(d->ds.rows, 30);
	djoin_free(j);
}

/*
 * After --state: rows up to the state's last row are in it (counted,
 * passed over); the first row after it ends that, for the device alone.
 */
static void
test_go_on(void **st)
{
	struct djoin *j = &((struct fix *)*st)->j;
	struct djoin_dev *a, *b;

	add_state(j, "bike-20", 0, 20, 1);
	add_state(j, "bike-21", 0, 10, 2);
	assert_int_equal(djoin_flush(j), 0);
	djoin_go_on(j);
	a = dev_named(j, "bike-20");
	b = dev_named(j, "bike-21");
	assert_true(a->loaded && b->loaded);
	assert_true(a->upto == T0 + SEC(190));
	assert_true(a->e.last_t == INT64_MIN);
	assert_int_equal(djoin_row(j, a, T0 + SEC(100)), 1);
	assert_int_equal(djoin_row(j, a, T0 + SEC(190)), 1);
	assert_int_equal(djoin_row(j, a, T0 + SEC(200)), 0);
	assert_false(a->loaded);
	/* Once past its state, a device's rows all go to the detector. */
	assert_int_equal(djoin_row(j, a, T0 + SEC(150)), 0);
	assert_int_equal(djoin_row(j, b, T0 + SEC(90)), 1);
	assert_true(b->loaded);
	assert_int_equal(j->stale, 3);
	djoin_free(j);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_place),
		cmocka_unit_test_setup_teardown(test_order, setup,
		    teardown),
		cmocka_unit_test_setup_teardown(test_join_any_order, setup,
		    teardown),
		cmocka_unit_test_setup_teardown(test_join_before, setup,
		    teardown),
		cmocka_unit_test_setup_teardown(test_overlap, setup,
		    teardown),
		cmocka_unit_test_setup_teardown(test_go_on, setup,
		    teardown),
	};

	cw_setprog("test_dcirjoin");
	return cmocka_run_group_tests(tests, NULL, NULL);
}
