/*
 * synthout.c: cw-synth's output: the raw gauge formats, the field faults
 * injected into them, the gzipped day files and the truth files (synth.h).
 *
 * Rows are formatted here by hand into a large buffer that goes to
 * gzwrite() in blocks of about a megabyte; nothing is allocated per row.
 * Faults are drawn from each device's own fault stream, never from the
 * physics streams, and every one is written to truth-faults.csv with the
 * line it landed on, which is the same in every format's file of the day.
 */
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <zlib.h>

#include "csvout.h"
#include "num.h"
#include "outf.h"
#include "synth.h"
#include "ts.h"

#define GZW_BUFSZ (1024 * 1024)
#define GZW_FLUSH (GZW_BUFSZ - 4 * SYNTH_LINEMAX)
#define GZW_GZBUF (256 * 1024)

/* Row faults need this many clean rows of the device before a jump. */
#define JUMP_CLEAN_S 120

const char *const synth_fault_name[SYNTH_NFAULT] = {
	"dup", "late", "stale", "trunc", "sentinel", "gap", "jump", "header"
};

const double synth_fault_default[SYNTH_NFAULT] = {
	0.001, 0.0005, 0.0002, 0.0002, 0.0005, 0.5, 0.05, 0.5
};

const char synth_header_a[] = "ts_ms,dev_id,pack_mv,pack_ma,temp_dk,soc_pct";
const char synth_header_b[] = "local_time;pack_id;volts;amps;temp_f;soc";

static const char *const sentinel_col[4] = {
	"voltage", "current", "temp", "soc"
};

struct gzw {
	int fmt;
	char path[4096];
	struct outf *o;
	gzFile gz;
	char *buf;
	size_t n;
};

struct tfile {
	struct outf *o;
	struct csvout w;
};

struct dayrec {
	unsigned long lines, data, headers;
};

struct run {
	const struct synth_conf *c;
	struct synth_fleet *f;
	struct gzw w[2];
	int nw;
	unsigned long line;	/* number of the next line of the day files */
	long day, slot, rpd;
	char daystr[16];
	struct tfile faults, charging, topoff, volt, rides;
	struct dayrec *days;
	struct synth_rng hrng;	/* repeated headers */
	struct synth_stats *st;
	long late_kmax, stale_kmin, stale_kmax, jump_clean;
};

static void tf_open(struct run *, struct tfile *, const char *,
	    const char *);
static void tf_close(struct tfile *);
static void gzw_open(struct run *, struct gzw *, int);
static void gzw_flush(struct gzw *);
static void gzw_close(struct gzw *);
static void put_header(struct run *);
static const struct synth_sample *signed_sample(const struct run *, int,
    const struct synth_sample *, struct synth_sample *);
static size_t put_dock(const struct run *, char *, char,
    const struct synth_sample *);
static void put_row(struct run *, struct synth_dev *,
	    const struct synth_sample *, cw_time, int, double);
static void fault(struct run *, unsigned long, const struct synth_dev *,
	    cw_time, int, const char *, double);
static void emit(struct run *, struct synth_dev *,
	    const struct synth_sample *);
static void on_cevent(void *, const struct synth_dev *,
	    const struct synth_cevent *);
static void on_topoff(void *, const struct synth_dev *,
	    const struct synth_topoff *);
static void on_ride(void *, const struct synth_dev *,
	    const struct synth_ride *);
static void write_devices(struct run *);
static void write_days(struct run *);
static void write_run(struct run *);
static size_t fmt_date(char *, long);
static char *put2(char *, unsigned);

int
synth_faults_parse(const char *s, double rate[SYNTH_NFAULT],
    const char **err)
{
	const char *p = s, *e, *eq;
	double x, sum = 0;
	size_t n;
	int k;

	for (;;) {
		e = strchr(p, ',');
		n = e != NULL ? (size_t)(e - p) : strlen(p);
		if (n == 4 && strncmp(p, "none", 4) == 0) {
			for (k = 0; k < SYNTH_NFAULT; k++)
				rate[k] = 0;
		} else if (n == 7 && strncmp(p, "default", 7) == 0) {
			for (k = 0; k < SYNTH_NFAULT; k++)
				rate[k] = synth_fault_default[k];
		} else {
			eq = memchr(p, '=', n);
			if (eq == NULL) {
				*err = "expected none, default or name=rate";
				return -1;
			}
			for (k = 0; k < SYNTH_NFAULT; k++)
				if ((size_t)(eq - p) ==
				    strlen(synth_fault_name[k]) &&
				    strncmp(p, synth_fault_name[k],
				    (size_t)(eq - p)) == 0)
					break;
			if (k == SYNTH_NFAULT) {
				*err = "unknown fault (dup, late, stale, trunc, "
				    "sentinel, gap, jump, header)";
				return -1;
			}
			if (num_parse(eq + 1, (size_t)(p + n - eq - 1), '.',
			    &x) != NUM_OK || x < 0 || x > (k < SYNTH_F_GAP ? 1.0 :
			    1000.0)) {
				*err = k < SYNTH_F_GAP ? "a row rate must be a "
				    "number from 0 to 1" : "a rate must be a "
				    "number from 0 to 1000";
				return -1;
			}
			rate[k] = x;
		}
		if (e == NULL)
			break;
		p = e + 1;
	}
	for (k = 0; k < SYNTH_F_GAP; k++)
		sum += rate[k];
	if (sum > 1.0) {
		*err = "the row rates (dup, late, stale, trunc, sentinel) add "
		    "up to more than 1";
		return -1;
	}
	return 0;
}

/* Formatting. */

size_t
synth_fmt_long(char *buf, long x)
{
	char tmp[24];
	size_t n = 0, k = 0;
	unsigned long u;

	if (x < 0) {
		buf[n++] = '-';
		u = 0UL - (unsigned long)x;
	} else
		u = (unsigned long)x;
	do {
		tmp[k++] = (char)('0' + u % 10);
		u /= 10;
	} while (u > 0);
	while (k > 0)
		buf[n++] = tmp[--k];
	return n;
}

size_t
synth_fmt_fixed(char *buf, long x, int dec, char mark)
{
	char tmp[24];
	size_t n = 0, k = 0;
	unsigned long u;

	if (x < 0) {
		buf[n++] = '-';
		u = 0UL - (unsigned long)x;
	} else
		u = (unsigned long)x;
	do {
		tmp[k++] = (char)('0' + u % 10);
		u /= 10;
	} while (u > 0);
	while (k <= (size_t)dec)
		tmp[k++] = '0';
	while (k > 0) {
		if (k == (size_t)dec)
			buf[n++] = mark;
		buf[n++] = tmp[--k];
	}
	return n;
}

static char *
put2(char *p, unsigned v)
{
	p[0] = (char)('0' + v / 10 % 10);
	p[1] = (char)('0' + v % 10);
	return p + 2;
}

/* YYYY-MM-DD of day Z since the epoch (years 0..9999). */
static size_t
fmt_date(char *buf, long z)
{
	long y;
	unsigned m, d;
	char *p = buf;

	ts_civil_from_days(z, &y, &m, &d);
	p = put2(p, (unsigned)(y / 100));
	p = put2(p, (unsigned)(y % 100));
	*p++ = '-';
	p = put2(p, m);
	*p++ = '-';
	p = put2(p, d);
	*p = '\0';
	return (size_t)(p - buf);
}

size_t
synth_fmt_local(char *buf, cw_time t, long tz_s)
{
	long long s = t / CW_US_PER_S, z, sod;
	long off = tz_s < 0 ? -tz_s : tz_s;
	char *p = buf;

	if (t % CW_US_PER_S < 0)
		s--;
	s += tz_s;
	z = s >= 0 ? s / 86400 : -((-s + 86399) / 86400);
	sod = s - z * 86400;
	p += fmt_date(p, (long)z);
	*p++ = 'T';
	p = put2(p, (unsigned)(sod / 3600));
	*p++ = ':';
	p = put2(p, (unsigned)(sod / 60 % 60));
	*p++ = ':';
	p = put2(p, (unsigned)(sod % 60));
	*p++ = tz_s < 0 ? '-' : '+';
	p = put2(p, (unsigned)(off / 3600));
	*p++ = ':';
	p = put2(p, (unsigned)(off / 60 % 60));
	return (size_t)(p - buf);
}

size_t
synth_fmt_a(char *buf, const struct synth_dev *d,
    const struct synth_sample *s, cw_time t_shown, int sentinel)
{
	char *p = buf;

	p += synth_fmt_long(p, (long)(t_shown / 1000));
	*p++ = ',';
	memcpy(p, d->name, d->namelen);
	p += d->namelen;
	*p++ = ',';
	if (sentinel == 0)
		p += synth_fmt_long(p, 65535);
	else
		p += synth_fmt_long(p, s->mv);
	*p++ = ',';
	/* Format A counts charging current as negative. */
	if (sentinel == 1)
		p += synth_fmt_long(p, -32768);
	else
		p += synth_fmt_long(p, -s->ma);
	*p++ = ',';
	if (sentinel == 2)
		p += synth_fmt_long(p, 65535);
	else
		p += synth_fmt_long(p, s->dk);
	*p++ = ',';
	if (sentinel == 3)
		p += synth_fmt_long(p, 255);
	else if (d->gauge_int)
		p += synth_fmt_long(p, s->soc10 / 10);
	else
		p += synth_fmt_fixed(p, s->soc10, 1, '.');
	return (size_t)(p - buf);
}

size_t
synth_fmt_b(char *buf, const struct synth_dev *d,
    const struct synth_sample *s, cw_time t_shown, long tz_s, int sentinel)
{
	char *p = buf;

	p += synth_fmt_local(p, t_shown, tz_s);
	*p++ = ';';
	memcpy(p, d->name, d->namelen);
	p += d->namelen;
	*p++ = ';';
	if (sentinel == 0)
		p += synth_fmt_long(p, 65535);
	else
		p += synth_fmt_fixed(p, s->mv, 3, ',');
	*p++ = ';';
	if (sentinel == 1)
		p += synth_fmt_long(p, -32768);
	else
		p += synth_fmt_fixed(p, s->ma, 3, ',');
	*p++ = ';';
	/* Degrees F from 0.1 K exactly: F = dK * 0.18 - 459.67. */
	if (sentinel == 2)
		p += synth_fmt_long(p, -32768);
	else
		p += synth_fmt_fixed(p, s->dk * 18 - 45967, 2, ',');
	*p++ = ';';
	if (sentinel == 3)
		p += synth_fmt_long(p, 255);
	else if (d->gauge_int)
		p += synth_fmt_long(p, s->soc10 / 10);
	else
		p += synth_fmt_fixed(p, s->soc10, 1, ',');
	return (size_t)(p - buf);
}

/* Files. */

static void
tf_open(struct run *r, struct tfile *t, const char *name, const char *hdr)
{
	char path[4096];

	if (snprintf(path, sizeof(path), "%s/%s", r->c->outdir, name) >=
	    (int)sizeof(path))
		cw_die(CW_EXIT_DATA, "%s: path too long", r->c->outdir);
	t->o = outf_open(path);
	csvout_init(&t->w, outf_fp(t->o));
	csvout_header(&t->w, hdr);
}

static void
tf_close(struct tfile *t)
{
	if (csvout_flush(&t->w) != 0 || outf_commit(t->o) != 0)
		cw_die(CW_EXIT_DATA, "cannot write the truth files");
	csvout_free(&t->w);
}

static void
gzw_open(struct run *r, struct gzw *w, int fmt)
{
	char mode[4] = "wb1";
	size_t n;
	int fd;

	n = (size_t)snprintf(w->path, sizeof(w->path), "%s/", r->c->outdir);
	if (n + 32 >= sizeof(w->path))
		cw_die(CW_EXIT_DATA, "%s: path too long", r->c->outdir);
	n += fmt_date(w->path + n, r->c->start_day + r->day);
	memcpy(w->path + n, fmt == SYNTH_FMT_A ? ".a.csv.gz" : ".b.csv.gz",
	    10);
	w->fmt = fmt;
	w->o = outf_open(w->path);
	fd = dup(fileno(outf_fp(w->o)));
	mode[2] = (char)('0' + r->c->level);
	if (fd < 0 || (w->gz = gzdopen(fd, mode)) == NULL)
		cw_die(CW_EXIT_DATA, "%s: %s", w->path, strerror(errno));
	if (gzbuffer(w->gz, GZW_GZBUF) != 0)
		cw_die(CW_EXIT_DATA, "%s: cannot size the gzip buffer",
		    w->path);
	w->n = 0;
	r->st->files++;
}

static void
gzw_flush(struct gzw *w)
{
	int e;

	if (w->n == 0)
		return;
	if (gzwrite(w->gz, w->buf, (unsigned)w->n) != (int)w->n)
		cw_die(CW_EXIT_DATA, "%s: write error: %s", w->path,
		    gzerror(w->gz, &e));
	w->n = 0;
}

static void
gzw_close(struct gzw *w)
{
	gzw_flush(w);
	if (gzclose(w->gz) != Z_OK)
		cw_die(CW_EXIT_DATA, "%s: write error: %s", w->path,
		    strerror(errno));
	w->gz = NULL;
	if (outf_commit(w->o) != 0)
		cw_die(CW_EXIT_DATA, "%s: cannot complete the file", w->path);
}

static void
put_header(struct run *r)
{
	int k;

	for (k = 0; k < r->nw; k++) {
		struct gzw *w = &r->w[k];
		const char *h = w->fmt == SYNTH_FMT_A ? synth_header_a :
		    synth_header_b;
		size_t n = strlen(h);

		memcpy(w->buf + w->n, h, n);
		if (r->c->docks) {
			memcpy(w->buf + w->n + n, w->fmt == SYNTH_FMT_A ?
			    ",dock" : ";dock", 5);
			n += 5;
		}
		w->buf[w->n + n] = '\n';
		w->n += n + 1;
		r->st->bytes += n + 1;
	}
	r->line++;
}

/*
 * --charge-sign: S as format FMT should write it.  Format A counts
 * charging negative and B positive (their own conventions); a sign asked
 * for that differs turns the current (into *BUF).
 */
static const struct synth_sample *
signed_sample(const struct run *r, int fmt, const struct synth_sample *s,
    struct synth_sample *buf)
{
	int own = fmt == SYNTH_FMT_A ? -1 : 1;

	if (r->c->charge_sign == 0 || r->c->charge_sign == own)
		return s;
	*buf = *s;
	buf->ma = -s->ma;
	return buf;
}

/* --docks: the delimiter DL and the site of S at P; its length. */
static size_t
put_dock(const struct run *r, char *p, char dl, const struct synth_sample *s)
{
	char site[16];
	size_t n;

	if (!r->c->docks)
		return 0;
	synth_site_name(s->site, site);
	n = strlen(site);
	p[0] = dl;
	memcpy(p + 1, site, n);
	return n + 1;
}

/*
 * One data line in every format: the row of sample S of device D at
 * time T_SHOWN, with the field SENTINEL replaced, or, when CUT >= 0, cut
 * at fraction CUT of the way to its last delimiter, which is lost.
 */
static void
put_row(struct run *r, struct synth_dev *d, const struct synth_sample *s,
    cw_time t_shown, int sentinel, double cut)
{
	int k;

	for (k = 0; k < r->nw; k++) {
		struct gzw *w = &r->w[k];
		struct synth_sample turned;
		const struct synth_sample *sw = signed_sample(r, w->fmt, s,
		    &turned);
		char *b = w->buf + w->n, dl;
		size_t n, last;

		if (w->fmt == SYNTH_FMT_A) {
			n = synth_fmt_a(b, d, sw, t_shown, sentinel);
			dl = ',';
		} else {
			n = synth_fmt_b(b, d, sw, t_shown, r->c->tz_s,
			    sentinel);
			dl = ';';
		}
		n += put_dock(r, b + n, dl, sw);
		if (cut >= 0) {
			for (last = n; last > 0 && b[last - 1] != dl; last--)
				;
			last--;	/* index of the last delimiter */
			n = 1 + (size_t)(cut * (double)last);
			if (n > last)
				n = last;
		}
		b[n] = '\n';
		w->n += n + 1;
		r->st->bytes += n + 1;
		if (w->n > GZW_FLUSH)
			gzw_flush(w);
	}
	r->line++;
	d->tr.written++;
}

/* One row of truth-faults.csv; LINE 0 leaves the line empty. */
static void
fault(struct run *r, unsigned long line, const struct synth_dev *d,
    cw_time t, int kind, const char *sdetail, double ndetail)
{
	struct csvout *w = &r->faults.w;

	csvout_str(w, r->daystr);
	if (line > 0)
		csvout_int(w, (long long)line);
	else
		csvout_empty(w);
	if (d != NULL) {
		csvout_strn(w, d->name, d->namelen);
		csvout_time(w, t);
	} else {
		csvout_empty(w);
		csvout_empty(w);
	}
	csvout_str(w, synth_fault_name[kind]);
	if (sdetail != NULL)
		csvout_str(w, sdetail);
	else if (cw_isnum(ndetail))
		csvout_num(w, ndetail);
	else
		csvout_empty(w);
	csvout_endrow(w);
}

/*
 * Write sample S of device D with whatever fault its fault stream draws.
 * The rules that keep every fault what it claims to be (a late row is
 * put back by a 60 s reorder window, a stale one or a jumped one is
 * rejected): a pending late row holds off every other fault of its device
 * until it is written, right after the device's row K slots later; a
 * jump starts only after two minutes of clean rows; faults never overlap.
 */
static void
emit(struct run *r, struct synth_dev *d, const struct synth_sample *s)
{
	const double *rate = r->c->rate;
	double per = (double)r->c->period_s, u, acc;
	long k, left;
	int kind;

	if (d->gap_left > 0) {
		d->gap_left--;
		d->tr.gap_rows++;
		d->clean_run = 0;
		return;
	}
	if (d->jump_left > 0) {
		fault(r, r->line, d, s->t, SYNTH_F_JUMP, NULL,
		    (double)-d->jump_s);
		put_row(r, d, s, s->t - d->jump_s * CW_US_PER_S, -1, -1);
		d->jump_left--;
		d->tr.jump_rows++;
		d->clean_run = 0;
		return;
	}
	if (d->pend_on) {
		put_row(r, d, s, s->t, -1, -1);
		d->clean_run++;
		if (r->slot == d->pend_slot) {
			fault(r, r->line, d, d->pend.t, d->pend_kind, NULL,
			    d->pend_delay);
			put_row(r, d, &d->pend, d->pend.t, -1, -1);
			d->pend_on = 0;
		}
		return;
	}
	u = synth_rng_unif(&d->frng);
	if (u < rate[SYNTH_F_GAP] / (double)r->rpd) {
		left = (r->c->ndays - r->day) * r->rpd - r->slot;
		k = (long)floor(exp(synth_rng_range(&d->frng, log(300.0),
		    log(4 * 3600.0))) / per + 0.5);
		k = k < 1 ? 1 : k > left ? left : k;
		fault(r, 0, d, s->t, SYNTH_F_GAP, NULL, (double)k);
		d->tr.fault[SYNTH_F_GAP]++;
		d->tr.gap_rows++;
		d->gap_left = k - 1;
		d->clean_run = 0;
		return;
	}
	u = synth_rng_unif(&d->frng);
	if (u < rate[SYNTH_F_JUMP] / (double)r->rpd &&
	    d->clean_run >= r->jump_clean) {
		k = (long)floor(synth_rng_range(&d->frng, 120, 1800) / per +
		    0.5);
		k = k < 1 ? 1 : k;
		d->jump_s = k * r->c->period_s +
		    (long)synth_rng_range(&d->frng, 900, 7200);
		if (r->c->period_s > 1 && d->jump_s % r->c->period_s == 0)
			d->jump_s++;
		d->tr.fault[SYNTH_F_JUMP]++;
		d->jump_left = k;
		emit(r, d, s);
		return;
	}
	u = synth_rng_unif(&d->frng);
	acc = 0;
	for (kind = 0; kind < SYNTH_F_GAP; kind++) {
		acc += rate[kind];
		if (u < acc)
			break;
	}
	switch (kind) {
	case SYNTH_F_DUP:
		put_row(r, d, s, s->t, -1, -1);
		fault(r, r->line, d, s->t, kind, NULL, CW_MISSING);
		put_row(r, d, s, s->t, -1, -1);
		break;
	case SYNTH_F_LATE:
	case SYNTH_F_STALE:
		if (kind == SYNTH_F_LATE && r->late_kmax == 0)
			goto clean;
		k = kind == SYNTH_F_LATE ? 1 + (long)(synth_rng_unif(&d->frng) *
		    (double)r->late_kmax) : r->stale_kmin +
		    (long)(synth_rng_unif(&d->frng) *
		    (double)(r->stale_kmax - r->stale_kmin + 1));
		if (r->slot + k >= r->rpd)
			goto clean;	/* it would leave the file */
		d->pend_on = 1;
		d->pend_kind = kind;
		d->pend_slot = r->slot + k;
		d->pend_delay = (double)(k * r->c->period_s);
		d->pend = *s;
		break;
	case SYNTH_F_TRUNC:
		fault(r, r->line, d, s->t, kind, NULL, CW_MISSING);
		put_row(r, d, s, s->t, -1, synth_rng_unif(&d->frng));
		break;
	case SYNTH_F_SENTINEL:
		k = (long)(synth_rng_unif(&d->frng) * 4);
		fault(r, r->line, d, s->t, kind, sentinel_col[k], CW_MISSING);
		put_row(r, d, s, s->t, (int)k, -1);
		break;
	default:
		goto clean;
	}
	d->tr.fault[kind]++;
	d->clean_run = kind == SYNTH_F_DUP ? d->clean_run + 1 : 0;
	return;
clean:
	put_row(r, d, s, s->t, -1, -1);
	d->clean_run++;
}

/* Truth found by the simulation. */

/* The verdicts of cw-thermal's charge protocol, by synth_cevent.protocol. */
static const char *const protocol_name[4] = {
	"within", "over-current", "over-voltage", "no-charge-allowed"
};

static void
on_cevent(void *ctx, const struct synth_dev *d, const struct synth_cevent *e)
{
	struct run *r = ctx;
	struct csvout *w = &r->charging.w;
	char site[16];

	csvout_strn(w, d->name, d->namelen);
	csvout_str(w, "charge");
	csvout_str(w, synth_zone_name[e->zone]);
	csvout_time(w, e->start);
	csvout_time(w, e->end);
	csvout_int(w, (long long)((e->end - e->start) / CW_US_PER_S));
	csvout_fixed(w, e->tmin, 2);
	csvout_fixed(w, e->tmax, 2);
	csvout_fixed(w, e->ah, 4);
	csvout_fixed(w, e->soc0, 2);
	csvout_fixed(w, e->soc1, 2);
	csvout_str(w, synth_dev_charger(d));
	synth_dev_site(d, site);
	csvout_str(w, site);
	csvout_fixed(w, e->i_max, 4);
	csvout_fixed(w, e->v_max, 4);
	csvout_str(w, protocol_name[e->protocol]);
	csvout_endrow(w);
}

static void
on_vevent(void *ctx, const struct synth_dev *d, const struct synth_vevent *e)
{
	static const char *const kind[3] = { "charge", "use", "rest" };
	struct run *r = ctx;
	struct csvout *w = &r->volt.w;

	csvout_strn(w, d->name, d->namelen);
	csvout_str(w, kind[e->kind]);
	csvout_str(w, e->limit == 0 ? "over" : "under");
	csvout_time(w, e->start);
	csvout_time(w, e->end);
	csvout_int(w, (long long)((e->end - e->start) / CW_US_PER_S));
	csvout_fixed(w, e->vmin, 4);
	csvout_fixed(w, e->vmax, 4);
	csvout_fixed(w, e->ah, 4);
	csvout_str(w, synth_incident_name[d->incident]);
	csvout_str(w, synth_dev_charger(d));
	csvout_endrow(w);
}

static void
on_topoff(void *ctx, const struct synth_dev *d, const struct synth_topoff *m)
{
	struct run *r = ctx;
	struct csvout *w = &r->topoff.w;

	csvout_strn(w, d->name, d->namelen);
	csvout_time(w, m->start);
	csvout_time(w, m->restart);
	csvout_time(w, m->end);
	csvout_fixed(w, m->depth, 3);
	csvout_fixed(w, m->ah, 4);
	csvout_int(w, m->completed);
	csvout_endrow(w);
}

static void
on_ride(void *ctx, const struct synth_dev *d, const struct synth_ride *m)
{
	struct run *r = ctx;
	struct csvout *w = &r->rides.w;

	csvout_strn(w, d->name, d->namelen);
	csvout_time(w, m->start);
	csvout_time(w, m->end);
	csvout_fixed(w, m->soc_start, 3);
	csvout_fixed(w, m->soc_min, 3);
	csvout_int(w, m->from_charger);
	csvout_int(w, m->to_charger);
	csvout_endrow(w);
}

static void
write_devices(struct run *r)
{
	struct tfile t;
	struct csvout *w = &t.w;
	double per = (double)r->c->period_s;
	long i, n = synth_fleet_ndev(r->f);
	struct synth_dev **v = cw_calloc((size_t)n, sizeof(*v));
	char site[16];
	int k;

	tf_open(r, &t, "truth-devices.csv", "device,profile,charger,site,"
	    "gauge,capacity_ah,r0_start_ohm,r0_end_ohm,r1_start_ohm,"
	    "r1_end_ohm,tau1_s,rstep_start_ohm,rstep_end_ohm,growth_pct,"
	    "first,last,soc_start_pct,soc_end_pct,charge_ah,discharge_ah,"
	    "efc,max_depth_pct,rides,plug_ins,hours_soc_ge_95,"
	    "hours_temp_ge_45,cold_charge_ah,hot_charge_ah,charge_events,"
	    "topoff_cycles,rows,lines,dup,late,stale,trunc,sentinel,gaps,"
	    "gap_rows,jumps,jump_rows,capacity_start_ah,capacity_end_ah,"
	    "fade_pct,gauge_gain_pct,gauge_drift_pct_per_day,swings_20");
	for (i = 0; i < n; i++) {
		struct synth_dev *d = synth_fleet_dev(r->f, i);

		v[d->idx] = d;
	}
	for (i = 0; i < n; i++) {
		const struct synth_dev *d = v[i];
		const struct synth_pack *p = &d->pack;
		const struct synth_truth *tr = &d->tr;
		double g = 1.0 + p->growth;

		csvout_strn(w, d->name, d->namelen);
		csvout_str(w, synth_profile_name[d->profile]);
		csvout_str(w, synth_dev_home(d, site));
		csvout_str(w, site);
		csvout_str(w, d->gauge_int ? "int" : "tenth");
		csvout_fixed(w, p->cap0_ah, 4);
		csvout_fixed(w, p->r0_ref, 6);
		csvout_fixed(w, p->r0_ref * g, 6);
		csvout_fixed(w, p->r1_ref, 6);
		csvout_fixed(w, p->r1_ref * g, 6);
		csvout_fixed(w, p->tau1_s, 3);
		csvout_fixed(w, d->r_start25, 6);
		csvout_fixed(w, synth_pack_rstep25(p, per), 6);
		csvout_fixed(w, 100.0 * p->growth, 4);
		csvout_time(w, tr->first);
		csvout_time(w, tr->last);
		csvout_fixed(w, tr->soc_start, 4);
		csvout_fixed(w, tr->soc_end, 4);
		csvout_fixed(w, tr->charge_ah, 4);
		csvout_fixed(w, tr->discharge_ah, 4);
		csvout_fixed(w, (tr->charge_ah + tr->discharge_ah) /
		    (2.0 * p->cap0_ah), 4);
		csvout_fixed(w, tr->max_depth, 3);
		csvout_int(w, (long long)tr->rides);
		csvout_int(w, (long long)tr->plugins);
		csvout_fixed(w, tr->hours_soc95, 4);
		csvout_fixed(w, tr->hours_t45, 4);
		csvout_fixed(w, tr->cold_ah, 4);
		csvout_fixed(w, tr->hot_ah, 4);
		csvout_int(w, (long long)tr->cevents);
		csvout_int(w, (long long)tr->topoffs);
		csvout_int(w, (long long)tr->rows);
		csvout_int(w, (long long)tr->written);
		for (k = 0; k < SYNTH_F_GAP; k++)
			csvout_int(w, (long long)tr->fault[k]);
		csvout_int(w, (long long)tr->fault[SYNTH_F_GAP]);
		csvout_int(w, (long long)tr->gap_rows);
		csvout_int(w, (long long)tr->fault[SYNTH_F_JUMP]);
		csvout_int(w, (long long)tr->jump_rows);
		csvout_fixed(w, tr->cap_first, 4);
		csvout_fixed(w, p->cap_ah, 4);
		csvout_fixed(w, 100.0 * (1.0 - p->cap_ah / tr->cap_first), 4);
		csvout_fixed(w, 100.0 * d->g_gain, 4);
		csvout_fixed(w, 86400.0 * d->g_drift, 4);
		csvout_int(w, (long long)tr->swings20);
		csvout_endrow(w);
	}
	free(v);
	tf_close(&t);
}

static void
write_days(struct run *r)
{
	struct tfile t;
	char day[16];
	long i;

	tf_open(r, &t, "truth-days.csv", "day,lines,data_lines,header_repeats");
	for (i = 0; i < r->c->ndays; i++) {
		fmt_date(day, r->c->start_day + i);
		csvout_str(&t.w, day);
		csvout_int(&t.w, (long long)r->days[i].lines);
		csvout_int(&t.w, (long long)r->days[i].data);
		csvout_int(&t.w, (long long)r->days[i].headers);
		csvout_endrow(&t.w);
	}
	tf_close(&t);
}

static void
write_run(struct run *r)
{
	const struct synth_conf *c = r->c;
	struct tfile t;
	char buf[64];
	long off = c->tz_s < 0 ? -c->tz_s : c->tz_s;
	int k;

	tf_open(r, &t, "truth-run.csv", "seed,devices,days,start,tz,period_s,"
	    "rows_per_day,formats,dup,late,stale,trunc,sentinel,gap,jump,"
	    "header");
	snprintf(buf, sizeof(buf), "%llu", (unsigned long long)c->seed);
	csvout_str(&t.w, buf);
	csvout_int(&t.w, c->ndev);
	csvout_int(&t.w, c->ndays);
	fmt_date(buf, c->start_day);
	csvout_str(&t.w, buf);
	buf[0] = c->tz_s < 0 ? '-' : '+';
	put2(buf + 1, (unsigned)(off / 3600));
	buf[3] = ':';
	put2(buf + 4, (unsigned)(off / 60 % 60));
	buf[6] = '\0';
	csvout_str(&t.w, buf);
	csvout_int(&t.w, c->period_s);
	csvout_int(&t.w, r->rpd);
	csvout_str(&t.w, c->formats == (SYNTH_FMT_A | SYNTH_FMT_B) ? "a b" :
	    c->formats == SYNTH_FMT_B ? "b" : "a");
	for (k = 0; k < SYNTH_NFAULT; k++)
		csvout_num(&t.w, c->rate[k]);
	csvout_endrow(&t.w);
	tf_close(&t);
}

int
synth_write(const struct synth_conf *c, struct synth_stats *st)
{
	struct run r;
	struct synth_hooks h;
	double per = (double)c->period_s;
	long i, n;
	int k;

	memset(&r, 0, sizeof(r));
	memset(st, 0, sizeof(*st));
	r.c = c;
	r.st = st;
	h.cevent = on_cevent;
	h.topoff = on_topoff;
	h.vevent = on_vevent;
	h.ride = on_ride;
	h.ctx = &r;
	r.f = synth_fleet_new(c, &h);
	r.rpd = synth_fleet_rows_per_day(r.f);
	n = synth_fleet_ndev(r.f);
	/*
	 * Late: 1 to 60 s, the reorder window of cw-clean inclusive; stale:
	 * the first period past 60 s to 10 min.  The two meet at the window,
	 * so a window a period shorter or longer than 60 s is told apart
	 * (tests/ref/synth_truth_clean.sh).
	 */
	r.late_kmax = (long)(60.0 / per);
	r.stale_kmin = r.late_kmax + 1;
	r.stale_kmax = (long)(600.0 / per);
	if (r.stale_kmax < r.stale_kmin)
		r.stale_kmax = r.stale_kmin;
	r.jump_clean = 2 + (long)ceil(JUMP_CLEAN_S / per);
	r.days = cw_calloc((size_t)c->ndays, sizeof(*r.days));
	synth_rng_seed(&r.hrng, c->seed, UINT64_MAX);
	if (c->formats & SYNTH_FMT_A)
		r.w[r.nw++].fmt = SYNTH_FMT_A;
	if (c->formats & SYNTH_FMT_B)
		r.w[r.nw++].fmt = SYNTH_FMT_B;
	for (k = 0; k < r.nw; k++)
		r.w[k].buf = cw_malloc(GZW_BUFSZ);
	tf_open(&r, &r.faults, "truth-faults.csv",
	    "day,line,device,time,fault,detail");
	tf_open(&r, &r.charging, "truth-charging.csv", "device,kind,zone,"
	    "start,end,duration_s,temp_min_c,temp_max_c,charge_ah,"
	    "soc_start_pct,soc_end_pct,charger,site,i_max_a,v_cell_max,"
	    "protocol");
	tf_open(&r, &r.volt, "truth-volt.csv", "device,kind,limit,start,end,"
	    "duration_s,v_cell_min,v_cell_max,charge_ah,incident,charger");
	tf_open(&r, &r.topoff, "truth-topoff.csv",
	    "device,start,restart,end,depth_pct,charge_ah,completed");
	tf_open(&r, &r.rides, "truth-rides.csv", "device,start,end,"
	    "soc_start_pct,soc_min_pct,from_charger,to_charger");
	for (r.day = 0; r.day < c->ndays; r.day++) {
		unsigned long before = 0;

		for (i = 0; i < n; i++)
			before += synth_fleet_dev(r.f, i)->tr.written;
		synth_fleet_day(r.f, r.day);
		fmt_date(r.daystr, c->start_day + r.day);
		for (k = 0; k < r.nw; k++)
			gzw_open(&r, &r.w[k], r.w[k].fmt);
		r.line = 1;
		put_header(&r);
		for (r.slot = 0; r.slot < r.rpd; r.slot++) {
			if (synth_rng_unif(&r.hrng) < c->rate[SYNTH_F_HEADER] /
			    (double)r.rpd) {
				fault(&r, r.line, NULL, 0, SYNTH_F_HEADER, NULL,
				    CW_MISSING);
				put_header(&r);
				r.days[r.day].headers++;
			}
			for (i = 0; i < n; i++) {
				struct synth_dev *d = synth_fleet_dev(r.f, i);
				struct synth_sample s;

				synth_fleet_sample(r.f, d, r.slot, &s);
				st->rows++;
				emit(&r, d, &s);
			}
		}
		for (k = 0; k < r.nw; k++)
			gzw_close(&r.w[k]);
		r.days[r.day].lines = r.line - 1;
		for (i = 0; i < n; i++)
			r.days[r.day].data += synth_fleet_dev(r.f, i)->tr.written;
		r.days[r.day].data -= before;
		st->lines += r.line - 1;
		if (csvout_flush(&r.faults.w) != 0 ||
		    csvout_flush(&r.charging.w) != 0 ||
		    csvout_flush(&r.topoff.w) != 0 ||
		    csvout_flush(&r.volt.w) != 0 ||
		    csvout_flush(&r.rides.w) != 0)
			cw_die(CW_EXIT_DATA, "%s: cannot write the truth files",
			    c->outdir);
	}
	synth_fleet_finish(r.f);
	tf_close(&r.faults);
	tf_close(&r.charging);
	tf_close(&r.topoff);
	tf_close(&r.volt);
	tf_close(&r.rides);
	write_devices(&r);
	write_days(&r);
	write_run(&r);
	for (k = 0; k < r.nw; k++)
		free(r.w[k].buf);
	free(r.days);
	synth_fleet_free(r.f);
	return 0;
}
