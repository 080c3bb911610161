/*
 * fuzz_thermal.c: the charge-temperature event detector (lib/thermal.c)
 * fed arbitrary sample streams.
 *
 * Configuration: the limits (defaults, all equal, or tight), hysteresis,
 * minimum current, minimum duration, merge time and gap limit.  Oracles,
 * from the rules in thermal.h and cw-thermal(1):
 * - a charge event's zone is not the normal window; a use event's zone
 *   is below-min or above-max; the kind is charge or use;
 * - no event is shorter than the minimum duration, and start <= end;
 * - events of one kind and device come in time order without overlap;
 * - temp_min <= temp_max when both are known, and both lie within the
 *   temperatures pushed; charge_ah is finite for tame currents;
 * - the per-zone counts of the device state equal the events emitted,
 *   and the per-zone Ah are finite for tame input.
 */
#include "fuzz_engine.h"
#include "thermal.h"

struct dev {
	struct devent e;
	struct thermal_dev th;
	cw_time last_end[THERMAL_NKIND];
	int any[THERMAL_NKIND];
	unsigned long n[THERMAL_NKIND][THERMAL_NZONE];
	double tlo, thi;
	int tame;
};

struct run {
	struct thermal_conf conf;
};

static void
on_event(void *ctx, struct thermal_dev *th, const struct thermal_event *ev)
{
	struct dev *d = (struct dev *)((char *)th - offsetof(struct dev, th));
	struct run *r = ctx;

	FZ_CHECK(ev->kind == THERMAL_CHARGE || ev->kind == THERMAL_USE);
	FZ_CHECK(ev->zone >= 0 && ev->zone < THERMAL_NZONE);
	if (ev->kind == THERMAL_CHARGE)
		FZ_CHECK(ev->zone != THERMAL_NORMAL);
	else
		FZ_CHECK(ev->zone == THERMAL_BELOW_MIN ||
		    ev->zone == THERMAL_ABOVE_MAX);
	FZ_CHECK(ev->start <= ev->end);
	FZ_CHECK(ev->end - ev->start >= r->conf.min_duration);
	if (d->any[ev->kind])
		FZ_CHECK(ev->start >= d->last_end[ev->kind]);
	d->any[ev->kind] = 1;
	d->last_end[ev->kind] = ev->end;
	FZ_CHECK(ev->rows >= 1 && ev->parts >= 1);
	if (cw_isnum(ev->temp_min) && cw_isnum(ev->temp_max)) {
		FZ_CHECK(ev->temp_min <= ev->temp_max);
		FZ_CHECK(ev->temp_min >= d->tlo && ev->temp_max <= d->thi);
	}
	if (d->tame)
		FZ_CHECK(isfinite(ev->charge_ah));
	d->n[ev->kind][ev->zone]++;
}

static void
init(void *ctx, void *dp)
{
	struct dev *d = dp;

	(void)ctx;
	thermal_init(&d->th);
	d->tlo = INFINITY;
	d->thi = -INFINITY;
	d->tame = 1;
}

static void
push(void *ctx, void *dp, const struct cw_sample *s)
{
	struct run *r = ctx;
	struct dev *d = dp;

	if (cw_isnum(s->temp)) {
		d->tlo = fmin(d->tlo, s->temp);
		d->thi = fmax(d->thi, s->temp);
	}
	if (cw_isnum(s->i))
		d->tame &= fz_tame(s->i);
	thermal_push(&d->th, &r->conf, s->t, s->i, s->temp, s->soc);
}

static void
finish(void *ctx, void *dp)
{
	struct run *r = ctx;
	struct dev *d = dp;
	int k, z;

	thermal_finish(&d->th, &r->conf);
	for (k = 0; k < THERMAL_NKIND; k++)
		for (z = 0; z < THERMAL_NZONE; z++)
			FZ_CHECK(d->th.events[k][z] == d->n[k][z]);
	FZ_CHECK(d->th.rows == d->e.nrows);
	FZ_CHECK(d->th.unjudged <= d->th.rows);
	if (d->tame)
		for (z = 0; z < THERMAL_NZONE; z++)
			FZ_CHECK(isfinite(d->th.ah.zone[z]));
}

int
LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
	static const double hysts[] = { THERMAL_HYST, 0, 5, 100 };
	static const double currents[] = { 0.05, 0, 1, 1e-9 };
	static const cw_time durs[] = { 60, 0, 1, 3600 };
	static const cw_time merges[] = { 120, 0, 1, 86400 };
	static const cw_time gaps[] = { 900, 1, 60, 86400 };
	struct run r;
	struct fz_engine e;
	struct thermal_limits *l = &r.conf.lim;
	unsigned b1, b2;

	memset(&r, 0, sizeof(r));
	memset(&e, 0, sizeof(e));
	thermal_conf_default(&r.conf);
	r.conf.emit = on_event;
	r.conf.ctx = &r;
	b1 = size > 1 ? data[1] : 0;
	b2 = size > 2 ? data[2] : 0;
	switch (b1 & 3) {
	case 1:		/* every threshold the same */
		l->t[0] = l->t[1] = l->t[2] = l->t[3] = 20;
		break;
	case 2:		/* a narrow normal window */
		l->t[0] = -1e-9;
		l->t[1] = 0;
		l->t[2] = 0;
		l->t[3] = 1e-9;
		l->use_lo = l->use_hi = 0;
		break;
	}
	l->hyst = hysts[(b1 >> 2) & 3];
	r.conf.min_current = currents[(b1 >> 4) & 3];
	r.conf.min_duration = durs[(b1 >> 6) & 3] * CW_US_PER_S;
	r.conf.merge = merges[b2 & 3] * CW_US_PER_S;
	r.conf.max_gap = gaps[(b2 >> 2) & 3] * CW_US_PER_S;
	e.statesz = sizeof(struct dev);
	e.init = init;
	e.push = push;
	e.finish = finish;
	e.ctx = &r;
	return fz_engine_run(&e, data, size);
}
