/*
 * wearjoin.c: joining saved cw-wear states with each other and with new
 * rows (wearjoin.h).
 */
#include <stdio.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "cw.h"
#include "devtab.h"
#include "ts.h"
#include "wear.h"
#include "wearjoin.h"

void
wjoin_init(struct wjoin *j, const struct wear_conf *c)
{
	memset(j, 0, sizeof(*j));
	j->conf = c;
	j->devs = devtab_new(sizeof(struct wjoin_dev));
}

void
wjoin_free(struct wjoin *j)
{
	size_t k;

	for (k = 0; k < j->npiece; k++)
		wear_free(&j->piece[k].w);
	free(j->piece);
	j->piece = NULL;
	j->npiece = j->piececap = 0;
	devtab_free(j->devs);
	j->devs = NULL;
}

enum wjoin_where
wjoin_place(cw_time first, cw_time last, cw_time hfirst, cw_time hlast)
{
	if (first >= hlast)
		return WJOIN_AFTER;
	if (last <= hfirst)
		return WJOIN_BEFORE;
	if (first > hfirst && last > hlast)
		return WJOIN_ENDS;
	if (first < hfirst && last < hlast)
		return WJOIN_BEGINS;
	return WJOIN_OVERLAP;
}

int
wjoin_piece_cmp(const void *pa, const void *pb)
{
	const struct wjoin_piece *a = pa, *b = pb;

	if (a->w.acc.first != b->w.acc.first)
		return a->w.acc.first < b->w.acc.first ? -1 : 1;
	if (a->w.acc.last != b->w.acc.last)
		return a->w.acc.last < b->w.acc.last ? -1 : 1;
	return a->line < b->line ? -1 : a->line > b->line;
}

int
wjoin_state(void *ctx, const char *src, unsigned long line, const char *name,
    size_t len, struct wear_dev *w)
{
	struct wjoin *j = ctx;
	struct wjoin_dev *d;
	struct wjoin_piece *p;
	int rc;

	d = devtab_get(j->devs, name, len, NULL);
	if (d != j->run_dev && (rc = wjoin_flush(j)) != 0) {
		wear_free(w);
		return rc;
	}
	j->run_dev = d;
	if (j->npiece == j->piececap) {
		j->piececap = j->piececap ? 2 * j->piececap : 16;
		j->piece = cw_realloc(j->piece, j->piececap *
		    sizeof(*j->piece));
	}
	p = &j->piece[j->npiece++];
	p->w = *w;
	p->line = line;
	snprintf(p->src, sizeof(p->src), "%s", src);
	return 0;
}

/*
 * State P of device D overlaps the one D holds by a little, at its end or
 * its beginning (WHERE): a clock that went back across the boundary of
 * two files.  It is joined all the same, after or before, and counted.
 */
static void
straddle(struct wjoin *j, const struct wjoin_piece *p,
    const struct wjoin_dev *d, const char *where)
{
	char t[3][TS_FMTMAX];

	if (j->straddles++ >= WJOIN_MAXWARN)
		return;
	ts_format(p->w.acc.first, t[0]);
	ts_format(p->w.acc.last, t[1]);
	ts_format(where[0] == 'e' ? d->w.acc.last : d->w.acc.first, t[2]);
	cw_warn_at(p->src, p->line, "the state of %s from %s to %s overlaps "
	    "the one joined so far, which %s at %s: joined all the same, its "
	    "rows on the other side of %s counted (one pass over the rows "
	    "would skip them as going back in time)%s", d->e.name, t[0],
	    t[1], where, t[2], t[2], j->straddles == WJOIN_MAXWARN ?
	    " (further ones only counted)" : "");
}

/* The one message of a state P that overlaps what D holds. */
static void
overlap(const struct wjoin_piece *p, const struct wjoin_dev *d)
{
	char t[4][TS_FMTMAX];

	ts_format(p->w.acc.first, t[0]);
	ts_format(p->w.acc.last, t[1]);
	ts_format(d->w.acc.first, t[2]);
	ts_format(d->w.acc.last, t[3]);
	cw_warn_at(p->src, p->line, "the state of %s from %s to %s overlaps "
	    "the one joined so far, from %s to %s: the same rows twice, or a "
	    "state that falls between two joined before it", d->e.name,
	    t[0], t[1], t[2], t[3]);
}

int
wjoin_flush(struct wjoin *j)
{
	struct wjoin_dev *d = j->run_dev;
	struct wjoin_piece *p;
	size_t k;
	int where;

	if (j->npiece == 0)
		return 0;
	qsort(j->piece, j->npiece, sizeof(*j->piece), wjoin_piece_cmp);
	for (k = 0; k < j->npiece; k++) {
		p = &j->piece[k];
		if (!d->started) {
			d->w = p->w;
			d->started = 1;
			d->e.last_t = d->w.acc.last;
			continue;
		}
		where = wjoin_place(p->w.acc.first, p->w.acc.last,
		    d->w.acc.first, d->w.acc.last);
		if (where == WJOIN_OVERLAP) {
			overlap(p, d);
			for (; k < j->npiece; k++)
				wear_free(&j->piece[k].w);
			j->npiece = 0;
			return CW_EXIT_DATA;
		}
		/* It begins before the end: a clock gone back. */
		if (where == WJOIN_ENDS)
			straddle(j, p, d, "ends");
		else if (where == WJOIN_BEGINS)
			straddle(j, p, d, "begins");
		if (where == WJOIN_AFTER || where == WJOIN_ENDS)
			wear_join(&d->w, &p->w, j->conf);
		else {
			wear_join(&p->w, &d->w, j->conf);
			d->w = p->w;
		}
		j->joins++;
		d->e.last_t = d->w.acc.last;
	}
	j->npiece = 0;
	return 0;
}

void
wjoin_go_on(struct wjoin *j)
{
	size_t k;

	for (k = 0; k < devtab_count(j->devs); k++) {
		struct wjoin_dev *d = devtab_at(j->devs, k);

		d->loaded = 1;
		d->upto = d->w.acc.last;
		d->e.last_t = INT64_MIN;
	}
}

int
wjoin_row(struct wjoin *j, struct wjoin_dev *d, cw_time t)
{
	if (!d->started) {
		wear_init(&d->w, j->conf);
		d->started = 1;
	}
	if (!d->loaded)
		return 0;
	/*
	 * Rows up to the end of the state are in it already when they come
	 * with its last row (the same day again); see wjoin_stale_of() for
	 * the others.
	 */
	if (t <= d->upto) {
		if (d->nstale++ == 0)
			d->stale_first = t;
		d->stale_last = t;
		d->seen_end |= t == d->upto;
		return 1;
	}
	d->loaded = 0;
	d->past = 1;
	return 0;
}

enum wjoin_stale
wjoin_stale_of(const struct wjoin_dev *d, cw_time max_gap)
{
	if (d->nstale == 0)
		return WJOIN_FRESH;
	if (d->seen_end)
		return WJOIN_AGAIN;
	if (d->past && d->stale_first >= d->upto - max_gap)
		return WJOIN_BACK;
	return WJOIN_LATE;
}

void
wjoin_stale_check(struct wjoin *j, const char *state)
{
	char t[3][TS_FMTMAX];
	unsigned long late = 0, late_devs = 0, back = 0, back_devs = 0;
	size_t k;

	for (k = 0; k < devtab_count(j->devs); k++) {
		struct wjoin_dev *d = devtab_at(j->devs, k);

		switch (wjoin_stale_of(d, j->conf->max_gap)) {
		case WJOIN_FRESH:
			continue;
		case WJOIN_AGAIN:
			j->stale += d->nstale;
			j->stale_devs++;
			continue;
		case WJOIN_BACK:
			back += d->nstale;
			back_devs++;
			continue;
		case WJOIN_LATE:
			break;
		}
		late += d->nstale;
		if (late_devs++ >= WJOIN_MAXWARN)
			continue;
		ts_format(d->stale_first, t[0]);
		ts_format(d->stale_last, t[1]);
		ts_format(d->upto, t[2]);
		cw_warn("%s: %.*s: %lu rows from %s to %s come before the end "
		    "of its state (%s) but not with its last row: not in the "
		    "state", state, (int)d->e.namelen, d->e.name, d->nstale,
		    t[0], t[1], t[2]);
	}
	if (late > 0)
		cw_die(CW_EXIT_DATA, "%s: %lu rows of %lu devices are older "
		    "than the state and not in it (a day that came late?); "
		    "nothing written, the state is as it was.  To fold them "
		    "in, rebuild the state from every day in time order, with "
		    "each day's cw-wear --state-out and one cw-wear --merge "
		    "(README, \"A day that comes late\")", state, late,
		    late_devs);
	if (back > 0)
		cw_warn("%s: %lu rows of %lu devices within --max-gap before "
		    "the end of their state, followed by newer rows (a clock "
		    "gone back across the boundary?): not in the state, "
		    "skipped", state, back, back_devs);
	if (j->stale > 0)
		cw_warn("%s: %lu rows of %lu devices up to the end of their "
		    "state came again, its last row among them: already in "
		    "it, skipped", state, j->stale, j->stale_devs);
}
