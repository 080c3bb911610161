/*
 * fuzz_capacity.c: the capacity segments, the rest-voltage variant and
 * the trend (lib/capacity.c, lib/ocv.c, lib/theilsen.c) fed arbitrary
 * sample streams.
 *
 * Configuration: minimum current, gap, rest, swing, jump tolerance, a
 * rating or none, the temperature gate or none, points kept, the OCV
 * variant (a fixed three-point table) instead of the gauge's SoC.
 * Oracles, from the rules in capacity.h and cw-capacity(1):
 * - an estimate has a SoC change of at least min_swing, charge and SoC
 *   moving the way of its direction, capacity = 100 |charge| / |SoC
 *   change| (recomputed here), start <= end, and a non-negative
 *   resolution (gauge) or none (OCV);
 * - every judged segment counts under exactly one reason, and no more
 *   segments end by an event than were judged;
 * - the trend keeps at most max points; a fitted slope lies in its
 *   interval, and an end-of-life date needs a rating and an interval
 *   below zero.
 */
#include "capacity.h"
#include "ocv.h"
#include "fuzz_engine.h"

struct dev {
	struct devent e;
	struct cap_dev cd;
	struct cap_ocvdev od;
	struct cap_counts cnt;
	struct dcir_series ser;
	unsigned long judged, ok;
};

struct run {
	struct cap_conf conf;
	struct cap_trend_conf tconf;
	struct ocv ocv;
	int use_ocv;
	double rated;
	size_t maxpts;
};

static void
init(void *ctx, void *dp)
{
	struct run *r = ctx;
	struct dev *d = dp;

	cap_dev_init(&d->cd, r->rated);
}

static void
check_est(struct run *r, struct dev *d, const struct cap_est *e)
{
	double ds = e->soc_to - e->soc_from, cap;
	unsigned long sum = 0;
	int k;

	d->judged++;
	FZ_CHECK(e->reason >= 0 && e->reason < CAP_NREASON);
	FZ_CHECK(e->dir == 1 || e->dir == -1);
	for (k = 0; k < CAP_NREASON; k++)
		sum += d->cnt.n[k];
	FZ_CHECK(sum == d->judged);
	if (e->reason != CAP_OK)
		return;
	d->ok++;
	FZ_CHECK(fabs(ds) >= r->conf.min_swing);
	FZ_CHECK(ds * e->dir > 0 && e->charge_ah * e->dir > 0);
	FZ_CHECK(e->start <= e->end);
	cap = 100 * fabs(e->charge_ah) / fabs(ds);
	FZ_CHECK(e->capacity_ah == cap);
	if (r->use_ocv)
		FZ_CHECK(!cw_isnum(e->resolution_pct));
	else
		FZ_CHECK(e->resolution_pct >= 0);
	dcir_series_add(&d->ser, e->start + (e->end - e->start) / 2,
	    e->capacity_ah, CW_MISSING, r->maxpts);
	FZ_CHECK(d->ser.n <= r->maxpts && d->ser.steps == d->ok);
}

static void
push(void *ctx, void *dp, const struct cw_sample *s)
{
	struct run *r = ctx;
	struct dev *d = dp;
	struct cap_est e;
	int n;

	if (r->use_ocv)
		n = cap_ocv_feed(&r->conf, &r->ocv, &d->od, s->t, s->v, s->i,
		    s->temp, &d->cnt, &e);
	else
		n = cap_feed(&r->conf, &d->cd, s->t, s->i, s->temp, s->soc,
		    &d->cnt, &e);
	FZ_CHECK(n == 0 || n == 1);
	if (n == 1)
		check_est(r, d, &e);
}

static void
finish(void *ctx, void *dp)
{
	struct run *r = ctx;
	struct dev *d = dp;
	struct cap_trend tr;
	struct cap_est e;
	unsigned long cuts = 0;
	int k;

	if ((r->use_ocv ? cap_ocv_finish(&r->conf, &d->od, &d->cnt, &e) :
	    cap_finish(&r->conf, &d->cd, &d->cnt, &e)) == 1)
		check_est(r, d, &e);
	for (k = 0; k < CAP_NREASON; k++)
		cuts += d->cnt.cut[k];
	if (!r->use_ocv)
		FZ_CHECK(cuts <= d->judged);
	FZ_CHECK(d->cnt.n[CAP_OK] == d->ok);
	cap_trend_fit(&d->ser, r->rated, &r->tconf, &tr);
	if (tr.fitted) {
		FZ_CHECK(tr.used == d->ser.n && tr.used >= 2);
		FZ_CHECK(d->ser.steps >= r->tconf.min_estimates);
		if (cw_isnum(tr.slope_lo) && cw_isnum(tr.slope_hi))
			FZ_CHECK(tr.slope_lo <= tr.slope &&
			    tr.slope <= tr.slope_hi);
	}
	if (tr.has_eol)
		FZ_CHECK(tr.fitted && r->rated > 0 && tr.slope_hi < 0);
	dcir_series_free(&d->ser);
}

int
LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
	static const double mincur[] = { 0.1, 1e-9, 5, 0.01 };
	static const cw_time gaps[] = { 900, 1, 86400, 10 };
	static const cw_time rests[] = { 300, 1, 3600, 10 };
	static const double swings[] = { 20, 1e-9, 100, 1 };
	static const double jumps[] = { 2, 0, 100, 0.5 };
	static const double rateds[] = { -1, 14, 1e-6, 1e6 };
	static const size_t maxpts[] = { 2048, 16, 17, 32 };
	static const unsigned long minest[] = { 5, 2, 3, 100 };
	struct run r;
	struct fz_engine e;
	unsigned b1 = size > 1 ? data[1] : 0, b2 = size > 2 ? data[2] : 0;
	unsigned b3 = size > 3 ? data[3] : 0;

	memset(&r, 0, sizeof(r));
	memset(&e, 0, sizeof(e));
	cap_conf_default(&r.conf);
	cap_trend_conf_default(&r.tconf);
	r.conf.min_current = mincur[b1 & 3];
	r.conf.max_gap = gaps[(b1 >> 2) & 3] * CW_US_PER_S;
	r.conf.max_rest = rests[(b1 >> 4) & 3] * CW_US_PER_S;
	r.conf.ocv_rest = r.conf.max_rest;
	r.conf.ocv_span = r.conf.max_gap * 10;
	r.conf.min_swing = swings[(b1 >> 6) & 3];
	r.conf.jump = jumps[b2 & 3];
	r.rated = rateds[(b2 >> 2) & 3];
	if (r.rated < 0)
		r.rated = CW_MISSING;
	r.maxpts = maxpts[(b2 >> 4) & 3];
	r.tconf.min_estimates = minest[(b2 >> 6) & 3];
	r.conf.temp_any = b3 & 1;
	r.use_ocv = (b3 >> 1) & 1;
	r.ocv.n = 3;
	r.ocv.v[0] = 3.0;
	r.ocv.v[1] = 3.7;
	r.ocv.v[2] = 4.2;
	r.ocv.soc[1] = 50;
	r.ocv.soc[2] = 100;
	e.statesz = sizeof(struct dev);
	e.init = init;
	e.push = push;
	e.finish = finish;
	e.ctx = &r;
	return fz_engine_run(&e, data, size);
}
