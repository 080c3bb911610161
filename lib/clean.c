/* clean.c: see clean.h. */
#include <math.h>
#include <stdint.h>
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
#include "sampin.h"
#include "ts.h"

const char *const clean_reason_name[CR_NREASON] = {
	"malformed", "missing-field", "bad-number", "bad-time",
	"out-of-range", "duplicate", "out-of-order", "future", "empty"
};

/*
 * A device's state, laid out for a stream that cycles through thousands
 * of devices (every row a cache miss): the fields every row reads come
 * first, next to the devent (whose line also holds a short name, see
 * devtab.c), then the resampler's, then those only --soc-from-charge
 * uses.  A row touches these, the reorder window's last pending row (a
 * row in order goes after it, no search) and its first (the one
 * released), which are in the entry too while the window holds at most
 * CLEAN_QINLINE rows (6 at 10 s with the default 60 s window).
 */
#define CLEAN_QINLINE	8

struct cdev {
	struct devent e;
	cw_time max_seen;	/* latest time accepted */
	cw_time last_out;	/* latest time released */
	struct rs_point *q;	/* pending rows, sorted by time, [qh, qn) */
	uint32_t qh, qn, qcap;
	struct rs_state rs;
	/*
	 * --keep: the values of the pending rows, beside q (a slot of
	 * kstride bytes each), and of the last two rows released, by the
	 * parity of their key (the count of rows released): a grid point
	 * takes the row it closes or the one before (resample.h).
	 */
	char *qk;
	char *kv;
	unsigned long nrel;
	/* The window's first CLEAN_QINLINE rows live here, in the entry
	 * (fetched with it), more on the heap. */
	struct rs_point qin[CLEAN_QINLINE];
	double soc;		/* coulomb-counted SoC */
	cw_time soc_t;
	int soc_known;
	/* A row far past the device's time line, until its next row. */
	int held;
	struct rs_point hp;
	struct csvin_rec hrec;	/* src, line and raw text, for --rejects */
	char *hraw;
	size_t hrawcap;
	char *hk;		/* its --keep values (kstride bytes) */
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
	/*
	 * Unit plausibility of this file (units_add(), units_check()): the
	 * first CLEAN_UNIT_ROWS values of each, in one block of UCAP values
	 * each (uv), made by the first value and grown to CLEAN_UNIT_ROWS,
	 * kept for the run's files.
	 */
	int ucap;
	double *uv;		/* voltage, V as assumed */
	double *ui;		/* |current|, A as assumed */
	double *uiv;		/* its pack voltage */
	double *ut;		/* temperature, C as assumed */
	struct {
		int nv, ni, nt, nint;	/* nint: whole-number currents */
		int done;
		char src[256];
		char hdr[CM_NFIELD][64];	/* the columns' headers */
		int unit[CM_NFIELD];		/* and their units */
		int has_temp;
	} u;
	/* --keep: this file's columns, the slot size, this row's values. */
	int keepcol[CLEAN_KEEP_MAX];
	size_t kstride;
	char *krow;
	char *ktmp;		/* krow kept while a held row goes in */
};

/* A device's last row in the read-ahead. */
struct scandev {
	struct devent de;
	double soc, v;
	cw_time t;
	int have;
	double vref;		/* voltage since which the change counts */
	int iref;		/* the sign of the current since then */
};
#define SCAN_STOP	1000	/* a callback's "enough", not an error */

static int on_header(void *, const struct csvin_rec *);
static int on_row(void *, const struct csvin_rec *);
static int on_bad(void *, const struct csvin_rec *, const char *);
static int on_blank(void *, const struct csvin_rec *);
static int reject(struct run *, const struct csvin_rec *, int);
static void release(struct run *, struct cdev *, const struct rs_point *,
    const char *);
static int keep_header(struct run *, const struct csvin_rec *);
static void units_add(struct run *, int, double);
static void units_check(struct run *);
static int cmp_dbl(const void *, const void *);
static double pct(double *, int, double);
static void keep_row(struct run *, const struct csvin_rec *);
static void emit(void *, const struct rs_point *);
static void drain(struct run *, struct cdev *, cw_time);
static void guess_next(const struct cdev *);
static size_t strip_ext(const char *, size_t, const char *const *, size_t);
static size_t strip_date(const char *, size_t);
static int place(struct run *, struct cdev *, const struct rs_point *,
    const struct csvin_rec *);
static void hold(struct run *, struct cdev *, const struct rs_point *,
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

int
clean_keep_parse(struct clean_conf *c, const char *list, const char **err)
{
	static char buf[1024];
	char *p, *next;
	int j, k;

	c->nkeep = 0;
	if (strlen(list) >= sizeof(buf)) {
		*err = "list too long";
		return -1;
	}
	strcpy(buf, list);
	for (p = buf; p != NULL; p = next) {
		next = strchr(p, ',');
		if (next != NULL)
			*next++ = '\0';
		if (*p == '\0') {
			*err = "empty column name";
			return -1;
		}
		for (k = 0; k < SAMP_EXTRA; k++)
			if (strcmp(p, sampin_colname[k]) == 0) {
				*err = "a column of the sample stream already";
				return -1;
			}
		for (j = 0; j < c->nkeep; j++)
			if (strcmp(p, c->keep[j]) == 0) {
				*err = "a column named twice";
				return -1;
			}
		if (c->nkeep == CLEAN_KEEP_MAX) {
			*err = "at most 8 columns";
			return -1;
		}
		c->keep[c->nkeep++] = p;
	}
	return 0;
}

/*
 * The --keep columns in header H: by exact name, else ignoring case (as
 * -c finds its headers).  A missing one is an error: a mistyped name
 * would otherwise give a column of nothing.
 */
static int
keep_header(struct run *r, const struct csvin_rec *h)
{
	int j;
	size_t i;

	for (j = 0; j < r->c->nkeep; j++) {
		int col = csvin_find(h, r->c->keep[j]);

		for (i = 0; col < 0 && i < h->nf; i++)
			if (strcasecmp(h->f[i], r->c->keep[j]) == 0)
				col = (int)i;
		if (col < 0) {
			char seen[512] = "";

			for (i = 0; i < h->nf && strlen(seen) < 400; i++) {
				if (i > 0)
					strcat(seen, ", ");
				strncat(seen, h->f[i], 60);
			}
			cw_warn_at(h->src, h->line, "no column '%s' for --keep; "
			    "headers seen: %s", r->c->keep[j], seen);
			return CW_EXIT_DATA;
		}
		r->keepcol[j] = col;
	}
	return 0;
}

/*
 * This row's --keep values into r->krow, as read; a value too long for
 * its slot is cut at a character boundary, the first one told.
 */
static void
keep_row(struct run *r, const struct csvin_rec *rec)
{
	int j;

	for (j = 0; j < r->c->nkeep; j++) {
		unsigned char *slot = (unsigned char *)r->krow +
		    (size_t)j * CLEAN_KEEP_LEN;
		size_t n = rec->len[r->keepcol[j]];

		if (n > CLEAN_KEEP_LEN - 1) {
			n = CLEAN_KEEP_LEN - 1;
			/* Not inside a UTF-8 sequence. */
			while (n > 0 && ((unsigned char)rec->f[r->keepcol[j]][n]
			    & 0xC0) == 0x80)
				n--;
			if (r->st->keep_cut++ == 0)
				cw_warn_at(rec->src, rec->line, "--keep %s: value "
				    "longer than %d bytes cut (further ones only "
				    "counted)", r->c->keep[j], CLEAN_KEEP_LEN - 1);
		}
		slot[0] = (unsigned char)n;
		memcpy(slot + 1, rec->f[r->keepcol[j]], n);
	}
}

static int
cmp_dbl(const void *a, const void *b)
{
	double x = *(const double *)a, y = *(const double *)b;

	return x < y ? -1 : x > y;
}

/* Percentile P (0..1) of the N values of V, sorted here. */
static double
pct(double *v, int n, double p)
{
	qsort(v, (size_t)n, sizeof(*v), cmp_dbl);
	return v[(int)(p * (n - 1) + 0.5)];
}

/* A value of field F of this row, in the unit assumed, for the check. */
static void
units_add(struct run *r, int f, double x)
{
	int most = r->u.nv > r->u.ni ? r->u.nv : r->u.ni;

	if (r->u.nt > most)
		most = r->u.nt;
	if (most >= r->ucap && r->ucap < CLEAN_UNIT_ROWS) {
		/* Room for the next value of each: the block doubles. */
		int cap = r->ucap > 0 ? 2 * r->ucap : 64;
		double *b;

		if (cap > CLEAN_UNIT_ROWS)
			cap = CLEAN_UNIT_ROWS;
		b = cw_malloc(4 * (size_t)cap * sizeof(*b));
		if (r->uv != NULL) {
			memcpy(b, r->uv, (size_t)r->u.nv * sizeof(*b));
			memcpy(b + cap, r->ui, (size_t)r->u.ni * sizeof(*b));
			memcpy(b + 2 * cap, r->uiv, (size_t)r->u.ni *
			    sizeof(*b));
			memcpy(b + 3 * cap, r->ut, (size_t)r->u.nt * sizeof(*b));
			free(r->uv);
		}
		r->uv = b;
		r->ui = b + cap;
		r->uiv = b + 2 * cap;
		r->ut = b + 3 * cap;
		r->ucap = cap;
	}
	switch (f) {
	case CM_VOLTAGE:
		if (r->u.nv < CLEAN_UNIT_ROWS)
			r->uv[r->u.nv++] = x;
		break;
	case CM_CURRENT:
		/* Rests say nothing of the unit. */
		if (r->u.ni < CLEAN_UNIT_ROWS && x != 0 && r->u.nv > 0) {
			r->uiv[r->u.ni] = r->uv[r->u.nv - 1];
			r->ui[r->u.ni++] = fabs(x);
			r->u.nint += x == floor(x);
		}
		break;
	case CM_TEMP:
		if (r->u.nt < CLEAN_UNIT_ROWS)
			r->ut[r->u.nt++] = x;
		break;
	}
	if (r->u.nv == CLEAN_UNIT_ROWS && r->u.ni == CLEAN_UNIT_ROWS &&
	    (r->u.nt == CLEAN_UNIT_ROWS || !r->u.has_temp))
		units_check(r);
}

/*
 * Tell when this file's values only make sense in another unit.  The
 * thresholds (common practice, no source): a lithium-ion cell lies
 * between 2.5 and 4.25 V, so a median above the voltage bound is a pack
 * (whatever the unit) or, in volts as assumed, millivolts; a pack's current in amperes is rarely above 25 A per
 * volt of the pack (an e-bike's 40 V, 20 A is 0.5; milliamperes of the
 * same pack are 50 and more), nor, written in whole numbers of a median
 * of 100 and more, above 1.5 (a gauge's own 100..250 mA of standby at
 * 40 V are 2.5..6 as amperes); a pack's median temperature over the
 * first rows is below 50 C, and 50..150 read as Celsius is Fahrenheit,
 * 230..370 kelvin (or 0.1 C), 1500..4000 tenths of a kelvin.
 */
static void
units_check(struct run *r)
{
	const struct clean_conf *c = r->c;
	double med, lo, hi, vmed = 0, vscale = 1;
	int k;

	if (r->u.done || r->u.src[0] == '\0')
		return;
	r->u.done = 1;
	if (r->u.nv >= CLEAN_UNIT_MIN) {
		lo = pct(r->uv, r->u.nv, 0.01);
		hi = pct(r->uv, r->u.nv, 0.99);
		vmed = med = pct(r->uv, r->u.nv, 0.5);
		if (med > c->hi[CM_VOLTAGE] && med >= 1000 &&
		    r->u.unit[CM_VOLTAGE] == CMU_V) {
			vscale = 1000;
			if (med <= 5000)
				cw_warn("%s: voltage '%s' looks like millivolts "
				    "(median %.6g over %d rows): give -c "
				    "'voltage=%s:mV'", r->u.src,
				    r->u.hdr[CM_VOLTAGE], med, r->u.nv,
				    r->u.hdr[CM_VOLTAGE]);
		}
		if (med > c->hi[CM_VOLTAGE] && med / vscale > 5.0) {
			/* Counts kept within int: a value of 1e300 V is no
			 * pack, but must not overflow the conversion. */
			double c1 = fmin(fmax(ceil(hi / vscale / 4.25), -1e9),
			    1e9);
			double c2 = fmin(fmax(floor(lo / vscale / 2.5), -1e9),
			    1e9);
			int n1 = (int)c1, n2 = (int)c2;
			char cells[48], fix[128];

			if (n2 > n1)
				snprintf(cells, sizeof(cells), "%d to %d", n1,
				    n2);
			else
				snprintf(cells, sizeof(cells), "%d", n1);
			if (vscale > 1)
				snprintf(fix, sizeof(fix), "-c 'voltage=%s:mV' "
				    "and ", r->u.hdr[CM_VOLTAGE]);
			else
				fix[0] = '\0';
			cw_warn("%s: voltage '%s' looks like %sa pack of %s "
			    "cells in series (median %.6g, 1st to 99th "
			    "percentile %.6g to %.6g over %d rows; a cell 2.5 "
			    "to 4.25 V): give %s--cells N", r->u.src,
			    r->u.hdr[CM_VOLTAGE], vscale > 1 ? "millivolts of " :
			    "", cells, med, lo, hi, r->u.nv, fix);
		}
	}
	if (r->u.ni >= CLEAN_UNIT_MIN && r->u.unit[CM_CURRENT] == CMU_A &&
	    vmed > 0) {
		double per_v, p90;

		for (k = 0; k < r->u.ni; k++)
			r->uiv[k] = r->ui[k] / (fabs(r->uiv[k]) / vscale +
			    1e-9);
		per_v = pct(r->uiv, r->u.ni, 0.5);
		p90 = pct(r->ui, r->u.ni, 0.9);
		med = pct(r->ui, r->u.ni, 0.5);
		if (per_v > 25 || (r->u.nint >= 0.95 * r->u.ni && med >= 100 &&
		    per_v > 1.5))
			cw_warn("%s: current '%s' looks like milliamperes "
			    "(median |I| %.6g, 90th percentile %.6g over %d "
			    "rows, %.3g A per volt of the pack as amperes): "
			    "give -c 'current=%s:mA'", r->u.src,
			    r->u.hdr[CM_CURRENT], med, p90, r->u.ni, per_v,
			    r->u.hdr[CM_CURRENT]);
	}
	if (r->u.nt >= CLEAN_UNIT_MIN && r->u.unit[CM_TEMP] == CMU_C) {
		const char *what = NULL, *unit = NULL;

		med = pct(r->ut, r->u.nt, 0.5);
		if (med >= 1500 && med <= 4000) {
			what = "tenths of a kelvin";
			unit = "dK";
		} else if (med >= 230 && med <= 370) {
			what = "kelvin (or tenths of a degree C: dC)";
			unit = "K";
		} else if (med > 150 && med < 700) {
			what = "tenths of a degree C";
			unit = "dC";
		} else if (med > 50 && med <= 150) {
			what = "degrees Fahrenheit";
			unit = "F";
		}
		if (what != NULL)
			cw_warn("%s: temperature '%s' looks like %s (median "
			    "%.6g over %d rows, implausible for a pack in "
			    "degrees C): give -c 'temp=%s:%s'", r->u.src,
			    r->u.hdr[CM_TEMP], what, med, r->u.nt,
			    r->u.hdr[CM_TEMP], unit);
	}
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
	if (keep_header(r, h) != 0)
		return CW_EXIT_DATA;
	/* The file before was judged on what it had; now this one. */
	units_check(r);
	memset(&r->u, 0, sizeof(r->u));
	snprintf(r->u.src, sizeof(r->u.src), "%s", h->src);
	{
		int f;

		for (f = 0; f < CM_NFIELD; f++) {
			if (r->map.col[f] >= 0)
				snprintf(r->u.hdr[f], sizeof(r->u.hdr[f]),
				    "%s", h->f[r->map.col[f]]);
			r->u.unit[f] = r->map.unit[f];
		}
		r->u.has_temp = r->map.col[CM_TEMP] >= 0;
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
	/* The first rows' values for the unit check, in range or not. */
	for (k = 0; !r->u.done && k < sizeof(fields) / sizeof(fields[0]); k++)
		if (field_num(r, rec, fields[k], &x[fields[k]]) == 0)
			units_add(r, fields[k], x[fields[k]]);
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
	p.key = 0;
	if (c->nkeep > 0)
		keep_row(r, rec);

	{
		int isnew;

		/*
		 * devtab_get() tries the device of the row before and its
		 * follower before it hashes the name.
		 */
		d = devtab_get(r->devs, name, namelen, &isnew);
		if (isnew) {
			d->max_seen = d->last_out = INT64_MIN;
			r->st->devices++;
			if (c->nkeep > 0)
				d->kv = cw_calloc(2, r->kstride);
		}
		if (d != r->last) {
			r->last = d;
			guess_next(d);
		}
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
			hold(r, d, &p, rec);
			return 0;
		}
	}
	return place(r, d, &p, rec);
}

/* Keep row P of D (its record REC) until D's next row or the end. */
static void
hold(struct run *r, struct cdev *d, const struct rs_point *p,
    const struct csvin_rec *rec)
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
	if (r->kstride > 0) {
		if (d->hk == NULL)
			d->hk = cw_malloc(r->kstride);
		memcpy(d->hk, r->krow, r->kstride);
	}
}

/* The held row of D: rejected as future (FUTURE), or taken in. */
static void
unhold(struct run *r, struct cdev *d, int future)
{
	d->held = 0;
	if (future) {
		reject(r, &d->hrec, CR_FUTURE);
		return;
	}
	/* The held row goes in with its own --keep values. */
	if (r->kstride > 0) {
		memcpy(r->ktmp, r->krow, r->kstride);
		memcpy(r->krow, d->hk, r->kstride);
	}
	place(r, d, &d->hp, &d->hrec);
	if (r->kstride > 0)
		memcpy(r->krow, r->ktmp, r->kstride);
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
	if (lo == hi || d->q[hi - 1].t < p.t)
		lo = hi;	/* in order: after the last pending row */
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
		release(r, d, &p, r->krow);
		d->max_seen = p.t;
		return 0;
	}
	if (d->qn == d->qcap) {
		if (d->qh > 0) {
			memmove(d->q, d->q + d->qh, (d->qn - d->qh) *
			    sizeof(*d->q));
			if (r->kstride > 0)
				memmove(d->qk, d->qk + d->qh * r->kstride,
				    (d->qn - d->qh) * r->kstride);
			d->qn -= d->qh;
			lo -= d->qh;
			d->qh = 0;
		}
		if (d->qn == d->qcap) {
			if (d->qcap >= UINT32_MAX / 2)
				cw_die(CW_EXIT_DATA, "%s: reorder window of "
				    "more than %lu rows", d->e.name,
				    (unsigned long)d->qcap);
			if (d->qcap == 0) {
				d->q = d->qin;
				d->qcap = CLEAN_QINLINE;
			} else if (d->q == d->qin) {
				d->q = cw_malloc(2 * d->qcap * sizeof(*d->q));
				memcpy(d->q, d->qin, d->qn * sizeof(*d->q));
				d->qcap *= 2;
			} else {
				d->qcap *= 2;
				d->q = cw_realloc(d->q, d->qcap *
				    sizeof(*d->q));
			}
			if (r->kstride > 0)
				d->qk = cw_realloc(d->qk, (size_t)d->qcap *
				    r->kstride);
		}
	}
	memmove(d->q + lo + 1, d->q + lo, (d->qn - lo) * sizeof(*d->q));
	d->q[lo] = p;
	if (r->kstride > 0) {
		memmove(d->qk + (lo + 1) * r->kstride, d->qk + lo * r->kstride,
		    (d->qn - lo) * r->kstride);
		memcpy(d->qk + lo * r->kstride, r->krow, r->kstride);
	}
	d->qn++;
	if (p.t > d->max_seen)
		d->max_seen = p.t;
	drain(r, d, d->max_seen - c->reorder);
	return 0;
}

/*
 * Logs of many devices merged by time repeat the devices in much the same
 * order, and each row's state is a cache miss at thousands of devices.
 * The device that followed D last time is likely to come next: its name
 * is tried before the hash (devtab_get()), and the memory the next two rows
 * are likely to touch is fetched now, while this row is worked on: the
 * state of the one after next (its entry, name included) and the reorder
 * window ends of the next, whose state a previous row fetched.  A wrong
 * guess costs a few loads, never a wrong answer.
 */
static void
guess_next(const struct cdev *d)
{
	const struct cdev *n = (const struct cdev *)d->e.next;

	if (n == NULL)
		return;
	if (n->q != n->qin && n->qn > n->qh) {
		DEVTAB_PREFETCH(n->q + n->qh);
		DEVTAB_PREFETCH(n->q + n->qn - 1);
	}
	if (n->e.next != NULL)
		devtab_prefetch(n->e.next, (int)((DEVTAB_INLINE +
		    sizeof(struct cdev) + DEVTAB_LINE - 1) / DEVTAB_LINE));
}

/* Release pending rows of D up to time UPTO. */
static void
drain(struct run *r, struct cdev *d, cw_time upto)
{
	while (d->qh < d->qn && d->q[d->qh].t <= upto) {
		struct rs_point p = d->q[d->qh];

		release(r, d, &p, r->kstride > 0 ? d->qk + d->qh * r->kstride :
		    NULL);
		d->qh++;
	}
	if (d->qh == d->qn)
		d->qh = d->qn = 0;
}

/* A row leaves the reorder window, in time order. */
static void
release(struct run *r, struct cdev *d, const struct rs_point *p0,
    const char *kv)
{
	const struct clean_conf *c = r->c;
	struct rs_point p = *p0;

	p.key = ++d->nrel;
	if (r->kstride > 0)
		memcpy(d->kv + (p.key & 1) * r->kstride, kv, r->kstride);

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
	if (r->kstride > 0) {
		const char *kv = r->cur->kv + (p->key & 1) * r->kstride;
		int j;

		for (j = 0; j < r->c->nkeep; j++, kv += CLEAN_KEEP_LEN)
			csvout_strn(w, kv + 1, (unsigned char)kv[0]);
	}
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
	/*
	 * The voltage's change counts from a reference that stays while the
	 * current keeps its sign, so that a slow rise of 1 mV a row adds up
	 * to the 5 mV that decide (the slack: 3.605 - 3.600 is less than
	 * 0.005 in binary).
	 */
	if (r->scan_by_v && (!d->have || t <= d->t ||
	    t - d->t > r->c->max_gap || fabs(i) < 0.05 ||
	    (i > 0) != (d->iref > 0))) {
		d->vref = d->have && t > d->t && t - d->t <= r->c->max_gap &&
		    fabs(i) >= 0.05 ? d->v : v;
		d->iref = i > 0 ? 1 : -1;
	}
	if (d->have && t > d->t && t - d->t <= r->c->max_gap &&
	    fabs(i) >= 0.05) {
		dx = r->scan_by_v ? v - d->vref : soc - d->soc;
		if (fabs(dx) >= (r->scan_by_v ? 0.005 - 1e-9 : 1e-9)) {
			if ((dx > 0) == (i > 0))
				r->agree++;
			else
				r->disagree++;
			d->vref = v;
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

/*
 * --charge-sign: read each named file ahead and decide whether it counts
 * charging negative; tell what was found.  Returns the decisions, one
 * per file (1 negative), or NULL when nothing is read ahead.
 */
static signed char *
scan_signs(const struct clean_conf *c, char **files, int n, unsigned req)
{
	static const struct csvin_ops ops = { on_header, scan_row,
	    scan_other, csvin_skip_blank };
	signed char *sg;
	int k, rc, neg, decided;

	if (n == 0) {
		if (c->charge_sign == CLEAN_SIGN_AUTO)
			cw_warn("standard input: not a regular file, so the "
			    "charge sign cannot be decided ahead: taken as "
			    "positive (name the file, or give --charge-sign)");
		return NULL;
	}
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
		if (strcmp(files[k], "-") != 0 && stat(files[k], &sb) != 0)
			continue;	/* the main pass tells why */
		if (strcmp(files[k], "-") == 0 || !S_ISREG(sb.st_mode)) {
			/*
			 * Said without -v: a log that counts charging
			 * negative would go through with every sign wrong.
			 */
			if (c->charge_sign == CLEAN_SIGN_AUTO)
				cw_warn("%s: not a regular file, so the charge "
				    "sign cannot be decided ahead: taken as "
				    "positive (name the file, or give "
				    "--charge-sign)", strcmp(files[k], "-") ==
				    0 ? "standard input" : files[k]);
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
			} else if (!decided && d >= CLEAN_SIGN_HINT &&
			    d >= CLEAN_SIGN_RATIO * a)
				/* Too few rows to turn, but they lean so. */
				cw_warn("%s: charge sign undecided, taken as "
				    "positive, though %lu rows' current went "
				    "against the change of %s and %lu with it "
				    "(fewer than %d to decide): check it, or "
				    "give --charge-sign", files[k], d, why, a,
				    CLEAN_SIGN_MIN);
			else if (cw_verbose)
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
	cw_time newest;
	int rc, k;

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
	/* The stream's columns (sampin_colname[]), then the kept ones. */
	for (k = 0; k < SAMP_EXTRA; k++)
		csvout_str(out, sampin_colname[k]);
	for (k = 0; k < c->nkeep; k++)
		csvout_str(out, c->keep[k]);
	csvout_endrow(out);
	r.kstride = (size_t)c->nkeep * CLEAN_KEEP_LEN;
	if (r.kstride > 0) {
		r.krow = cw_calloc(1, r.kstride);
		r.ktmp = cw_calloc(1, r.kstride);
	}
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
	units_check(&r);
	free((void *)r.fsign);
	st->header_repeats = csvin_stats(in)->header_repeats;
	st->unended = csvin_stats(in)->unended;
	st->held = csvin_stats(in)->held;
	csvin_free(in);
	/*
	 * What is still in the windows leaves now, device by device.  A
	 * held row with no row after it is judged against the newest row
	 * accepted before this loop: one that the loop itself accepts must
	 * not move the mark, or the verdict would hang on the devices'
	 * order in the table (a file of one row per device, weeks apart,
	 * lost all but the first).
	 */
	newest = r.newest;
	for (i = 0; i < devtab_count(r.devs); i++) {
		struct cdev *d = devtab_at(r.devs, i);

		if (d->held)
			unhold(&r, d, newest != INT64_MIN && d->hp.t > newest &&
			    d->hp.t - newest > c->max_jump);
		drain(&r, d, INT64_MAX);
		if (c->step > 0) {
			r.cur = d;
			rs_flush(&d->rs, c->step, emit, &r);
		}
		if (d->q != d->qin)
			free(d->q);
		free(d->qk);
		free(d->kv);
		free(d->hraw);
		free(d->hk);
	}
	devtab_free(r.devs);
	free(r.uv);
	free(r.krow);
	free(r.ktmp);
	if (st->keep_cut > 1)
		cw_warn("--keep: %lu values cut in all", st->keep_cut);
	return rc;
}
