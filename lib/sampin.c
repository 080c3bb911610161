/*
 * sampin.c: the sample stream reader (see sampin.h).
 */
#include <stdarg.h>
#include <stdio.h>
#include <string.h>

#include "csvin.h"
#include "num.h"
#include "sampin.h"
#include "ts.h"

#define SAMPIN_MAXWARN 10	/* skipped rows reported one by one */

const char *const sampin_colname[SAMP_NCOL] = {
	"device", "time", "voltage_v", "current_a", "temp_c", "soc_pct", NULL,
	NULL
};

struct rd {
	const struct sampin_conf *c;
	struct sampin_stats *st;
	int col[SAMP_NCOL];
	unsigned long warned;
};

static int on_header(void *, const struct csvin_rec *);
static int on_row(void *, const struct csvin_rec *);
static int on_bad(void *, const struct csvin_rec *, const char *);
static const char *colname(const struct sampin_conf *, int);
static void skip(struct rd *, const struct csvin_rec *, const char *, ...)
    __attribute__((format(printf, 3, 4)));

/* The name of column K for the tool (NULL: none). */
static const char *
colname(const struct sampin_conf *c, int k)
{
	if (k == SAMP_EXTRA)
		return c->extra;
	if (k == SAMP_TAG)
		return c->tag;
	return sampin_colname[k];
}

static void
skip(struct rd *d, const struct csvin_rec *r, const char *fmt, ...)
{
	char msg[256];
	va_list ap;

	d->st->skipped++;
	if (d->warned++ >= SAMPIN_MAXWARN)
		return;
	va_start(ap, fmt);
	vsnprintf(msg, sizeof(msg), fmt, ap);
	va_end(ap);
	cw_warn_at(r->src, r->line, "%s; row skipped%s", msg,
	    d->warned == SAMPIN_MAXWARN ? " (further skips only counted)" :
	    "");
}

static int
on_header(void *ctx, const struct csvin_rec *r)
{
	struct rd *d = ctx;
	int k;

	for (k = 0; k < SAMP_NCOL; k++) {
		const char *name = colname(d->c, k);

		d->col[k] = name != NULL ? csvin_find(r, name) : -1;
		if (d->col[k] < 0 && (d->c->need & SAMP_BIT(k))) {
			cw_warn_at(r->src, r->line, "no column '%s' in the "
			    "header", name);
			return CW_EXIT_DATA;
		}
	}
	if (d->c->need_any != 0) {
		for (k = 0; k < SAMP_NCOL; k++)
			if ((d->c->need_any & SAMP_BIT(k)) && d->col[k] >= 0)
				break;
		if (k == SAMP_NCOL) {
			char names[256] = "";

			for (k = 0; k < SAMP_NCOL; k++)
				if (d->c->need_any & SAMP_BIT(k)) {
					const char *nm = colname(d->c, k);

					if (names[0] != '\0')
						strcat(names, " or ");
					strncat(names, nm, 64);
				}
			cw_warn_at(r->src, r->line, "the header has no column "
			    "%s", names);
			return CW_EXIT_DATA;
		}
	}
	return 0;
}

static double
value(struct rd *d, const struct csvin_rec *r, int k)
{
	int i = d->col[k];
	double x;
	int rc;

	if (i < 0)
		return CW_MISSING;
	if ((size_t)i >= r->nf || r->len[i] == 0) {
		d->st->missing[k]++;
		return CW_MISSING;
	}
	rc = num_parse(r->f[i], r->len[i], '.', &x);
	if (rc == NUM_OK)
		return x;
	if (rc == NUM_EMPTY)
		d->st->missing[k]++;
	else
		d->st->invalid[k]++;
	return CW_MISSING;
}

static int
on_row(void *ctx, const struct csvin_rec *r)
{
	struct rd *d = ctx;
	struct cw_sample s;
	struct devent *dev;
	const char *name = "";
	size_t namelen = 0;
	int i;

	d->st->rows++;
	i = d->col[SAMP_DEVICE];
	if (i >= 0) {
		if ((size_t)i >= r->nf || r->len[i] == 0) {
			d->st->missing[SAMP_DEVICE]++;
			skip(d, r, "no device");
			return 0;
		}
		name = r->f[i];
		namelen = r->len[i];
	}
	i = d->col[SAMP_TIME];
	if ((size_t)i >= r->nf || ts_parse(r->f[i], r->len[i], TS_AUTO, 0,
	    &s.t) < 0) {
		d->st->invalid[SAMP_TIME]++;
		skip(d, r, "bad time '%.40s'", (size_t)i < r->nf ? r->f[i] :
		    "");
		return 0;
	}
	s.v = value(d, r, SAMP_VOLTAGE);
	s.i = value(d, r, SAMP_CURRENT);
	s.temp = value(d, r, SAMP_TEMP);
	s.soc = value(d, r, SAMP_SOC);
	s.x = value(d, r, SAMP_EXTRA);
	s.tag = "";
	s.taglen = 0;
	i = d->col[SAMP_TAG];
	if (i >= 0 && (size_t)i < r->nf) {
		s.tag = r->f[i];
		s.taglen = r->len[i];
	}
	if (i >= 0 && s.taglen == 0)
		d->st->missing[SAMP_TAG]++;
	s.src = r->src;
	s.line = r->line;
	dev = devtab_get(d->c->devs, name, namelen, NULL);
	if (s.t < dev->last_t) {
		char a[TS_FMTMAX], b[TS_FMTMAX];

		ts_format(s.t, a);
		ts_format(dev->last_t, b);
		skip(d, r, "time goes back for %s (%s after %s; clean the "
		    "stream with cw-clean)", dev->name, a, b);
		return 0;
	}
	dev->last_t = s.t;
	dev->nrows++;
	d->st->used++;
	return d->c->row(d->c->ctx, dev, &s);
}

static int
on_bad(void *ctx, const struct csvin_rec *r, const char *why)
{
	struct rd *d = ctx;

	d->st->rows++;
	skip(d, r, "%s", why);
	return 0;
}

int
sampin_run(const struct sampin_conf *c, char **files, int n,
    struct sampin_stats *st)
{
	static const struct csvin_ops ops = { on_header, on_row, on_bad,
	    csvin_skip_blank };
	struct rd d;
	struct csvin *r;
	int rc;

	memset(st, 0, sizeof(*st));
	memset(&d, 0, sizeof(d));
	d.c = c;
	d.st = st;
	r = csvin_new(',', &ops, &d);
	rc = csvin_files(r, files, n);
	csvin_free(r);
	if (rc == 0 && d.warned > SAMPIN_MAXWARN)
		cw_warn("%lu rows skipped in all", st->skipped);
	return rc;
}

void
sampin_report(const struct sampin_stats *st, const char *extra)
{
	sampin_report_tag(st, extra, NULL);
}

void
sampin_report_tag(const struct sampin_stats *st, const char *extra,
    const char *tag)
{
	struct sampin_conf c;
	int k;

	memset(&c, 0, sizeof(c));
	c.extra = extra;
	c.tag = tag;
	cw_warn("%lu rows read, %lu used, %lu skipped", st->rows, st->used,
	    st->skipped);
	for (k = 0; k < SAMP_NCOL; k++) {
		const char *name = colname(&c, k);

		if (name == NULL || (st->missing[k] == 0 &&
		    st->invalid[k] == 0))
			continue;
		cw_warn("%s: %lu empty, %lu not a number", name,
		    st->missing[k], st->invalid[k]);
	}
}
