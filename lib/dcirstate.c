/* dcirstate.c: cw-dcir device states, their text form and join. */
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "csvin.h"
#include "cw.h"
#include "dcirstate.h"
#include "statefmt.h"
#include "ts.h"

/* A setting: a double, or a time or int shown as a double. */
#define NSET	13
static const char *const setname[NSET] = {
	"min_step", "max_dt_us", "steady_n", "steady_tol", "soc_lo",
	"soc_hi", "soc_auto", "temp_lo", "temp_hi", "allow_no_soc",
	"ref_temp_c", "ea_kj", "max_points"
};
static const char *const setopt[NSET] = {
	"--min-step", "--max-dt", "--steady", "--steady-tol", "--soc",
	"--soc", "--soc", "--temp", "--temp", "--allow-no-soc",
	"--ref-temp", "--ea", "--max-points"
};

/* device, first, last, tag; settings; rows, steps, level; hist, bins,
 * points, pre; check. */
#define COL_SET		4
#define COL_N		(COL_SET + NSET)
#define COL_LIST	(COL_N + 3)
#define NCOL		(COL_LIST + 5)

static struct sfmt_buf B;

static void	settings(const struct dstate_conf *, double *);
static void	put_pts(struct sfmt_buf *, const struct dcir_pt *, size_t);
static int	get_pts(const char *, size_t, struct dcir_pt *, size_t,
		    size_t *);
static const char *check(const struct dstate_dev *,
		    const struct dstate_conf *);

int
dstate_feed(struct dstate_dev *d, const struct dcir_conf *c,
    const struct dcir_pt *s, struct dcir_counts *cnt, struct dcir_step *out)
{
	if (d->rows++ == 0)
		d->first = s->t;
	d->last = s->t;
	if (d->npre < DCIR_HIST_MAX)
		d->pre[d->npre++] = *s;
	return dcir_feed(c, &d->det, s, cnt, out);
}

unsigned long
dstate_join(struct dstate_dev *a, struct dstate_dev *b,
    const struct dstate_conf *sc)
{
	struct dcir_counts cnt;
	struct dcir_step st;
	struct dcir_dev det = a->det;
	unsigned long found = 0;
	unsigned j;

	/*
	 * B's detector judged its rows from steady_n on alone, as one pass
	 * would; the first steady_n need A's last rows.
	 */
	for (j = 0; j < b->npre; j++)
		if (dcir_feed(sc->c, &det, &b->pre[j], &cnt, &st) == 1 &&
		    j < (unsigned)sc->c->steady_n) {
			dcir_series_add(&a->ser, st.t, st.r_ref, st.soc,
			    sc->max_points);
			found++;
		}
	/* All of B's rows in PRE: the ring is A's fed with them. */
	a->det = b->rows <= b->npre ? det : b->det;
	dcir_series_join(&a->ser, &b->ser, sc->max_points);
	for (j = 0; j < b->npre && a->npre < DCIR_HIST_MAX; j++)
		a->pre[a->npre++] = b->pre[j];
	a->rows += b->rows;
	a->last = b->last;
	memset(b, 0, sizeof(*b));
	return found;
}

void
dstate_free(struct dstate_dev *d)
{
	dcir_series_free(&d->ser);
}

static void
settings(const struct dstate_conf *sc, double *v)
{
	const struct dcir_conf *c = sc->c;

	v[0] = c->min_step;
	v[1] = (double)c->max_dt;
	v[2] = c->steady_n;
	v[3] = c->steady_tol;
	v[4] = c->soc_auto ? CW_MISSING : c->soc_lo;
	v[5] = c->soc_auto ? CW_MISSING : c->soc_hi;
	v[6] = c->soc_auto;
	v[7] = c->temp_lo;
	v[8] = c->temp_hi;
	v[9] = c->unknown_soc_ok;
	v[10] = c->ref_temp_c;
	v[11] = c->ea_kj;
	v[12] = (double)sc->max_points;
}

int
dstate_write_header(FILE *fp, const struct dstate_conf *sc)
{
	int k;

	(void)sc;
	B.n = 0;
	sfmt_str(&B, "device,first,last," DSTATE_TAG);
	for (k = 0; k < NSET; k++) {
		sfmt_add(&B, ",", 1);
		sfmt_str(&B, setname[k]);
	}
	sfmt_str(&B, ",rows,steps,level,hist,bins,points,pre,check\n");
	return fwrite(B.s, 1, B.n, fp) == B.n ? 0 : -1;
}

/* Samples "t:v:i:temp:soc;...". */
static void
put_pts(struct sfmt_buf *b, const struct dcir_pt *p, size_t n)
{
	size_t k;

	for (k = 0; k < n; k++) {
		if (k > 0)
			sfmt_add(b, ";", 1);
		sfmt_i64(b, (long long)p[k].t);
		sfmt_add(b, ":", 1);
		sfmt_dbl(b, p[k].v, 1);
		sfmt_add(b, ":", 1);
		sfmt_dbl(b, p[k].i, 1);
		sfmt_add(b, ":", 1);
		sfmt_dbl(b, p[k].temp, 1);
		sfmt_add(b, ":", 1);
		sfmt_dbl(b, p[k].soc, 1);
	}
}

int
dstate_write_dev(FILE *fp, const char *name, size_t namelen,
    const struct dstate_dev *d, const struct dstate_conf *sc)
{
	struct dcir_pt ring[DCIR_HIST_MAX];
	char t[TS_FMTMAX];
	double v[NSET];
	unsigned k;
	size_t i;

	B.n = 0;
	sfmt_name(&B, name, namelen);
	sfmt_add(&B, ",", 1);
	sfmt_add(&B, t, ts_format(d->first, t));
	sfmt_add(&B, ",", 1);
	sfmt_add(&B, t, ts_format(d->last, t));
	sfmt_str(&B, "," DSTATE_TAG);
	settings(sc, v);
	for (k = 0; k < NSET; k++) {
		sfmt_add(&B, ",", 1);
		sfmt_dbl(&B, v[k], 1);
	}
	sfmt_add(&B, ",", 1);
	sfmt_ul(&B, d->rows);
	sfmt_add(&B, ",", 1);
	sfmt_ul(&B, d->ser.steps);
	sfmt_add(&B, ",", 1);
	sfmt_i64(&B, d->ser.level);
	/* The ring, oldest first. */
	for (k = 0; k < d->det.n; k++)
		ring[k] = d->det.hist[(d->det.head + DCIR_HIST_MAX - d->det.n +
		    k) % DCIR_HIST_MAX];
	sfmt_add(&B, ",", 1);
	put_pts(&B, ring, d->det.n);
	sfmt_add(&B, ",", 1);
	for (k = 0, i = 0; d->ser.bin != NULL && k <= DCIR_NBIN; k++) {
		const struct dcir_bin *bn = &d->ser.bin[k];

		if (bn->n == 0)
			continue;
		if (i++ > 0)
			sfmt_add(&B, ";", 1);
		sfmt_ul(&B, k);
		sfmt_add(&B, ":", 1);
		sfmt_ul(&B, bn->n);
		sfmt_add(&B, ":", 1);
		sfmt_i64(&B, (long long)bn->first);
		sfmt_add(&B, ":", 1);
		sfmt_i64(&B, (long long)bn->last);
	}
	sfmt_add(&B, ",", 1);
	for (i = 0; i < d->ser.n; i++) {
		if (i > 0)
			sfmt_add(&B, ";", 1);
		sfmt_i64(&B, (long long)d->ser.pt[i].t);
		sfmt_add(&B, ":", 1);
		sfmt_dbl(&B, d->ser.pt[i].r, 0);
		sfmt_add(&B, ":", 1);
		sfmt_ul(&B, (unsigned long)d->ser.pt[i].bin);
	}
	sfmt_add(&B, ",", 1);
	put_pts(&B, d->pre, d->npre);
	return sfmt_end_row(fp, &B);
}

int
dstate_write_end(FILE *fp, unsigned long rows)
{
	return sfmt_write_end(fp, &B, DSTATE_TAG, rows);
}

/* Samples "t:v:i:temp:soc;..." into P[0..MAX); *N of them. */
static int
get_pts(const char *s, size_t n, struct dcir_pt *p, size_t max, size_t *np)
{
	const char *it[DCIR_HIST_MAX + 1], *f[5];
	size_t il[DCIR_HIST_MAX + 1], fl[5];
	int k, m = sfmt_split(s, n, ';', it, il, DCIR_HIST_MAX + 1);

	if (m < 0 || (size_t)m > max)
		return -1;
	for (k = 0; k < m; k++)
		if (sfmt_split(it[k], il[k], ':', f, fl, 5) != 5 ||
		    sfmt_get_field(SFMT_TIME, f[0], fl[0], 0, 0, &p[k].t) < 0 ||
		    sfmt_get_field(SFMT_DBLN, f[1], fl[1], 0, 0, &p[k].v) < 0 ||
		    sfmt_get_field(SFMT_DBLN, f[2], fl[2], 0, 0, &p[k].i) < 0 ||
		    sfmt_get_field(SFMT_DBLN, f[3], fl[3], 0, 0,
		    &p[k].temp) < 0 ||
		    sfmt_get_field(SFMT_DBLN, f[4], fl[4], 0, 0, &p[k].soc) < 0)
			return -1;
	*np = (size_t)m;
	return 0;
}

/* What a state read back must hold; NULL, or what is wrong. */
static const char *
check(const struct dstate_dev *d, const struct dstate_conf *sc)
{
	const struct dcir_series *s = &d->ser;
	unsigned long n = 0;
	size_t i;
	int k;

	if (d->rows == 0 || d->first > d->last)
		return "no rows, or first after last";
	if (d->det.n > d->rows || d->npre > d->rows || (d->rows <
	    DCIR_HIST_MAX && (d->npre != d->rows || d->det.n != d->rows)) ||
	    (d->rows >= DCIR_HIST_MAX && (d->npre != DCIR_HIST_MAX ||
	    d->det.n != DCIR_HIST_MAX)))
		return "sample lists do not match the rows";
	for (i = 0; i < d->npre; i++)
		if (d->pre[i].t < d->first || d->pre[i].t > d->last ||
		    (i > 0 && d->pre[i].t < d->pre[i - 1].t))
			return "first samples out of order";
	if (d->npre > 0 && d->pre[0].t != d->first)
		return "first samples do not start at the first row";
	/* The last samples: rows of the state, in order (oldest first). */
	for (i = 0; i < d->det.n; i++)
		if (d->det.hist[i].t < d->first || d->det.hist[i].t > d->last ||
		    (i > 0 && d->det.hist[i].t < d->det.hist[i - 1].t))
			return "last samples out of order";
	if (s->steps > d->rows)
		return "more steps than rows";
	if (d->det.n > 0 && d->det.hist[(d->det.head + DCIR_HIST_MAX - 1) %
	    DCIR_HIST_MAX].t != d->last)
		return "last samples do not end at the last row";
	/*
	 * More points than the cap only at DCIR_LEVEL_TIME, where versions
	 * before the merging of SoC bins stopped (one point per bin);
	 * dstate_read() thins them on.
	 */
	if (s->level < 0 || s->level > DCIR_LEVEL_MAX || (s->n >
	    sc->max_points && s->level != DCIR_LEVEL_TIME) || s->n > s->steps)
		return "trend points inconsistent";
	for (k = 0; s->bin != NULL && k <= DCIR_NBIN; k++) {
		if (s->bin[k].n > 0 && (s->bin[k].first > s->bin[k].last ||
		    s->bin[k].first < s->first || s->bin[k].last > s->last))
			return "step bins inconsistent";
		n += s->bin[k].n;
	}
	if (n != s->steps || (s->steps > 0 && (s->first < d->first ||
	    s->last > d->last)))
		return "step bins do not add up";
	for (i = 0; i < s->n; i++)
		if (s->pt[i].t < s->first || s->pt[i].t > s->last ||
		    (i > 0 && s->pt[i].t < s->pt[i - 1].t) ||
		    s->bin[s->pt[i].bin].n == 0)
			return "trend points out of order";
	return NULL;
}

/* What one read of a file keeps. */
struct rd {
	struct dstate_read *r;
	unsigned long nrec, rows, announced, ends, first_n;
	int first_kind;		/* 0 device row, 1 header, 2 end row */
};

static int
bad_row(const struct csvin_rec *rec, const char *why)
{
	cw_warn_at(rec->src, rec->line, "%s: the state is corrupt", why);
	return CW_EXIT_DATA;
}

static int
dev_row(struct rd *d, const struct csvin_rec *rec)
{
	struct dstate_dev w;
	struct dcir_series *s = &w.ser;
	double v[NSET], x;
	const char *it[DCIR_NBIN + 2], *f[4], *why;
	size_t il[DCIR_NBIN + 2], fl[4], n;
	unsigned long u[4];
	long long lv;
	const char *p, *e, *q;
	int k, m, rc;

	if (rec->nf != NCOL) {
		cw_warn_at(rec->src, rec->line, "a state row of %zu fields, "
		    "not %d: the state is cut short or corrupt", rec->nf,
		    NCOL);
		return CW_EXIT_DATA;
	}
	if (!sfmt_row_ok(rec))
		return bad_row(rec, "the check field does not match the row");
	if (rec->len[0] == 0)
		return bad_row(rec, "a state row without a device");
	settings(d->r->sc, v);
	for (k = 0; k < NSET; k++) {
		if (sfmt_get_field(SFMT_DBLN, rec->f[COL_SET + k],
		    rec->len[COL_SET + k], 0, 0, &x) < 0)
			return bad_row(rec, "a bad setting");
		if (!sfmt_same(SFMT_DBL, &x, &v[k])) {
			cw_warn_at(rec->src, rec->line, "the state was made "
			    "with another %s (%s %s, this run %.15g): give "
			    "the same options to every run of one state",
			    setopt[k], setname[k], rec->f[COL_SET + k], v[k]);
			return CW_EXIT_DATA;
		}
	}
	memset(&w, 0, sizeof(w));
	if (ts_parse(rec->f[1], rec->len[1], TS_ISO, 0, &w.first) < 0 ||
	    ts_parse(rec->f[2], rec->len[2], TS_ISO, 0, &w.last) < 0 ||
	    sfmt_get_ul(rec->f[COL_N], rec->len[COL_N], &w.rows) < 0 ||
	    sfmt_get_ul(rec->f[COL_N + 1], rec->len[COL_N + 1],
	    &s->steps) < 0 ||
	    sfmt_get_i64(rec->f[COL_N + 2], rec->len[COL_N + 2], &lv) < 0 ||
	    lv < 0 || lv > DCIR_LEVEL_MAX)
		return bad_row(rec, "a bad count or time");
	s->level = (int)lv;
	if (get_pts(rec->f[COL_LIST], rec->len[COL_LIST], w.det.hist,
	    DCIR_HIST_MAX, &n) < 0)
		return bad_row(rec, "a bad list in column hist");
	w.det.n = (unsigned)n;
	w.det.head = (unsigned)(n % DCIR_HIST_MAX);
	if (get_pts(rec->f[COL_LIST + 3], rec->len[COL_LIST + 3], w.pre,
	    DCIR_HIST_MAX, &n) < 0)
		return bad_row(rec, "a bad list in column pre");
	w.npre = (unsigned)n;
	m = sfmt_split(rec->f[COL_LIST + 1], rec->len[COL_LIST + 1], ';', it,
	    il, DCIR_NBIN + 1);
	if (m < 0)
		return bad_row(rec, "a bad list in column bins");
	s->bin = cw_calloc(DCIR_NBIN + 1, sizeof(*s->bin));
	for (k = 0; k < m; k++) {
		struct dcir_bin *bn;

		if (sfmt_split(it[k], il[k], ':', f, fl, 4) != 4 ||
		    sfmt_get_ul(f[0], fl[0], &u[0]) < 0 || u[0] > DCIR_NBIN ||
		    sfmt_get_ul(f[1], fl[1], &u[1]) < 0 || u[1] == 0 ||
		    s->bin[u[0]].n != 0) {
			dstate_free(&w);
			return bad_row(rec, "a bad list in column bins");
		}
		bn = &s->bin[u[0]];
		bn->n = u[1];
		if (sfmt_get_field(SFMT_TIME, f[2], fl[2], 0, 0,
		    &bn->first) < 0 || sfmt_get_field(SFMT_TIME, f[3], fl[3],
		    0, 0, &bn->last) < 0) {
			dstate_free(&w);
			return bad_row(rec, "a bad list in column bins");
		}
		if (k == 0) {
			s->first = bn->first;
			s->last = bn->last;
		}
		if (bn->first < s->first)
			s->first = bn->first;
		if (bn->last > s->last)
			s->last = bn->last;
	}
	/* Points "t:r:bin;..." */
	p = rec->f[COL_LIST + 2];
	e = p + rec->len[COL_LIST + 2];
	while (p < e) {
		q = memchr(p, ';', (size_t)(e - p));
		if (q == NULL)
			q = e;
		if (s->n > d->r->sc->max_points + DCIR_NBIN ||
		    sfmt_split(p, (size_t)(q - p), ':', f, fl, 3) != 3) {
			dstate_free(&w);
			return bad_row(rec, "a bad list in column points");
		}
		if (s->n == s->cap) {
			s->cap = s->cap ? 2 * s->cap : 16;
			s->pt = cw_realloc(s->pt, s->cap * sizeof(*s->pt));
		}
		if (sfmt_get_field(SFMT_TIME, f[0], fl[0], 0, 0,
		    &s->pt[s->n].t) < 0 || sfmt_get_field(SFMT_DBL, f[1],
		    fl[1], 0, 0, &s->pt[s->n].r) < 0 || sfmt_get_field(
		    SFMT_INT, f[2], fl[2], 0, DCIR_NBIN, &s->pt[s->n].bin) < 0) {
			dstate_free(&w);
			return bad_row(rec, "a bad list in column points");
		}
		s->n++;
		p = q + 1;
	}
	if (s->steps == 0) {
		free(s->bin);
		s->bin = NULL;
	}
	if ((why = check(&w, d->r->sc)) != NULL) {
		cw_warn_at(rec->src, rec->line, "device %s: %s: the state is "
		    "corrupt", rec->f[0], why);
		dstate_free(&w);
		return CW_EXIT_DATA;
	}
	dcir_series_cap(&w.ser, d->r->sc->max_points);
	d->rows++;
	d->r->rows++;
	rc = d->r->dev(d->r->ctx, rec->src, rec->line, rec->f[0],
	    rec->len[0], &w);
	return rc;
}

static int
on_rec(void *ctx, const struct csvin_rec *rec)
{
	struct rd *d = ctx;
	unsigned long n;
	const char *tag = rec->nf > 3 ? rec->f[3] : "";

	if (d->nrec++ == 0)
		d->first_kind = rec->nf > 0 && strcmp(rec->f[0], "device") ==
		    0 ? 1 : rec->nf > 0 && rec->len[0] == 0 ? 2 : 0;
	if (strcmp(tag, DSTATE_TAG) != 0) {
		if (strncmp(tag, "cw-dcir-state-", 14) == 0)
			cw_warn_at(rec->src, rec->line, "a state of format "
			    "%.40s, which this cw-dcir (it reads %s) does not "
			    "know: read it with the cw-dcir that wrote it, or "
			    "make the state again from the logs (cw-dcir "
			    "--state FILE over them)", tag, DSTATE_TAG);
		else
			cw_warn_at(rec->src, rec->line, "not a cw-dcir state "
			    "(no %s in column 4)", DSTATE_TAG);
		return CW_EXIT_DATA;
	}
	if (strcmp(rec->f[0], "device") == 0) {
		if (rec->nf != NCOL || rec->len[NCOL - 1] != 5)
			return bad_row(rec, "a state header of other columns");
		d->r->headers++;
		return 0;
	}
	if (rec->len[0] == 0 && rec->nf > 4 && strcmp(rec->f[4], "end") ==
	    0) {
		if (rec->nf != 7 || sfmt_get_ul(rec->f[5], rec->len[5],
		    &n) < 0 || !sfmt_row_ok(rec))
			return bad_row(rec, "a damaged end row");
		if (d->nrec == 1)
			d->first_n = n;
		d->announced += n;
		d->ends++;
		d->r->ends++;
		return 0;
	}
	return dev_row(d, rec);
}

static int
on_bad(void *ctx, const struct csvin_rec *rec, const char *why)
{
	(void)ctx;
	return bad_row(rec, why);
}

static int
on_blank(void *ctx, const struct csvin_rec *rec)
{
	(void)ctx;
	return bad_row(rec, "an empty line");
}

int
dstate_read(struct dstate_read *r, const char *path, int strict)
{
	static const struct csvin_ops ops = { on_rec, on_rec, on_bad,
	    on_blank };
	struct csvin *in;
	struct rd d;
	const char *name = strcmp(path, "-") == 0 ? "<stdin>" : path;
	unsigned long rep;
	int rc;

	memset(&d, 0, sizeof(d));
	d.r = r;
	in = csvin_new(',', &ops, &d);
	rc = csvin_file(in, path);
	rep = csvin_stats(in)->header_repeats;
	csvin_free(in);
	if (rc != 0)
		return rc;
	if (rep > 0 && d.first_kind == 0) {
		cw_warn("%s: a state row comes more than once", name);
		return CW_EXIT_DATA;
	}
	if (d.first_kind == 2) {
		d.ends += rep;
		d.announced += rep * d.first_n;
	}
	return strict ? sfmt_check_ends(name, d.ends, d.announced, d.rows) : 0;
}
