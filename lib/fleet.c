/*
 * fleet.c: the fleet file reader.  The whole register is kept (one state
 * per pack in a devtab, site and model strings in a growing arena): it is
 * small beside the logs, and memory grows with packs only.
 */
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "csvin.h"
#include "fleet.h"
#include "num.h"
#include "ts.h"

enum fcol {
	FC_DEVICE, FC_CAPACITY, FC_CELLS, FC_IN_SERVICE, FC_SOH, FC_EFC,
	FC_SITE, FC_MODEL, FC_N
};

static const char *const fleet_colname[FC_N] = {
	"device", "capacity_ah", "cells", "in_service", "soh_pct",
	"efc_prior", "site", "model"
};

struct fleet {
	struct devtab *packs;
	char **strs;		/* site and model strings, one malloc each */
	size_t nstrs, strcap;
};

struct loadctx {
	struct fleet *f;
	int col[FC_N];		/* field index per column of this file, or -1 */
};

static int	fl_header(void *, const struct csvin_rec *);
static int	fl_row(void *, const struct csvin_rec *);
static int	fl_bad(void *, const struct csvin_rec *, const char *);
static double	fl_number(const struct csvin_rec *, int, const char *,
		    double, double);
static const char *fl_keep(struct fleet *, const char *, size_t);

struct fleet *
fleet_load(const char *path)
{
	static const struct csvin_ops ops = {
		fl_header, fl_row, fl_bad, csvin_skip_blank
	};
	struct loadctx lc;

	if (path == NULL)
		return NULL;
	lc.f = cw_calloc(1, sizeof(*lc.f));
	lc.f->packs = devtab_new(sizeof(struct fleet_pack));
	for (int k = 0; k < FC_N; k++)
		lc.col[k] = -1;
	csvin_load(path, &ops, &lc, "empty fleet file (no header)",
	    "the fleet file");
	return lc.f;
}

static int
fl_header(void *ctx, const struct csvin_rec *r)
{
	struct loadctx *lc = ctx;

	for (int k = 0; k < FC_N; k++)
		lc->col[k] = csvin_find(r, fleet_colname[k]);
	if (lc->col[FC_DEVICE] < 0)
		cw_die(CW_EXIT_DATA, "%s:%lu: fleet file has no device column",
		    r->src, r->line);
	return 0;
}

/* The number in column K of R, NaN when empty; outside [LO, HI]: die. */
static double
fl_number(const struct csvin_rec *r, int k, const char *name, double lo,
    double hi)
{
	double x;
	int st;

	if (k < 0 || (size_t)k >= r->nf)
		return CW_MISSING;
	st = num_parse(r->f[k], r->len[k], '.', &x);
	if (st == NUM_EMPTY)
		return CW_MISSING;
	if (st != NUM_OK)
		cw_die(CW_EXIT_DATA, "%s:%lu: %s: %s: \"%.*s\"", r->src,
		    r->line, name, num_strerror(st), (int)r->len[k], r->f[k]);
	if (!(x >= lo && x <= hi))
		cw_die(CW_EXIT_DATA, "%s:%lu: %s %g is outside %g..%g",
		    r->src, r->line, name, x, lo, hi);
	return x;
}

static int
fl_row(void *ctx, const struct csvin_rec *r)
{
	struct loadctx *lc = ctx;
	struct fleet_pack *p;
	int k, isnew;
	double x;

	k = lc->col[FC_DEVICE];
	if ((size_t)k >= r->nf || r->len[k] == 0)
		cw_die(CW_EXIT_DATA, "%s:%lu: fleet row without a device",
		    r->src, r->line);
	p = devtab_get(lc->f->packs, r->f[k], r->len[k], &isnew);
	if (!isnew)
		cw_die(CW_EXIT_DATA, "%s:%lu: device \"%.*s\" again (first "
		    "on line %lu)", r->src, r->line, (int)r->len[k], r->f[k],
		    p->line);
	p->line = r->line;
	p->site = p->model = "";

	/* Bounds: what a pack can be, not what is typical. */
	x = fl_number(r, lc->col[FC_CAPACITY], "capacity_ah", 1e-6, 1e6);
	if (cw_isnum(x)) {
		if (x <= 0)
			cw_die(CW_EXIT_DATA, "%s:%lu: capacity_ah must be "
			    "above 0", r->src, r->line);
		p->capacity_ah = x;
		p->have |= FLEET_CAPACITY;
	}
	x = fl_number(r, lc->col[FC_CELLS], "cells", 1, 1000);
	if (cw_isnum(x)) {
		if (x != floor(x))
			cw_die(CW_EXIT_DATA, "%s:%lu: cells %g is not a whole "
			    "number", r->src, r->line, x);
		p->cells = (int)x;
		p->have |= FLEET_CELLS;
	}
	x = fl_number(r, lc->col[FC_SOH], "soh_pct", 1e-9, 150);
	if (cw_isnum(x)) {
		p->soh_pct = x;
		p->have |= FLEET_SOH;
	}
	x = fl_number(r, lc->col[FC_EFC], "efc_prior", 0, 1e7);
	if (cw_isnum(x)) {
		p->efc_prior = x;
		p->have |= FLEET_EFC_PRIOR;
	}
	k = lc->col[FC_IN_SERVICE];
	if (k >= 0 && (size_t)k < r->nf && r->len[k] > 0) {
		char buf[32];
		const char *s = r->f[k];
		size_t n = r->len[k];

		/* A bare date is the start of that day, UTC. */
		if (n == 10) {
			memcpy(buf, s, 10);
			memcpy(buf + 10, "T00:00:00Z", 11);
			s = buf;
			n = 20;
		}
		if (ts_parse(s, n, TS_ISO, 0, &p->in_service) != 0)
			cw_die(CW_EXIT_DATA, "%s:%lu: in_service: not a date "
			    "(YYYY-MM-DD or ISO 8601): \"%.*s\"", r->src,
			    r->line, (int)r->len[k], r->f[k]);
		p->have |= FLEET_IN_SERVICE;
	}
	k = lc->col[FC_SITE];
	if (k >= 0 && (size_t)k < r->nf && r->len[k] > 0) {
		p->site = fl_keep(lc->f, r->f[k], r->len[k]);
		p->have |= FLEET_SITE;
	}
	k = lc->col[FC_MODEL];
	if (k >= 0 && (size_t)k < r->nf && r->len[k] > 0) {
		p->model = fl_keep(lc->f, r->f[k], r->len[k]);
		p->have |= FLEET_MODEL;
	}
	return 0;
}

static int
fl_bad(void *ctx, const struct csvin_rec *r, const char *why)
{
	(void)ctx;
	cw_die(CW_EXIT_DATA, "%s:%lu: fleet file: %s", r->src, r->line, why);
}

static const char *
fl_keep(struct fleet *f, const char *s, size_t n)
{
	char *c;

	if (f->nstrs == f->strcap) {
		f->strcap = f->strcap ? 2 * f->strcap : 64;
		f->strs = cw_realloc(f->strs, f->strcap * sizeof(*f->strs));
	}
	c = cw_malloc(n + 1);
	memcpy(c, s, n);
	c[n] = '\0';
	f->strs[f->nstrs++] = c;
	return c;
}

const struct fleet_pack *
fleet_find(const struct fleet *f, const char *name, size_t len)
{
	if (f == NULL)
		return NULL;
	return devtab_find(f->packs, name, len);
}

size_t
fleet_count(const struct fleet *f)
{
	return f ? devtab_count(f->packs) : 0;
}

double
fleet_capacity(const struct fleet *f, const char *name, size_t len,
    double dflt)
{
	const struct fleet_pack *p = fleet_find(f, name, len);

	return p && (p->have & FLEET_CAPACITY) ? p->capacity_ah : dflt;
}

int
fleet_cells(const struct fleet *f, const char *name, size_t len, int dflt)
{
	const struct fleet_pack *p = fleet_find(f, name, len);

	return p && (p->have & FLEET_CELLS) ? p->cells : dflt;
}

void
fleet_free(struct fleet *f)
{
	if (f == NULL)
		return;
	for (size_t k = 0; k < f->nstrs; k++)
		free(f->strs[k]);
	free(f->strs);
	devtab_free(f->packs);
	free(f);
}
