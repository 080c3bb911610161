/*
 * fuzz_dcir.c: the DCIR step detector, the trend series and the
 * Theil-Sen trend fit (lib/dcir.c, lib/theilsen.c) fed arbitrary sample
 * streams.
 *
 * Configuration: minimum step, pair spacing, steadiness, SoC window or
 * unknown SoC allowed, activation energy, points kept, trend gates.
 * Oracles, from the rules in dcir.h and cw-dcir(1):
 * - an accepted step has |delta I| >= min_step, 0 < dt <= max_dt,
 *   R = delta V / delta I > 0, SoC and temperature inside the windows,
 *   and r_ref = the Arrhenius formula of R (recomputed here);
 * - the counts: accepted steps = the OK count, and no count exceeds
 *   the pairs of samples fed;
 * - the series keeps at most max points and counts every step; a fitted
 *   trend uses those points, its slope lies inside its confidence
 *   interval, and an end-of-life date needs a positive slope and comes
 *   after the first step.
 */
#include "dcir.h"
#include "fuzz_engine.h"

struct dev {
	struct devent e;
	struct dcir_dev det;
	struct dcir_series ser;
	struct dcir_counts cnt;
	unsigned long found, fed;
};

struct run {
	struct dcir_conf conf;
	struct dcir_trend_conf tconf;
	size_t maxpts;
};

static void
init(void *ctx, void *dp)
{
	(void)ctx;
	(void)dp;
}

static void
push(void *ctx, void *dp, const struct cw_sample *s)
{
	struct run *r = ctx;
	struct dev *d = dp;
	const struct dcir_conf *c = &r->conf;
	struct dcir_pt p;
	struct dcir_step st;
	double ref;

	p.t = s->t;
	p.v = s->v;
	p.i = s->i;
	p.temp = s->temp;
	p.soc = s->soc;
	d->fed++;
	if (dcir_feed(c, &d->det, &p, &d->cnt, &st) != 1)
		return;
	d->found++;
	FZ_CHECK(fabs(st.di) >= c->min_step);
	FZ_CHECK(st.dt > 0 && st.dt <= c->max_dt && st.t == s->t);
	FZ_CHECK(st.r > 0 && st.r == st.dv / st.di);
	if (cw_isnum(st.soc))
		FZ_CHECK(st.soc >= c->soc_lo && st.soc <= c->soc_hi);
	else
		FZ_CHECK(c->unknown_soc_ok);
	FZ_CHECK(st.temp >= c->temp_lo && st.temp <= c->temp_hi);
	ref = st.r * exp(-(c->ea_kj * 1000.0 / DCIR_RGAS) *
	    (1.0 / (st.temp + 273.15) - 1.0 / (c->ref_temp_c + 273.15)));
	FZ_CHECK(st.r_ref == ref || fabs(st.r_ref - ref) <= 1e-12 * ref);
	dcir_series_add(&d->ser, st.t, st.r_ref, st.soc, r->maxpts);
	FZ_CHECK(d->ser.n <= r->maxpts && d->ser.n <= d->ser.steps);
	FZ_CHECK(d->ser.steps == d->found);
}

static void
finish(void *ctx, void *dp)
{
	struct run *r = ctx;
	struct dev *d = dp;
	struct dcir_trend tr;
	unsigned long sum = 0;
	int k;

	for (k = 0; k < DCIR_NREASON; k++) {
		FZ_CHECK(d->cnt.n[k] < d->fed || d->cnt.n[k] == 0);
		sum += d->cnt.n[k];
		FZ_CHECK(dcir_reason_name[k] != NULL);
	}
	FZ_CHECK(sum < d->fed || sum == 0);
	FZ_CHECK(d->cnt.n[DCIR_OK] == d->found);
	dcir_trend_fit(&d->ser, &r->tconf, &tr);
	if (tr.fitted) {
		FZ_CHECK(tr.used == d->ser.n && tr.used >= 2);
		FZ_CHECK(d->ser.steps >= r->tconf.min_steps);
		FZ_CHECK(d->ser.last - d->ser.first >= r->tconf.min_span);
		if (cw_isnum(tr.slope_lo) && cw_isnum(tr.slope_hi))
			FZ_CHECK(tr.slope_lo <= tr.slope &&
			    tr.slope <= tr.slope_hi);
		if (tr.has_eol) {
			FZ_CHECK(tr.slope > 0 && tr.r_start > 0);
			FZ_CHECK(tr.eol_t >= d->ser.first);
		}
	} else
		FZ_CHECK(!tr.has_eol);
	dcir_series_free(&d->ser);
}

int
LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
	static const double steps[] = { 0.5, 1e-9, 5, 0.01 };
	static const cw_time dts[] = { 15, 1, 86400, 0 };
	static const int steadies[] = { 3, 1, 2, DCIR_HIST_MAX };
	static const double eas[] = { 30, 0, 100, 1e-3 };
	static const size_t maxpts[] = { 1000, 2, 3, 16 };
	static const unsigned long minsteps[] = { 10, 0, 1, 2 };
	static const cw_time spans[] = { 7 * 86400, 0, 1, 86400 };
	static const double eols[] = { 200, 100.001, 1000, 150 };
	struct run r;
	struct fz_engine e;
	unsigned b1 = size > 1 ? data[1] : 0, b2 = size > 2 ? data[2] : 0;

	memset(&r, 0, sizeof(r));
	memset(&e, 0, sizeof(e));
	dcir_conf_default(&r.conf);
	dcir_trend_conf_default(&r.tconf);
	r.conf.min_step = steps[b1 & 3];
	r.conf.max_dt = dts[(b1 >> 2) & 3] * CW_US_PER_S;
	if (r.conf.max_dt == 0)
		r.conf.max_dt = 1;
	r.conf.steady_n = steadies[(b1 >> 4) & 3];
	r.conf.unknown_soc_ok = (b1 >> 6) & 1;
	if (b1 & 0x80) {
		r.conf.soc_lo = 0;
		r.conf.soc_hi = 100;
		r.conf.temp_lo = -40;
		r.conf.temp_hi = 100;
	}
	r.conf.ea_kj = eas[b2 & 3];
	r.maxpts = maxpts[(b2 >> 2) & 3];
	r.tconf.min_steps = minsteps[(b2 >> 4) & 3];
	r.tconf.min_span = spans[(b2 >> 6) & 3] * CW_US_PER_S;
	r.tconf.eol_pct = eols[(size > 3 ? data[3] : 0) & 3];
	e.statesz = sizeof(struct dev);
	e.init = init;
	e.push = push;
	e.finish = finish;
	e.ctx = &r;
	return fz_engine_run(&e, data, size);
}
