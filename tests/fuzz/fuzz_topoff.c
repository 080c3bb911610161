/*
 * fuzz_topoff.c: the hold and top-off micro-cycle detector
 * (lib/topoff.c) fed arbitrary sample streams.
 *
 * Configuration: the band (SoC percent, full voltage or none), minimum
 * depth, minimum current and gap limit.  Oracles, from the rules in
 * topoff.h and cw-topoff(1):
 * - a hold has start <= end, at least one row, carried rows among them,
 *   a known signal, as many micro-cycles as were emitted for it, a
 *   deepest cycle no shallower than the minimum depth (up to rounding)
 *   when it has cycles, a depth sum at least the deepest, a time at the
 *   top within the hold, and holds of a device do not overlap;
 * - a micro-cycle lies inside its hold, has start <= end, depth = peak -
 *   trough >= minimum depth (up to rounding), and comes before its hold;
 * - the totals count every hold and cycle emitted and every row pushed.
 */
#include "fuzz_engine.h"
#include "topoff.h"

struct dev {
	struct devent e;
	struct topoff top;
	unsigned long holds, cycles, open_cycles;
	cw_time first_cycle, last_end;
	int any_hold;
};

struct run {
	struct topoff_conf conf;
};

static struct dev *
dev_of(struct topoff *st)
{
	return (struct dev *)((char *)st - offsetof(struct dev, top));
}

static void
on_cycle(void *ctx, struct topoff *st, const struct topoff_cycle *cy)
{
	struct run *r = ctx;
	struct dev *d = dev_of(st);
	double eps = 1e-6 * (1 + fabs(cy->peak));

	FZ_CHECK(cy->signal == TOPOFF_SOC || cy->signal == TOPOFF_VOLTAGE);
	FZ_CHECK(cy->start <= cy->end);
	FZ_CHECK(cy->depth >= r->conf.min_depth - eps);
	FZ_CHECK(cy->trough <= cy->peak);
	if (d->open_cycles == 0)
		d->first_cycle = cy->start;
	d->open_cycles++;
	d->cycles++;
}

static void
on_hold(void *ctx, struct topoff *st, const struct topoff_hold *h)
{
	struct run *r = ctx;
	struct dev *d = dev_of(st);

	FZ_CHECK(h->signal == TOPOFF_SOC || h->signal == TOPOFF_VOLTAGE);
	FZ_CHECK(h->start <= h->end);
	FZ_CHECK(h->rows >= 1 && h->carried <= h->rows);
	FZ_CHECK(h->cycles == d->open_cycles);
	if (h->cycles > 0) {
		FZ_CHECK(d->first_cycle >= h->start);
		FZ_CHECK(h->depth_max >= r->conf.min_depth - 1e-6 *
		    (1 + h->depth_max));
		FZ_CHECK(h->depth_sum >= h->depth_max * (1 - 1e-12));
	} else
		FZ_CHECK(h->depth_max == 0);
	FZ_CHECK(h->at_top2 >= 0 && h->at_top2 <= 2 * (h->end - h->start));
	if (h->signal == TOPOFF_VOLTAGE)
		FZ_CHECK(h->at_top2 == 0);
	if (d->any_hold)
		FZ_CHECK(h->start >= d->last_end);
	d->any_hold = 1;
	d->last_end = h->end;
	d->open_cycles = 0;
	d->holds++;
}

static void
init(void *ctx, void *dp)
{
	struct dev *d = dp;

	(void)ctx;
	topoff_init(&d->top);
}

static void
push(void *ctx, void *dp, const struct cw_sample *s)
{
	struct run *r = ctx;
	struct dev *d = dp;

	topoff_push(&d->top, &r->conf, s->t, s->v, s->i, s->soc);
}

static void
finish(void *ctx, void *dp)
{
	struct run *r = ctx;
	struct dev *d = dp;
	const struct topoff_totals *t = &d->top.tot;

	topoff_finish(&d->top, &r->conf);
	FZ_CHECK(d->open_cycles == 0);
	FZ_CHECK(t->holds == d->holds && t->cycles == d->cycles);
	FZ_CHECK(t->rows == d->e.nrows);
	FZ_CHECK(t->unjudged + t->carried <= t->rows);
	FZ_CHECK(t->soc_held <= t->held && t->held >= 0);
	FZ_CHECK(t->at_top2 <= 2 * t->soc_held);
}

int
LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
	static const double fulls[] = { 95, 100, 0, 99.5 };
	static const double volts[] = { 0, 4.2, 1e-3, 41.5 };
	static const double depths[] = { 0.5, 1e-9, 5, 0.1 };
	static const double currents[] = { 0.05, 0, 1, 1e-9 };
	static const cw_time gaps[] = { 900, 1, 60, 86400 };
	struct run r;
	struct fz_engine e;
	unsigned b1 = size > 1 ? data[1] : 0, b2 = size > 2 ? data[2] : 0;

	memset(&r, 0, sizeof(r));
	memset(&e, 0, sizeof(e));
	topoff_conf_default(&r.conf);
	r.conf.full_pct = fulls[b1 & 3];
	r.conf.full_v = volts[(b1 >> 2) & 3] > 0 ? volts[(b1 >> 2) & 3] :
	    CW_MISSING;
	r.conf.min_depth = depths[(b1 >> 4) & 3];
	r.conf.min_current = currents[(b1 >> 6) & 3];
	r.conf.max_gap = gaps[b2 & 3] * CW_US_PER_S;
	r.conf.on_hold = on_hold;
	r.conf.on_cycle = on_cycle;
	r.conf.ctx = &r;
	e.statesz = sizeof(struct dev);
	e.init = init;
	e.push = push;
	e.finish = finish;
	e.ctx = &r;
	return fz_engine_run(&e, data, size);
}
