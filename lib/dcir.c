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
	else if (cw_isnum(soc) && !c->soc_auto && (soc < c->soc_lo ||
	    soc > c->soc_hi))
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

int
dcir_soc_bin(double soc)
{
	if (!cw_isnum(soc))
		return DCIR_NBIN;
	if (soc < 0)
		return 0;
	if (soc >= DCIR_NBIN - 1)
		return DCIR_NBIN - 1;
	return (int)soc;
}

/*
 * The bucket of time T at LEVEL: floor(T / 2^LEVEL s); above
 * DCIR_LEVEL_TIME, one bucket.
 */
static cw_time
bucket(cw_time t, int level)
{
	cw_time w = CW_US_PER_S, q;

	if (level > DCIR_LEVEL_TIME)
		return 0;
	w <<= level;
	q = t / w;
	if (t % w != 0 && t < 0)
		q--;
	return q;
}

static void
pt_grow(struct dcir_series *s, size_t want, size_t maxpts)
{
	if (want <= s->cap)
		return;
	while (s->cap < want)
		s->cap = s->cap ? 2 * s->cap : 16;
	if (s->cap > maxpts + 1 && want <= maxpts + 1)
		s->cap = maxpts + 1;
	s->pt = cw_realloc(s->pt, s->cap * sizeof *s->pt);
}

/*
 * The SoC group of BIN at LEVEL: the bin itself up to DCIR_LEVEL_TIME,
 * then bins of 2^(LEVEL - DCIR_LEVEL_TIME) points; unknown SoC stays
 * apart.
 */
static int
group(int bin, int level)
{
	if (level <= DCIR_LEVEL_TIME || bin == DCIR_NBIN)
		return bin;
	return bin >> (level - DCIR_LEVEL_TIME);
}

/*
 * Keep, at LEVEL, the first point of each bucket and SoC group; the
 * points are in time order, so the points of a bucket follow each other.
 */
static void
thin(struct dcir_series *s, int level)
{
	unsigned char seen[DCIR_NBIN + 1];
	cw_time cur = 0;
	size_t i, j;

	s->level = level;
	for (i = j = 0; i < s->n; i++) {
		cw_time b = bucket(s->pt[i].t, level);

		if (i == 0 || b != cur) {
			memset(seen, 0, sizeof seen);
			cur = b;
		}
		if (seen[group(s->pt[i].bin, level)])
			continue;
		seen[group(s->pt[i].bin, level)] = 1;
		s->pt[j++] = s->pt[i];
	}
	s->n = j;
}

static void
cap_points(struct dcir_series *s, size_t maxpts)
{
	while (s->n > maxpts && s->level < DCIR_LEVEL_MAX)
		thin(s, s->level + 1);
}

void
dcir_series_cap(struct dcir_series *s, size_t maxpts)
{
	cap_points(s, maxpts < 2 ? 2 : maxpts);
}

void
dcir_series_add(struct dcir_series *s, cw_time t, double r_ref, double soc,
    size_t maxpts)
{
	struct dcir_bin *bn;
	cw_time b;
	size_t k;
	int bin = dcir_soc_bin(soc), g;

	if (maxpts < 2)
		maxpts = 2;
	if (s->steps++ == 0) {
		s->first = t;
		s->bin = cw_calloc(DCIR_NBIN + 1, sizeof *s->bin);
	}
	s->last = t;
	bn = &s->bin[bin];
	if (bn->n++ == 0)
		bn->first = t;
	bn->last = t;
	/* An earlier point of this bucket and SoC group keeps its place. */
	b = bucket(t, s->level);
	g = group(bin, s->level);
	for (k = s->n; k > 0 && bucket(s->pt[k - 1].t, s->level) == b; k--)
		if (group(s->pt[k - 1].bin, s->level) == g)
			return;
	pt_grow(s, s->n + 1, maxpts);
	s->pt[s->n].t = t;
	s->pt[s->n].r = r_ref;
	s->pt[s->n].bin = bin;
	s->n++;
	cap_points(s, maxpts);
}

void
dcir_series_join(struct dcir_series *a, struct dcir_series *b,
    size_t maxpts)
{
	int k;

	if (b->steps == 0) {
		dcir_series_free(b);
		return;
	}
	if (a->steps == 0) {
		dcir_series_free(a);
		*a = *b;
		memset(b, 0, sizeof *b);
		cap_points(a, maxpts < 2 ? 2 : maxpts);
		return;
	}
	if (maxpts < 2)
		maxpts = 2;
	if (a->level < b->level)
		thin(a, b->level);
	else if (b->level < a->level)
		thin(b, a->level);
	pt_grow(a, a->n + b->n, a->n + b->n);
	memcpy(a->pt + a->n, b->pt, b->n * sizeof *b->pt);
	a->n += b->n;
	thin(a, a->level);
	cap_points(a, maxpts);
	for (k = 0; k <= DCIR_NBIN; k++) {
		struct dcir_bin *x = &a->bin[k], *y = &b->bin[k];

		if (y->n == 0)
			continue;
		if (x->n == 0)
			x->first = y->first;
		x->last = y->last;
		x->n += y->n;
	}
	a->steps += b->steps;
	a->last = b->last;
	dcir_series_free(b);
}

void
dcir_series_free(struct dcir_series *s)
{
	free(s->bin);
	free(s->pt);
	memset(s, 0, sizeof *s);
}

int
dcir_series_window(const struct dcir_series *s)
{
	unsigned long n = 0, best = 0;
	int lo, k, bestlo = -1, dist, bestdist = 0;

	if (s->bin == NULL)
		return -1;
	for (k = 0; k < DCIR_WINDOW; k++)
		n += s->bin[k].n;
	for (lo = 0; lo + DCIR_WINDOW <= DCIR_NBIN; lo++) {
		if (lo > 0)
			n += s->bin[lo + DCIR_WINDOW - 1].n - s->bin[lo - 1].n;
		dist = abs(2 * lo + DCIR_WINDOW - DCIR_NBIN);
		if (n > best || (n == best && n > 0 && dist < bestdist)) {
			best = n;
			bestlo = lo;
			bestdist = dist;
		}
	}
	return bestlo;
}

void
dcir_trend_conf_default(struct dcir_trend_conf *c)
{
	c->min_steps = 10;
	c->min_span = 7 * 86400 * CW_US_PER_S;
	c->eol_pct = 200;
	c->conf = 0.95;
}

static int
in_window(int bin, int lo)
{
	return lo < 0 || bin == DCIR_NBIN || (bin >= lo &&
	    bin < lo + DCIR_WINDOW);
}

void
dcir_trend_fit_window(const struct dcir_series *s,
    const struct dcir_trend_conf *c, int lo, struct dcir_trend *out)
{
	struct theil_fit f;
	double *x, *y, xlast, days;
	size_t i, m;
	int k;

	memset(out, 0, sizeof *out);
	out->slope = out->slope_lo = out->slope_hi = CW_MISSING;
	out->r_start = out->r_end = CW_MISSING;
	out->growth_pct = out->growth_30d = CW_MISSING;
	out->growth_lo_30d = out->growth_hi_30d = CW_MISSING;
	for (k = 0; s->bin != NULL && k <= DCIR_NBIN; k++) {
		const struct dcir_bin *b = &s->bin[k];

		if (b->n == 0 || !in_window(k, lo))
			continue;
		if (out->steps == 0 || b->first < out->first)
			out->first = b->first;
		if (out->steps == 0 || b->last > out->last)
			out->last = b->last;
		out->steps += b->n;
	}
	if (out->steps < c->min_steps || out->steps == 0 ||
	    out->last - out->first < c->min_span)
		return;
	x = cw_malloc(s->n * sizeof *x);
	y = cw_malloc(s->n * sizeof *y);
	for (i = m = 0; i < s->n; i++) {
		if (!in_window(s->pt[i].bin, lo))
			continue;
		x[m] = (double)(s->pt[i].t - out->first) / US_PER_DAY;
		y[m++] = s->pt[i].r;
	}
	i = m >= 2 ? theil_fit(x, y, m, c->conf, &f) : 1;
	free(x);
	free(y);
	if (i != 0)
		return;
	out->fitted = 1;
	out->used = m;
	out->slope = f.slope;
	out->slope_lo = f.slope_lo;
	out->slope_hi = f.slope_hi;
	xlast = (double)(out->last - out->first) / US_PER_DAY;
	out->r_start = f.intercept;
	out->r_end = f.intercept + f.slope * xlast;
	if (!(out->r_start > 0))
		return;		/* no growth relative to a non-resistance */
	out->growth_pct = 100 * (out->r_end - out->r_start) / out->r_start;
	out->growth_30d = 100 * f.slope * 30 / out->r_start;
	out->growth_lo_30d = 100 * f.slope_lo * 30 / out->r_start;
	out->growth_hi_30d = 100 * f.slope_hi * 30 / out->r_start;
	/* Only a sure growth: the whole interval above zero. */
	if (!(f.slope > 0) || !(f.slope_lo > 0))
		return;
	days = (c->eol_pct / 100 - 1) * out->r_start / f.slope;
	if (days * US_PER_DAY < (double)(DCIR_T_MAX - out->first)) {
		out->eol_t = out->first + (cw_time)(days * US_PER_DAY);
		out->has_eol = 1;
	}
}

void
dcir_trend_fit(const struct dcir_series *s, const struct dcir_trend_conf *c,
    struct dcir_trend *out)
{
	dcir_trend_fit_window(s, c, -1, out);
}
