/*
 * fuzz_wear.c: the wear engine (lib/wear.c, with lib/xu2018.c, the
 * rainflow counter and the top-off detector inside) fed arbitrary sample
 * streams, and its report.
 *
 * Configuration: cycle and calendar life, hysteresis, residue mode,
 * minimum current, gap limit, capacity.  Oracles, from cw-wear(1)
 * and the meaning of each column:
 * - amounts that cannot be negative are not: days, charge, efc, depth,
 *   hours, cold and hot charge, top-off cycles, fade, damage;
 * - cold and hot charge are parts of all charge; the depth is at most
 *   100 %, fade at most 100 %; hours at high SoC or temperature fit in
 *   the span the device covers;
 * - dominant is one of the words cw-wear(1) allows, or empty;
 * - for tame input (every number |x| < 1e6) every reported number is
 *   finite or missing (NaN), never infinite;
 * - the shares add up to 1;
 * - the dwell table (lib/dwell.c) of the same rows: every cell at least
 *   0, idle hours at most the hours, all of them at most the span.
 */
#include "dwell.h"
#include "fuzz_engine.h"
#include "wear.h"

struct dev {
	struct devent e;
	struct wear_dev w;
	struct dwell_dev dw;
	int tame;
};

struct run {
	struct wear_conf conf;
	struct dwell_conf dc;
	double capacity;
};

static void
init(void *ctx, void *dp)
{
	struct run *r = ctx;
	struct dev *d = dp;

	wear_init(&d->w, &r->conf);
	memset(&d->dw, 0, sizeof(d->dw));
	d->tame = 1;
}

static void
push(void *ctx, void *dp, const struct cw_sample *s)
{
	struct run *r = ctx;
	struct dev *d = dp;

	d->tame &= (!cw_isnum(s->v) || fz_tame(s->v)) &&
	    (!cw_isnum(s->i) || fz_tame(s->i)) &&
	    (!cw_isnum(s->temp) || fz_tame(s->temp)) &&
	    (!cw_isnum(s->soc) || fz_tame(s->soc));
	wear_push(&d->w, &r->conf, s->t, s->v, s->i, s->temp, s->soc);
	dwell_push(&d->dw, &r->dc, s->t, s->i, s->temp, s->soc);
}

/* X is missing, or a number at least 0 (finite when TAME). */
static int
nonneg(double x, int tame)
{
	if (!cw_isnum(x))
		return 1;
	return x >= 0 && (!tame || isfinite(x));
}

static void
finish(void *ctx, void *dp)
{
	static const char *const dom[] = { "", "cycling", "high-soc", "heat",
	    "cold-charge", "none" };
	struct run *r = ctx;
	struct dev *d = dp;
	struct wear_result x;
	double eps, span_h;
	size_t k;
	int t, ok;

	wear_finish(&d->w, &r->conf);
	wear_report(&r->conf, &d->w.acc, NULL, r->capacity, &x);
	t = d->tame;
	FZ_CHECK(nonneg(x.days, 1) && nonneg(x.charge_ah, t));
	FZ_CHECK(nonneg(x.efc, t) && nonneg(x.max_depth_pct, t));
	FZ_CHECK(nonneg(x.hours_near_full, 1));
	FZ_CHECK(nonneg(x.hours_hot, 1));
	FZ_CHECK(nonneg(x.cold_charge_ah, t) && nonneg(x.hot_charge_ah, t));
	FZ_CHECK(nonneg(x.cool_charge_ah, t));
	FZ_CHECK(nonneg(x.topoff_cycles, 1));
	FZ_CHECK(nonneg(x.fade_pct, t) && nonneg(x.damage, t));
	FZ_CHECK(nonneg(x.days_to_eol, 0));
	eps = 1e-9 * (1 + (cw_isnum(x.charge_ah) ? x.charge_ah : 0));
	if (cw_isnum(x.charge_ah)) {
		if (cw_isnum(x.cold_charge_ah))
			FZ_CHECK(x.cold_charge_ah <= x.charge_ah + eps);
		if (cw_isnum(x.hot_charge_ah))
			FZ_CHECK(x.hot_charge_ah <= x.charge_ah + eps);
	}
	if (cw_isnum(x.max_depth_pct))
		FZ_CHECK(x.max_depth_pct <= 100 + 1e-9);
	if (cw_isnum(x.fade_pct))
		FZ_CHECK(x.fade_pct <= 100 + 1e-9);
	span_h = d->w.acc.have ? (double)(d->w.acc.last - d->w.acc.first) /
	    (3600.0 * CW_US_PER_S) : 0;
	if (cw_isnum(x.hours_near_full))
		FZ_CHECK(x.hours_near_full <= span_h * (1 + 1e-9) + 1e-9);
	if (cw_isnum(x.hours_hot))
		FZ_CHECK(x.hours_hot <= span_h * (1 + 1e-9) + 1e-9);
	FZ_CHECK(x.dominant != NULL);
	for (ok = 0, k = 0; k < sizeof(dom) / sizeof(dom[0]); k++)
		ok |= strcmp(x.dominant, dom[k]) == 0;
	FZ_CHECK(ok);
	if (t) {
		const double v[] = { x.share_cycling, x.share_high_soc,
		    x.share_heat, x.max_charge_c, x.mean_charge_c, x.fade_ah,
		    x.share_age, x.soh_pct };

		for (k = 0; k < sizeof(v) / sizeof(v[0]); k++)
			FZ_CHECK(!isinf(v[k]));
		/* The shares add up to 1 (cw-wear(1)). */
		if (cw_isnum(x.share_age) && isfinite(x.damage))
			FZ_CHECK(fabs(x.share_age + x.share_cycling +
			    x.share_high_soc + x.share_heat - 1) <= 1e-9 *
			    (fabs(x.share_age) + fabs(x.share_cycling) +
			    fabs(x.share_high_soc) + fabs(x.share_heat)));
	}
	FZ_CHECK(d->w.acc.rows == d->e.nrows);
	for (k = 0; k < DWELL_NSOC * DWELL_NTEMP; k++) {
		double h = d->dw.hours[k / DWELL_NTEMP][k % DWELL_NTEMP];
		double i = d->dw.idle_hours[k / DWELL_NTEMP][k % DWELL_NTEMP];

		FZ_CHECK(h >= 0 && i >= 0 && i <= h * (1 + 1e-12) &&
		    isfinite(h));
	}
	FZ_CHECK(d->dw.covered_h <= span_h * (1 + 1e-9) + 1e-9);
	wear_free(&d->w);
}

int
LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
	static const double lives[] = { 0, 1, 500, 1e6 };
	static const double hysts[] = { 1, 0, 0.1, 50 };
	static const double currents[] = { 0.05, 0, 1, 1e-9 };
	static const cw_time gaps[] = { 900, 1, 60, 86400 };
	static const double caps[] = { 0, 14, 1e-6, 1000 };
	struct run r;
	struct fz_engine e;
	unsigned b1 = size > 1 ? data[1] : 0, b2 = size > 2 ? data[2] : 0;

	memset(&r, 0, sizeof(r));
	memset(&e, 0, sizeof(e));
	wear_conf_default(&r.conf);
	if (lives[b1 & 3] > 0)
		wear_set_cycle_life(&r.conf, lives[b1 & 3]);
	if (lives[(b1 >> 2) & 3] > 0)
		wear_set_calendar_life(&r.conf, lives[(b1 >> 2) & 3] * 10);
	r.conf.hysteresis = hysts[(b1 >> 4) & 3];
	r.conf.residue = ((b1 >> 6) & 3) % 3;
	r.conf.min_current = currents[b2 & 3];
	r.conf.topoff.min_current = r.conf.min_current;
	r.conf.max_gap = gaps[(b2 >> 2) & 3] * CW_US_PER_S;
	r.conf.topoff.max_gap = r.conf.max_gap;
	r.capacity = caps[(b2 >> 4) & 3];
	dwell_conf_set(&r.dc, &r.conf.lim, r.conf.min_current, r.conf.max_gap);
	e.statesz = sizeof(struct dev);
	e.init = init;
	e.push = push;
	e.finish = finish;
	e.ctx = &r;
	return fz_engine_run(&e, data, size);
}
