/* wear.c: wear stress and modelled fade per device (see wear.h). */
#include <math.h>
#include <stddef.h>
#include <stdlib.h>
#include <string.h>

#include "charge.h"
#include "wear.h"

#define PRE_MINCAP 8

/* What a rainflow cycle needs to reach its device; lives on the stack. */
struct cyc_ctx {
	struct wear_dev *d;
	const struct wear_conf *c;
};

static void on_cycle(void *, const struct rf_cycle *);
static void on_topoff(void *, struct topoff *, const struct topoff_cycle *);
static double time_above(double, double, double, double);
static double maxd(double, double);
static double form(const struct model_eval *, int);
static void charge_span(struct wear_acc *, const struct wear_conf *,
    cw_time, cw_time, double, double);
static void soc_span(struct wear_acc *, const struct wear_conf *, cw_time,
    double, cw_time, double);
static void temp_span(struct wear_acc *, const struct wear_conf *, cw_time,
    double, cw_time, double);
static void model_span(struct wear_acc *, const struct wear_conf *,
    cw_time, const struct model_eval *, cw_time, const struct model_eval *);
static void topoff_row(struct wear_dev *, const struct wear_conf *,
    const struct wear_run *);
static int synchronises(const struct topoff_conf *, int,
    const struct wear_run *);
static int current_kind(const struct topoff_conf *, double);
static int repeats(const struct topoff_conf *, const struct wear_run *,
    const struct wear_run *);
static void pre_add(struct wear_dev *, const struct wear_run *);
static void pre_join(struct wear_dev *, struct wear_dev *, unsigned long,
    unsigned long);
static void topoff_join(struct wear_dev *, struct wear_dev *,
    const struct wear_conf *);
static void rf_pair(struct wear_dev *, const struct wear_conf *);

static double
maxd(double a, double b)
{
	return a > b ? a : b;
}

/* Form K (WEAR_FULL ...) of E. */
static double
form(const struct model_eval *e, int k)
{
	switch (k) {
	case WEAR_REF:
		return e->ref;
	case WEAR_SOC:
		return e->soc;
	case WEAR_TEMP:
		return e->temp;
	}
	return e->full;
}

/*
 * Seconds of an interval of DT seconds during which a value going
 * linearly from A to B is at or above TH.
 */
static double
time_above(double a, double b, double th, double dt)
{
	if (a >= th && b >= th)
		return dt;
	if (a < th && b < th)
		return 0;
	/* The fraction first, in halves: no step may overflow, whatever
	 * finite values a damaged log holds (1e308 C gave inf hours). */
	if (a >= th)
		return dt * ((a * 0.5 - th * 0.5) / (a * 0.5 - b * 0.5));
	return dt * ((b * 0.5 - th * 0.5) / (b * 0.5 - a * 0.5));
}

void
wear_conf_default(struct wear_conf *c)
{
	memset(c, 0, sizeof(*c));
	c->model = model_table[0];
	c->cycle_scale = 1;
	c->cal_scale = 1;
	thermal_limits_default(&c->lim);
	c->min_current = TOPOFF_MIN_CURRENT;
	c->max_gap = CHARGE_MAX_GAP;
	c->hysteresis = 1;
	c->residue = RF_RESIDUE_HALF;
	topoff_conf_default(&c->topoff);
	c->topoff.on_cycle = on_topoff;
}

void
wear_set_cycle_life(struct wear_conf *c, double n)
{
	struct model_eval e;

	c->model->cycle(1.0, c->model->ref_soc, c->model->ref_temp_c, &e);
	c->cycle_scale = c->model->damage_at(WEAR_EOL_FADE) / (n * e.full);
}

void
wear_set_calendar_life(struct wear_conf *c, double days)
{
	struct model_eval e;

	c->model->calendar(c->model->ref_soc, c->model->ref_temp_c, &e);
	c->cal_scale = c->model->damage_at(WEAR_EOL_FADE) /
	    (days * 86400.0 * e.full);
}

void
wear_init(struct wear_dev *d, const struct wear_conf *c)
{
	memset(d, 0, sizeof(*d));
	rf_init(&d->rf, c->hysteresis);
	d->rf.raw_start = c->joinable != 0;
	topoff_init(&d->top);
	/*
	 * Only a state written for a later join (--state-out) needs the
	 * top-off prefix; a plain pass or a cumulative --state does not keep
	 * it (as wear_compact() drops it), which saves its memory.
	 */
	d->pre_state = c->joinable ? WEAR_PRE_OPEN : WEAR_PRE_LOST;
}

/* A micro-cycle of the top-off detector embedded in a struct wear_dev. */
static void
on_topoff(void *ctx, struct topoff *st, const struct topoff_cycle *cy)
{
	struct wear_dev *d;

	(void)ctx;
	(void)cy;
	d = (struct wear_dev *)(void *)((char *)st -
	    offsetof(struct wear_dev, top));
	d->acc.topoff_cycles++;
}

static void
on_cycle(void *ctx, const struct rf_cycle *cy)
{
	struct cyc_ctx *x = ctx;
	struct wear_acc *a = &x->d->acc;
	struct model_eval e;
	int k;

	rf_sum_add(&a->rf, cy);
	if (!cw_isnum(cy->aux_mean)) {
		a->cycles_no_temp += cy->count;
		return;
	}
	x->c->model->cycle(cy->range / 100.0, cy->mean / 100.0, cy->aux_mean,
	    &e);
	for (k = 0; k < WEAR_NFORM; k++)
		a->cyc[k] += cy->count * form(&e, k);
}

/* Charge of current I_A over (T0, T1], in the zone of TEMP_C. */
static void
charge_span(struct wear_acc *a, const struct wear_conf *c, cw_time t0,
    cw_time t1, double i_a, double temp_c)
{
	double ah;

	if (!(i_a > c->min_current))
		return;
	ah = charge_ah(i_a, t0, t1, c->max_gap);
	if (ah > 0) {
		a->charge_ah += ah;
		a->charge_s += (double)(t1 - t0) / CW_US_PER_S;
		thermal_ah_add(&a->zone_ah, &c->lim, temp_c, ah);
	}
}

/* Time at high SoC from (T0, X0) to (T1, X1); a gap holds X0. */
static void
soc_span(struct wear_acc *a, const struct wear_conf *c, cw_time t0,
    double x0, cw_time t1, double x1)
{
	double dt;

	if (t1 <= t0)
		return;
	dt = (double)(t1 - t0) / CW_US_PER_S;
	a->soc_s += dt;
	if (t1 - t0 <= c->max_gap)
		a->soc_high_s += time_above(x0, x1, c->topoff.full_pct, dt);
	else if (x0 >= c->topoff.full_pct)
		a->soc_high_s += dt;
}

/* Time at high temperature, likewise. */
static void
temp_span(struct wear_acc *a, const struct wear_conf *c, cw_time t0,
    double x0, cw_time t1, double x1)
{
	double dt;

	if (t1 <= t0)
		return;
	dt = (double)(t1 - t0) / CW_US_PER_S;
	a->temp_s += dt;
	if (t1 - t0 <= c->max_gap)
		a->temp_high_s += time_above(x0, x1, c->lim.t[2], dt);
	else if (x0 >= c->lim.t[2])
		a->temp_high_s += dt;
}

/* Calendar aging from rate R0 at T0 to R1 at T1 (trapezoid rule). */
static void
model_span(struct wear_acc *a, const struct wear_conf *c, cw_time t0,
    const struct model_eval *r0, cw_time t1, const struct model_eval *r1)
{
	double dt;
	int k;

	if (t1 <= t0)
		return;
	dt = (double)(t1 - t0) / CW_US_PER_S;
	a->model_s += dt;
	if (t1 - t0 <= c->max_gap) {
		for (k = 0; k < WEAR_NFORM; k++)
			a->cal[k] += dt * (form(r0, k) + form(r1, k)) / 2;
	} else {
		a->gaps++;
		a->gap_s += dt;
		for (k = 0; k < WEAR_NFORM; k++)
			a->cal[k] += dt * form(r0, k);
	}
}

/*
 * A run of rows through the top-off detector, counting those judged: its
 * first row, and its last again when it has more (rows with a SoC,
 * always judged, that change nothing after the first).
 */
static void
topoff_row(struct wear_dev *d, const struct wear_conf *c,
    const struct wear_run *r)
{
	unsigned long u = d->top.tot.unjudged;

	topoff_push(&d->top, &c->topoff, r->t, r->v, r->i, r->soc);
	if (r->n > 1)
		topoff_push(&d->top, &c->topoff, r->t_last, r->v, r->i,
		    r->soc);
	if (d->top.tot.unjudged == u)
		d->acc.topoff_judged += r->n;
}

/* Charging 1, resting 0, unknown -1, as the detector tells them. */
static int
current_kind(const struct topoff_conf *tc, double i_a)
{
	if (i_a > tc->min_current)
		return 1;
	return i_a <= tc->min_current ? 0 : -1;
}

/*
 * Whether row R repeats the run E for the detector: the same SoC, the same
 * kind of current, within max_gap of E's first row (so no interval in
 * between is a gap either).  The detector is then where E's first row
 * left it, but for times and charge (see topoff.c: a hold row at the
 * level it is at changes nothing but those).  Rows without SoC are kept
 * one by one: whether one is judged by voltage, or carries the last
 * level, depends on the time since the last SoC.
 */
static int
repeats(const struct topoff_conf *tc, const struct wear_run *e,
    const struct wear_run *r)
{
	return cw_isnum(r->soc) && cw_isnum(e->soc) && r->soc == e->soc &&
	    current_kind(tc, r->i) == current_kind(tc, e->i) &&
	    r->t - e->t <= tc->max_gap;
}

/*
 * Whether the detector is in the same state after row R whatever state it
 * was in before (see wear.h); GAP: R follows its previous row by more
 * than max_gap.  A gap ends any hold (and makes any SoC before it too old
 * to matter); a row with a SoC below the band ends any hold; a resting
 * row at 100 % SoC ends a hold of the other signal and restarts it, or,
 * in a SoC hold, is at or above any peak (SoC levels are at most 100) and
 * ends any recharge, so it leaves the detector watching from a fresh peak
 * there.  A row without SoC settles nothing: whether the detector judges
 * it by its voltage depends on how recent the last SoC was.
 */
static int
synchronises(const struct topoff_conf *tc, int gap, const struct wear_run *r)
{
	if (gap)
		return 1;
	if (cw_isnum(r->soc))
		return r->soc < tc->full_pct || (r->soc >= 100 &&
		    cw_isnum(r->i) && r->i <= tc->min_current);
	return 0;
}

static void
pre_add(struct wear_dev *d, const struct wear_run *r)
{
	if (d->pre_n == WEAR_PRE_MAX) {
		free(d->pre);
		d->pre = NULL;
		d->pre_n = d->pre_cap = 0;
		d->pre_state = WEAR_PRE_LOST;
		return;
	}
	if (d->pre_n == d->pre_cap) {
		d->pre_cap = d->pre_cap ? 2 * d->pre_cap : PRE_MINCAP;
		if (d->pre_cap > WEAR_PRE_MAX)
			d->pre_cap = WEAR_PRE_MAX;
		d->pre = cw_realloc(d->pre, d->pre_cap * sizeof(*d->pre));
	}
	d->pre[d->pre_n++] = *r;
}

void
wear_push(struct wear_dev *d, const struct wear_conf *c, cw_time t,
    double v, double i_a, double temp_c, double soc)
{
	struct wear_acc *a = &d->acc;
	struct cyc_ctx x;
	struct model_eval e;
	struct wear_run row;
	int ok_soc, ok_temp, gap;

	ok_soc = cw_isnum(soc) && soc >= 0 && soc <= 100;
	ok_temp = cw_isnum(temp_c) && temp_c > -273.15;
	if (!a->have) {
		a->have = 1;
		a->first = t;
		d->head_i = i_a;
		d->head_temp = ok_temp ? temp_c : CW_MISSING;
	}
	a->last = t;
	a->rows++;
	gap = d->have_prev && t - d->prev_t > c->topoff.max_gap;

	/* Charge over the interval that ends at this row. */
	if (!cw_isnum(i_a))
		a->rows_no_current++;
	else if (i_a > c->min_current) {
		a->max_charge_a = maxd(a->max_charge_a, i_a);
		if (d->have_prev)
			charge_span(a, c, d->prev_t, t, i_a,
			    ok_temp ? temp_c : CW_MISSING);
	}
	d->have_prev = 1;
	d->prev_t = t;

	/* Time at high SoC; a gap holds the state before it. */
	if (!ok_soc)
		a->rows_no_soc++;
	else {
		if (d->have_soc)
			soc_span(a, c, d->soc_t, d->soc, t, soc);
		else {
			d->have_soc0 = 1;
			d->soc0_t = t;
			d->soc0 = soc;
		}
		d->have_soc = 1;
		d->soc_t = t;
		d->soc = soc;
	}

	/* Time at high temperature, likewise. */
	if (!ok_temp)
		a->rows_no_temp++;
	else {
		if (d->have_temp)
			temp_span(a, c, d->temp_t, d->temp, t, temp_c);
		else {
			d->have_temp0 = 1;
			d->temp0_t = t;
			d->temp0 = temp_c;
		}
		d->have_temp = 1;
		d->temp_t = t;
		d->temp = temp_c;
	}

	/* Calendar aging, sample by sample (trapezoid rule). */
	if (ok_soc && ok_temp) {
		a->rows_model++;
		c->model->calendar(soc / 100.0, temp_c, &e);
		if (d->have_model)
			model_span(a, c, d->model_t, &d->rate, t, &e);
		else {
			d->have_model0 = 1;
			d->model0_t = t;
			d->rate0 = e;
		}
		d->have_model = 1;
		d->model_t = t;
		d->rate = e;
	}

	/* Cycles: rainflow over the SoC, the temperature carried along. */
	if (ok_soc) {
		x.d = d;
		x.c = c;
		rf_push(&d->rf, t, soc, ok_temp ? temp_c : CW_MISSING,
		    on_cycle, &x);
	}

	/* Top-off, and its first rows while they may matter to a join. */
	row.t = row.t_last = t;
	row.n = 1;
	row.v = v;
	row.i = i_a;
	row.soc = ok_soc ? soc : CW_MISSING;
	topoff_row(d, c, &row);
	if (d->pre_state == WEAR_PRE_OPEN && d->pre_n > 0 &&
	    repeats(&c->topoff, &d->pre[d->pre_n - 1], &row)) {
		d->pre[d->pre_n - 1].t_last = t;
		d->pre[d->pre_n - 1].n++;
		d->pre_cycles = a->topoff_cycles;
		d->pre_judged = a->topoff_judged;
	} else if (d->pre_state == WEAR_PRE_OPEN) {
		pre_add(d, &row);
		if (d->pre_state == WEAR_PRE_OPEN) {
			d->pre_cycles = a->topoff_cycles;
			d->pre_judged = a->topoff_judged;
			if (synchronises(&c->topoff, gap, &row))
				d->pre_state = WEAR_PRE_DONE;
		}
	}
}

/* A raw rainflow start side paired as a plain pass pairs it. */
static void
rf_pair(struct wear_dev *d, const struct wear_conf *c)
{
	struct cyc_ctx x;
	struct rf_state q;

	if (!d->rf.raw_start)
		return;
	x.d = d;
	x.c = c;
	rf_init(&q, d->rf.hyst);
	rf_join(&q, &d->rf, on_cycle, &x);
	rf_free(&d->rf);
	d->rf = q;
}

void
wear_compact(struct wear_dev *d, const struct wear_conf *c)
{
	rf_pair(d, c);
	/* Nothing is to come before it: the top-off prefix is not needed. */
	free(d->pre);
	d->pre = NULL;
	d->pre_n = d->pre_cap = 0;
	d->pre_state = WEAR_PRE_LOST;
}

void
wear_finish(struct wear_dev *d, const struct wear_conf *c)
{
	struct cyc_ctx x;

	rf_pair(d, c);
	x.d = d;
	x.c = c;
	rf_finish(&d->rf, c->residue, on_cycle, &x);
	topoff_finish(&d->top, &c->topoff);
}

/*
 * The prefix of A followed by B: while A's rows never synchronised the
 * detector, every one of them is in A's prefix, so B's prefix goes on
 * after it.  CYCLES and JUDGED are A's counts once B's prefix has been
 * run after A's rows.
 */
static void
pre_join(struct wear_dev *a, struct wear_dev *b, unsigned long cycles,
    unsigned long judged)
{
	size_t k;

	if (a->pre_state != WEAR_PRE_OPEN)
		return;
	if (b->pre_state == WEAR_PRE_LOST ||
	    a->pre_n + b->pre_n > WEAR_PRE_MAX) {
		free(a->pre);
		a->pre = NULL;
		a->pre_n = a->pre_cap = 0;
		a->pre_state = WEAR_PRE_LOST;
		return;
	}
	for (k = 0; k < b->pre_n; k++)
		pre_add(a, &b->pre[k]);
	a->pre_state = b->pre_state;
	a->pre_cycles = cycles;
	a->pre_judged = judged;
}

/*
 * The top-off detector across the join.  A's totals already hold B's.
 * B's prefix runs through A's detector, which is then in the state B's
 * own detector reached at the end of the prefix (if B's prefix ended at a
 * synchronising row) or is the state of both (if B never synchronised).
 * The prefix's micro-cycles and judged rows, as B counted them alone,
 * are replaced by those A's detector counted.
 */
static void
topoff_join(struct wear_dev *a, struct wear_dev *b, const struct wear_conf *c)
{
	unsigned long cyc0, jud0, cyc, jud;
	size_t k;

	if (b->pre_state == WEAR_PRE_LOST) {
		a->top = b->top;
		a->acc.topoff_cut++;
		pre_join(a, b, 0, 0);
		return;
	}
	cyc0 = a->acc.topoff_cycles;
	jud0 = a->acc.topoff_judged;
	for (k = 0; k < b->pre_n; k++)
		topoff_row(a, c, &b->pre[k]);
	/* What the prefix gave after A's rows, instead of after none. */
	cyc = a->acc.topoff_cycles - cyc0;
	jud = a->acc.topoff_judged - jud0;
	a->acc.topoff_cycles = cyc0 - b->pre_cycles + cyc;
	a->acc.topoff_judged = jud0 - b->pre_judged + jud;
	if (b->pre_state == WEAR_PRE_DONE)
		a->top = b->top;
	/* A's own counts, before B's were added, and then the prefix's. */
	pre_join(a, b, cyc0 - b->acc.topoff_cycles + cyc,
	    jud0 - b->acc.topoff_judged + jud);
}

void
wear_join(struct wear_dev *a, struct wear_dev *b, const struct wear_conf *c)
{
	struct wear_acc *s = &a->acc;
	struct cyc_ctx x;

	if (!b->acc.have) {
		wear_free(b);
		return;
	}
	if (!s->have) {
		wear_free(a);
		*a = *b;
		memset(b, 0, sizeof(*b));
		return;
	}
	/* The intervals from A's last rows to B's first. */
	if (cw_isnum(b->head_i) && b->head_i > c->min_current)
		charge_span(s, c, a->prev_t, b->acc.first, b->head_i,
		    b->head_temp);
	if (a->have_soc && b->have_soc0)
		soc_span(s, c, a->soc_t, a->soc, b->soc0_t, b->soc0);
	if (a->have_temp && b->have_temp0)
		temp_span(s, c, a->temp_t, a->temp, b->temp0_t, b->temp0);
	if (a->have_model && b->have_model0)
		model_span(s, c, a->model_t, &a->rate, b->model0_t, &b->rate0);

	wear_acc_merge(s, &b->acc);
	x.d = a;
	x.c = c;
	rf_join(&a->rf, &b->rf, on_cycle, &x);
	topoff_join(a, b, c);

	/* The first rows stay A's where A has them, the last become B's. */
	if (!a->have_soc0) {
		a->have_soc0 = b->have_soc0;
		a->soc0_t = b->soc0_t;
		a->soc0 = b->soc0;
	}
	if (!a->have_temp0) {
		a->have_temp0 = b->have_temp0;
		a->temp0_t = b->temp0_t;
		a->temp0 = b->temp0;
	}
	if (!a->have_model0) {
		a->have_model0 = b->have_model0;
		a->model0_t = b->model0_t;
		a->rate0 = b->rate0;
	}
	a->prev_t = b->prev_t;
	if (b->have_soc) {
		a->have_soc = 1;
		a->soc_t = b->soc_t;
		a->soc = b->soc;
	}
	if (b->have_temp) {
		a->have_temp = 1;
		a->temp_t = b->temp_t;
		a->temp = b->temp;
	}
	if (b->have_model) {
		a->have_model = 1;
		a->model_t = b->model_t;
		a->rate = b->rate;
	}
	wear_free(b);
	memset(b, 0, sizeof(*b));
}

void
wear_free(struct wear_dev *d)
{
	rf_free(&d->rf);
	free(d->pre);
	d->pre = NULL;
	d->pre_n = d->pre_cap = 0;
}

void
wear_acc_merge(struct wear_acc *a, const struct wear_acc *b)
{
	int k;

	if (!b->have)
		return;
	if (!a->have) {
		*a = *b;
		return;
	}
	if (b->first < a->first)
		a->first = b->first;
	if (b->last > a->last)
		a->last = b->last;
	a->rows += b->rows;
	a->rows_no_current += b->rows_no_current;
	a->rows_no_soc += b->rows_no_soc;
	a->rows_no_temp += b->rows_no_temp;
	a->rows_model += b->rows_model;
	a->charge_ah += b->charge_ah;
	a->charge_s += b->charge_s;
	a->max_charge_a = maxd(a->max_charge_a, b->max_charge_a);
	for (k = 0; k < THERMAL_NZONE; k++)
		a->zone_ah.zone[k] += b->zone_ah.zone[k];
	a->zone_ah.no_temp += b->zone_ah.no_temp;
	a->soc_s += b->soc_s;
	a->soc_high_s += b->soc_high_s;
	a->temp_s += b->temp_s;
	a->temp_high_s += b->temp_high_s;
	a->model_s += b->model_s;
	a->gap_s += b->gap_s;
	a->gaps += b->gaps;
	a->rf.cycles += b->rf.cycles;
	a->rf.range_sum += b->rf.range_sum;
	a->rf.max_range = maxd(a->rf.max_range, b->rf.max_range);
	a->rf.full += b->rf.full;
	a->rf.half += b->rf.half;
	a->cycles_no_temp += b->cycles_no_temp;
	a->topoff_cycles += b->topoff_cycles;
	a->topoff_judged += b->topoff_judged;
	a->topoff_cut += b->topoff_cut;
	for (k = 0; k < WEAR_NFORM; k++) {
		a->cyc[k] += b->cyc[k];
		a->cal[k] += b->cal[k];
	}
}

const char *
wear_prior_name(int kind)
{
	static const char *const name[WEAR_PRIOR_NKIND] = { "new", "soh",
	    "age" };

	return kind >= 0 && kind < WEAR_PRIOR_NKIND ? name[kind] : "new";
}

double
wear_prior_damage(const struct wear_conf *c, const struct wear_prior *p)
{
	const struct model *m = c->model;
	struct model_eval cyc, cal;
	double f = 0;

	if (p == NULL)
		return 0;
	switch (p->kind) {
	case WEAR_PRIOR_SOH:
		/* L(f0) = 1 - SoH; a pack above its rating is taken as new. */
		if (p->soh_pct < 100)
			f = m->damage_at(1 - p->soh_pct / 100);
		break;
	case WEAR_PRIOR_AGE:
		/* Rest and full cycles at the reference conditions. */
		m->cycle(1.0, m->ref_soc, m->ref_temp_c, &cyc);
		m->calendar(m->ref_soc, m->ref_temp_c, &cal);
		if (p->age_s > 0)
			f += c->cal_scale * cal.full * p->age_s;
		if (p->efc > 0)
			f += c->cycle_scale * cyc.full * p->efc;
		break;
	}
	return f;
}

void
wear_report(const struct wear_conf *c, const struct wear_acc *a,
    const struct wear_prior *p, double capacity_ah, struct wear_result *r)
{
	static const char *const cause[3] = { "cycling", "high-soc", "heat" };
	const struct model *m = c->model;
	double f, f0, l0, soh0, f_eol, part[4], sum, sh[3], best;
	int known_soc, known_temp, known_model, k;

	r->days = r->charge_ah = r->efc = r->max_depth_pct = CW_MISSING;
	r->hours_near_full = r->hours_hot = CW_MISSING;
	r->cold_charge_ah = r->cool_charge_ah = r->hot_charge_ah = CW_MISSING;
	r->topoff_cycles = CW_MISSING;
	r->share_age = r->share_cycling = r->share_high_soc = CW_MISSING;
	r->share_heat = CW_MISSING;
	r->fade_pct = r->soh_pct = r->days_to_eol = r->damage = CW_MISSING;
	r->max_charge_c = r->mean_charge_c = r->fade_ah = CW_MISSING;
	r->dominant = "";
	r->prior = wear_prior_name(p != NULL ? p->kind : WEAR_PRIOR_NEW);
	r->damage_prior = f0 = wear_prior_damage(c, p);
	if (!a->have)
		return;

	known_soc = a->rows_no_soc < a->rows;
	known_temp = a->rows_no_temp < a->rows;
	known_model = a->model_s > 0 || a->rf.cycles > a->cycles_no_temp;
	r->days = (double)(a->last - a->first) / CW_US_PER_S / 86400.0;
	if (a->rows_no_current < a->rows)
		r->charge_ah = a->charge_ah;
	if (known_soc) {
		r->efc = a->rf.range_sum / 100.0;
		r->max_depth_pct = a->rf.max_range;
		r->hours_near_full = a->soc_high_s / 3600.0;
	}
	if (known_temp) {
		r->hours_hot = a->temp_high_s / 3600.0;
		if (cw_isnum(r->charge_ah)) {
			r->cold_charge_ah = a->zone_ah.zone[THERMAL_BELOW_MIN];
			r->cool_charge_ah = a->zone_ah.zone[THERMAL_COOL];
			r->hot_charge_ah = a->zone_ah.zone[THERMAL_WARM] +
			    a->zone_ah.zone[THERMAL_ABOVE_MAX];
		}
	}
	if (a->topoff_judged > 0)
		r->topoff_cycles = (double)a->topoff_cycles;

	if (known_model) {
		f = c->cycle_scale * a->cyc[WEAR_FULL] +
		    c->cal_scale * a->cal[WEAR_FULL];
		r->damage = f;
		/*
		 * The shares split the span's damage f, linear in the
		 * stresses; the fade L(f0 + f) - L(f0) is one function of
		 * their sum, so no share of it is any cause's alone.
		 */
		part[0] = c->cal_scale * a->cal[WEAR_REF];
		part[1] = c->cycle_scale * a->cyc[WEAR_REF];
		part[2] = c->cycle_scale * a->cyc[WEAR_SOC] +
		    c->cal_scale * a->cal[WEAR_SOC];
		part[3] = c->cycle_scale * a->cyc[WEAR_TEMP] +
		    c->cal_scale * a->cal[WEAR_TEMP];
		sum = part[0] + part[1] + part[2] + part[3];
		if (f > 0 && sum > 0) {
			r->share_age = part[0] / sum;
			r->share_cycling = part[1] / sum;
			r->share_high_soc = part[2] / sum;
			r->share_heat = part[3] / sum;
		}
		l0 = m->fade(f0);
		soh0 = p != NULL && p->kind == WEAR_PRIOR_SOH ? p->soh_pct :
		    100 * (1 - l0);
		r->fade_pct = 100 * (m->fade(f0 + f) - l0);
		r->soh_pct = soh0 - r->fade_pct;
		/* At the span's mean damage rate, until the SoH is 80 %. */
		f_eol = m->damage_at(l0 + (soh0 - 100 * (1 - WEAR_EOL_FADE)) /
		    100);
		if (f0 + f >= f_eol)
			r->days_to_eol = 0;
		else if (f > 0 && a->model_s > 0)
			r->days_to_eol = (f_eol - f0 - f) / (f / a->model_s) /
			    86400.0;
		if (capacity_ah > 0)
			r->fade_ah = capacity_ah * r->fade_pct / 100;
	}
	if (capacity_ah > 0 && cw_isnum(r->charge_ah) && a->charge_s > 0) {
		r->max_charge_c = a->max_charge_a / capacity_ah;
		r->mean_charge_c = a->charge_ah / (a->charge_s / 3600.0) /
		    capacity_ah;
	}

	/* The model has no plating term, so cold charge comes first and
	 * leaves no life to tell. */
	if (cw_isnum(r->cold_charge_ah) && a->charge_ah > 0 &&
	    r->cold_charge_ah >= WEAR_COLD_SHARE * a->charge_ah) {
		r->dominant = "cold-charge";
		r->days_to_eol = CW_MISSING;
		return;
	}
	if (!cw_isnum(r->share_cycling))
		return;
	sh[0] = r->share_cycling;
	sh[1] = r->share_high_soc;
	sh[2] = r->share_heat;
	r->dominant = "none";
	best = WEAR_DOMINANT;
	for (k = 0; k < 3; k++)
		if (sh[k] >= best) {
			best = sh[k];
			r->dominant = cause[k];
		}
}
