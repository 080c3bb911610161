/*
 * capacity.c: capacity by coulomb counting over charge and discharge
 * segments, and its Theil-Sen trend; see capacity.h.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "capacity.h"
#include "charge.h"
#include "ocv.h"
#include "theilsen.h"

#define US_PER_DAY	(86400.0 * CW_US_PER_S)
/* 9999-12-31T23:59:59Z: no date is projected beyond it. */
#define CAP_T_MAX	(253402300799LL * CW_US_PER_S)
/* Swing a segment needs before its own ratio serves the jump test. */
#define CAP_SELF_SWING	5.0

const char *const cap_reason_name[CAP_NREASON] = {
	"accepted", "swing", "gap", "jump", "no-soc", "temp", "no-current",
	"sign"
};

static double	ref_capacity(const struct cap_dev *d);
static int	is_jump(const struct cap_conf *c, const struct cap_dev *d,
		    double dq, double ds, int sgn);
static void	add_row(struct cap_dev *d, cw_time t, double dq, double temp,
		    cw_time dt, double soc, double ds, int active);
static void	commit_pause(struct cap_dev *d);
static int	judge(const struct cap_conf *c, struct cap_dev *d,
		    enum cap_reason end, struct cap_counts *cnt,
		    struct cap_est *out);
static int	cmp_double(const void *a, const void *b);
static int	ocv_commit(const struct cap_conf *c, struct cap_ocvdev *d,
		    struct cap_counts *cnt, struct cap_est *out);
static double	median(const double *x, unsigned n);

void
cap_conf_default(struct cap_conf *c)
{
	memset(c, 0, sizeof *c);
	c->min_current = 0.1;
	c->max_gap = CHARGE_MAX_GAP;
	c->max_rest = 5 * 60 * CW_US_PER_S;
	c->temp_lo = 10;
	c->temp_hi = 45;
	c->min_swing = 20;
	c->jump = 2;
	c->ocv_rest = 30 * 60 * CW_US_PER_S;
	c->ocv_span = 86400 * CW_US_PER_S;
}

void
cap_dev_init(struct cap_dev *d, double rated_ah)
{
	memset(d, 0, sizeof *d);
	d->prev_soc = CW_MISSING;
	d->recent_med = CW_MISSING;
	d->rated_ah = rated_ah > 0 ? rated_ah : CW_MISSING;
}

static int
cmp_double(const void *a, const void *b)
{
	double x = *(const double *)a, y = *(const double *)b;

	return x < y ? -1 : x > y;
}

/* The median of X[0..N), 0 < N <= CAP_RECENT. */
static double
median(const double *x, unsigned n)
{
	double v[CAP_RECENT];

	memcpy(v, x, n * sizeof v[0]);
	qsort(v, n, sizeof v[0], cmp_double);
	return n % 2 ? v[n / 2] : (v[n / 2 - 1] + v[n / 2]) / 2;
}

/*
 * The capacity the jump test expects a step from: the rating, else the
 * median of the device's last accepted estimates, else the open segment's
 * own ratio once it has moved CAP_SELF_SWING points; NaN when none is.
 */
static double
ref_capacity(const struct cap_dev *d)
{
	double ds;

	if (cw_isnum(d->rated_ah))
		return d->rated_ah;
	if (d->nrecent > 0)
		return d->recent_med;
	if (d->dir != 0 && d->has_a && d->has_b) {
		ds = fabs(d->b.soc - d->a.soc);
		if (ds >= CAP_SELF_SWING)
			return 100 * fabs(d->b.q - d->a.q) / ds;
	}
	return CW_MISSING;
}

/*
 * A SoC step DS over a row of charge DQ is a jump when it misses the
 * step that charge makes at the reference capacity, e = 100 DQ / C, by
 * more than c->jump points plus half of e (so a capacity off by a third
 * and a whole-percent gauge's rounding pass).  Without a reference only
 * what needs none is tested: a step against the row's current, or any
 * step over a pause row, of more than c->jump points.
 */
static int
is_jump(const struct cap_conf *c, const struct cap_dev *d, double dq,
    double ds, int sgn)
{
	double cap = ref_capacity(d), e;

	if (cw_isnum(cap)) {
		e = 100 * dq / cap;
		return fabs(ds - e) > c->jump + 0.5 * fabs(e);
	}
	if (sgn == 0)
		return fabs(ds) > c->jump;
	return ds * sgn < -c->jump;
}

/* Add a row of the open segment, active or part of a pause. */
static void
add_row(struct cap_dev *d, cw_time t, double dq, double temp, cw_time dt,
    double soc, double ds, int active)
{
	double w = (double)dt / CW_US_PER_S;
	struct cap_step st;

	d->q += dq;
	st.t = t;
	st.soc = soc;
	st.q = d->q;
	st.dq = dq;
	if (!active) {
		d->prows++;
		d->pause += dt;
		if (cw_isnum(temp) && w > 0) {
			d->ptw += temp * w;
			d->ptwt += w;
		}
		if (ds != 0) {
			if (!d->has_pa)
				d->pa = st;
			d->has_pa = 1;
			d->pb = st;
			d->has_pb = 1;
		}
		return;
	}
	commit_pause(d);
	d->rows++;
	d->t_act = t;
	d->soc_act = soc;
	if (cw_isnum(temp) && w > 0) {
		d->tw += temp * w;
		d->twt += w;
	}
	if (ds != 0) {
		if (!d->has_a)
			d->a = st;
		d->has_a = 1;
		d->b = st;
		d->has_b = 1;
	}
}

/* A pause followed by an active row belongs to the segment. */
static void
commit_pause(struct cap_dev *d)
{
	d->rows += d->prows;
	d->tw += d->ptw;
	d->twt += d->ptwt;
	if (d->has_pa && !d->has_a) {
		d->a = d->pa;
		d->has_a = 1;
	}
	if (d->has_pb) {
		d->b = d->pb;
		d->has_b = 1;
	}
	d->prows = 0;
	d->pause = 0;
	d->ptw = d->ptwt = 0;
	d->has_pa = d->has_pb = 0;
}

/*
 * Judge the open segment of D, ended for reason END (CAP_SWING for an
 * ordinary end), into *OUT; count it; close it.  Returns 1.
 */
static int
judge(const struct cap_conf *c, struct cap_dev *d, enum cap_reason end,
    struct cap_counts *cnt, struct cap_est *out)
{
	double ds = 0, q = 0;

	memset(out, 0, sizeof *out);
	out->dir = d->dir;
	out->rows = d->rows;
	out->capacity_ah = CW_MISSING;
	out->resolution_pct = CW_MISSING;
	out->temp_c = d->twt > 0 ? d->tw / d->twt : CW_MISSING;
	if (d->has_a) {
		ds = d->b.soc - d->a.soc;
		q = d->b.q - d->a.q;
		out->start = d->a.t;
		out->end = d->b.t;
		out->soc_from = d->a.soc;
		out->soc_to = d->b.soc;
	} else {
		out->start = d->t_first;
		out->end = d->t_act;
		out->soc_from = d->soc0;
		out->soc_to = d->soc_act;
	}
	out->charge_ah = q;
	if (!d->has_a || fabs(ds) < c->min_swing)
		out->reason = end;
	else if (!(ds * d->dir > 0 && q * d->dir > 0) || !isfinite(q) ||
	    !isfinite(d->a.dq) || !isfinite(d->b.dq))
		/*
		 * A charge that overflowed (to infinity or NaN), or whose
		 * steps cannot be bounded, is no estimate either.
		 */
		out->reason = CAP_SIGN;
	else {
		out->reason = CAP_OK;
		out->capacity_ah = 100 * fabs(q) / fabs(ds);
		out->resolution_pct = 100 * (fabs(d->a.dq) + fabs(d->b.dq)) /
		    fabs(q);
		d->recent[d->recent_head] = out->capacity_ah;
		d->recent_head = (d->recent_head + 1) % CAP_RECENT;
		if (d->nrecent < CAP_RECENT)
			d->nrecent++;
		d->recent_med = median(d->recent, d->nrecent);
	}
	cnt->n[out->reason]++;
	if (end != CAP_SWING)
		cnt->cut[end]++;
	d->dir = 0;
	d->rows = d->prows = 0;
	d->pause = 0;
	d->q = d->tw = d->twt = d->ptw = d->ptwt = 0;
	d->has_a = d->has_b = d->has_pa = d->has_pb = 0;
	return 1;
}

int
cap_feed(const struct cap_conf *c, struct cap_dev *d, cw_time t, double i_a,
    double temp_c, double soc_pct, struct cap_counts *cnt,
    struct cap_est *out)
{
	enum cap_reason end = CAP_OK;
	cw_time dt;
	double dq, ds;
	int n = 0, sgn, gap, temp_ok;

	if (!d->have_prev) {
		d->have_prev = 1;
		d->prev_t = t;
		d->prev_soc = soc_pct;
		return 0;
	}
	dt = t - d->prev_t;
	gap = dt > c->max_gap;
	dq = charge_ah(i_a, d->prev_t, t, c->max_gap);
	ds = soc_pct - d->prev_soc;
	sgn = i_a >= c->min_current ? 1 : i_a <= -c->min_current ? -1 : 0;
	temp_ok = c->temp_any || (temp_c >= c->temp_lo &&
	    temp_c <= c->temp_hi);
	if (sgn != 0 && !gap && ds != 0 && cw_isnum(ds)) {
		if (ds * sgn > 0)
			cnt->with++;
		else
			cnt->against++;
	}

	if (d->dir != 0) {
		/* What ends the open segment at this row, first found. */
		if (gap)
			end = CAP_GAP;
		else if (!cw_isnum(i_a))
			end = CAP_NO_I;
		else if (!cw_isnum(soc_pct))
			end = CAP_NO_SOC;
		else if (!temp_ok)
			end = CAP_TEMP;
		else if (is_jump(c, d, dq, ds, sgn))
			end = CAP_JUMP;
		else if (sgn == -d->dir)
			end = CAP_SWING;
		if (end != CAP_OK)
			n = judge(c, d, end, cnt, out);
		else if (sgn == d->dir)
			add_row(d, t, dq, temp_c, dt, soc_pct, ds, 1);
		else if (d->pause + dt > c->max_rest)
			n = judge(c, d, CAP_SWING, cnt, out);
		else
			add_row(d, t, dq, temp_c, dt, soc_pct, ds, 0);
	}
	/* A segment starts at an active row whose boundary, the row before,
	 * has a SoC, with nothing between them that would end it (a jump
	 * that ended a segment here is not tested again: without the
	 * segment's own ratio the test might pass). */
	if (d->dir == 0 && sgn != 0 && !gap && end != CAP_JUMP &&
	    cw_isnum(soc_pct) &&
	    cw_isnum(d->prev_soc) && temp_ok && !is_jump(c, d, dq, ds, sgn)) {
		d->dir = sgn;
		d->t_first = t;
		d->soc0 = d->prev_soc;
		add_row(d, t, dq, temp_c, dt, soc_pct, ds, 1);
	}
	d->prev_t = t;
	d->prev_soc = soc_pct;
	return n;
}

int
cap_finish(const struct cap_conf *c, struct cap_dev *d,
    struct cap_counts *cnt, struct cap_est *out)
{
	if (d->dir == 0)
		return 0;
	return judge(c, d, CAP_SWING, cnt, out);
}

/*
 * The rest of D has ended: its candidate becomes a point.  Returns 1 with
 * *OUT when it ends an estimate.
 */
static int
ocv_commit(const struct cap_conf *c, struct cap_ocvdev *d,
    struct cap_counts *cnt, struct cap_est *out)
{
	const struct cap_pt *a = &d->anchor, *p = &d->cand;
	double ds, q;

	if (!d->has_cand)
		return 0;
	d->has_cand = 0;
	if (!d->has_anchor || p->t - a->t > c->ocv_span) {
		d->anchor = *p;
		d->has_anchor = 1;
		return 0;
	}
	ds = p->soc - a->soc;
	if (fabs(ds) < c->min_swing)
		return 0;
	q = p->q - a->q;
	memset(out, 0, sizeof out[0]);
	out->dir = q > 0 ? 1 : -1;
	out->start = a->t;
	out->end = p->t;
	out->soc_from = a->soc;
	out->soc_to = p->soc;
	out->charge_ah = q;
	out->temp_c = (a->temp + p->temp) / 2;
	out->rows = p->rows - a->rows;
	out->resolution_pct = CW_MISSING;
	out->capacity_ah = CW_MISSING;
	if (!(ds * q > 0))
		out->reason = CAP_SIGN;
	else {
		out->reason = CAP_OK;
		out->capacity_ah = 100 * fabs(q) / fabs(ds);
	}
	cnt->n[out->reason]++;
	d->anchor = *p;
	return 1;
}

int
cap_ocv_feed(const struct cap_conf *c, const struct ocv *o,
    struct cap_ocvdev *d, cw_time t, double v_cell, double i_a,
    double temp_c, struct cap_counts *cnt, struct cap_est *out)
{
	int n = 0, low = fabs(i_a) < c->min_current;
	double soc;

	if (!d->have_prev || t - d->prev_t > c->max_gap || !cw_isnum(i_a)) {
		/* Nothing is known of the charge before: a rest held so far
		 * is still a point, but no estimate spans this row. */
		if (d->have_prev) {
			n = ocv_commit(c, d, cnt, out);
			cnt->cut[cw_isnum(i_a) ? CAP_GAP : CAP_NO_I]++;
		}
		d->have_prev = 1;
		d->has_anchor = 0;
		d->q = 0;
		d->rows = 0;
		d->resting = cw_isnum(i_a) && low;
		d->rest_start = t;
		d->prev_t = t;
		return n;
	}
	d->q += charge_ah(i_a, d->prev_t, t, c->max_gap);
	d->rows++;
	if (!low) {
		n = ocv_commit(c, d, cnt, out);
		d->resting = 0;
	} else {
		if (!d->resting) {
			d->resting = 1;
			d->rest_start = d->prev_t;
		}
		soc = cw_isnum(v_cell) ? ocv_soc(o, v_cell) : CW_MISSING;
		if (t - d->rest_start >= c->ocv_rest && cw_isnum(soc) &&
		    (c->temp_any || (temp_c >= c->temp_lo &&
		    temp_c <= c->temp_hi))) {
			d->cand.t = t;
			d->cand.soc = soc;
			d->cand.temp = temp_c;
			d->cand.q = d->q;
			d->cand.rows = d->rows;
			d->has_cand = 1;
		}
	}
	d->prev_t = t;
	return n;
}

int
cap_ocv_finish(const struct cap_conf *c, struct cap_ocvdev *d,
    struct cap_counts *cnt, struct cap_est *out)
{
	return ocv_commit(c, d, cnt, out);
}

void
cap_trend_conf_default(struct cap_trend_conf *c)
{
	c->min_estimates = 5;
	c->eol_pct = 80;
	c->conf = 0.95;
}

void
cap_trend_fit(const struct dcir_series *s, double rated_ah,
    const struct cap_trend_conf *c, struct cap_trend *out)
{
	struct theil_fit f;
	double *x, xlast, days, at;
	size_t i;
	int rc;

	memset(out, 0, sizeof *out);
	out->slope = out->slope_lo = out->slope_hi = CW_MISSING;
	out->cap_start = out->cap_end = CW_MISSING;
	out->fade_pct = out->fade_30d = out->soh_pct = CW_MISSING;
	if (s->steps < c->min_estimates || s->steps == 0 || s->n < 2)
		return;
	/* One SoC bin for all (dcir_series_add with SoC unknown). */
	x = cw_malloc(2 * s->n * sizeof *x);
	for (i = 0; i < s->n; i++) {
		x[i] = (double)(s->pt[i].t - s->first) / US_PER_DAY;
		x[s->n + i] = s->pt[i].r;
	}
	rc = theil_fit(x, x + s->n, s->n, c->conf, &f);
	free(x);
	if (rc != 0)
		return;
	out->fitted = 1;
	out->used = s->n;
	out->slope = f.slope;
	out->slope_lo = f.slope_lo;
	out->slope_hi = f.slope_hi;
	xlast = (double)(s->last - s->first) / US_PER_DAY;
	out->cap_start = f.intercept;
	out->cap_end = f.intercept + f.slope * xlast;
	if (!(out->cap_start > 0))
		return;		/* no fade relative to a non-capacity */
	out->fade_pct = 100 * (out->cap_start - out->cap_end) /
	    out->cap_start;
	out->fade_30d = -100 * f.slope * 30 / out->cap_start;
	if (!(rated_ah > 0))
		return;
	out->soh_pct = 100 * out->cap_end / rated_ah;
	/* A date only for a fade the interval is sure of. */
	if (!(f.slope_hi < 0))
		return;
	days = (c->eol_pct / 100 * rated_ah - f.intercept) / f.slope;
	at = (double)s->first + days * US_PER_DAY;
	if (at >= 0 && at <= (double)CAP_T_MAX) {
		out->eol_t = (cw_time)at;
		out->has_eol = 1;
	}
}
