/* resample.c: see resample.h. */
#include "resample.h"

static cw_time grid_ceil(cw_time, cw_time);
static void restart(struct rs_state *, const struct rs_point *, cw_time,
    rs_emit_fn, void *);

/* The first multiple of STEP at or after T. */
static cw_time
grid_ceil(cw_time t, cw_time step)
{
	cw_time q = t / step * step;

	return q < t ? q + step : q;
}

/* A grid point on the later sample (F 1) takes its value, known or not. */
static double
lerp(double a, double b, double f)
{
	if (f >= 1)
		return b;
	return a + (b - a) * f;
}

/* A first sample, or the first after a gap: the grid starts again. */
static void
restart(struct rs_state *s, const struct rs_point *p, cw_time step,
    rs_emit_fn emit, void *ctx)
{
	s->have = 1;
	s->prev = *p;
	s->g_next = grid_ceil(p->t, step);
	s->acc_start = s->acc_pos = p->t;
	s->acc = 0;
	if (s->g_next == p->t) {
		/* On the grid: the sample itself, its own current. */
		emit(ctx, p);
		s->g_next += step;
	}
}

void
rs_push(struct rs_state *s, const struct rs_point *p, cw_time step,
    cw_time max_gap, rs_emit_fn emit, void *ctx)
{
	const struct rs_point *a = &s->prev;
	struct rs_point g;
	double f;

	if (!s->have || p->t - a->t > max_gap) {
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
		g.i = cw_isnum(p->i) ? s->acc / (double)(s->g_next -
		    s->acc_start) : CW_MISSING;
		emit(ctx, &g);
		s->acc = 0;
		s->acc_start = s->g_next;
		s->g_next += step;
	}
	if (cw_isnum(p->i))
		s->acc += p->i * (double)(p->t - s->acc_pos);
	s->acc_pos = p->t;
	s->prev = *p;
}
