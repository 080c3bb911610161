/*
 * dcir.c: DC internal resistance from current steps; see dcir.h.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "dcir.h"
#include "theilsen.h"

#define US_PER_DAY	(86400.0 * CW_US_PER_S)
/* The last instant ISO 8601 dates of four digits can show: 9999-12-31. */
#define DCIR_T_MAX	(253402300799LL * CW_US_PER_S)

const char *const dcir_reason_name[DCIR_NREASON] = {
	"accepted", "no-current", "gap", "unsteady", "no-voltage",
	"soc-unknown", "soc-outside", "temp-unknown", "temp-outside",
	"non-positive"
};

static const struct dcir_pt *hist_back(const struct dcir_dev *, unsigned);
static int	steady(const struct dcir_conf *, const struct dcir_dev *,
		    double);
static double	either(double, double);

void
dcir_conf_default(struct dcir_conf *c)
{
	memset(c, 0, sizeof *c);
	c->min_step = 0.5;
	c->max_dt = 15 * CW_US_PER_S;
	c->steady_n = 3;
	c->steady_tol = 0.1;
	c->soc_lo = 20;
	c->soc_hi = 80;
	c->temp_lo = 10;
	c->temp_hi = 45;
	c->unknown_soc_ok = 0;
	c->ref_temp_c = 25;
	c->ea_kj = 30;
}

/* The sample K back from the newest (K = 0: the newest); K < d->n. */
static const struct dcir_pt *
hist_back(const struct dcir_dev *d, unsigned k)
{
	return &d->hist[(d->head + DCIR_HIST_MAX - 1 - k) % DCIR_HIST_MAX];
}

/*
 * Is the current steady over the steady_n newest samples (the newest being
 * the pre sample of the step)?  All have a current, follow each other at
 * most max_dt apart, and their spread is within steady_tol * |DI|.
 */
static int
steady(const struct dcir_conf *c, const struct dcir_dev *d, double di)
{
	const struct dcir_pt *p, *q;
	double lo, hi;
	unsigned k;

	if (d->n < (unsigned)c->steady_n)
		return 0;
	p = hist_back(d, 0);
	lo = hi = p->i;
	for (k = 1; k < (unsigned)c->steady_n; k++) {
		q = hist_back(d, k);
		if (!cw_isnum(q->i) || p->t - q->t > c->max_dt ||
		    p->t - q->t <= 0)
			return 0;
		if (q->i < lo)
			lo = q->i;
		if (q->i > hi)
			hi = q->i;
		p = q;
	}
	return hi - lo <= c->steady_tol * fabs(di);
}

static double
either(double a, double b)
{
	return cw_isnum(a) ? a : b;
}

int
dcir_feed(const struct dcir_conf *c, struct dcir_dev *d,
    const struct dcir_pt *s, struct dcir_counts *cnt, struct dcir_step *out)
{
	const struct dcir_pt *p;
	enum dcir_reason why;
	double di, soc, temp, r;
	cw_time dt;
	int found = 0;

	if (d->n == 0)
		goto push;
	p = hist_back(d, 0);
	dt = s->t - p->t;
	if (!cw_isnum(p->i) || !cw_isnum(s->i)) {
		/* Only pairs that could have been tested are worth a count. */
		if (dt > 0 && dt <= c->max_dt)
			cnt->n[DCIR_NO_I]++;
		goto push;
	}
	di = s->i - p->i;
	if (!(fabs(di) >= c->min_step))
		goto push;

	soc = either(p->soc, s->soc);
	temp = either(p->temp, s->temp);
	r = CW_MISSING;
	if (dt <= 0 || dt > c->max_dt)
		why = DCIR_GAP;
	else if (!steady(c, d, di))
		why = DCIR_UNSTEADY;
	else if (!cw_isnum(p->v) || !cw_isnum(s->v))
		why = DCIR_NO_V;
	else if (!cw_isnum(soc) && !c->unknown_soc_ok)
		why = DCIR_SOC_UNKNOWN;
	else if (cw_isnum(soc) && (soc < c->soc_lo || soc > c->soc_hi))
		why = DCIR_SOC_OUT;
	else if (!cw_isnum(temp))
		why = DCIR_TEMP_UNKNOWN;
	else if (temp < c->temp_lo || temp > c->temp_hi)
		why = DCIR_TEMP_OUT;
	else if (!((r = (s->v - p->v) / di) > 0))
		why = DCIR_NONPOS;
	else
		why = DCIR_OK;
	cnt->n[why]++;
	if (why == DCIR_OK) {
		out->t = s->t;
		out->soc = soc;
		out->temp = temp;
		out->di = di;
		out->dv = s->v - p->v;
		out->i_pre = p->i;
		out->dt = dt;
		out->r = r;
		out->r_ref = dcir_arrhenius(r, temp, c->ref_temp_c, c->ea_kj);
		found = 1;
	}

push:
	d->hist[d->head] = *s;
	d->head = (d->head + 1) % DCIR_HIST_MAX;
	if (d->n < DCIR_HIST_MAX)
		d->n++;
	return found;
}

double
dcir_arrhenius(double r, double temp_c, double ref_c, double ea_kj)
{
	double t = temp_c + DCIR_KELVIN, tref = ref_c + DCIR_KELVIN;

	return r * exp(-(ea_kj * 1000.0 / DCIR_RGAS) * (1.0 / t - 1.0 / tref));
}

void
dcir_series_add(struct dcir_series *s, cw_time t, double r_ref,
    size_t maxpts)
{
	unsigned long k = s->steps++;
	size_t i, j;

	if (k == 0) {
		s->first = t;
		s->stride = 1;
	}
	s->last = t;
	if (maxpts < 2)
		maxpts = 2;
	if (s->n >= maxpts) {
		/* Thin evenly: keep every other point, then every 2 stride-th
		 * step from now on.  The kept steps stay those whose number is
		 * a multiple of the stride. */
		for (i = j = 0; i < s->n; i += 2, j++) {
			s->t[j] = s->t[i];
			s->r[j] = s->r[i];
		}
		s->n = j;
		s->stride *= 2;
	}
	if (k % s->stride != 0)
		return;
	if (s->n == s->cap) {
		s->cap = s->cap ? 2 * s->cap : 16;
		if (s->cap > maxpts)
			s->cap = maxpts;
		s->t = cw_realloc(s->t, s->cap * sizeof *s->t);
		s->r = cw_realloc(s->r, s->cap * sizeof *s->r);
	}
	s->t[s->n] = t;
	s->r[s->n] = r_ref;
	s->n++;
}

void
dcir_series_free(struct dcir_series *s)
{
	free(s->t);
	free(s->r);
	memset(s, 0, sizeof *s);
}

void
dcir_trend_conf_default(struct dcir_trend_conf *c)
{
	c->min_steps = 10;
	c->min_span = 7 * 86400 * CW_US_PER_S;
	c->eol_pct = 200;
	c->conf = 0.95;
}

void
dcir_trend_fit(const struct dcir_series *s, const struct dcir_trend_conf *c,
    struct dcir_trend *out)
{
	struct theil_fit f;
	double *x, xlast, days;
	size_t i;

	memset(out, 0, sizeof *out);
	out->slope = out->slope_lo = out->slope_hi = CW_MISSING;
	out->r_start = out->r_end = CW_MISSING;
	out->growth_pct = out->growth_30d = CW_MISSING;
	if (s->steps < c->min_steps || s->steps == 0 ||
	    s->last - s->first < c->min_span || s->n < 2)
		return;
	x = cw_malloc(s->n * sizeof *x);
	for (i = 0; i < s->n; i++)
		x[i] = (double)(s->t[i] - s->first) / US_PER_DAY;
	i = theil_fit(x, s->r, s->n, c->conf, &f);
	free(x);
	if (i != 0)
		return;
	out->fitted = 1;
	out->used = s->n;
	out->slope = f.slope;
	out->slope_lo = f.slope_lo;
	out->slope_hi = f.slope_hi;
	xlast = (double)(s->last - s->first) / US_PER_DAY;
	out->r_start = f.intercept;
	out->r_end = f.intercept + f.slope * xlast;
	if (!(out->r_start > 0))
		return;		/* no growth relative to a non-resistance */
	out->growth_pct = 100 * (out->r_end - out->r_start) / out->r_start;
	out->growth_30d = 100 * f.slope * 30 / out->r_start;
	if (!(f.slope > 0))
		return;
	days = (c->eol_pct / 100 - 1) * out->r_start / f.slope;
	if (days * US_PER_DAY < (double)(DCIR_T_MAX - s->first)) {
		out->eol_t = s->first + (cw_time)(days * US_PER_DAY);
		out->has_eol = 1;
	}
}
