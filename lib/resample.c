/* resample.c: see resample.h. */
#include "resample.h"

static void restart(struct rs_state *, const struct rs_point *, cw_time,
    rs_emit_fn, void *);

static double
lerp(double a, double b, double f)
{
	if (f >= 1)
		return b;
	return a + (b - a) * f;
}

/*
 * A first sample, or the first after a gap: the grid starts again at the
 * grid point at or before the sample, which takes the sample's values (no
 * charge of the run falls in its interval; it gives the next point's
 * interval a start).
 */
static void
restart(struct rs_state *s, const struct rs_point *p, cw_time step,
    rs_emit_fn emit, void *ctx)
{
	struct rs_point g = *p;
	cw_time q = p->t / step * step;

	if (q > p->t)
		q -= step;	/* before the epoch */
	s->have = 1;
	s->prev = *p;
	s->g_next = q + step;
	s->acc_pos = p->t;
	s->acc = 0;
	g.t = q;
	emit(ctx, &g);
}

void
rs_push(struct rs_state *s, const struct rs_point *p, cw_time step,
    cw_time max_gap, rs_emit_fn emit, void *ctx)
{
	const struct rs_point *a = &s->prev;
	struct rs_point g;
	double f;

	if (!s->have || p->t - a->t > max_gap) {
		rs_flush(s, step, emit, ctx);
		restart(s, p, step, emit, ctx);
		return;
	}
	if (p->t <= a->t)
		return;		/* the caller has removed duplicates */
	while (s->g_next <= p->t) {
		if (cw_isnum(p->i))
			s->acc += p->i * (double)(s->g_next - s->acc_pos);
		s->acc_pos = s->g_next;
		f = (double)(s->g_next - a->t) / (double)(p->t - a->t);
		g.t = s->g_next;
		g.v = lerp(a->v, p->v, f);
		g.temp = lerp(a->temp, p->temp, f);
		g.soc = lerp(a->soc, p->soc, f);
		g.i = cw_isnum(p->i) ? s->acc / (double)step : CW_MISSING;
		g.key = g.t == p->t ? p->key : a->key;
		emit(ctx, &g);
		s->acc = 0;
		s->g_next += step;
	}
	if (cw_isnum(p->i))
		s->acc += p->i * (double)(p->t - s->acc_pos);
	s->acc_pos = p->t;
	s->prev = *p;
}

void
rs_flush(struct rs_state *s, cw_time step, rs_emit_fn emit, void *ctx)
{
	struct rs_point g;

	if (!s->have)
		return;
	s->have = 0;
	if (s->acc_pos <= s->g_next - step)
		return;		/* the run ended on a grid point */
	/*
	 * The run ends inside a grid interval: its last point carries the
	 * charge of that piece, with the last sample's values held (for
	 * less than one step).
	 */
	g = s->prev;
	g.t = s->g_next;
	g.i = cw_isnum(s->prev.i) ? s->acc / (double)step : CW_MISSING;
	emit(ctx, &g);
}
