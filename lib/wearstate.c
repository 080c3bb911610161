/* wearstate.c: the text form of cw-wear device states (see wearstate.h). */
#include <math.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "csvin.h"
#include "cw.h"
#include "num.h"
#include "statefmt.h"
#include "ts.h"
#include "wearstate.h"

#define TAG_STEM	"cw-wear-state-"

/* What the first record of a file is (csvin skips copies of it). */
enum { FIRST_DEV, FIRST_HEADER, FIRST_END };


/*
 * A field of the device row: as the engine that owns it describes it
 * (struct sfmt_spec), its offset now within struct wear_dev.
 */
#define F_(n, k, m, lo, hi, r) \
	{ n, k, offsetof(struct wear_dev, m), lo, hi, r, 1 }
#define FD(n, m)	F_(n, SFMT_DBL, m, 0, 0, SFMT_R_NONNEG)
#define FX(n, m)	F_(n, SFMT_DBL, m, 0, 0, SFMT_R_ANY)
#define FS(n, m)	F_(n, SFMT_DBL, m, 0, 0, SFMT_R_SPAN_S)
#define FN(n, m)	F_(n, SFMT_DBLN, m, 0, 0, SFMT_R_ANY)
#define FT(n, m)	F_(n, SFMT_TIME, m, 0, 0, SFMT_R_TIME)
#define FU(n, m)	F_(n, SFMT_UL, m, 0, 0, SFMT_R_ROWS)
#define FI(n, m, lo, hi) F_(n, SFMT_INT, m, lo, hi, SFMT_R_ANY)

/*
 * The device's own fields, in three runs; the row is the first, then the
 * rainflow state's fields (rf_state_fields()), the top-off detector's of
 * its revision 1 (topoff_state_fields()), the second, the top-off
 * detector's of revision 2, and the third (composed by fields()).
 */
static const struct sfmt_spec own1[] = {
	F_("rows", SFMT_UL, acc.rows, 0, 0, SFMT_R_ANY),
	FU("rows_no_current", acc.rows_no_current),
	FU("rows_no_soc", acc.rows_no_soc),
	FU("rows_no_temp", acc.rows_no_temp),
	FU("rows_model", acc.rows_model),
	FD("charge_ah", acc.charge_ah),
	FS("charge_s", acc.charge_s),
	FD("max_charge_a", acc.max_charge_a),
	FD("ah_below_min", acc.zone_ah.zone[THERMAL_BELOW_MIN]),
	FD("ah_cool", acc.zone_ah.zone[THERMAL_COOL]),
	FD("ah_normal", acc.zone_ah.zone[THERMAL_NORMAL]),
	FD("ah_warm", acc.zone_ah.zone[THERMAL_WARM]),
	FD("ah_above_max", acc.zone_ah.zone[THERMAL_ABOVE_MAX]),
	FD("ah_no_temp", acc.zone_ah.no_temp),
	FS("soc_s", acc.soc_s),
	FS("soc_high_s", acc.soc_high_s),
	FS("temp_s", acc.temp_s),
	FS("temp_high_s", acc.temp_high_s),
	FS("model_s", acc.model_s),
	FS("gap_s", acc.gap_s),
	FU("gaps", acc.gaps),
	FD("rf_cycles", acc.rf.cycles),
	FD("rf_range_sum", acc.rf.range_sum),
	FD("rf_max_range", acc.rf.max_range),
	FU("rf_full", acc.rf.full),
	FU("rf_half", acc.rf.half),
	FD("cycles_no_temp", acc.cycles_no_temp),
	FU("topoff_cycles", acc.topoff_cycles),
	FU("topoff_judged", acc.topoff_judged),
	FU("topoff_cut", acc.topoff_cut),
	FD("cyc_full", acc.cyc[WEAR_FULL]),
	FD("cyc_ref", acc.cyc[WEAR_REF]),
	FX("cyc_soc", acc.cyc[WEAR_SOC]),
	FX("cyc_temp", acc.cyc[WEAR_TEMP]),
	FD("cal_full", acc.cal[WEAR_FULL]),
	FD("cal_ref", acc.cal[WEAR_REF]),
	FX("cal_soc", acc.cal[WEAR_SOC]),
	FX("cal_temp", acc.cal[WEAR_TEMP]),
	FN("head_i", head_i),
	FN("head_temp", head_temp),
	FI("have_soc0", have_soc0, 0, 1),
	FT("soc0_t", soc0_t),
	FX("soc0", soc0),
	FI("have_temp0", have_temp0, 0, 1),
	FT("temp0_t", temp0_t),
	FX("temp0", temp0),
	FI("have_model0", have_model0, 0, 1),
	FT("model0_t", model0_t),
	FD("rate0_full", rate0.full),
	FD("rate0_ref", rate0.ref),
	FX("rate0_soc", rate0.soc),
	FX("rate0_temp", rate0.temp),
	FI("have_soc", have_soc, 0, 1),
	FT("soc_t", soc_t),
	FX("soc", soc),
	FI("have_temp", have_temp, 0, 1),
	FT("temp_t", temp_t),
	FX("temp", temp),
	FI("have_model", have_model, 0, 1),
	FT("model_t", model_t),
	FD("rate_full", rate.full),
	FD("rate_ref", rate.ref),
	FX("rate_soc", rate.soc),
	FX("rate_temp", rate.temp)
};
static const struct sfmt_spec own2[] = {
	FI("pre_state", pre_state, 0, WEAR_PRE_NSTATE - 1),
	FU("pre_cycles", pre_cycles),
	FU("pre_judged", pre_judged)
};
/* Since cw-wear-state-2: the damage before the log (packs in service). */
static const struct sfmt_spec own3[] = {
	FI("prior", prior.kind, 0, WEAR_PRIOR_NKIND - 1),
	FN("prior_soh_pct", prior.soh_pct),
	FX("prior_age_s", prior.age_s),
	FX("prior_efc", prior.efc)
};
#define NOWN(t)		(sizeof(t) / sizeof(t[0]))

/* The device's fields, in the order of the row (fields()). */
static struct sfmt_spec devf[160];
static size_t ndevf;
/*
 * Fields of a device in a state of version V.  Only version 2 is read
 * (tag_version); version 1 is refused with a message, since its damage
 * is not split by cause.
 */
#define NDEVF_V(v)	((void)(v), ndevf)

/*
 * The settings, over struct wear_conf, with the option that sets each
 * and the range that option takes (cmd/cw-wear.c; a duration in
 * microseconds, as opt_dur_arg() takes it): a state's value outside it
 * is refused as the option's would be.  --limits must also not decrease.
 */
struct setting {
	const char *name;
	int kind;
	size_t off;
	unsigned bit;
	const char *opt;
	double lo, hi;
};

#define SET(n, k, m, b, o, lo, hi) \
	{ n, k, offsetof(struct wear_conf, m), b, o, lo, hi }
static const struct setting setf[] = {
	SET("hysteresis", SFMT_DBL, hysteresis, WSTATE_SET_HYSTERESIS,
	    "--hysteresis", 0, 100),
	SET("min_current", SFMT_DBL, min_current, WSTATE_SET_MIN_CURRENT,
	    "--min-current", 0, 1e6),
	SET("max_gap_us", SFMT_TIME, max_gap, WSTATE_SET_MAX_GAP, "--max-gap",
	    1, 1e17),
	SET("t1", SFMT_DBL, lim.t[0], WSTATE_SET_LIMITS, "--limits", -273.15,
	    HUGE_VAL),
	SET("t2", SFMT_DBL, lim.t[1], WSTATE_SET_LIMITS, "--limits", -273.15,
	    HUGE_VAL),
	SET("t3", SFMT_DBL, lim.t[2], WSTATE_SET_LIMITS, "--limits", -273.15,
	    HUGE_VAL),
	SET("t4", SFMT_DBL, lim.t[3], WSTATE_SET_LIMITS, "--limits", -273.15,
	    HUGE_VAL),
	SET("full_pct", SFMT_DBL, topoff.full_pct, WSTATE_SET_FULL, "--full",
	    0, 100),
	SET("full_v", SFMT_DBLN, topoff.full_v, WSTATE_SET_FULL_VOLTAGE,
	    "--full-voltage", 1e-3, 1e6),
	SET("min_depth", SFMT_DBL, topoff.min_depth, WSTATE_SET_MIN_DEPTH,
	    "--min-depth", 1e-6, 100)
};
#define NSETF (sizeof(setf) / sizeof(setf[0]))

/* device, first, last, tag, model; the settings; the fields; rf_pts,
 * pre_rows, check; in a state of version V. */
#define COL_SET		5
#define COL_DEV		(COL_SET + NSETF)
#define COL_RF(v)	(COL_DEV + NDEVF_V(v))
#define COL_PRE(v)	(COL_RF(v) + 1)
#define COL_CHECK(v)	(COL_PRE(v) + 1)
#define NCOL(v)		(COL_CHECK(v) + 1)


/* What one read of a file keeps. */
struct rd {
	struct wstate_read *r;
	const char *path;
	int strict;
	unsigned long nrec;		/* records of this file */
	unsigned long rows, announced;	/* this file's */
	unsigned long ends;	/* end rows of this file */
	int first_kind;		/* of the first record: FIRST_* */
	unsigned long first_n;	/* the first record's N, an end row's */
};

static struct sfmt_buf B;

static const struct sfmt_buf *header(int);
static int tag_version(const char *);
static int settings(struct rd *, const struct csvin_rec *);
static int get_pre(struct wear_dev *, const char *, size_t);
static const char *check_dev(const struct wear_dev *,
    const struct wear_conf *);
static int dev_row(struct rd *, const struct csvin_rec *, int);
static int end_rec(struct rd *, const struct csvin_rec *);
static int on_rec(void *, const struct csvin_rec *);
static int on_bad(void *, const struct csvin_rec *, const char *);
static int on_blank(void *, const struct csvin_rec *);










/* Append the fields of T[0..N) of revision SINCE, at BASE in wear_dev. */
static void
add_fields(const struct sfmt_spec *t, size_t n, size_t base, int since)
{
	size_t k;

	for (k = 0; k < n; k++) {
		if (t[k].since != since)
			continue;
		if (ndevf == sizeof(devf) / sizeof(devf[0]))
			cw_die(CW_EXIT_DATA, "internal error: too many "
			    "state fields");
		devf[ndevf] = t[k];
		devf[ndevf++].off += base;
	}
}

/* The device row's fields, composed once from the engines' tables. */
static void
fields(void)
{
	const struct sfmt_spec *rf, *top;
	size_t nrf, ntop;

	if (ndevf > 0)
		return;
	rf = rf_state_fields(&nrf);
	top = topoff_state_fields(&ntop);
	add_fields(own1, NOWN(own1), 0, 1);
	add_fields(rf, nrf, offsetof(struct wear_dev, rf), 1);
	add_fields(top, ntop, offsetof(struct wear_dev, top), 1);
	add_fields(own2, NOWN(own2), 0, 1);
	/* Since cw-wear-state-2: the top-off detector's use dips ... */
	add_fields(top, ntop, offsetof(struct wear_dev, top), 2);
	/* ... and the damage before the log. */
	add_fields(own3, NOWN(own3), 0, 1);
}

/* The header row of version V (1 or 2), with its line end, made once. */
static const struct sfmt_buf *
header(int v)
{
	static struct sfmt_buf hb[2];
	struct sfmt_buf *h = &hb[v - 1];
	size_t k;

	if (h->n > 0)
		return h;
	fields();
	sfmt_str(h, "device,first,last,");
	sfmt_str(h, WSTATE_TAG);
	sfmt_str(h, ",model");
	for (k = 0; k < NSETF; k++) {
		sfmt_add(h, ",", 1);
		sfmt_str(h, setf[k].name);
	}
	for (k = 0; k < NDEVF_V(v); k++) {
		sfmt_add(h, ",", 1);
		sfmt_str(h, devf[k].name);
	}
	sfmt_str(h, ",rf_pts,pre_rows,check\n");
	return h;
}

/* The version of a state tag this cw-wear reads: 2, or 0. */
static int
tag_version(const char *tag)
{
	return strcmp(tag, WSTATE_TAG) == 0 ? 2 : 0;
}

int
wstate_write_header(FILE *fp)
{
	const struct sfmt_buf *h = header(2);

	return fwrite(h->s, 1, h->n, fp) == h->n ? 0 : -1;
}

int
wstate_write_dev(FILE *fp, const char *name, size_t namelen,
    const struct wear_dev *d, const struct wear_conf *c)
{
	char t[TS_FMTMAX];
	size_t k;

	fields();
	B.n = 0;
	sfmt_name(&B, name, namelen);
	sfmt_add(&B, ",", 1);
	sfmt_add(&B, t, ts_format(d->acc.first, t));
	sfmt_add(&B, ",", 1);
	sfmt_add(&B, t, ts_format(d->acc.last, t));
	sfmt_str(&B, "," WSTATE_TAG ",");
	sfmt_str(&B, c->model->name);
	for (k = 0; k < NSETF; k++) {
		sfmt_add(&B, ",", 1);
		sfmt_field(&B, setf[k].kind, (const char *)c + setf[k].off);
	}
	for (k = 0; k < ndevf; k++) {
		sfmt_add(&B, ",", 1);
		sfmt_field(&B, devf[k].kind, (const char *)d + devf[k].off);
	}
	sfmt_add(&B, ",", 1);
	rf_state_put_residue(&B, &d->rf);
	sfmt_add(&B, ",", 1);
	for (k = 0; k < d->pre_n; k++) {
		if (k > 0)
			sfmt_add(&B, ";", 1);
		sfmt_i64(&B, (long long)d->pre[k].t);
		sfmt_add(&B, ":", 1);
		sfmt_i64(&B, (long long)d->pre[k].t_last);
		sfmt_add(&B, ":", 1);
		sfmt_ul(&B, d->pre[k].n);
		sfmt_add(&B, ":", 1);
		sfmt_dbl(&B, d->pre[k].v, 1);
		sfmt_add(&B, ":", 1);
		sfmt_dbl(&B, d->pre[k].i, 1);
		sfmt_add(&B, ":", 1);
		sfmt_dbl(&B, d->pre[k].soc, 1);
	}
	return sfmt_end_row(fp, &B);
}

int
wstate_write_end(FILE *fp, unsigned long rows)
{
	return sfmt_write_end(fp, &B, WSTATE_TAG, rows);
}






/*
 * The settings of a row: adopted from the first row where the command
 * line did not fix them, then the same on every row.
 */
static int
settings(struct rd *d, const struct csvin_rec *rec)
{
	struct wstate_read *r = d->r;
	struct wear_conf *c = r->conf;
	const struct model *m;
	char have[128], want[128];
	unsigned char v[sizeof(double) > sizeof(cw_time) ? sizeof(double) :
	    sizeof(cw_time)];
	double x, prev_lim = -HUGE_VAL;
	size_t k;

	m = model_find(rec->f[4]);
	if (m == NULL) {
		cw_warn_at(rec->src, rec->line, "the state was made with "
		    "model '%s', which this cw-wear does not have",
		    rec->f[4]);
		return CW_EXIT_DATA;
	}
	if (!r->adopted && !(r->fixed & WSTATE_SET_MODEL))
		c->model = m;
	else if (m != c->model) {
		cw_warn_at(rec->src, rec->line, "the state was made with "
		    "--model %s, %s %s", m->name, r->adopted ?
		    "an earlier one with" : "this run asks for",
		    c->model->name);
		return CW_EXIT_DATA;
	}
	for (k = 0; k < NSETF; k++) {
		const struct setting *s = &setf[k];
		char *p = (char *)c + s->off;

		if (sfmt_get_field(s->kind, rec->f[COL_SET + k],
		    rec->len[COL_SET + k], 0, 0, v) < 0) {
			cw_warn_at(rec->src, rec->line, "bad value '%.40s' in "
			    "column %s: the state is corrupt",
			    rec->f[COL_SET + k], s->name);
			return CW_EXIT_DATA;
		}
		/* In the option's range; limits in its order. */
		if (s->kind == SFMT_TIME)
			x = (double)*(cw_time *)(void *)v;
		else
			memcpy(&x, v, sizeof(x));
		if (cw_isnum(x) && (x < s->lo || x > s->hi)) {
			cw_warn_at(rec->src, rec->line, "%s %.40s is outside "
			    "what %s takes: the state is corrupt", s->name,
			    rec->f[COL_SET + k], s->opt);
			return CW_EXIT_DATA;
		}
		if (s->bit == WSTATE_SET_LIMITS) {
			if (x < prev_lim) {
				cw_warn_at(rec->src, rec->line, "limits %.24s,"
				    "%.24s,%.24s,%.24s decrease, which --limits "
				    "refuses: the state is corrupt",
				    rec->f[COL_SET + 3], rec->f[COL_SET + 4],
				    rec->f[COL_SET + 5], rec->f[COL_SET + 6]);
				return CW_EXIT_DATA;
			}
			prev_lim = x;
		}
		if (!r->adopted && !(r->fixed & s->bit)) {
			memcpy(p, v, s->kind == SFMT_TIME ? sizeof(cw_time) :
			    sizeof(double));
			continue;
		}
		if (!sfmt_same(s->kind, p, v)) {
			if (s->bit == WSTATE_SET_LIMITS) {
				/* All four, as --limits takes them. */
				snprintf(have, sizeof(have), "%.24s,%.24s,"
				    "%.24s,%.24s", rec->f[COL_SET + 3],
				    rec->f[COL_SET + 4], rec->f[COL_SET + 5],
				    rec->f[COL_SET + 6]);
				snprintf(want, sizeof(want), "%.15g,%.15g,"
				    "%.15g,%.15g", c->lim.t[0], c->lim.t[1],
				    c->lim.t[2], c->lim.t[3]);
			} else {
				sfmt_show(s->kind, v, have, sizeof(have));
				sfmt_show(s->kind, p, want, sizeof(want));
			}
			cw_warn_at(rec->src, rec->line, "the state was made "
			    "with %s %s, %s %s", s->opt, have, r->adopted ?
			    "an earlier one with" : "this run asks for",
			    want);
			return CW_EXIT_DATA;
		}
	}
	/* The top-off detector follows the run's gap and current. */
	c->topoff.max_gap = c->max_gap;
	c->topoff.min_current = c->min_current;
	r->adopted = 1;
	return 0;
}

/* The top-off prefix, "t:t_last:n:v:i:soc;...". */
static int
get_pre(struct wear_dev *d, const char *s, size_t n)
{
	static const int kind[6] = { SFMT_TIME, SFMT_TIME, SFMT_UL, SFMT_DBLN, SFMT_DBLN,
	    SFMT_DBLN };
	const char *p = s, *e = s + n, *q, *f[6];
	struct wear_run w;
	void *to[6];
	size_t cnt = 0, i, fl[6];
	int k;

	if (n == 0)
		return 0;
	for (i = 0; i < n; i++)
		cnt += s[i] == ';';
	cnt++;
	if (cnt > WEAR_PRE_MAX)
		return -1;
	d->pre = cw_malloc(cnt * sizeof(*d->pre));
	d->pre_cap = cnt;
	to[0] = &w.t;
	to[1] = &w.t_last;
	to[2] = &w.n;
	to[3] = &w.v;
	to[4] = &w.i;
	to[5] = &w.soc;
	while (p <= e) {
		q = memchr(p, ';', (size_t)(e - p));
		if (q == NULL)
			q = e;
		if (sfmt_split(p, (size_t)(q - p), ':', f, fl, 6) != 6)
			return -1;
		for (k = 0; k < 6; k++)
			if (sfmt_get_field(kind[k], f[k], fl[k], 0, 0,
			    to[k]) < 0)
				return -1;
		d->pre[d->pre_n++] = w;
		p = q + 1;
	}
	return 0;
}

/*
 * What a state read back must hold to be one wear_push() could have made,
 * as far as the rest of the code relies on it; NULL, or what is wrong.
 */
static const char *
check_dev(const struct wear_dev *d, const struct wear_conf *c)
{
	static char why[160];
	const struct wear_acc *a = &d->acc;
	const char *bad;
	double span_s;
	unsigned long n;
	size_t k;

	if (a->rows == 0 || a->first > a->last)
		return "no rows, or first after last";
	/* Every field by its rule (SFMT_R_*); times bounded by the rows'. */
	span_s = (double)(a->last - a->first) / CW_US_PER_S;
	for (k = 0; k < ndevf; k++) {
		const void *p = (const char *)d + devf[k].off;

		bad = NULL;

		switch (devf[k].rule) {
		case SFMT_R_NONNEG:
			if (!(*(const double *)p >= 0))
				bad = "is below 0";
			break;
		case SFMT_R_SPAN_S:
			if (!(*(const double *)p >= 0) || *(const double *)p >
			    span_s * (1 + 1e-9) + 1e-6)
				bad = "is not within the seconds from first to "
				    "last";
			break;
		case SFMT_R_ROWS:
			if (*(const unsigned long *)p > a->rows)
				bad = "is more than the rows";
			break;
		case SFMT_R_TIME:
			if (*(const cw_time *)p != 0 && (*(const cw_time *)p <
			    a->first || *(const cw_time *)p > a->last))
				bad = "is a time outside first to last";
			break;
		}
		if (bad != NULL) {
			snprintf(why, sizeof(why), "%s %s", devf[k].name, bad);
			return why;
		}
	}
	if ((bad = topoff_state_check(&d->top, a->last)) != NULL)
		return bad;
	if (d->rf.n > a->rows)
		return "rf_pts holds more turning points than the rows";
	if (a->rows_no_current > a->rows || a->rows_no_soc > a->rows ||
	    a->rows_no_temp > a->rows || a->rows_model > a->rows ||
	    a->topoff_judged > a->rows)
		return "more rows counted than the state has";
	if ((d->have_soc0 && (d->soc0_t < a->first || d->soc0_t > d->soc_t ||
	    !d->have_soc)) || (d->have_soc && (d->soc_t > a->last ||
	    !d->have_soc0)))
		return "first or last row with SoC outside the state";
	if ((d->have_temp0 && (d->temp0_t < a->first ||
	    d->temp0_t > d->temp_t || !d->have_temp)) || (d->have_temp &&
	    (d->temp_t > a->last || !d->have_temp0)))
		return "first or last row with temperature outside the state";
	if ((d->have_model0 && (d->model0_t < a->first ||
	    d->model0_t > d->model_t || !d->have_model)) ||
	    (d->have_model && (d->model_t > a->last || !d->have_model0)))
		return "first or last row of the model outside the state";
	if (rf_check(&d->rf) < 0)
		return "rainflow state inconsistent";
	for (k = 0; k < d->rf.n; k++)
		if (d->rf.pt[k].t < a->first || d->rf.pt[k].t > a->last)
			return "rainflow turning point outside the state";
	if (d->pre_n > a->rows || (d->pre_state == WEAR_PRE_LOST &&
	    d->pre_n != 0) || (d->pre_state == WEAR_PRE_DONE &&
	    d->pre_n == 0) || d->pre_cycles > a->topoff_cycles ||
	    d->pre_judged > a->topoff_judged)
		return "top-off prefix inconsistent";
	for (n = 0, k = 0; k < d->pre_n; k++) {
		const struct wear_run *w = &d->pre[k];

		if (w->t < (k ? d->pre[k - 1].t_last : a->first) ||
		    w->t_last < w->t || w->t_last > a->last || w->n == 0 ||
		    (w->n == 1 && w->t_last != w->t) ||
		    w->t_last - w->t > c->max_gap)
			return "top-off prefix rows out of order";
		n += w->n;
	}
	if (d->pre_n > 0 && d->pre[0].t != a->first)
		return "top-off prefix does not start at the first row";
	if (n > a->rows || (d->pre_state == WEAR_PRE_OPEN && n != a->rows))
		return "top-off prefix inconsistent";
	if ((d->prior.kind == WEAR_PRIOR_SOH && !(d->prior.soh_pct > 0 &&
	    d->prior.soh_pct <= 150)) || d->prior.age_s < 0 ||
	    d->prior.efc < 0)
		return "prior out of range";
	return NULL;
}

/* A device row of version V. */
static int
dev_row(struct rd *d, const struct csvin_rec *rec, int v)
{
	struct wstate_read *r = d->r;
	struct wear_dev w;
	const char *why;
	size_t k;
	int rc;

	if (rec->nf != NCOL(v)) {
		cw_warn_at(rec->src, rec->line, "a state row of %zu fields, "
		    "not %d: the state is cut short or corrupt", rec->nf,
		    (int)NCOL(v));
		return CW_EXIT_DATA;
	}
	if (!sfmt_row_ok(rec)) {
		cw_warn_at(rec->src, rec->line, "the check field does not "
		    "match the row: the state is corrupt");
		return CW_EXIT_DATA;
	}
	if (rec->len[0] == 0) {
		cw_warn_at(rec->src, rec->line, "a state row without a "
		    "device");
		return CW_EXIT_DATA;
	}
	if ((rc = settings(d, rec)) != 0)
		return rc;
	wear_init(&w, r->conf);
	w.acc.have = 1;
	w.have_prev = 1;
	if (ts_parse(rec->f[1], rec->len[1], TS_ISO, 0, &w.acc.first) < 0 ||
	    ts_parse(rec->f[2], rec->len[2], TS_ISO, 0, &w.acc.last) < 0) {
		cw_warn_at(rec->src, rec->line, "bad first or last time: the "
		    "state is corrupt");
		return CW_EXIT_DATA;
	}
	w.prev_t = w.acc.last;
	for (k = 0; k < NDEVF_V(v); k++)
		if (sfmt_get_field(devf[k].kind, rec->f[COL_DEV + k],
		    rec->len[COL_DEV + k], devf[k].lo, devf[k].hi,
		    (char *)&w + devf[k].off) < 0) {
			cw_warn_at(rec->src, rec->line, "bad value '%.40s' in "
			    "column %s: the state is corrupt",
			    rec->f[COL_DEV + k], devf[k].name);
			wear_free(&w);
			return CW_EXIT_DATA;
		}
	if (v == 1)
		w.top.lvl_since = w.top.lvl_t;	/* the best it can know */
	why = rf_state_get_residue(&w.rf, rec->f[COL_RF(v)],
	    rec->len[COL_RF(v)]) < 0 ?
	    "rf_pts" : get_pre(&w, rec->f[COL_PRE(v)],
	    rec->len[COL_PRE(v)]) < 0 ? "pre_rows" : NULL;
	if (why != NULL) {
		cw_warn_at(rec->src, rec->line, "bad list in column %s: the "
		    "state is corrupt", why);
		wear_free(&w);
		return CW_EXIT_DATA;
	}
	if ((why = check_dev(&w, r->conf)) != NULL) {
		cw_warn_at(rec->src, rec->line, "device %s: %s: the state is "
		    "corrupt", rec->f[0], why);
		wear_free(&w);
		return CW_EXIT_DATA;
	}
	d->rows++;
	r->rows++;
	return r->dev(r->ctx, rec->src, rec->line, rec->f[0], rec->len[0],
	    &w);
}

/* An end row: ",,,TAG,end,N,check". */
static int
end_rec(struct rd *d, const struct csvin_rec *rec)
{
	unsigned long n;

	if (rec->nf != 7 || rec->len[1] != 0 || rec->len[2] != 0 ||
	    sfmt_get_ul(rec->f[5], rec->len[5], &n) < 0 || !sfmt_row_ok(rec)) {
		cw_warn_at(rec->src, rec->line, "a damaged end row: the state "
		    "is corrupt");
		return CW_EXIT_DATA;
	}
	if (d->nrec == 1)
		d->first_n = n;
	d->announced += n;
	d->ends++;
	d->r->ends++;
	return 0;
}

/* Every record: header, end or device row, told apart by what they hold. */
static int
on_rec(void *ctx, const struct csvin_rec *rec)
{
	struct rd *d = ctx;
	const struct sfmt_buf *h;
	const char *tag;
	int v;

	if (d->nrec++ == 0)
		d->first_kind = rec->nf > 0 && strcmp(rec->f[0], "device") ==
		    0 ? FIRST_HEADER : rec->nf > 0 && rec->len[0] == 0 ?
		    FIRST_END : FIRST_DEV;
	tag = rec->nf > 3 ? rec->f[3] : "";
	if ((v = tag_version(tag)) == 0) {
		if (strcmp(tag, TAG_STEM "1") == 0)
			cw_warn_at(rec->src, rec->line, "a state of format "
			    "%s, whose damage is not split by cause as this "
			    "cw-wear splits it (%s): make the state again from "
			    "the logs (cw-wear --state FILE, with --fleet for "
			    "packs in service), or read it with the cw-wear "
			    "that wrote it", tag, WSTATE_TAG);
		else if (strncmp(tag, TAG_STEM, strlen(TAG_STEM)) == 0)
			cw_warn_at(rec->src, rec->line, "a state of format "
			    "%.40s, which this cw-wear (it reads %s) does not "
			    "know: read it with the cw-wear that wrote it, or "
			    "make the state again from the logs", tag,
			    WSTATE_TAG);
		else if (rec->nf <= 3)
			cw_warn_at(rec->src, rec->line, "a row of %zu fields: "
			    "a state cut short, or not a cw-wear state",
			    rec->nf);
		else
			cw_warn_at(rec->src, rec->line, "not a cw-wear state "
			    "(no %s in column 4)", WSTATE_TAG);
		return CW_EXIT_DATA;
	}
	if (rec->nf > 4 && strcmp(rec->f[0], "device") == 0 &&
	    strcmp(rec->f[4], "model") == 0) {
		/* A header; it must be its version's, column for column. */
		h = header(v);
		if (rec->rawlen + 1 != h->n || memcmp(rec->raw, h->s,
		    rec->rawlen) != 0) {
			cw_warn_at(rec->src, rec->line, "a state header with "
			    "other columns than %s has: the state is "
			    "corrupt", tag);
			return CW_EXIT_DATA;
		}
		d->r->headers++;
		return 0;
	}
	if (rec->nf > 4 && rec->len[0] == 0 && strcmp(rec->f[4], "end") == 0)
		return end_rec(d, rec);
	return dev_row(d, rec, v);
}

static int
on_bad(void *ctx, const struct csvin_rec *rec, const char *why)
{
	(void)ctx;
	cw_warn_at(rec->src, rec->line, "%s: the state is corrupt", why);
	return CW_EXIT_DATA;
}

static int
on_blank(void *ctx, const struct csvin_rec *rec)
{
	(void)ctx;
	cw_warn_at(rec->src, rec->line, "an empty line: the state is corrupt");
	return CW_EXIT_DATA;
}

int
wstate_read(struct wstate_read *r, const char *path, int strict)
{
	static const struct csvin_ops ops = { on_rec, on_rec, on_bad,
	    on_blank };
	struct csvin *in;
	struct rd d;
	const char *name = strcmp(path, "-") == 0 ? "<stdin>" : path;
	unsigned long rep;
	int rc;

	fields();
	memset(&d, 0, sizeof(d));
	d.r = r;
	d.path = path;
	d.strict = strict;
	in = csvin_new(',', &ops, &d);
	rc = csvin_file(in, path);
	rep = csvin_stats(in)->header_repeats;
	csvin_free(in);
	if (rc != 0)
		return rc;
	/* Copies of the first record were skipped: count them as theirs. */
	if (rep > 0 && d.first_kind == FIRST_DEV) {
		cw_warn("%s: a state row comes more than once", name);
		return CW_EXIT_DATA;
	}
	if (d.first_kind == FIRST_END) {
		d.ends += rep;
		d.announced += rep * d.first_n;
		r->ends += rep;
	} else
		r->headers += rep;
	return strict ? sfmt_check_ends(name, d.ends, d.announced, d.rows) : 0;
}
