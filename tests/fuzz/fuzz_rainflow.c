/*
 * fuzz_rainflow.c: the streaming rainflow counter (lib/rainflow.c) fed
 * arbitrary sample streams, with its histogram and summary.
 *
 * Configuration: hysteresis, residue mode, bin widths and, for CSV
 * input, the signal column.  Oracles:
 * - every count is 0.5 or 1, every range is >= 0 and not NaN, and a
 *   cycle's start is not after its end;
 * - for a history of tame values (|x| < 1e6) every range is finite and
 *   every mean lies between the smallest and largest value pushed;
 * - ASTM E1049-85 counting with the residue as half cycles uses each of
 *   the N - 1 ranges between N turning points once: 2 * full + half =
 *   N - 1 (a counted cycle is two half cycles);
 * - the histogram or matrix holds every cycle counted (sum of cells =
 *   sum of counts) and the summary agrees with the emitted cycles;
 * - the state is empty after rf_finish().
 */
#include "fuzz_engine.h"
#include "rainflow.h"

struct dev {
	struct devent e;
	struct rf_state rf;
	struct rf_hist hist;
	struct rf_sum sum;
	double lo, hi;		/* smallest and largest value pushed */
	int tame;		/* every value pushed was tame */
	double cycles;		/* counts emitted */
	unsigned long full, half;
	unsigned long nturn;	/* turning points, as the state counts them */
};

struct run {
	double hyst, rw, mw;
	int residue, col;
	struct dev *cur;
};

static void
emit(void *ctx, const struct rf_cycle *c)
{
	struct run *r = ctx;
	struct dev *d = r->cur;

	FZ_CHECK(c->count == 0.5 || c->count == 1.0);
	FZ_CHECK(c->range >= 0);
	FZ_CHECK(c->start <= c->end);
	if (d->tame) {
		FZ_CHECK(isfinite(c->range) && isfinite(c->mean));
		FZ_CHECK(c->mean >= d->lo && c->mean <= d->hi);
		FZ_CHECK(c->range <= d->hi - d->lo);
	}
	if (c->count == 1.0)
		d->full++;
	else
		d->half++;
	d->cycles += c->count;
	d->nturn = d->rf.nturn;
	rf_hist_add(&d->hist, c);
	rf_sum_add(&d->sum, c);
}

static void
init(void *ctx, void *dp)
{
	struct run *r = ctx;
	struct dev *d = dp;

	rf_init(&d->rf, r->hyst);
	rf_hist_init(&d->hist, r->rw, r->mw);
	d->lo = INFINITY;
	d->hi = -INFINITY;
	d->tame = 1;
}

static void
push(void *ctx, void *dp, const struct cw_sample *s)
{
	struct run *r = ctx;
	struct dev *d = dp;
	double x;

	switch (r->col) {
	case 0:
		x = s->soc;
		break;
	case 1:
		x = s->v;
		break;
	case 2:
		x = s->i;
		break;
	case 3:
		x = s->temp;
		break;
	default:
		x = s->x;
		break;
	}
	if (cw_isnum(x)) {
		d->lo = fmin(d->lo, x);
		d->hi = fmax(d->hi, x);
		d->tame &= fz_tame(x);
	}
	r->cur = d;
	rf_push(&d->rf, s->t, x, s->temp, emit, r);
}

static void
finish(void *ctx, void *dp)
{
	struct run *r = ctx;
	struct dev *d = dp;
	struct rf_cell *cell;
	double hsum = 0;
	size_t i, n;

	r->cur = d;
	rf_finish(&d->rf, r->residue, emit, r);
	FZ_CHECK(rf_residue_len(&d->rf) == 0);
	if (r->residue == RF_RESIDUE_HALF && d->full + d->half > 0)
		FZ_CHECK(2 * d->full + d->half == d->nturn - 1);
	FZ_CHECK(d->sum.full == d->full && d->sum.half == d->half);
	FZ_CHECK(d->sum.cycles == d->cycles);
	cell = rf_hist_sorted(&d->hist, &n);
	for (i = 0; i < n; i++) {
		FZ_CHECK(cell[i].cycles > 0);
		if (i > 0)
			FZ_CHECK(cell[i - 1].ri < cell[i].ri ||
			    (cell[i - 1].ri == cell[i].ri &&
			    cell[i - 1].mi < cell[i].mi));
		hsum += cell[i].cycles;
	}
	FZ_CHECK(fabs(hsum - d->cycles) <= 1e-9 * (1 + d->cycles));
	FZ_CHECK((n == 0) == (cell == NULL));
	free(cell);
	rf_hist_free(&d->hist);
	rf_free(&d->rf);
}

int
LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
	static const double hysts[] = { 1, 0, 0.5, 5, 1e-9, 1e-3, 100, 1 };
	static const double widths[] = { 1, 0.1, 7, 1e-3 };
	struct run r;
	struct fz_engine e;

	memset(&r, 0, sizeof(r));
	memset(&e, 0, sizeof(e));
	e.statesz = sizeof(struct dev);
	e.init = init;
	e.push = push;
	e.finish = finish;
	e.ctx = &r;
	/* The configuration is read inside fz_engine_run(); peek at it. */
	if (size >= 4) {
		r.hyst = hysts[(data[0] >> 1) & 7];
		r.residue = (data[1] & 3) % 3;
		r.rw = widths[(data[1] >> 2) & 3];
		r.mw = data[1] & 0x10 ? widths[(data[1] >> 5) & 3] : 0;
		r.col = data[2] % 5;
	} else {
		r.hyst = 1;
		r.rw = 1;
	}
	return fz_engine_run(&e, data, size);
}
