/*
 * dcirjoin.c: joining saved cw-dcir states with each other and going on
 * from them with new rows (dcirjoin.h).
 */
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cw.h"
#include "dcirjoin.h"
#include "dcirstate.h"
#include "devtab.h"
#include "ts.h"

void
djoin_init(struct djoin *j, const struct dstate_conf *sc)
{
	memset(j, 0, sizeof(*j));
	j->sc = sc;
	j->devs = devtab_new(sizeof(struct djoin_dev));
}

void
djoin_free(struct djoin *j)
{
	size_t k;

	for (k = 0; k < j->npiece; k++)
		dstate_free(&j->piece[k].w);
	free(j->piece);
	j->piece = NULL;
	j->npiece = j->piececap = 0;
	if (j->devs == NULL)
		return;
	for (k = 0; k < devtab_count(j->devs); k++)
		dstate_free(&((struct djoin_dev *)devtab_at(j->devs, k))->ds);
	devtab_free(j->devs);
	j->devs = NULL;
}

enum djoin_where
djoin_place(cw_time first, cw_time last, cw_time hfirst, cw_time hlast)
{
	if (first > hlast)
		return DJOIN_AFTER;
	if (last < hfirst)
		return DJOIN_BEFORE;
	return DJOIN_OVERLAP;
}

int
djoin_piece_cmp(const void *pa, const void *pb)
{
	const struct djoin_piece *a = pa, *b = pb;
	const struct devent *x = &a->dev->e, *y = &b->dev->e;
	int c;

	if (a->dev != b->dev) {
		/* By name, as devtab_sorted(). */
		c = memcmp(x->name, y->name, x->namelen < y->namelen ?
		    x->namelen : y->namelen);
		if (c == 0)
			c = x->namelen < y->namelen ? -1 : 1;
		return c;
	}
	if (a->w.first != b->w.first)
		return a->w.first < b->w.first ? -1 : 1;
	return a->line < b->line ? -1 : a->line > b->line;
}

int
djoin_state(void *ctx, const char *src, unsigned long line, const char *name,
    size_t len, struct dstate_dev *w)
{
	struct djoin *j = ctx;
	struct djoin_piece *p;

	if (j->npiece == j->piececap) {
		j->piececap = j->piececap ? 2 * j->piececap : 16;
		j->piece = cw_realloc(j->piece, j->piececap *
		    sizeof(*j->piece));
	}
	p = &j->piece[j->npiece++];
	p->dev = devtab_get(j->devs, name, len, NULL);
	p->w = *w;
	p->line = line;
	snprintf(p->src, sizeof(p->src), "%s", src);
	return 0;
}

/* The one message of a state P that overlaps what its device holds. */
static void
overlap(const struct djoin_piece *p)
{
	const struct djoin_dev *d = p->dev;
	char a[4][TS_FMTMAX];

	ts_format(p->w.first, a[0]);
	ts_format(p->w.last, a[1]);
	ts_format(d->ds.first, a[2]);
	ts_format(d->ds.last, a[3]);
	cw_warn_at(p->src, p->line, "the state of %s from %s to %s overlaps "
	    "the one joined so far, from %s to %s: the same rows twice, or a "
	    "state that falls between two joined before it", d->e.name,
	    a[0], a[1], a[2], a[3]);
}

int
djoin_flush(struct djoin *j)
{
	struct djoin_dev *d;
	struct dstate_dev *w;
	size_t k;

	if (j->npiece == 0)
		return 0;
	qsort(j->piece, j->npiece, sizeof(*j->piece), djoin_piece_cmp);
	for (k = 0; k < j->npiece; k++) {
		w = &j->piece[k].w;
		d = j->piece[k].dev;
		if (d->ds.rows == 0) {
			dstate_free(&d->ds);
			d->ds = *w;
			d->e.last_t = d->ds.last;
			continue;
		}
		switch (djoin_place(w->first, w->last, d->ds.first,
		    d->ds.last)) {
		case DJOIN_AFTER:
			j->joined += dstate_join(&d->ds, w, j->sc);
			break;
		case DJOIN_BEFORE:
			j->joined += dstate_join(w, &d->ds, j->sc);
			d->ds = *w;
			break;
		case DJOIN_OVERLAP:
			overlap(&j->piece[k]);
			for (; k < j->npiece; k++)
				dstate_free(&j->piece[k].w);
			j->npiece = 0;
			return CW_EXIT_DATA;
		}
		d->e.last_t = d->ds.last;
	}
	j->npiece = 0;
	return 0;
}

void
djoin_go_on(struct djoin *j)
{
	size_t k;

	for (k = 0; k < devtab_count(j->devs); k++) {
		struct djoin_dev *d = devtab_at(j->devs, k);

		d->loaded = 1;
		d->upto = d->ds.last;
		d->e.last_t = INT64_MIN;
	}
}

int
djoin_row(struct djoin *j, struct djoin_dev *d, cw_time t)
{
	if (!d->loaded)
		return 0;
	/* Rows up to the end of the state are in it already. */
	if (t <= d->upto) {
		j->stale++;
		return 1;
	}
	d->loaded = 0;
	return 0;
}
