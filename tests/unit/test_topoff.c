/*
 * test_topoff.c: the hold and top-off micro-cycle detector (topoff.h).
 *
 * References.  There is no published standard for counting top-off
 * micro-cycles, so every case here is hand-built with a known answer: the
 * rows come from a small pack model in this file, SoC(t) = SoC(0) +
 * 100 / C * integral of I dt (coulomb counting, the handbook definition of
 * charge Q = integral of I dt), and the expected holds, micro-cycles,
 * depths, charges and times follow from how the rows were made, worked
 * out in the comments, never from the code under test.  The numbers are
 * chosen (1 Ah, 36 s rows, so 1 A moves the SoC by exactly 1 % a row) to
 * be exact in binary floating point.  Thresholds such as "a charger
 * restarts 3 % below full" are invented test conditions, not data of any
 * real charger.
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <string.h>
#include <cmocka.h>

#include "topoff.h"

#define S (CW_US_PER_S)
#define MAXROW 200000
#define MAXEV 1000

struct row {
	cw_time t;
	double v, i, soc;
};

/* The pack model: SoC moved by coulomb counting over each row. */
struct sim {
	cw_time t, dt;
	double cap_ah;
	double soc;
	size_t n;
	struct row *rows;
};

/* What the detector emitted. */
struct rec {
	size_t nc, nh, nu;
	struct topoff_cycle c[MAXEV];
	struct topoff_cycle u[MAXEV];	/* use dips */
	struct topoff_hold h[MAXEV];
	struct topoff *from;	/* the state the last callback named */
};

static struct row rowbuf[MAXROW];
static struct rec rec;

static void
on_cycle(void *ctx, struct topoff *st, const struct topoff_cycle *c)
{
	struct rec *r = ctx;

	assert_true(r->nc < MAXEV);
	r->c[r->nc++] = *c;
	r->from = st;
}

static void
on_use(void *ctx, struct topoff *st, const struct topoff_cycle *c)
{
	struct rec *r = ctx;

	assert_true(r->nu < MAXEV);
	assert_true(c->use);
	r->u[r->nu++] = *c;
	r->from = st;
}

static void
on_hold(void *ctx, struct topoff *st, const struct topoff_hold *h)
{
	struct rec *r = ctx;

	assert_true(r->nh < MAXEV);
	r->h[r->nh++] = *h;
	r->from = st;
}

static void
conf_init(struct topoff_conf *c)
{
	topoff_conf_default(c);
	c->on_cycle = on_cycle;
	c->on_hold = on_hold;
	c->on_use = on_use;
	c->ctx = &rec;
	/*
	 * The model pack of 1 Ah drains at 0.5 A (0.5 % a row, 50 %/h) in
	 * these cases, to keep the steps exact: that is its standby here, so
	 * the standby level sits above it, at 1 A and 60 %/h, below the 3 A
	 * (300 %/h) rides of test_use_dips.
	 */
	c->standby_a = 1.0;
	c->standby_fall = 60.0;
	memset(&rec, 0, sizeof(rec));
}

static void
sim_init(struct sim *s, double soc, cw_time dt)
{
	s->t = 1000000 * S;
	s->dt = dt;
	s->cap_ah = 1.0;
	s->soc = soc;
	s->n = 0;
	s->rows = rowbuf;
	s->rows[s->n++] = (struct row){ s->t, CW_MISSING, 0.0, soc };
}

/* One row: current I_A over (t, t + dt], the SoC it leads to. */
static void
sim_step(struct sim *s, double i_a)
{
	assert_true(s->n < MAXROW);
	s->t += s->dt;
	/* 100 % / 3600 s = 1 % / 36 s, exact for the steps used here. */
	s->soc += i_a * ((double)s->dt / (36.0 * S)) / s->cap_ah;
	s->rows[s->n++] = (struct row){ s->t, CW_MISSING, i_a, s->soc };
}

/* A row whose current the gauge did not report: NaN in the row. */
static void
sim_step_nan(struct sim *s, double i_a)
{
	sim_step(s, i_a);
	s->rows[s->n - 1].i = CW_MISSING;
}

static void
sim_steps(struct sim *s, double i_a, int n)
{
	while (n-- > 0)
		sim_step(s, i_a);
}

static void
run(const struct sim *s, const struct topoff_conf *c, struct topoff *st)
{
	size_t k;

	topoff_init(st);
	for (k = 0; k < s->n; k++)
		topoff_push(st, c, s->rows[k].t, s->rows[k].v, s->rows[k].i,
		    s->rows[k].soc);
	topoff_finish(st, c);
}

static void
near(double got, double want, double tol)
{
	if (!(fabs(got - want) <= tol)) {
		print_error("got %.17g, want %.17g (tol %g)\n", got, want, tol);
		fail();
	}
}

/*
 * The hand-built hold, 1 Ah pack, R rows per 36 s (at R = 1, 1 A moves
 * the SoC by 1 % a row): charge at 1 A from 90 to 100, rest; then three
 * times: drain at 0.5 A for 2, 4, 6 % / 0.5 A (down 1, 2, 3 %), recharge
 * at 1 A back to 100, rest; last, unplug and drain at 0.5 A to 90.
 * MARK records the row numbers the expectations refer to.  R is a power
 * of two so that every SoC is exact in binary.
 */
struct mark {
	size_t band;		/* first row at or above 95 */
	size_t peak[3];		/* last resting row at 100 before each drop */
	size_t end[3];		/* last charging row of each recharge */
	size_t last;		/* last row at or above 95 */
};

static void
build_three(struct sim *s, struct mark *m, int r)
{
	int d;

	sim_init(s, 90.0, 36 * S / r);
	sim_steps(s, 1.0, 5 * r);		/* 95 */
	m->band = s->n - 1;
	sim_steps(s, 1.0, 5 * r);		/* 100 */
	sim_steps(s, 0.0, 5 * r);
	for (d = 1; d <= 3; d++) {
		m->peak[d - 1] = s->n - 1;
		sim_steps(s, -0.5, 2 * d * r);
		sim_steps(s, 1.0, d * r);
		m->end[d - 1] = s->n - 1;
		sim_steps(s, 0.0, 5 * r);
	}
	sim_steps(s, -0.5, 10 * r);		/* 100 down to 95 */
	m->last = s->n - 1;
	sim_steps(s, -0.5, 10 * r);		/* and on to 90 */
}

/* A hold with micro-cycles of depth 1, 2 and 3 %: all of it known. */
static void
test_three_depths(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	struct sim s;
	struct mark m;
	int k;

	(void)unused;
	conf_init(&c);
	build_three(&s, &m, 1);
	run(&s, &c, &st);
	assert_int_equal(rec.nh, 1);
	assert_int_equal(rec.nc, 3);
	for (k = 0; k < 3; k++) {
		near(rec.c[k].depth, k + 1.0, 1e-9);
		near(rec.c[k].peak, 100.0, 1e-9);
		/* 1 A for k + 1 rows of 36 s = 0.01 (k + 1) Ah. */
		near(rec.c[k].charge_ah, 0.01 * (k + 1), 1e-12);
		assert_true(rec.c[k].start == s.rows[m.peak[k]].t);
		assert_true(rec.c[k].end == s.rows[m.end[k]].t);
		assert_int_equal(rec.c[k].signal, TOPOFF_SOC);
	}
	assert_true(rec.h[0].start == s.rows[m.band].t);
	assert_true(rec.h[0].end == s.rows[m.last].t);
	assert_int_equal(rec.h[0].cycles, 3);
	near(rec.h[0].depth_sum / rec.h[0].cycles, 2.0, 1e-9);
	near(rec.h[0].depth_max, 3.0, 1e-9);
	/* Charging after the first rest: the recharges only, 0.06 Ah. */
	near(rec.h[0].topoff_ah, 0.06, 1e-12);
	assert_int_equal(rec.h[0].rows, m.last - m.band + 1);
	assert_int_equal(st.tot.holds, 1);
	assert_int_equal(st.tot.cycles, 3);
	assert_true(st.tot.held == rec.h[0].end - rec.h[0].start);
	assert_ptr_equal(rec.from, &st);
}

/*
 * A smaller --min-depth does not see more in the same hold, a larger one
 * drops the shallow ones: min-depth 1.5 leaves the 2 and 3 % cycles,
 * 3 leaves one, 3.5 none.
 */
static void
test_min_depth(void **unused)
{
	static const double md[] = { 0.1, 1.0, 1.5, 3.0, 3.5 };
	static const size_t want[] = { 3, 3, 2, 1, 0 };
	struct topoff_conf c;
	struct topoff st;
	struct sim s;
	struct mark m;
	size_t k;

	(void)unused;
	for (k = 0; k < sizeof(md) / sizeof(md[0]); k++) {
		conf_init(&c);
		c.min_depth = md[k];
		build_three(&s, &m, 1);
		run(&s, &c, &st);
		assert_int_equal(rec.nc, want[k]);
		assert_int_equal(rec.nh, 1);
	}
}

/* A gauge that reports whole percent (rounded, then truncated). */
static void
quantise(struct sim *s, int floor_it)
{
	size_t k;

	for (k = 0; k < s->n; k++)
		s->rows[k].soc = floor_it ? floor(s->rows[k].soc + 1e-9) :
		    floor(s->rows[k].soc + 0.5);
}

/*
 * Integer SoC: the same hold at 4.5 s rows (0.125 % a row at 1 A), the
 * gauge rounding or truncating to whole percent.  The true drops are 1, 2
 * and 3 %, which both gauges show as drops of 1, 2 and 3 whole percent;
 * the charge is the model's exactly, the same 0.01 (k + 1) Ah.
 */
static void
test_integer_soc(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	struct sim s;
	struct mark m;
	int fl, k;

	(void)unused;
	for (fl = 0; fl <= 1; fl++) {
		conf_init(&c);
		build_three(&s, &m, 8);
		quantise(&s, fl);
		run(&s, &c, &st);
		assert_int_equal(rec.nh, 1);
		assert_int_equal(rec.nc, 3);
		for (k = 0; k < 3; k++) {
			near(rec.c[k].depth, k + 1.0, 1e-9);
			near(rec.c[k].charge_ah, 0.01 * (k + 1), 1e-9);
		}
	}
}

/*
 * A drop of 0.375 % under an integer gauge that rounds: the gauge stays at
 * 100 (the true SoC never goes below 99.5), so no micro-cycle can be seen,
 * but the hold's top-off charge still holds the 0.00375 Ah of the top-up
 * (1 A for 3 rows of 4.5 s).
 */
static void
test_below_resolution(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	struct sim s;

	(void)unused;
	conf_init(&c);
	sim_init(&s, 90.0, 36 * S / 8);
	sim_steps(&s, 1.0, 80);			/* to 100 */
	sim_steps(&s, 0.0, 5);
	sim_steps(&s, -0.5, 6);			/* 99.625 */
	sim_steps(&s, 1.0, 3);			/* 100 */
	sim_steps(&s, 0.0, 5);
	quantise(&s, 0);
	run(&s, &c, &st);
	assert_int_equal(rec.nh, 1);
	assert_int_equal(rec.nc, 0);
	near(rec.h[0].topoff_ah, 0.00375, 1e-12);
}

/* A deterministic noise source (the C standard's example rand()). */
static unsigned long lcg = 1;

static double
noise(double amp)
{
	lcg = lcg * 1103515245UL + 12345UL;
	return amp * (((double)((lcg / 65536UL) % 32768UL) / 16383.5) - 1.0);
}

static void
add_noise(struct sim *s, double soc_amp, double i_amp)
{
	size_t k;

	for (k = 0; k < s->n; k++) {
		s->rows[k].soc += noise(soc_amp);
		s->rows[k].i += noise(i_amp);
	}
}

/*
 * Dips by use apart from top-offs (topoff.h), 36 s rows of a 1 Ah pack:
 * from 96 % charged at 1 A to 100, then in turn
 *  1. drain at -0.5 A (standby) for 2 rows to 99, recharge 1 row: a
 *     top-off, depth 1;
 *  2. a ride at -3 A (below -1 A, the standby level here) for 1 row to
 *     97, a pause at 0, recharge 3 rows: a use dip, depth 3;
 *  3. 2 rows of drain without current (99.5, 99.0: 0.5 % in 36 s is
 *     50 %/h, under 60, timed from the first row at the level before),
 *     recharge 1 row: a top-off, depth 1;
 *  4. 1 row without current falling 3 % (300 %/h): a use row by the fall
 *     rate; recharge 3 rows: a use dip, depth 3;
 * each recharge ended by rows at rest; then drain out of the band.
 */
static void
build_uses(struct sim *s)
{
	sim_init(s, 96.0, 36 * S);
	sim_steps(s, 1.0, 4);
	sim_steps(s, 0.0, 3);
	sim_steps(s, -0.5, 2);
	sim_steps(s, 1.0, 1);
	sim_steps(s, 0.0, 3);
	sim_steps(s, -3.0, 1);
	sim_steps(s, 0.0, 1);
	sim_steps(s, 1.0, 3);
	sim_steps(s, 0.0, 3);
	sim_step_nan(s, -0.5);
	sim_step_nan(s, -0.5);
	sim_steps(s, 1.0, 1);
	sim_steps(s, 0.0, 3);
	sim_step_nan(s, -3.0);
	sim_steps(s, 1.0, 3);
	sim_steps(s, 0.0, 3);
	sim_steps(s, -0.5, 14);
}

static void
test_use_dips(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	struct sim s;
	size_t k;

	(void)unused;
	conf_init(&c);
	build_uses(&s);
	run(&s, &c, &st);
	assert_int_equal(rec.nh, 1);
	assert_int_equal(rec.nc, 2);
	assert_int_equal(rec.nu, 2);
	for (k = 0; k < 2; k++) {
		near(rec.c[k].depth, 1.0, 1e-9);
		assert_int_equal(rec.c[k].use, 0);
		near(rec.u[k].depth, 3.0, 1e-9);
		/* 3 rows at 1 A of 36 s: 0.03 Ah. */
		near(rec.u[k].charge_ah, 0.03, 1e-12);
	}
	/* In order: top-off, ride, top-off, fall. */
	assert_true(rec.c[0].end < rec.u[0].start + 1);
	assert_true(rec.u[0].end <= rec.c[1].start);
	assert_true(rec.c[1].end <= rec.u[1].start);
	assert_int_equal(rec.h[0].cycles, 2);
	assert_int_equal(rec.h[0].use_dips, 2);
	near(rec.h[0].depth_max, 1.0, 1e-9);
	assert_int_equal(st.tot.use_dips, 2);
	assert_int_equal(st.tot.cycles, 2);

	/* This device's standby level of 5 A takes the ride for standby. */
	conf_init(&c);
	topoff_init(&st);
	st.standby_a = 5.0;
	for (k = 0; k < s.n; k++)
		topoff_push(&st, &c, s.rows[k].t, s.rows[k].v, s.rows[k].i,
		    s.rows[k].soc);
	topoff_finish(&st, &c);
	assert_int_equal(rec.nc, 3);
	assert_int_equal(rec.nu, 1);
	/* A fall rate of 40 %/h takes the 50 %/h drain for use too. */
	conf_init(&c);
	c.standby_fall = 40.0;
	run(&s, &c, &st);
	assert_int_equal(rec.nc, 1);
	assert_int_equal(rec.nu, 3);
	/* Without on_use, use dips are only counted. */
	conf_init(&c);
	c.on_use = NULL;
	run(&s, &c, &st);
	assert_int_equal(rec.nc, 2);
	assert_int_equal(rec.nu, 0);
	assert_int_equal(rec.h[0].use_dips, 2);
}

/*
 * Noise: the hold of the first case at 4.5 s rows, SoC noise of up to
 * +-0.2 % (so noise alone moves the level by 0.4 at most, less than
 * min-depth 0.5) and current noise of up to +-0.02 A (below min-current
 * 0.05), 20 different draws.  Still exactly three micro-cycles; each depth
 * within 0.4 (twice the noise) of the truth.
 */
static void
test_noise(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	struct sim s;
	struct mark m;
	int rep, k;

	(void)unused;
	for (rep = 0; rep < 20; rep++) {
		conf_init(&c);
		build_three(&s, &m, 8);
		add_noise(&s, 0.2, 0.02);
		run(&s, &c, &st);
		assert_int_equal(rec.nc, 3);
		for (k = 0; k < 3; k++)
			near(rec.c[k].depth, k + 1.0, 0.4 + 1e-9);
	}
}

/*
 * Unplugged as soon as full: a CC charge from 80 % at 1 A, a taper to
 * 100 (0.5 A, then 0.25 A), the charger stops and the pack is taken
 * and used down to 40 %.  One hold, no micro-cycle, no top-off charge.
 * The same without the resting row (pulled off during the taper), and
 * with noise on SoC and current.
 */
static void
test_unplug_at_full(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	struct sim s;
	int variant;

	(void)unused;
	for (variant = 0; variant < 3; variant++) {
		conf_init(&c);
		sim_init(&s, 80.0, 36 * S);
		sim_steps(&s, 1.0, 18);		/* 98 */
		sim_steps(&s, 0.5, 2);		/* 99 */
		sim_steps(&s, 0.25, 4);		/* 100 */
		if (variant != 1)
			sim_step(&s, 0.0);
		sim_steps(&s, -2.0, 30);	/* 40 */
		if (variant == 2)
			add_noise(&s, 0.2, 0.02);
		run(&s, &c, &st);
		assert_int_equal(rec.nh, 1);
		assert_int_equal(rec.nc, 0);
		near(rec.h[0].topoff_ah, 0.0, 1e-12);
	}
}

/*
 * Ordinary deep cycling through the band: five cycles 20 -> 100 -> 20 %
 * (charge at 1 A, rest 2 rows, use at -1.25 A with a regenerative pulse
 * of +1 A every fifth row).  In the band the use goes 100 -> 95 (drop 5)
 * and the pulse brings it to 96, less than half the drop back (it would
 * need 97.5, step 4 of topoff.h).  Five holds, no micro-cycle; with noise
 * on SoC and current (which may split a hold where it wobbles across 95),
 * still no micro-cycle.
 */
static void
test_deep_cycling(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	struct sim s;
	int cyc, k, noisy;

	(void)unused;
	for (noisy = 0; noisy <= 1; noisy++) {
		conf_init(&c);
		sim_init(&s, 20.0, 36 * S);
		for (cyc = 0; cyc < 5; cyc++) {
			sim_steps(&s, 1.0, 80);
			sim_steps(&s, 0.0, 2);
			for (k = 0; k < 100; k++)
				sim_step(&s, k % 5 == 4 ? 1.0 : -1.25);
		}
		near(s.soc, 20.0, 1e-9);
		if (noisy)
			add_noise(&s, 0.2, 0.02);
		run(&s, &c, &st);
		if (!noisy)
			assert_int_equal(rec.nh, 5);
		assert_int_equal(rec.nc, 0);
		assert_int_equal(st.tot.cycles, 0);
	}
}

/*
 * Noise while the main charge is still on (current never at rest) cannot
 * count: the level wobbles by +-0.4 % around a rising SoC with current
 * flowing, then the pack is unplugged.  Step 1 of topoff.h.
 */
static void
test_charge_noise(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	struct sim s;
	size_t k;

	(void)unused;
	conf_init(&c);
	sim_init(&s, 90.0, 36 * S / 8);
	sim_steps(&s, 1.0, 76);			/* 90 -> 99.5 */
	sim_steps(&s, 0.06, 60);		/* a taper, still on: 99.95 */
	sim_steps(&s, -1.0, 100);		/* unplugged */
	for (k = 0; k < s.n; k++)
		s.rows[k].soc += noise(0.4);
	run(&s, &c, &st);
	assert_int_equal(rec.nc, 0);
}

/*
 * A pulsed recharge: after a 3 % drop the charger gives 1 % pulses with a
 * resting row between them.  The first pulse recovers 1 of 3 % (less than
 * half: the drop goes on), the second 2 of 3 (99 >= 100 - 1.5), so the
 * micro-cycle ends at the second pulse with 0.02 Ah.  The third pulse,
 * to 100, follows no new drop: a new peak, no second micro-cycle.
 */
static void
test_pulsed(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	struct sim s;
	size_t end;

	(void)unused;
	conf_init(&c);
	sim_init(&s, 100.0, 36 * S);
	sim_steps(&s, 0.0, 3);
	sim_steps(&s, -0.5, 6);			/* 97 */
	sim_step(&s, 1.0);			/* 98 */
	sim_step(&s, 0.0);
	sim_step(&s, 1.0);			/* 99 */
	end = s.n - 1;
	sim_step(&s, 0.0);
	sim_step(&s, 1.0);			/* 100 */
	sim_steps(&s, 0.0, 3);
	run(&s, &c, &st);
	assert_int_equal(rec.nc, 1);
	near(rec.c[0].depth, 3.0, 1e-9);
	near(rec.c[0].charge_ah, 0.02, 1e-12);
	assert_true(rec.c[0].end == s.rows[end].t);
	/* All three pulses came after the rest: 0.03 Ah in the hold. */
	near(rec.h[0].topoff_ah, 0.03, 1e-12);
}

/*
 * Regenerative pulses during use, at whole percent: 100, down to 99, a
 * pulse that holds it at 99 (half of the drop of 1 would be 99.5: not
 * back), on down to 98, a pulse holding 98.  The rise of the first pulse
 * (99) came before the deeper trough and must not count against it: no
 * micro-cycle.  The real case that showed it: tests/ref/topoff_fleet.sh.
 */
static void
test_regen_deeper(void **unused)
{
	static const double lvl[] = { 100, 100, 99, 99, 99, 99, 98, 98, 98,
	    98, 97, 96, 95, 94 };
	static const double cur[] = { 0, 0, -9, 4, 4, -9, -9, 4, 4, -9, -9,
	    -9, -9, -9 };
	struct topoff_conf c;
	struct topoff st;
	size_t k;

	(void)unused;
	conf_init(&c);
	topoff_init(&st);
	for (k = 0; k < sizeof(lvl) / sizeof(lvl[0]); k++)
		topoff_push(&st, &c, (cw_time)k * 10 * S, CW_MISSING, cur[k],
		    lvl[k]);
	topoff_finish(&st, &c);
	assert_int_equal(rec.nh, 1);
	assert_int_equal(rec.nc, 0);
}

/*
 * The stream ends in the middle of a recharge: counted when it has come
 * back half way (100 -> 97 -> 99), not when it has not (100 -> 97 -> 98).
 */
static void
test_end_in_recharge(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	struct sim s;
	int up;

	(void)unused;
	for (up = 1; up <= 2; up++) {
		conf_init(&c);
		sim_init(&s, 100.0, 36 * S);
		sim_steps(&s, 0.0, 3);
		sim_steps(&s, -0.5, 6);
		sim_steps(&s, 1.0, up);
		run(&s, &c, &st);
		assert_int_equal(rec.nh, 1);
		assert_int_equal(rec.nc, up == 2 ? 1 : 0);
	}
}

/*
 * A gap longer than max-gap (20 min, default 15 min) inside a hold splits
 * it in two; a gap of 14 min does not.
 */
static void
test_gap(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	struct sim s;
	int g;

	(void)unused;
	for (g = 0; g < 2; g++) {
		conf_init(&c);
		sim_init(&s, 100.0, 60 * S);
		sim_steps(&s, 0.0, 10);
		s.t += (g == 0 ? 20 : 13) * 60 * S;	/* + one 60 s row */
		sim_steps(&s, 0.0, 10);
		run(&s, &c, &st);
		assert_int_equal(rec.nh, g == 0 ? 2 : 1);
		assert_int_equal(st.tot.gaps, g == 0 ? 1 : 0);
		if (g == 0) {
			assert_true(rec.h[0].end == s.rows[10].t);
			assert_true(rec.h[1].start == s.rows[11].t);
		}
	}
}

/*
 * Voltage only (no SoC), full voltage 41.0 V: the pack sits at 42.0 V at
 * the end of charge, relaxes at rest to 41.6 V, the charger restarts and
 * brings it back to 42.0 V; three times.  Depth = 100 (42.0 - 41.6) / 41.0
 * percent of the full voltage.  Then it is used and falls below 41.0 V.
 */
static void
test_voltage(void **unused)
{
	static const double relax[] = { 41.9, 41.8, 41.7, 41.6 };
	struct topoff_conf c;
	struct topoff st;
	cw_time t = 5000000 * S;
	size_t k;
	int cyc;

	(void)unused;
	conf_init(&c);
	c.full_v = 41.0;
	topoff_init(&st);
	topoff_push(&st, &c, t, 40.5, 2.0, CW_MISSING);
	topoff_push(&st, &c, t += 60 * S, 41.5, 2.0, CW_MISSING);
	topoff_push(&st, &c, t += 60 * S, 42.0, 1.0, CW_MISSING);
	for (cyc = 0; cyc < 3; cyc++) {
		topoff_push(&st, &c, t += 60 * S, 42.0, 0.0, CW_MISSING);
		for (k = 0; k < 4; k++)
			topoff_push(&st, &c, t += 600 * S, relax[k], 0.0,
			    CW_MISSING);
		topoff_push(&st, &c, t += 60 * S, 42.0, 0.6, CW_MISSING);
		topoff_push(&st, &c, t += 60 * S, 42.0, 0.3, CW_MISSING);
	}
	topoff_push(&st, &c, t += 60 * S, 42.0, 0.0, CW_MISSING);
	topoff_push(&st, &c, t += 60 * S, 41.2, -3.0, CW_MISSING);
	topoff_push(&st, &c, t += 60 * S, 40.8, -3.0, CW_MISSING);
	topoff_finish(&st, &c);
	assert_int_equal(rec.nh, 1);
	assert_int_equal(rec.nc, 3);
	for (k = 0; k < 3; k++) {
		near(rec.c[k].depth, 100.0 * (42.0 - 41.6) / 41.0, 1e-9);
		/* 0.6 A and 0.3 A for a minute each: 0.015 Ah. */
		near(rec.c[k].charge_ah, 0.9 / 60.0, 1e-12);
		assert_int_equal(rec.c[k].signal, TOPOFF_VOLTAGE);
	}
	assert_int_equal(rec.h[0].signal, TOPOFF_VOLTAGE);
	assert_true(rec.h[0].at_top2 == 0);
	assert_true(st.tot.soc_held == 0);
	/* The first row at or above 41.0 V is the second one. */
	assert_true(rec.h[0].start == 5000000 * S + 60 * S);
	assert_true(rec.h[0].end == t - 60 * S);
	/* Without a full voltage nothing is judged, every row counted. */
	conf_init(&c);
	topoff_init(&st);
	topoff_push(&st, &c, t, 42.0, 0.0, CW_MISSING);
	topoff_push(&st, &c, t + 60 * S, 42.0, 0.0, CW_MISSING);
	topoff_finish(&st, &c);
	assert_int_equal(rec.nh, 0);
	assert_int_equal(st.tot.unjudged, 2);
}

/*
 * SoC reported on every third row only (the other rows have voltage and
 * current but no SoC): rows between keep the last level, their current
 * still counts, so the hand-built hold gives the same three micro-cycles
 * and the same charge as with SoC on every row.
 */
static void
test_sparse_soc(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	struct sim s;
	struct mark m;
	size_t k, unset = 0;

	(void)unused;
	conf_init(&c);
	build_three(&s, &m, 8);
	for (k = 0; k < s.n; k++)
		if (k % 3 != 0) {
			s.rows[k].soc = CW_MISSING;
			unset++;
		}
	run(&s, &c, &st);
	assert_int_equal(rec.nc, 3);
	for (k = 0; k < 3; k++)
		near(rec.c[k].charge_ah, 0.01 * (k + 1), 1e-9);
	near(rec.h[0].topoff_ah, 0.06, 1e-9);
	/* Every row without SoC is either carried or counted unjudged. */
	assert_int_equal(st.tot.carried + st.tot.unjudged, unset);
	assert_int_equal(rec.h[0].carried, st.tot.carried);

	/*
	 * The same with a voltage on every row, in its band, and a full
	 * voltage set (a fleet where other packs have no SoC): the rows
	 * without SoC still keep the SoC level instead of starting voltage
	 * holds, so one hold and the same three micro-cycles.
	 */
	conf_init(&c);
	c.full_v = 4.0;
	for (k = 0; k < s.n; k++)
		s.rows[k].v = 4.1;
	run(&s, &c, &st);
	assert_int_equal(rec.nh, 1);
	assert_int_equal(rec.nc, 3);
	assert_int_equal(rec.h[0].signal, TOPOFF_SOC);
	/* A device that stops reporting SoC for longer than max-gap is
	 * judged by voltage after that. */
	conf_init(&c);
	c.full_v = 4.0;
	topoff_init(&st);
	topoff_push(&st, &c, 0, 4.1, 0.0, 99.0);
	for (k = 1; k <= 20; k++)
		topoff_push(&st, &c, (cw_time)k * 60 * S, 4.1, 0.0,
		    CW_MISSING);
	topoff_finish(&st, &c);
	assert_int_equal(rec.nh, 2);
	assert_int_equal(rec.h[0].signal, TOPOFF_SOC);
	assert_int_equal(rec.h[1].signal, TOPOFF_VOLTAGE);
	/* The SoC hold keeps its level for 15 min, 15 rows. */
	assert_true(rec.h[0].end == 15 * 60 * S);
	assert_true(rec.h[1].start == 16 * 60 * S);
}

/*
 * Time at 100 %, trapezoid rule over the indicator, worked by hand: rows
 * at 0, 60, 180, 200 s with SoC 96, 100, 99.5, 98: held 200 s, at the top
 * 60 / 2 + 120 + 20 / 2 = 160 s, so at_top2 = 320 s (99.5 counts as the
 * top, TOPOFF_AT_TOP_PCT).  The left or right end rule would give 140 or
 * 180 s.
 */
static void
test_at_top(void **unused)
{
	static const double soc[] = { 96, 100, 99.5, 98 };
	static const int sec[] = { 0, 60, 180, 200 };
	struct topoff_conf c;
	struct topoff st;
	int k;

	(void)unused;
	conf_init(&c);
	topoff_init(&st);
	for (k = 0; k < 4; k++)
		topoff_push(&st, &c, sec[k] * S, CW_MISSING, 0.0, soc[k]);
	topoff_finish(&st, &c);
	assert_int_equal(rec.nh, 1);
	assert_true(rec.h[0].at_top2 == 320 * S);
	assert_true(st.tot.held == 200 * S);
	assert_true(st.tot.soc_held == 200 * S);
	assert_true(st.tot.at_top2 == 320 * S);
}

/*
 * A level goes stale: SoC stops at row 5 of a hold at 100 %, rows with
 * current but no SoC follow every 60 s for 30 min.  They keep the level
 * for max-gap (15 min: 15 rows), so the hold ends 15 min after the last
 * SoC and the other 15 rows are counted as unjudged.
 */
static void
test_stale_level(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	int k;

	(void)unused;
	conf_init(&c);
	topoff_init(&st);
	for (k = 0; k <= 5; k++)
		topoff_push(&st, &c, k * 60 * S, CW_MISSING, 0.0, 100.0);
	for (k = 6; k <= 35; k++)
		topoff_push(&st, &c, k * 60 * S, CW_MISSING, 0.0, CW_MISSING);
	topoff_finish(&st, &c);
	assert_int_equal(rec.nh, 1);
	assert_true(rec.h[0].end == 20 * 60 * S);
	assert_int_equal(rec.h[0].carried, 15);
	assert_int_equal(st.tot.unjudged, 15);
}

/*
 * "At least min-depth" holds for a drop of exactly min-depth even where
 * the decimal readings do not subtract exactly in binary: full voltage
 * 40.0 V, peak 40.507 V, trough 40.307 V, a drop of 0.2 V = 0.5 % of the
 * full voltage, which double arithmetic makes 0.49999999999998579 %.
 * One micro-cycle.
 */
static void
test_depth_boundary(void **unused)
{
	struct topoff_conf c;
	struct topoff st;

	(void)unused;
	conf_init(&c);
	c.full_v = 40.0;
	topoff_init(&st);
	topoff_push(&st, &c, 0, 40.507, 0.0, CW_MISSING);
	topoff_push(&st, &c, 60 * S, 40.307, 0.0, CW_MISSING);
	topoff_push(&st, &c, 120 * S, 40.507, 1.0, CW_MISSING);
	topoff_push(&st, &c, 180 * S, 40.507, 0.0, CW_MISSING);
	topoff_finish(&st, &c);
	assert_int_equal(rec.nc, 1);
	near(rec.c[0].depth, 0.5, 1e-9);
}

/*
 * A change of signal ends the hold: rows with voltage only (full voltage
 * set), then the gauge starts to report SoC, all in their bands: two
 * holds, one of each.  (From SoC to voltage: test_sparse_soc.)
 */
static void
test_signal_change(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	int k;

	(void)unused;
	conf_init(&c);
	c.full_v = 4.1;
	topoff_init(&st);
	for (k = 0; k < 4; k++)
		topoff_push(&st, &c, k * 60 * S, 4.15, 0.0, CW_MISSING);
	for (k = 4; k < 8; k++)
		topoff_push(&st, &c, k * 60 * S, 4.15, 0.0, 99.0);
	topoff_finish(&st, &c);
	assert_int_equal(rec.nh, 2);
	assert_int_equal(rec.h[0].signal, TOPOFF_VOLTAGE);
	assert_int_equal(rec.h[1].signal, TOPOFF_SOC);
}

/*
 * A charger model run second by second, the ground truth being the
 * model's own count of charger restarts: a 2 Ah pack on a dock with a
 * 0.25 A standby load; the charger gives 1 A (net 0.75 A) from the
 * moment the SoC falls under 97 % until it reaches 100 %, over 24 h.  Fed
 * raw (1 s rows) and resampled onto a 60 s grid the way cw-clean --step
 * does (current: the mean over (t - 60, t]; SoC: the value at t), the
 * detector counts the restarts exactly, in both; with the SoC also
 * rounded to whole percent, too.
 */
static void
test_raw_and_resampled(void **unused)
{
	struct topoff_conf c;
	struct topoff st;
	double soc = 90.0, i, isum = 0.0;
	int on = 1, restarts = 0, pass;
	long sec;
	size_t n60 = 0, nraw = 0;
	static struct row raw[86401];
	struct row *g = rowbuf;

	(void)unused;
	for (sec = 0; sec <= 86400; sec++) {
		if (sec > 0) {
			if (!on && soc < 97.0) {
				on = 1;
				restarts++;
			}
			i = on ? 0.75 : -0.25;
			soc += 100.0 * i / 3600.0 / 2.0;
			if (on && soc >= 100.0)
				on = 0;
		} else
			i = 0.0;
		isum += i;
		raw[nraw++] = (struct row){ sec * S, CW_MISSING, i, soc };
		if (sec % 60 == 0) {
			g[n60++] = (struct row){ sec * S, CW_MISSING,
			    sec > 0 ? isum / 60.0 : 0.0, soc };
			isum = 0.0;
		}
	}
	assert_true(restarts > 10);
	for (pass = 0; pass < 4; pass++) {
		const struct row *r = pass % 2 == 0 ? raw : g;
		size_t n = pass % 2 == 0 ? nraw : n60, k;

		conf_init(&c);
		topoff_init(&st);
		for (k = 0; k < n; k++)
			topoff_push(&st, &c, r[k].t, r[k].v, r[k].i,
			    pass < 2 ? r[k].soc : floor(r[k].soc + 0.5));
		topoff_finish(&st, &c);
		assert_int_equal(rec.nh, 1);
		assert_int_equal(rec.nc, (size_t)restarts);
	}
}

/* Two devices interleaved, each in its own embedded state. */
struct mydev {
	char name[8];
	struct topoff top;
	unsigned long cycles;
};

static void
dev_cycle(void *ctx, struct topoff *st, const struct topoff_cycle *cy)
{
	struct mydev *d = (struct mydev *)(void *)((char *)st -
	    offsetof(struct mydev, top));

	(void)ctx;
	(void)cy;
	d->cycles++;
}

static void
test_two_devices(void **unused)
{
	struct topoff_conf c;
	struct mydev d[2];
	struct sim s;
	struct mark m;
	size_t k;

	(void)unused;
	topoff_conf_default(&c);
	c.on_cycle = dev_cycle;
	memset(d, 0, sizeof(d));
	topoff_init(&d[0].top);
	topoff_init(&d[1].top);
	build_three(&s, &m, 1);
	/* Device 0 gets the hold, device 1 only its first half. */
	for (k = 0; k < s.n; k++) {
		topoff_push(&d[0].top, &c, s.rows[k].t, CW_MISSING,
		    s.rows[k].i, s.rows[k].soc);
		if (k <= m.end[0])
			topoff_push(&d[1].top, &c, s.rows[k].t, CW_MISSING,
			    s.rows[k].i, s.rows[k].soc);
	}
	topoff_finish(&d[0].top, &c);
	topoff_finish(&d[1].top, &c);
	assert_int_equal(d[0].cycles, 3);
	assert_int_equal(d[1].cycles, 1);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_three_depths),
		cmocka_unit_test(test_min_depth),
		cmocka_unit_test(test_integer_soc),
		cmocka_unit_test(test_below_resolution),
		cmocka_unit_test(test_noise),
		cmocka_unit_test(test_unplug_at_full),
		cmocka_unit_test(test_deep_cycling),
		cmocka_unit_test(test_charge_noise),
		cmocka_unit_test(test_pulsed),
		cmocka_unit_test(test_regen_deeper),
		cmocka_unit_test(test_end_in_recharge),
		cmocka_unit_test(test_gap),
		cmocka_unit_test(test_voltage),
		cmocka_unit_test(test_sparse_soc),
		cmocka_unit_test(test_at_top),
		cmocka_unit_test(test_stale_level),
		cmocka_unit_test(test_depth_boundary),
		cmocka_unit_test(test_signal_change),
		cmocka_unit_test(test_raw_and_resampled),
		cmocka_unit_test(test_two_devices),
		cmocka_unit_test(test_use_dips),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
