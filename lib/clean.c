/* clean.c: see clean.h. */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <strings.h>
#include <sys/stat.h>

#include "clean.h"
#include "csvin.h"
#include "devtab.h"
#include "num.h"
#include "resample.h"
#include "ts.h"

const char *const clean_reason_name[CR_NREASON] = {
	"malformed", "missing-field", "bad-number", "bad-time",
	"out-of-range", "duplicate", "out-of-order", "future", "empty"
};

struct cdev {
	struct devent e;
	struct rs_point *q;	/* pending rows, sorted by time, [qh, qn) */
	size_t qh, qn, qcap;
	cw_time max_seen;	/* latest time accepted */
	cw_time last_out;	/* latest time released */
	double soc;		/* coulomb-counted SoC */
	int soc_known;
	cw_time soc_t;
	struct rs_state rs;
	/* A row far past the device's time line, until its next row. */
	int held;
	struct rs_point hp;
	struct csvin_rec hrec;	/* src, line and raw text, for --rejects */
	char *hraw;
	size_t hrawcap;
};

struct run {
	const struct clean_conf *c;
	struct clean_stats *st;
	struct csvout *out, *rej;
	struct devtab *devs;
	struct csvin *in;
	cw_time newest;		/* latest time accepted, any device */
	char dec;		/* decimal mark of this file */
	struct cdev *last;	/* device of the previous row */
	struct colmap map;
	size_t hdr_nf;
	unsigned required;
	const char *file_dev;	/* --device @file: this file's name */
	size_t file_devlen;
	char file_devbuf[256];
	struct cdev *cur;	/* for the emit callback */
	int negative;		/* this file counts charging negative */
	int nfile;		/* files whose header was read */
	const signed char *fsign;	/* per named file: 1 negative, 0 not */
	char **files;
	int nfsign;
	/* The read-ahead of --charge-sign auto (one file). */
	int scan;
	unsigned long scan_rows, agree, disagree;
	int scan_by_v;		/* no SoC column: by voltage */
	struct devtab *scan_devs;
};

/* A device's last row in the read-ahead. */
struct scandev {
	struct devent de;
	double soc, v;
	cw_time t;
	int have;
};
#define SCAN_STOP	1000	/* a callback's "enough", not an error */

static int on_header(void *, const struct csvin_rec *);
static int on_row(void *, const struct csvin_rec *);
static int on_bad(void *, const struct csvin_rec *, const char *);
static int on_blank(void *, const struct csvin_rec *);
static int reject(struct run *, const struct csvin_rec *, int);
static void release(struct run *, struct cdev *, const struct rs_point *);
static void emit(void *, const struct rs_point *);
static void drain(struct run *, struct cdev *, cw_time);
static size_t strip_ext(const char *, size_t, const char *const *, size_t);
static size_t strip_date(const char *, size_t);
static int place(struct run *, struct cdev *, const struct rs_point *,
    const struct csvin_rec *);
static void hold(struct cdev *, const struct rs_point *,
    const struct csvin_rec *);
static void unhold(struct run *, struct cdev *, int);

void
clean_conf_default(struct clean_conf *c)
{
	memset(c, 0, sizeof(*c));
	c->delim = '\0';
	c->dec = '\0';
	c->lo[CM_VOLTAGE] = 1.5;
	c->hi[CM_VOLTAGE] = 5.0;
	c->lo[CM_CURRENT] = -1000;
	c->hi[CM_CURRENT] = 1000;
	c->lo[CM_TEMP] = -40;
	c->hi[CM_TEMP] = 100;
	c->lo[CM_SOC] = 0;
	c->hi[CM_SOC] = 100;
	/* The markers 16-bit gauge registers use for "no reading". */
	c->sentinel[0] = -32768;
	c->sentinel[1] = 65535;
	c->nsentinel = 2;
	c->reorder = 60 * CW_US_PER_S;
	c->max_gap = 15 * 60 * CW_US_PER_S;
	c->max_time = INT64_MAX;
	c->max_jump = CLEAN_MAX_JUMP;
}

static int
reject(struct run *r, const struct csvin_rec *rec, int why)
{
	struct csvout *w = r->rej;

	r->st->rejected++;
	r->st->reason[why]++;
	if (w == NULL)
		return 0;
	csvout_str(w, rec->src);
	csvout_int(w, (long long)rec->line);
	csvout_str(w, clean_reason_name[why]);
	csvout_strn(w, rec->raw, rec->rawlen);
	csvout_endrow(w);
	return 0;
}

/*
 * The base name of PATH without its known extensions (compression, then
 * log kinds, each at most once, any case) and then a date part of a daily
 * file (".YYYY-MM-DD" or ".YYYYMMDD"): "10.0.0.1.csv.gz" is device
 * "10.0.0.1", "EB-0042.2026-03-01.csv" is "EB-0042", "pack.A.log" is
 * "pack.A".
 */
static void
file_device(struct run *r, const char *path)
{
	static const char *const zext[] = { ".gz", ".bz2", ".xz", ".zst",
	    ".z" };
	static const char *const lext[] = { ".csv", ".tsv", ".txt", ".log",
	    ".dat" };
	const char *b = strrchr(path, '/');
	size_t n;

	b = b != NULL ? b + 1 : path;
	n = strlen(b);
	n = strip_ext(b, n, zext, sizeof(zext) / sizeof(zext[0]));
	n = strip_ext(b, n, lext, sizeof(lext) / sizeof(lext[0]));
	n = strip_date(b, n);
	if (n >= sizeof(r->file_devbuf))
		n = sizeof(r->file_devbuf) - 1;
	memcpy(r->file_devbuf, b, n);
	r->file_devbuf[n] = '\0';
	r->file_dev = r->file_devbuf;
	r->file_devlen = n;
}

/* N, less a date part ".YYYY-MM-DD" or ".YYYYMMDD" that B[0..N) ends with. */
static size_t
strip_date(const char *b, size_t n)
{
	static const char *const form[] = { ".dddd-dd-dd", ".dddddddd" };
	size_t k, m, j;

	for (k = 0; k < 2; k++) {
		m = strlen(form[k]);
		if (n <= m)
			continue;
		for (j = 0; j < m; j++)
			if (form[k][j] == 'd' ? (unsigned)(b[n - m + j] -
			    '0') > 9 : b[n - m + j] != form[k][j])
				break;
		if (j == m)
			return n - m;
	}
	return n;
}

/* N, less one of the extensions EXT[0..NEXT) that B[0..N) ends with. */
static size_t
strip_ext(const char *b, size_t n, const char *const *ext, size_t next)
{
	size_t k, m;

	for (k = 0; k < next; k++) {
		m = strlen(ext[k]);
		if (n > m && strncasecmp(b + n - m, ext[k], m) == 0)
			return n - m;
	}
	return n;
}

static int
on_header(void *ctx, const struct csvin_rec *h)
{
	struct run *r = ctx;

	if (colmap_resolve(&r->c->spec, h, r->required, &r->map) < 0)
		return CW_EXIT_DATA;
	r->hdr_nf = h->nf;
	r->dec = r->c->dec;
	if (r->dec == '\0' && csvin_delim(r->in) == ',')
		r->dec = '.';
	if (r->c->device_from_file)
		file_device(r, h->src);
	if (r->scan) {
		r->scan_by_v = r->map.col[CM_SOC] < 0;
		return 0;
	}
	/* This file's sign: the read-ahead's finding, found by name. */
	r->negative = r->c->charge_sign == CLEAN_SIGN_NEGATIVE;
	for (int j = r->nfile; j < r->nfsign; j++)
		if (strcmp(r->files[j], h->src) == 0) {
			r->negative = r->fsign[j];
			r->nfile = j + 1;
			break;
		}
	if (cw_verbose) {
		char buf[512];
		size_t n = 0;
		int f;

		for (f = 0; f < CM_NFIELD && n < sizeof(buf) - 1; f++) {
			int i = r->map.col[f];

			if (i < 0)
				continue;
			n += (size_t)snprintf(buf + n, sizeof(buf) - n,
			    "%s%s='%.40s'%s%s", n ? ", " : "",
			    colmap_field_name[f], h->f[i],
			    f == CM_DEVICE || f == CM_DATE ? "" : " ",
			    f == CM_DEVICE || f == CM_DATE ? "" :
			    colmap_unit_name(r->map.unit[f]));
		}
		if (csvin_delim(r->in) != ',')
			cw_warn_at(h->src, h->line, "delimiter '%s', decimal "
			    "mark %s", csvin_delim(r->in) == '\t' ? "\\t" :
			    (char[2]){ csvin_delim(r->in), '\0' },
			    r->dec == ',' ? "','" : r->dec == '.' ? "'.'" :
			    "'.' or ','");
		cw_warn_at(h->src, h->line, "columns: %s", buf);
	}
	return 0;
}

/*
 * Field F of REC as a number in canonical units; -1 empty, -2 bad, -3 a
 * sentinel (compared before conversion: -32768 mA, not -32.768 A).
 */
static int
field_num(struct run *r, const struct csvin_rec *rec, int f, double *x)
{
	int i = r->map.col[f], rc, k;
	size_t n;

	if (i < 0 || rec->len[i] == 0)
		return -1;
	n = rec->len[i];
	if (f == CM_SOC && rec->f[i][n - 1] == '%')
		n--;	/* "83.5%" */
	rc = num_parse(rec->f[i], n, r->dec, x);
	if (rc == NUM_EMPTY)
		return -1;
	if (rc != NUM_OK)
		return -2;
	for (k = 0; k < r->c->nsentinel; k++)
		if (*x == r->c->sentinel[k])
			return -3;
	switch (r->map.unit[f]) {
	case CMU_MV:
	case CMU_MA:
		*x /= 1000.0;
		break;
	case CMU_F:
		*x = (*x - 32.0) * (5.0 / 9.0);
		break;
	case CMU_K:
		*x -= 273.15;
		break;
	case CMU_DK:
		*x = *x / 10.0 - 273.15;
		break;
	case CMU_DC:
		*x /= 10.0;
		break;
	case CMU_FRAC:
		*x *= 100.0;
		break;
	}
	return 0;
}

static int
field_time(struct run *r, const struct csvin_rec *rec, cw_time *t)
{
	int i = r->map.col[CM_TIME], kind;
	const char *s = rec->f[i];
	size_t n = rec->len[i], k, digits;

	if (r->map.col[CM_DATE] >= 0 && (n < 10 || (s[4] != '-' &&
	    s[4] != '/'))) {
		/* A date column and a time of day: join them. */
		char buf[96];
		int d = r->map.col[CM_DATE];

		if (rec->len[d] + n + 2 > sizeof(buf))
			return -1;
		memcpy(buf, rec->f[d], rec->len[d]);
		buf[rec->len[d]] = 'T';
		memcpy(buf + rec->len[d] + 1, s, n);
		return ts_parse(buf, rec->len[d] + 1 + n, TS_ISO, r->c->tz_s, t);
	}
	switch (r->map.unit[CM_TIME]) {
	case CMU_ISO:
		kind = TS_ISO;
		break;
	case CMU_S:
		kind = TS_EPOCH_S;
		break;
	case CMU_MS:
		kind = TS_EPOCH_MS;
		break;
	case CMU_US:
		kind = TS_EPOCH_US;
		break;
	default:
		/* ISO by its date dashes, else epoch scaled by its size. */
		if (n >= 10 && (s[4] == '-' || s[4] == '/')) {
			kind = TS_ISO;
			break;
		}
		for (k = 0, digits = 0; k < n && s[k] != '.'; k++)
			if ((unsigned)(s[k] - '0') <= 9)
				digits++;
		kind = digits <= 11 ? TS_EPOCH_S : digits <= 14 ?
		    TS_EPOCH_MS : TS_EPOCH_US;
		break;
	}
	return ts_parse(s, n, kind, r->c->tz_s, t);
}

static int
on_row(void *ctx, const struct csvin_rec *rec)
{
	static const int fields[] = { CM_VOLTAGE, CM_CURRENT, CM_TEMP,
	    CM_SOC };
	struct run *r = ctx;
	const struct clean_conf *c = r->c;
	struct rs_point p;
	double x[CM_NFIELD];
	struct cdev *d;
	const char *name;
	size_t namelen, k;
	int i, f, rc;

	r->st->lines++;
	if (rec->nf != r->hdr_nf)
		return reject(r, rec, CR_MALFORMED);
	if (c->device != NULL || c->device_from_file) {
		name = c->device != NULL ? c->device : r->file_dev;
		namelen = c->device != NULL ? strlen(c->device) :
		    r->file_devlen;
	} else {
		i = r->map.col[CM_DEVICE];
		if (rec->len[i] == 0)
			return reject(r, rec, CR_MISSING);
		name = rec->f[i];
		namelen = rec->len[i];
	}
	if (rec->len[r->map.col[CM_TIME]] == 0)
		return reject(r, rec, CR_MISSING);
	if (field_time(r, rec, &p.t) < 0)
		return reject(r, rec, CR_BADTIME);
	for (k = 0; k < sizeof(fields) / sizeof(fields[0]); k++) {
		f = fields[k];
		rc = field_num(r, rec, f, &x[f]);
		if (rc == -2)
			return reject(r, rec, CR_BADNUM);
		if (rc == -3)
			return reject(r, rec, CR_RANGE);
		if (rc == -1) {
			if (f == CM_VOLTAGE || f == CM_CURRENT)
				return reject(r, rec, CR_MISSING);
			x[f] = CW_MISSING;
			continue;
		}
		if (f == CM_CURRENT && r->negative)
			x[f] = -x[f];
		if (x[f] < c->lo[f] || x[f] > c->hi[f])
			return reject(r, rec, CR_RANGE);
	}
	p.v = x[CM_VOLTAGE];
	p.i = x[CM_CURRENT];
	p.temp = x[CM_TEMP];
	p.soc = x[CM_SOC];

	d = r->last;
	if (d == NULL || d->e.namelen != namelen ||
	    memcmp(d->e.name, name, namelen) != 0) {
		int isnew;

		d = devtab_get(r->devs, name, namelen, &isnew);
		if (isnew) {
			d->max_seen = d->last_out = INT64_MIN;
			r->st->devices++;
		}
		r->last = d;
	}
	if (p.t > c->max_time)
		return reject(r, rec, CR_FUTURE);
	/*
	 * A held row is judged by the row after it: far behind it, the held
	 * one was a clock gone wrong; else the gap was real.
	 */
	if (d->held)
		unhold(r, d, c->max_jump > 0 && p.t < d->hp.t - c->max_jump);
	if (c->max_jump > 0) {
		cw_time ref = d->max_seen != INT64_MIN ? d->max_seen :
		    r->newest;

		if (ref == INT64_MIN || (p.t > ref &&
		    p.t - ref > c->max_jump)) {
			hold(d, &p, rec);
			return 0;
		}
	}
	return place(r, d, &p, rec);
}

/* Keep row P of D (its record REC) until D's next row or the end. */
static void
hold(struct cdev *d, const struct rs_point *p, const struct csvin_rec *rec)
{
	if (rec->rawlen + 1 > d->hrawcap) {
		d->hrawcap = rec->rawlen + 1 > 256 ? rec->rawlen + 1 : 256;
		d->hraw = cw_realloc(d->hraw, d->hrawcap);
	}
	memcpy(d->hraw, rec->raw, rec->rawlen);
	d->hraw[rec->rawlen] = '\0';
	memset(&d->hrec, 0, sizeof(d->hrec));
	d->hrec.src = rec->src;
	d->hrec.line = rec->line;
	d->hrec.raw = d->hraw;
	d->hrec.rawlen = rec->rawlen;
	d->hp = *p;
	d->held = 1;
}

/* The held row of D: rejected as future (FUTURE), or taken in. */
static void
unhold(struct run *r, struct cdev *d, int future)
{
	d->held = 0;
	if (future)
		reject(r, &d->hrec, CR_FUTURE);
	else
		place(r, d, &d->hp, &d->hrec);
}

/* Row P of D, read as REC, into D's reorder window (or rejected). */
static int
place(struct run *r, struct cdev *d, const struct rs_point *pp,
    const struct csvin_rec *rec)
{
	const struct clean_conf *c = r->c;
	struct rs_point p = *pp;
	size_t lo, hi;
	/* Too late for the window, or a time already seen. */
	if (p.t <= d->last_out)
		return reject(r, rec, p.t == d->last_out ? CR_DUPLICATE :
		    CR_ORDER);
	if (d->max_seen != INT64_MIN && p.t < d->max_seen - c->reorder)
		return reject(r, rec, CR_ORDER);
	lo = d->qh;
	hi = d->qn;
	while (lo < hi) {	/* first pending row not before p.t */
		size_t mid = lo + (hi - lo) / 2;

		if (d->q[mid].t < p.t)
			lo = mid + 1;
		else
			hi = mid;
	}
	if (lo < d->qn && d->q[lo].t == p.t)
		return reject(r, rec, CR_DUPLICATE);
	r->st->accepted++;
	if (p.t > r->newest)
		r->newest = p.t;
	if (c->reorder == 0 && d->qh == d->qn) {
		release(r, d, &p);
		d->max_seen = p.t;
		return 0;
	}
	if (d->qn == d->qcap) {
		if (d->qh > 0) {
			memmove(d->q, d->q + d->qh, (d->qn - d->qh) *
			    sizeof(*d->q));
			d->qn -= d->qh;
			lo -= d->qh;
			d->qh = 0;
		}
		if (d->qn == d->qcap) {
			d->qcap = d->qcap ? 2 * d->qcap : 16;
			d->q = cw_realloc(d->q, d->qcap * sizeof(*d->q));
		}
	}
	memmove(d->q + lo + 1, d->q + lo, (d->qn - lo) * sizeof(*d->q));
	d->q[lo] = p;
	d->qn++;
	if (p.t > d->max_seen)
		d->max_seen = p.t;
	drain(r, d, d->max_seen - c->reorder);
	return 0;
}

/* Release pending rows of D up to time UPTO. */
static void
drain(struct run *r, struct cdev *d, cw_time upto)
{
	while (d->qh < d->qn && d->q[d->qh].t <= upto) {
		struct rs_point p = d->q[d->qh++];

		release(r, d, &p);
	}
	if (d->qh == d->qn)
		d->qh = d->qn = 0;
}

/* A row leaves the reorder window, in time order. */
static void
release(struct run *r, struct cdev *d, const struct rs_point *p0)
{
	const struct clean_conf *c = r->c;
	struct rs_point p = *p0;

	if (c->soc_ah > 0) {
		if (d->soc_known) {
			cw_time dt = p.t - d->soc_t;

			if (dt > c->max_gap || !cw_isnum(p.i))
				d->soc_known = 0;
			else {
				d->soc += p.i * (double)dt / (36.0 *
				    CW_US_PER_S * c->soc_ah);
				if (d->soc > 100)
					d->soc = 100;
				if (d->soc < 0)
					d->soc = 0;
			}
		}
		/* Full: at the full voltage with the current below C/20. */
		if (p.v >= c->full_v && p.i < c->soc_ah / 20 &&
		    p.i > -c->soc_ah / 20) {
			d->soc = 100;
			d->soc_known = 1;
		}
		d->soc_t = p.t;
		p.soc = d->soc_known ? d->soc : CW_MISSING;
	}
	d->last_out = p.t;
	r->cur = d;
	if (c->step > 0)
		rs_push(&d->rs, &p, c->step, c->max_gap, emit, r);
	else
		emit(r, &p);
}

static void
emit(void *ctx, const struct rs_point *p)
{
	struct run *r = ctx;
	struct csvout *w = r->out;

	csvout_strn(w, r->cur->e.name, r->cur->e.namelen);
	csvout_time(w, p->t);
	csvout_num(w, p->v);
	csvout_num(w, p->i);
	csvout_num(w, p->temp);
	csvout_num(w, p->soc);
	csvout_endrow(w);
	r->st->written++;
}

static int
on_bad(void *ctx, const struct csvin_rec *rec, const char *why)
{
	struct run *r = ctx;

	(void)why;
	r->st->lines++;
	return reject(r, rec, CR_MALFORMED);
}

static int
on_blank(void *ctx, const struct csvin_rec *rec)
{
	struct run *r = ctx;

	r->st->lines++;
	return reject(r, rec, CR_EMPTY);
}

/*
 * A row of the read-ahead: does its current agree in sign with the change
 * of SoC (or voltage) since the device's previous row?  The current of a
 * row holds over the interval that ends at it (charge.h), so it is set
 * against the change over that interval.  Rests, rows apart by more than
 * --max-gap, and changes too small to mean anything (no SoC step; under
 * 2 mV a cell... taken as 5 mV here) give no evidence.
 */
static int
scan_row(void *ctx, const struct csvin_rec *rec)
{
	struct run *r = ctx;
	struct scandev *d;
	double i, soc = CW_MISSING, v, dx;
	cw_time t;
	const char *name;
	size_t namelen;
	int k;

	if (++r->scan_rows > CLEAN_SIGN_ROWS ||
	    r->agree + r->disagree >= CLEAN_SIGN_ENOUGH)
		return SCAN_STOP;
	if (rec->nf != r->hdr_nf || field_time(r, rec, &t) < 0 ||
	    field_num(r, rec, CM_CURRENT, &i) != 0 ||
	    field_num(r, rec, CM_VOLTAGE, &v) != 0)
		return 0;
	if (!r->scan_by_v && field_num(r, rec, CM_SOC, &soc) != 0)
		return 0;
	if (r->c->device != NULL || r->c->device_from_file) {
		name = r->c->device != NULL ? r->c->device : r->file_dev;
		namelen = strlen(name);
		if (r->c->device_from_file)
			namelen = r->file_devlen;
	} else {
		k = r->map.col[CM_DEVICE];
		name = rec->f[k];
		namelen = rec->len[k];
	}
	d = devtab_get(r->scan_devs, name, namelen, NULL);
	if (d->have && t > d->t && t - d->t <= r->c->max_gap &&
	    fabs(i) >= 0.05) {
		dx = r->scan_by_v ? v - d->v : soc - d->soc;
		if (fabs(dx) >= (r->scan_by_v ? 0.005 : 1e-9)) {
			if ((dx > 0) == (i > 0))
				r->agree++;
			else
				r->disagree++;
		}
	}
	d->have = 1;
	d->t = t;
	d->soc = soc;
	d->v = v;
	return 0;
}

static int
scan_other(void *ctx, const struct csvin_rec *rec, const char *why)
{
	(void)ctx;
	(void)rec;
	(void)why;
	return 0;
}

static int
scan_blank(void *ctx, const struct csvin_rec *rec)
{
	(void)ctx;
	(void)rec;
	return 0;
}

/*
 * --charge-sign: read each named file ahead and decide whether it counts
 * charging negative; tell what was found.  Returns the decisions, one
 * per file (1 negative), or NULL when nothing is read ahead.
 */
static signed char *
scan_signs(const struct clean_conf *c, char **files, int n, unsigned req)
{
	static const struct csvin_ops ops = { on_header, scan_row,
	    scan_other, scan_blank };
	signed char *sg;
	int k, rc, neg, decided;

	if (n == 0)
		return NULL;
	sg = cw_calloc((size_t)n, 1);
	for (k = 0; k < n; k++) {
		struct run r;
		struct stat sb;
		const char *why;
		unsigned long a, d;

		neg = c->charge_sign == CLEAN_SIGN_NEGATIVE;
		sg[k] = (signed char)neg;
		/*
		 * Only a regular file can be read twice: a pipe or FIFO
		 * (standard input, <(zcat ...)) read ahead would lose its
		 * rows to the main pass.
		 */
		if (strcmp(files[k], "-") == 0 || stat(files[k], &sb) != 0 ||
		    !S_ISREG(sb.st_mode)) {
			if (cw_verbose && c->charge_sign == CLEAN_SIGN_AUTO)
				cw_warn("%s: not a regular file, not read "
				    "ahead; charge sign taken as positive",
				    files[k]);
			continue;
		}
		memset(&r, 0, sizeof(r));
		r.c = c;
		r.scan = 1;
		r.required = req;
		r.scan_devs = devtab_new(sizeof(struct scandev));
		r.in = csvin_new(c->delim, &ops, &r);
		/* Errors are the main pass's to report; here they end it. */
		cw_quiet = 1;
		rc = csvin_file(r.in, files[k]);
		cw_quiet = 0;
		(void)rc;
		csvin_free(r.in);
		devtab_free(r.scan_devs);
		a = r.agree;
		d = r.disagree;
		why = r.scan_by_v ? "voltage" : "SoC";
		decided = 0;
		if (d >= CLEAN_SIGN_MIN && d >= CLEAN_SIGN_RATIO * a)
			decided = -1;	/* charging counted negative */
		else if (a >= CLEAN_SIGN_MIN && a >= CLEAN_SIGN_RATIO * d)
			decided = 1;
		if (c->charge_sign == CLEAN_SIGN_AUTO) {
			if (decided < 0) {
				sg[k] = 1;
				cw_warn("%s: charging current counted negative "
				    "(%lu rows' current against the change of "
				    "%s, %lu with it): turned", files[k], d, why,
				    a);
			} else if (cw_verbose)
				cw_warn("%s: charge sign %s (%lu rows' current "
				    "with the change of %s, %lu against)",
				    files[k], decided ? "positive" :
				    "undecided, taken as positive", a, why, d);
		} else if ((decided < 0 && !neg) || (decided > 0 && neg))
			cw_warn("%s: --charge-sign %s, but the data say %s "
			    "(%lu rows' current as logged with the change of "
			    "%s, %lu against): check the sign (--charge-sign "
			    "auto decides it per file)", files[k],
			    neg ? "negative" : "positive",
			    neg ? "positive" : "negative", a, why, d);
	}
	return sg;
}

int
clean_run(const struct clean_conf *c, char **files, int n,
    struct csvout *out, struct csvout *rej, struct clean_stats *st)
{
	static const struct csvin_ops ops = { on_header, on_row, on_bad,
	    on_blank };
	struct run r;
	struct csvin *in;
	size_t i;
	int rc;

	memset(st, 0, sizeof(*st));
	memset(&r, 0, sizeof(r));
	r.c = c;
	r.st = st;
	r.out = out;
	r.rej = rej;
	r.devs = devtab_new(sizeof(struct cdev));
	r.newest = INT64_MIN;
	r.required = (1u << CM_TIME) | (1u << CM_VOLTAGE) | (1u << CM_CURRENT);
	if (c->device == NULL && !c->device_from_file)
		r.required |= 1u << CM_DEVICE;
	csvout_header(out, "device,time,voltage_v,current_a,temp_c,soc_pct");
	if (rej != NULL)
		csvout_header(rej, "source,line,reason,record");
	r.negative = c->charge_sign == CLEAN_SIGN_NEGATIVE;
	r.fsign = scan_signs(c, files, n, r.required);
	r.nfsign = r.fsign ? n : 0;
	r.files = files;
	in = csvin_new(c->delim, &ops, &r);
	csvin_set_growing(in, c->growing);
	r.in = in;
	rc = csvin_files(in, files, n);
	free((void *)r.fsign);
	st->header_repeats = csvin_stats(in)->header_repeats;
	st->unended = csvin_stats(in)->unended;
	st->held = csvin_stats(in)->held;
	csvin_free(in);
	/* What is still in the windows leaves now, device by device. */
	for (i = 0; i < devtab_count(r.devs); i++) {
		struct cdev *d = devtab_at(r.devs, i);

		/* A held row with no row after it: far past the run, future. */
		if (d->held)
			unhold(&r, d, r.newest != INT64_MIN &&
			    d->hp.t > r.newest && d->hp.t - r.newest >
			    c->max_jump);
		drain(&r, d, INT64_MAX);
		if (c->step > 0) {
			r.cur = d;
			rs_flush(&d->rs, c->step, emit, &r);
		}
		free(d->q);
		free(d->hraw);
	}
	devtab_free(r.devs);
	return rc;
}
