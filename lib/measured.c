/*
 * measured.c: a cw-capacity --trend output read by device, the measured
 * fade over cw-wear's span, and the least-squares fit of the model's
 * scales to it.  The whole file is kept (one state per device in a
 * devtab): it is one row per pack.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "csvin.h"
#include "measured.h"
#include "num.h"
#include "ts.h"

enum mcol {
	MC_DEVICE, MC_FIRST, MC_LAST, MC_START, MC_SLOPE, MC_LO, MC_HI,
	MC_ESTIMATES, MC_RATED, MC_N
};

/* The columns of cw-capacity --trend that are read; the first eight
 * must be there (rated_ah may not). */
static const char *const meas_colname[MC_N] = {
	"device", "first", "last", "capacity_start_ah", "slope_ah_per_day",
	"slope_lo_ah_per_day", "slope_hi_ah_per_day", "estimates", "rated_ah"
};

struct meas {
	struct devtab *packs;
};

struct mload {
	struct meas *m;
	int col[MC_N];
};

static int	ml_header(void *, const struct csvin_rec *);
static int	ml_row(void *, const struct csvin_rec *);
static int	ml_bad(void *, const struct csvin_rec *, const char *);
static double	ml_number(const struct csvin_rec *, int, const char *);
static int	ml_time(const struct csvin_rec *, int, const char *,
		    cw_time *);
static double	fit_rss(const struct wear_conf *, const struct meas_obs *,
		    size_t, const double *, int, double *);
static void	fit_scales(const struct wear_conf *, const double *, int,
		    struct wear_conf *);
static void	fit_jac(const struct wear_conf *, const struct meas_obs *,
		    size_t, const double *, int, double *, double *);
static void	fit_effect(const struct wear_conf *, const struct meas_obs *,
		    size_t, double *, double *, double *, size_t *, double *);
static int	dbl_cmp(const void *, const void *);

struct meas *
meas_load(const char *path)
{
	static const struct csvin_ops ops = {
		ml_header, ml_row, ml_bad, csvin_skip_blank
	};
	struct mload lc;

	lc.m = cw_calloc(1, sizeof(*lc.m));
	lc.m->packs = devtab_new(sizeof(struct meas_pack));
	for (int k = 0; k < MC_N; k++)
		lc.col[k] = -1;
	csvin_load(path, &ops, &lc, "empty file: no cw-capacity --trend "
	    "header", "the measured capacity trend");
	return lc.m;
}

static int
ml_header(void *ctx, const struct csvin_rec *r)
{
	struct mload *lc = ctx;

	for (int k = 0; k < MC_N; k++) {
		lc->col[k] = csvin_find(r, meas_colname[k]);
		if (lc->col[k] < 0 && k != MC_RATED)
			cw_die(CW_EXIT_DATA, "%s:%lu: not a cw-capacity "
			    "--trend output: no column '%s'", r->src, r->line,
			    meas_colname[k]);
	}
	return 0;
}

/* The number in column K of R, NaN when empty; not a number: die. */
static double
ml_number(const struct csvin_rec *r, int k, const char *name)
{
	double x;
	int st;

	if (k < 0 || (size_t)k >= r->nf)
		return CW_MISSING;
	st = num_parse(r->f[k], r->len[k], '.', &x);
	if (st == NUM_EMPTY)
		return CW_MISSING;
	if (st != NUM_OK || !isfinite(x))
		cw_die(CW_EXIT_DATA, "%s:%lu: %s: not a number: \"%.*s\"",
		    r->src, r->line, name, (int)r->len[k], r->f[k]);
	return x;
}

/* The time in column K of R into *T: 1, or 0 when empty; bad: die. */
static int
ml_time(const struct csvin_rec *r, int k, const char *name, cw_time *t)
{
	if ((size_t)k >= r->nf || r->len[k] == 0)
		return 0;
	if (ts_parse(r->f[k], r->len[k], TS_AUTO, 0, t) != 0)
		cw_die(CW_EXIT_DATA, "%s:%lu: %s: not a time: \"%.*s\"",
		    r->src, r->line, name, (int)r->len[k], r->f[k]);
	return 1;
}

static int
ml_row(void *ctx, const struct csvin_rec *r)
{
	struct mload *lc = ctx;
	struct meas_pack *p;
	int k = lc->col[MC_DEVICE], isnew, times;

	if ((size_t)k >= r->nf || r->len[k] == 0)
		cw_die(CW_EXIT_DATA, "%s:%lu: trend row without a device",
		    r->src, r->line);
	p = devtab_get(lc->m->packs, r->f[k], r->len[k], &isnew);
	if (!isnew)
		cw_die(CW_EXIT_DATA, "%s:%lu: device \"%.*s\" again (first on "
		    "line %lu)", r->src, r->line, (int)r->len[k], r->f[k],
		    p->line);
	p->line = r->line;
	p->cap_start_ah = ml_number(r, lc->col[MC_START],
	    "capacity_start_ah");
	p->rated_ah = ml_number(r, lc->col[MC_RATED], "rated_ah");
	p->slope = ml_number(r, lc->col[MC_SLOPE], "slope_ah_per_day");
	p->slope_lo = ml_number(r, lc->col[MC_LO], "slope_lo_ah_per_day");
	p->slope_hi = ml_number(r, lc->col[MC_HI], "slope_hi_ah_per_day");
	times = ml_time(r, lc->col[MC_FIRST], "first", &p->first) +
	    ml_time(r, lc->col[MC_LAST], "last", &p->last);
	if (!cw_isnum(p->slope))
		return 0;
	if (times != 2 || !cw_isnum(p->slope_lo) || !cw_isnum(p->slope_hi))
		cw_die(CW_EXIT_DATA, "%s:%lu: a slope without first, last "
		    "or its interval", r->src, r->line);
	if (p->last < p->first || !(p->slope_lo <= p->slope_hi))
		cw_die(CW_EXIT_DATA, "%s:%lu: last before first, or "
		    "slope_lo_ah_per_day above slope_hi_ah_per_day", r->src,
		    r->line);
	p->have_slope = 1;
	return 0;
}

static int
ml_bad(void *ctx, const struct csvin_rec *r, const char *why)
{
	(void)ctx;
	cw_die(CW_EXIT_DATA, "%s:%lu: %s", r->src, r->line, why);
}

const struct meas_pack *
meas_find(const struct meas *m, const char *name, size_t len)
{
	return m != NULL ? devtab_find(m->packs, name, len) : NULL;
}

size_t
meas_count(const struct meas *m)
{
	return m != NULL ? devtab_count(m->packs) : 0;
}

void
meas_free(struct meas *m)
{
	if (m == NULL)
		return;
	devtab_free(m->packs);
	free(m);
}

const char *
meas_why(int why)
{
	static const char *const w[MEAS_NWHY] = {
		"measured", "not in the file", "no slope",
		"interval holds zero", "estimates cover too little"
	};

	return why >= 0 && why < MEAS_NWHY ? w[why] : "?";
}

int
meas_fade(const struct meas_pack *p, cw_time first, cw_time last,
    double rated_ah, double *pct)
{
	cw_time lo, hi;
	double r;

	*pct = CW_MISSING;
	if (p == NULL)
		return MEAS_NOROW;
	if (!p->have_slope)
		return MEAS_NOSLOPE;
	if (p->slope_lo <= 0 && p->slope_hi >= 0)
		return MEAS_UNSURE;
	lo = p->first > first ? p->first : first;
	hi = p->last < last ? p->last : last;
	if (last <= first || hi <= lo ||
	    (double)(hi - lo) < MEAS_COVER * (double)(last - first))
		return MEAS_SPAN;
	r = rated_ah > 0 ? rated_ah : p->rated_ah > 0 ? p->rated_ah :
	    p->cap_start_ah;
	if (!(r > 0))
		return MEAS_NOSLOPE;
	*pct = -p->slope * ((double)(last - first) / CW_US_PER_S / 86400.0) /
	    r * 100.0;
	return MEAS_OK;
}

/*
 * The fit.  Its parameters Q are logarithms of factors on C's scales:
 * two (cycle, calendar), or one common to both (COMMON).
 */
static void
fit_scales(const struct wear_conf *c, const double *q, int common,
    struct wear_conf *out)
{
	*out = *c;
	out->cycle_scale = c->cycle_scale * exp(q[0]);
	out->cal_scale = c->cal_scale * exp(q[common ? 0 : 1]);
}

/* The sum of squared residuals at Q, and the residuals into RES. */
static double
fit_rss(const struct wear_conf *c, const struct meas_obs *o, size_t n,
    const double *q, int common, double *res)
{
	struct wear_conf cq;
	struct wear_result x;
	double s = 0;
	size_t i;

	fit_scales(c, q, common, &cq);
	for (i = 0; i < n; i++) {
		wear_report(&cq, o[i].acc, o[i].prior, o[i].capacity_ah, &x);
		res[i] = cw_isnum(x.fade_pct) ? x.fade_pct - o[i].measured_pct :
		    0;
		s += res[i] * res[i];
	}
	return s;
}

/* The Jacobian of the residuals in Q (central differences), J[i*2+j]. */
static void
fit_jac(const struct wear_conf *c, const struct meas_obs *o, size_t n,
    const double *q, int common, double *jac, double *tmp)
{
	const double h = 1e-5;
	double qq[2];
	size_t i;
	int j, np = common ? 1 : 2;

	for (j = 0; j < np; j++) {
		qq[0] = q[0];
		qq[1] = q[1];
		qq[j] = q[j] + h;
		fit_rss(c, o, n, qq, common, tmp);
		for (i = 0; i < n; i++)
			jac[i * 2 + j] = tmp[i];
		qq[j] = q[j] - h;
		fit_rss(c, o, n, qq, common, tmp);
		for (i = 0; i < n; i++)
			jac[i * 2 + j] = (jac[i * 2 + j] - tmp[i]) / (2 * h);
	}
}

static int
dbl_cmp(const void *pa, const void *pb)
{
	double a = *(const double *)pa, b = *(const double *)pb;

	return a < b ? -1 : a > b;
}

/* Root mean square and mean of the residuals, median days_to_eol. */
static void
fit_effect(const struct wear_conf *c, const struct meas_obs *o, size_t n,
    double *rms, double *bias, double *med, size_t *neol, double *tmp)
{
	struct wear_result x;
	double s = 0, s2 = 0, e;
	size_t i, m = 0;

	for (i = 0; i < n; i++) {
		wear_report(c, o[i].acc, o[i].prior, o[i].capacity_ah, &x);
		e = cw_isnum(x.fade_pct) ? x.fade_pct - o[i].measured_pct : 0;
		s += e;
		s2 += e * e;
		if (cw_isnum(x.days_to_eol))
			tmp[m++] = x.days_to_eol;
	}
	*rms = sqrt(s2 / (double)n);
	*bias = s / (double)n;
	*neol = m;
	*med = CW_MISSING;
	if (m > 0) {
		qsort(tmp, m, sizeof(*tmp), dbl_cmp);
		*med = m % 2 ? tmp[m / 2] : (tmp[m / 2 - 1] + tmp[m / 2]) / 2;
	}
}

int
meas_fit_scales(const struct wear_conf *c, const struct meas_obs *o,
    size_t n, struct meas_fit *fit)
{
	struct wear_conf cf;
	double q[2] = { 0, 0 }, qn[2], *res, *jac, *tmp;
	double a[3], g[2], s, sn = 0, lambda = 1e-3, d[2], det, aa, bb, cc, cosv;
	double jl[2], s2;
	size_t i;
	int it, np, common = 0;

	memset(fit, 0, sizeof(*fit));
	fit->n = n;
	fit->corr = fit->se[0] = fit->se[1] = CW_MISSING;
	fit->scale[0][0] = c->cycle_scale;
	fit->scale[0][1] = c->cal_scale;
	if (n < 2)
		return -1;
	res = cw_calloc(n, sizeof(*res));
	jac = cw_calloc(2 * n, sizeof(*jac));
	tmp = cw_calloc(n, sizeof(*tmp));

	/* Parallel columns: the packs cannot tell cycling from age. */
	fit_jac(c, o, n, q, 0, jac, tmp);
	aa = bb = cc = 0;
	for (i = 0; i < n; i++) {
		aa += jac[i * 2] * jac[i * 2];
		bb += jac[i * 2] * jac[i * 2 + 1];
		cc += jac[i * 2 + 1] * jac[i * 2 + 1];
	}
	cosv = aa > 0 && cc > 0 ? fabs(bb) / sqrt(aa * cc) : 1;
	if (cosv > 1 - 1e-6)
		common = 1;
	np = common ? 1 : 2;

	s = fit_rss(c, o, n, q, common, res);
	for (it = 0; it < 200; it++) {
		fit_jac(c, o, n, q, common, jac, tmp);
		a[0] = a[1] = a[2] = g[0] = g[1] = 0;
		for (i = 0; i < n; i++) {
			a[0] += jac[i * 2] * jac[i * 2];
			a[1] += jac[i * 2] * jac[i * 2 + 1];
			a[2] += jac[i * 2 + 1] * jac[i * 2 + 1];
			g[0] += jac[i * 2] * res[i];
			g[1] += jac[i * 2 + 1] * res[i];
		}
		for (;;) {
			/* (A + lambda diag A) d = -g, Marquardt's scaling. */
			aa = a[0] * (1 + lambda);
			cc = a[2] * (1 + lambda);
			if (np == 1) {
				d[0] = aa > 0 ? -g[0] / aa : 0;
				d[1] = 0;
			} else {
				det = aa * cc - a[1] * a[1];
				d[0] = det != 0 ? (-g[0] * cc + g[1] * a[1]) /
				    det : 0;
				d[1] = det != 0 ? (-g[1] * aa + g[0] * a[1]) /
				    det : 0;
			}
			qn[0] = q[0] + d[0];
			qn[1] = q[1] + d[1];
			/* Factors beyond e^+-30 are no fit of this model. */
			if (fabs(qn[0]) < 30 && fabs(qn[1]) < 30 &&
			    (sn = fit_rss(c, o, n, qn, common, tmp)) <= s)
				break;
			lambda *= 10;
			if (lambda > 1e12)
				break;
		}
		if (lambda > 1e12) {
			fit->converged = 1;
			break;
		}
		q[0] = qn[0];
		q[1] = qn[1];
		lambda = lambda / 10 > 1e-12 ? lambda / 10 : 1e-12;
		fit_rss(c, o, n, q, common, res);
		if (fabs(d[0]) + fabs(d[1]) < 1e-10 || s - sn <= 1e-15 * s ||
		    sn == 0) {
			s = sn;
			fit->converged = 1;
			break;
		}
		s = sn;
	}
	fit_scales(c, q, common, &cf);
	fit->common = common;
	fit->scale[1][0] = cf.cycle_scale;
	fit->scale[1][1] = cf.cal_scale;

	/*
	 * Errors: the covariance s^2 (J'J)^-1 of the scales themselves (J
	 * in the scales, the chain rule on the logarithms), s^2 the residual
	 * variance over n - p degrees of freedom.
	 */
	if (n > (size_t)np) {
		fit_jac(c, o, n, q, common, jac, tmp);
		s2 = s / (double)(n - (size_t)np);
		if (common) {
			aa = 0;
			for (i = 0; i < n; i++)
				aa += jac[i * 2] * jac[i * 2];
			if (aa > 0) {
				fit->se[0] = sqrt(s2 / aa) * cf.cycle_scale;
				fit->se[1] = sqrt(s2 / aa) * cf.cal_scale;
				fit->corr = 1;
			}
		} else {
			aa = bb = cc = 0;
			for (i = 0; i < n; i++) {
				jl[0] = jac[i * 2] / cf.cycle_scale;
				jl[1] = jac[i * 2 + 1] / cf.cal_scale;
				aa += jl[0] * jl[0];
				bb += jl[0] * jl[1];
				cc += jl[1] * jl[1];
			}
			det = aa * cc - bb * bb;
			if (det > 0) {
				fit->se[0] = sqrt(s2 * cc / det);
				fit->se[1] = sqrt(s2 * aa / det);
				fit->corr = -bb / sqrt(aa * cc);
			}
		}
	}
	fit_effect(c, o, n, &fit->rms[0], &fit->bias[0], &fit->eol_median[0],
	    &fit->eol_n[0], tmp);
	fit_effect(&cf, o, n, &fit->rms[1], &fit->bias[1],
	    &fit->eol_median[1], &fit->eol_n[1], tmp);
	free(res);
	free(jac);
	free(tmp);
	return 0;
}
