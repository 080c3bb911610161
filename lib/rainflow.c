/*
 * rainflow.c: turning points with hysteresis and the three-point rule of
 * ASTM E1049-85 section 5.4.4 (see rainflow.h).
 */
#include <float.h>
#include <stddef.h>
#include <limits.h>
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "rainflow.h"
#include "statefmt.h"

/* Where the history is heading. */
enum {
	RF_DIR_EMPTY,	/* no sample yet */
	RF_DIR_FLAT,	/* not yet moved by the hysteresis */
	RF_DIR_UP,	/* the provisional extreme is a peak */
	RF_DIR_DOWN	/* the provisional extreme is a valley */
};

#define RF_MINCAP 16
#define RF_ULPS 4.0	/* rounding allowance, in units in the last place */

static double slack(double, double);
static int moved(double, double, double);
static void emit_pair(const struct rf_point *, const struct rf_point *,
    double, rf_emit_fn *, void *);
static void turn(struct rf_state *, const struct rf_point *, rf_emit_fn *,
    void *);
static int tie(const struct rf_point *);
static void pair_halves(struct rf_state *, rf_emit_fn *, void *);
static void repeat(struct rf_state *, rf_emit_fn *, void *);
static size_t cell_slot(const struct rf_hist *, long, long);
static void hist_grow(struct rf_hist *);
static int cell_cmp(const void *, const void *);

/* The rounding allowance for a difference of A and B. */
static double
slack(double a, double b)
{
	return RF_ULPS * DBL_EPSILON * fmax(fabs(a), fabs(b));
}

/* Whether going from FROM to TO is a move of at least H (and above 0). */
static int
moved(double from, double to, double h)
{
	double d = fabs(to - from);

	return d > 0 && d + slack(from, to) >= h;
}

void
rf_init(struct rf_state *s, double hyst)
{
	memset(s, 0, sizeof(*s));
	s->hyst = hyst > 0 ? hyst : 0;
	s->dir = RF_DIR_EMPTY;
}

void
rf_free(struct rf_state *s)
{
	free(s->pt);
	s->pt = NULL;
	s->n = s->cap = s->start = 0;
}

size_t
rf_residue_len(const struct rf_state *s)
{
	return s->n;
}

static void
emit_pair(const struct rf_point *a, const struct rf_point *b, double count,
    rf_emit_fn *emit, void *ctx)
{
	struct rf_cycle c;

	c.range = fabs(b->x - a->x);
	c.mean = (a->x + b->x) / 2;
	c.count = count;
	c.start = a->t < b->t ? a->t : b->t;
	c.end = a->t < b->t ? b->t : a->t;
	if (cw_isnum(a->aux) && cw_isnum(b->aux))
		c.aux_mean = (a->aux + b->aux) / 2;
	else if (cw_isnum(a->aux))
		c.aux_mean = a->aux;
	else
		c.aux_mean = b->aux;
	emit(ctx, &c);
}

/*
 * Whether the start-side ranges P[0]-P[1] and P[1]-P[2] are equal: the
 * start side's ranges never fall, so "not smaller" is enough.
 */
static int
tie(const struct rf_point *p)
{
	double r0 = fabs(p[1].x - p[0].x), r1 = fabs(p[2].x - p[1].x);

	return r0 + slack(fmax(fabs(p[0].x), fabs(p[1].x)), p[2].x) >= r1;
}

/*
 * The last two start-side half cycles have the same range and mean: the
 * history went S0 -> S1 -> S2 with S2 back at S0.  Count them as the one
 * full cycle S1-S2 and take S1, S2 out of the residue; S0 is the starting
 * point again (its value is S2's).
 */
static void
pair_halves(struct rf_state *s, rf_emit_fn *emit, void *ctx)
{
	size_t i = s->start;

	emit_pair(&s->pt[i - 1], &s->pt[i], 1.0, emit, ctx);
	memmove(&s->pt[i - 1], &s->pt[i + 1], (s->n - i - 1) *
	    sizeof(*s->pt));
	s->n -= 2;
	s->start -= 2;
}

/*
 * A confirmed turning point P: push it, then apply the three-point rule
 * (ASTM E1049-85 5.4.4, steps 2 to 5) until X < Y or fewer than three
 * points are left after the starting point.
 */
static void
turn(struct rf_state *s, const struct rf_point *p, rf_emit_fn *emit,
    void *ctx)
{
	struct rf_point *a, *b, *c;
	double x, y;

	if (s->n == s->cap) {
		s->cap = s->cap ? 2 * s->cap : RF_MINCAP;
		s->pt = cw_realloc(s->pt, s->cap * sizeof(*s->pt));
	}
	s->pt[s->n++] = *p;
	s->nturn++;
	while (s->n - s->start >= 3) {
		a = &s->pt[s->n - 3];
		b = a + 1;
		c = a + 2;
		y = fabs(b->x - a->x);
		x = fabs(c->x - b->x);
		if (x + slack(fmax(fabs(a->x), fabs(b->x)), c->x) < y)
			break;			/* step 3: X < Y */
		if (!s->periodic && s->n - 3 == s->start) {
			s->start++;		/* step 5: a half cycle */
			if (!s->raw_start && s->start >= 2 &&
			    tie(&s->pt[s->start - 2]))
				pair_halves(s, emit, ctx);
			continue;
		}
		emit_pair(a, b, 1.0, emit, ctx);	/* step 4 */
		*a = *c;
		s->n -= 2;
	}
}

void
rf_push(struct rf_state *s, cw_time t, double x, double aux,
    rf_emit_fn *emit, void *ctx)
{
	struct rf_point p;

	if (!isfinite(x))
		return;
	p.x = x;
	p.aux = aux;
	p.t = t;
	switch (s->dir) {
	case RF_DIR_EMPTY:
		s->lo = s->hi = p;
		s->dir = RF_DIR_FLAT;
		break;
	case RF_DIR_FLAT:
		if (x > s->lo.x && moved(s->lo.x, x, s->hyst)) {
			turn(s, &s->lo, emit, ctx);
			s->dir = RF_DIR_UP;
			s->cand = p;
		} else if (x < s->hi.x && moved(s->hi.x, x, s->hyst)) {
			turn(s, &s->hi, emit, ctx);
			s->dir = RF_DIR_DOWN;
			s->cand = p;
		} else if (x < s->lo.x)
			s->lo = p;
		else if (x > s->hi.x)
			s->hi = p;
		break;
	case RF_DIR_UP:
		if (x > s->cand.x)
			s->cand = p;
		else if (x < s->cand.x && moved(s->cand.x, x, s->hyst)) {
			turn(s, &s->cand, emit, ctx);
			s->dir = RF_DIR_DOWN;
			s->cand = p;
		}
		break;
	case RF_DIR_DOWN:
		if (x < s->cand.x)
			s->cand = p;
		else if (x > s->cand.x && moved(s->cand.x, x, s->hyst)) {
			turn(s, &s->cand, emit, ctx);
			s->dir = RF_DIR_UP;
			s->cand = p;
		}
		break;
	}
}

/*
 * RF_RESIDUE_REPEAT: the residue R[0..n) as one period of a repeating
 * history.  Rotated to start and end at its (first) maximum M, it runs
 * through a fresh counter without a starting point, so every range closes
 * as a full cycle and M alone is left.  The joint from R[n-1] back to R[0]
 * passes the same hysteresis, which drops a point that is no longer a
 * turning point there.
 */
static void
repeat(struct rf_state *s, rf_emit_fn *emit, void *ctx)
{
	struct rf_state q;
	size_t i, k, m;

	if (s->n < 2)
		return;
	for (m = 0, i = 1; i < s->n; i++)
		if (s->pt[i].x > s->pt[m].x)
			m = i;
	rf_init(&q, s->hyst);
	q.periodic = 1;
	for (k = 0; k <= s->n; k++) {
		const struct rf_point *p = &s->pt[(m + k) % s->n];

		rf_push(&q, p->t, p->x, p->aux, emit, ctx);
	}
	if (q.dir == RF_DIR_UP || q.dir == RF_DIR_DOWN)
		turn(&q, &q.cand, emit, ctx);
	/* Only M is left; should rounding leave more, count it as halves. */
	for (i = 0; i + 1 < q.n; i++)
		emit_pair(&q.pt[i], &q.pt[i + 1], 0.5, emit, ctx);
	rf_free(&q);
}

void
rf_finish(struct rf_state *s, int residue_mode, rf_emit_fn *emit,
    void *ctx)
{
	size_t i;

	if (s->dir == RF_DIR_UP || s->dir == RF_DIR_DOWN)
		turn(s, &s->cand, emit, ctx);
	if (residue_mode == RF_RESIDUE_REPEAT)
		repeat(s, emit, ctx);
	else
		for (i = 0; i + 1 < s->n; i++)
			emit_pair(&s->pt[i], &s->pt[i + 1],
			    residue_mode == RF_RESIDUE_FULL ? 1.0 : 0.5, emit,
			    ctx);
	s->n = s->start = 0;
	s->nturn = 0;
	s->dir = RF_DIR_EMPTY;
}

void
rf_join(struct rf_state *a, const struct rf_state *b, rf_emit_fn *emit,
    void *ctx)
{
	const struct rf_point *p, *q;
	size_t i;

	for (i = 0; i < b->n; i++)
		rf_push(a, b->pt[i].t, b->pt[i].x, b->pt[i].aux, emit, ctx);
	switch (b->dir) {
	case RF_DIR_FLAT:
		/* Not moved yet: its extremes, the earlier first. */
		p = b->hi.t < b->lo.t ? &b->hi : &b->lo;
		q = p == &b->lo ? &b->hi : &b->lo;
		rf_push(a, p->t, p->x, p->aux, emit, ctx);
		if (q->x != p->x)
			rf_push(a, q->t, q->x, q->aux, emit, ctx);
		break;
	case RF_DIR_UP:
	case RF_DIR_DOWN:
		rf_push(a, b->cand.t, b->cand.x, b->cand.aux, emit, ctx);
		break;
	}
}

int
rf_check(const struct rf_state *s)
{
	size_t i;

	if (!(s->hyst >= 0) || !isfinite(s->hyst) || s->dir < RF_DIR_EMPTY ||
	    s->dir > RF_DIR_DOWN || s->start > s->n || s->n > s->cap ||
	    (s->n > 0 && s->pt == NULL) || s->periodic != 0 ||
	    (s->raw_start != 0 && s->raw_start != 1))
		return -1;
	/* Turning points come only once the history has moved. */
	if ((s->dir == RF_DIR_EMPTY || s->dir == RF_DIR_FLAT) && s->n != 0)
		return -1;
	if ((s->dir == RF_DIR_UP || s->dir == RF_DIR_DOWN) && s->n == 0)
		return -1;
	if (s->dir == RF_DIR_FLAT && (!isfinite(s->lo.x) ||
	    !isfinite(s->hi.x) || s->lo.x > s->hi.x))
		return -1;
	if ((s->dir == RF_DIR_UP || s->dir == RF_DIR_DOWN) &&
	    (!isfinite(s->cand.x) || s->cand.t < s->pt[s->n - 1].t))
		return -1;
	for (i = 0; i < s->n; i++)
		if (!isfinite(s->pt[i].x) || (i > 0 &&
		    s->pt[i].t < s->pt[i - 1].t))
			return -1;
	return 0;
}

long
rf_bin_index(double v, double w)
{
	const double lim = fmin(1e15, (double)(LONG_MAX / 2));
	double q = v / w, r = nearbyint(q);

	if (fabs(q - r) <= 1e-9 * fmax(1.0, fabs(q)))
		q = r;
	/* Far beyond any real bin count; keeps the conversion defined. */
	if (!(q < lim))
		q = lim;
	if (q < -lim)
		q = -lim;
	return (long)ceil(q) - 1;
}

void
rf_hist_init(struct rf_hist *h, double range_width, double mean_width)
{
	memset(h, 0, sizeof(*h));
	h->rw = range_width;
	h->mw = mean_width > 0 ? mean_width : 0;
}

void
rf_hist_free(struct rf_hist *h)
{
	free(h->cell);
	h->cell = NULL;
	h->n = h->cap = 0;
}

/* The slot of cell (RI, MI): where it is, or the empty slot it would take. */
static size_t
cell_slot(const struct rf_hist *h, long ri, long mi)
{
	unsigned long long k = (unsigned long long)ri * 0x9E3779B97F4A7C15ull ^
	    (unsigned long long)mi * 0xC2B2AE3D27D4EB4Full;
	size_t i = (size_t)(k ^ (k >> 29)) & (h->cap - 1);

	while (h->cell[i].cycles != 0 &&
	    (h->cell[i].ri != ri || h->cell[i].mi != mi))
		i = (i + 1) & (h->cap - 1);
	return i;
}

static void
hist_grow(struct rf_hist *h)
{
	struct rf_cell *old = h->cell;
	size_t oldcap = h->cap, i;

	h->cap = oldcap ? 2 * oldcap : 64;
	h->cell = cw_calloc(h->cap, sizeof(*h->cell));
	for (i = 0; i < oldcap; i++)
		if (old[i].cycles != 0)
			h->cell[cell_slot(h, old[i].ri, old[i].mi)] = old[i];
	free(old);
}

void
rf_hist_add(struct rf_hist *h, const struct rf_cycle *c)
{
	long ri, mi;
	size_t i;

	/*
	 * A cycle of an infinite range (values near the limits of a double)
	 * lands in the last bin rf_bin_index() allows, not nowhere: nothing
	 * counted is left out of the histogram.
	 */
	if (!(c->count > 0))
		return;
	ri = rf_bin_index(c->range, h->rw);
	mi = h->mw > 0 ? rf_bin_index(c->mean, h->mw) : 0;
	if (2 * (h->n + 1) > h->cap)
		hist_grow(h);
	i = cell_slot(h, ri, mi);
	if (h->cell[i].cycles == 0) {
		h->cell[i].ri = ri;
		h->cell[i].mi = mi;
		h->n++;
	}
	h->cell[i].cycles += c->count;
}

static int
cell_cmp(const void *pa, const void *pb)
{
	const struct rf_cell *a = pa, *b = pb;

	if (a->ri != b->ri)
		return a->ri < b->ri ? -1 : 1;
	if (a->mi != b->mi)
		return a->mi < b->mi ? -1 : 1;
	return 0;
}

struct rf_cell *
rf_hist_sorted(const struct rf_hist *h, size_t *n)
{
	struct rf_cell *out;
	size_t i, k = 0;

	*n = h->n;
	if (h->n == 0)
		return NULL;
	out = cw_malloc(h->n * sizeof(*out));
	for (i = 0; i < h->cap; i++)
		if (h->cell[i].cycles != 0)
			out[k++] = h->cell[i];
	qsort(out, k, sizeof(*out), cell_cmp);
	return out;
}

void
rf_sum_add(struct rf_sum *m, const struct rf_cycle *c)
{
	m->cycles += c->count;
	m->range_sum += c->count * c->range;
	if (c->range > m->max_range)
		m->max_range = c->range;
	if (c->count < 1)
		m->half++;
	else
		m->full++;
}

int
rf_residue_parse(const char *s)
{
	if (strcmp(s, "half") == 0)
		return RF_RESIDUE_HALF;
	if (strcmp(s, "full") == 0)
		return RF_RESIDUE_FULL;
	if (strcmp(s, "repeat") == 0)
		return RF_RESIDUE_REPEAT;
	return -1;
}

double
rf_sum_mean_range(const struct rf_sum *m)
{
	return m->cycles > 0 ? m->range_sum / m->cycles : CW_MISSING;
}

#define RF_F(n, k, m, lo, hi, r) \
	{ n, k, offsetof(struct rf_state, m), lo, hi, r, 1 }
#define RF_T(n, m)	RF_F(n, SFMT_TIME, m, 0, 0, SFMT_R_TIME)
#define RF_X(n, m)	RF_F(n, SFMT_DBL, m, 0, 0, SFMT_R_ANY)
#define RF_N(n, m)	RF_F(n, SFMT_DBLN, m, 0, 0, SFMT_R_ANY)

/* The fields of a saved state, in the order of its columns. */
static const struct sfmt_spec rf_fields[] = {
	RF_F("rf_raw", SFMT_INT, raw_start, 0, 1, SFMT_R_ANY),
	RF_F("rf_dir", SFMT_INT, dir, RF_DIR_EMPTY, RF_DIR_DOWN, SFMT_R_ANY),
	RF_T("rf_lo_t", lo.t),
	RF_X("rf_lo_x", lo.x),
	RF_N("rf_lo_aux", lo.aux),
	RF_T("rf_hi_t", hi.t),
	RF_X("rf_hi_x", hi.x),
	RF_N("rf_hi_aux", hi.aux),
	RF_T("rf_cand_t", cand.t),
	RF_X("rf_cand_x", cand.x),
	RF_N("rf_cand_aux", cand.aux),
	RF_F("rf_start", SFMT_SIZE, start, 0, 0, SFMT_R_ANY),
	RF_F("rf_nturn", SFMT_UL, nturn, 0, 0, SFMT_R_ROWS)
};

const struct sfmt_spec *
rf_state_fields(size_t *n)
{
	*n = sizeof(rf_fields) / sizeof(rf_fields[0]);
	return rf_fields;
}

void
rf_state_put_residue(struct sfmt_buf *b, const struct rf_state *s)
{
	size_t k;

	for (k = 0; k < s->n; k++) {
		if (k > 0)
			sfmt_add(b, ";", 1);
		sfmt_i64(b, (long long)s->pt[k].t);
		sfmt_add(b, ":", 1);
		sfmt_dbl(b, s->pt[k].x, 0);
		sfmt_add(b, ":", 1);
		sfmt_dbl(b, s->pt[k].aux, 1);
	}
}

int
rf_state_get_residue(struct rf_state *s, const char *str, size_t n)
{
	const char *p = str, *e = str + n, *q, *f[3];
	struct rf_point pt;
	size_t cnt = 0, i, fl[3];

	if (n == 0)
		return 0;
	for (i = 0; i < n; i++)
		cnt += str[i] == ';';
	cnt++;
	s->pt = cw_malloc(cnt * sizeof(*s->pt));
	s->cap = cnt;
	while (p <= e) {
		q = memchr(p, ';', (size_t)(e - p));
		if (q == NULL)
			q = e;
		if (sfmt_split(p, (size_t)(q - p), ':', f, fl, 3) != 3 ||
		    sfmt_get_field(SFMT_TIME, f[0], fl[0], 0, 0, &pt.t) < 0 ||
		    sfmt_get_field(SFMT_DBL, f[1], fl[1], 0, 0, &pt.x) < 0 ||
		    sfmt_get_field(SFMT_DBLN, f[2], fl[2], 0, 0, &pt.aux) < 0)
			return -1;
		s->pt[s->n++] = pt;
		p = q + 1;
	}
	return 0;
}
