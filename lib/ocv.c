/*
 * ocv.c: the open-circuit-voltage table and its inverse; see ocv.h.
 */
#include <stdlib.h>
#include <string.h>

#include "csvin.h"
#include "cw.h"
#include "num.h"
#include "ocv.h"

struct loadctx {
	struct ocv *o;
	int col_soc, col_v;
};

static int	oc_header(void *, const struct csvin_rec *);
static int	oc_row(void *, const struct csvin_rec *);
static int	oc_bad(void *, const struct csvin_rec *, const char *);
static double	oc_number(const struct csvin_rec *, int, const char *);

struct ocv *
ocv_load(const char *path)
{
	static const struct csvin_ops ops = {
		oc_header, oc_row, oc_bad, csvin_skip_blank
	};
	struct loadctx lc;

	memset(&lc, 0, sizeof lc);
	lc.o = cw_calloc(1, sizeof *lc.o);
	csvin_load(path, &ops, &lc, "empty OCV table (no header)",
	    "the OCV table");
	if (lc.o->n < 2)
		cw_die(CW_EXIT_DATA, "%s: an OCV table needs two points or "
		    "more", path);
	return lc.o;
}

static int
oc_header(void *ctx, const struct csvin_rec *r)
{
	struct loadctx *lc = ctx;

	lc->col_soc = csvin_find(r, "soc_pct");
	lc->col_v = csvin_find(r, "voltage_v");
	if (lc->col_soc < 0 || lc->col_v < 0)
		cw_die(CW_EXIT_DATA, "%s:%lu: an OCV table needs columns "
		    "soc_pct and voltage_v", r->src, r->line);
	return 0;
}

static double
oc_number(const struct csvin_rec *r, int k, const char *name)
{
	double x;

	if ((size_t)k >= r->nf || r->len[k] == 0 ||
	    num_parse(r->f[k], r->len[k], '.', &x) != 0 || !cw_isnum(x))
		cw_die(CW_EXIT_DATA, "%s:%lu: %s: not a number: \"%.*s\"",
		    r->src, r->line, name, (size_t)k < r->nf ?
		    (int)r->len[k] : 0, (size_t)k < r->nf ? r->f[k] : "");
	return x;
}

static int
oc_row(void *ctx, const struct csvin_rec *r)
{
	struct loadctx *lc = ctx;
	struct ocv *o = lc->o;
	double s, v;

	s = oc_number(r, lc->col_soc, "soc_pct");
	v = oc_number(r, lc->col_v, "voltage_v");
	if (s < 0 || s > 100)
		cw_die(CW_EXIT_DATA, "%s:%lu: soc_pct %g is outside 0..100",
		    r->src, r->line, s);
	if (!(v > 0 && v < 100))
		cw_die(CW_EXIT_DATA, "%s:%lu: voltage_v %g is not a cell's "
		    "voltage (0..100 V)", r->src, r->line, v);
	if (o->n == OCV_MAX)
		cw_die(CW_EXIT_DATA, "%s:%lu: more than %d points", r->src,
		    r->line, OCV_MAX);
	if (o->n > 0 && !(s > o->soc[o->n - 1] && v > o->v[o->n - 1]))
		cw_die(CW_EXIT_DATA, "%s:%lu: the table must rise: SoC and "
		    "voltage above those of the row before", r->src, r->line);
	o->soc[o->n] = s;
	o->v[o->n] = v;
	o->n++;
	return 0;
}

static int
oc_bad(void *ctx, const struct csvin_rec *r, const char *why)
{
	(void)ctx;
	cw_die(CW_EXIT_DATA, "%s:%lu: OCV table: %s", r->src, r->line, why);
}

double
ocv_soc(const struct ocv *o, double v)
{
	size_t lo = 0, hi = o->n - 1, mid;

	if (!(v >= o->v[0] && v <= o->v[hi]))
		return CW_MISSING;
	while (hi - lo > 1) {
		mid = lo + (hi - lo) / 2;
		if (o->v[mid] <= v)
			lo = mid;
		else
			hi = mid;
	}
	return o->soc[lo] + (o->soc[hi] - o->soc[lo]) * (v - o->v[lo]) /
	    (o->v[hi] - o->v[lo]);
}

void
ocv_free(struct ocv *o)
{
	free(o);
}
