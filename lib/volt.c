/*
 * volt.c: the cell voltage window and its streaming event detector; see
 * volt.h for the rules.
 *
 * The default limits, 4.25 V and 2.50 V per cell, are from memory, not
 * from a data sheet: values typical of the common NMC and LCO cells
 * (charged to 4.2 V, with a little margin above it; discharged to 2.5 to
 * 3.0 V).  LFP cells need others (for example 3.65 V and 2.50 V, also
 * from memory).  cw-volt(1) says so.
 */
#include <math.h>
#include <string.h>

#include "charge.h"
#include "volt.h"

static int	side_of(const struct volt_conf *c, int open, int limit,
		    double vc);
static int	kind_of(const struct volt_conf *c, double i_a);
static void	ev_begin(struct volt_event *ev, int limit, int kind, cw_time t0,
		    double soc0);
static void	ev_row(struct volt_event *ev, cw_time t, double vc, double ah,
		    double soc);
static void	ev_join(struct volt_event *ev, const struct volt_event *tail);
static void	ev_close(struct volt_dev *d, const struct volt_conf *c);

static const char *const limit_names[VOLT_NLIMIT] = { "over", "under" };
static const char *const kind_names[VOLT_NKIND] = {
	"charge", "use", "rest"
};

const char *
volt_limit_name(int limit)
{
	if (limit < 0 || limit >= VOLT_NLIMIT)
		return "?";
	return limit_names[limit];
}

const char *
volt_kind_name(int kind)
{
	if (kind < 0 || kind >= VOLT_NKIND)
		return "?";
	return kind_names[kind];
}

void
volt_conf_default(struct volt_conf *c)
{
	memset(c, 0, sizeof(*c));
	c->vmax = VOLT_MAX;
	c->vmin = VOLT_MIN;
	c->hyst = VOLT_HYST;
	c->min_current = 0.05;
	c->min_duration = 30 * CW_US_PER_S;
	c->max_gap = CHARGE_MAX_GAP;
}

void
volt_init(struct volt_dev *d, int cells)
{
	memset(d, 0, sizeof(*d));
	d->cells = cells < 1 ? 1 : cells;
	d->prev_soc = CW_MISSING;
	d->v_min = INFINITY;
	d->v_max = -INFINITY;
}

/*
 * The side of the window cell voltage VC is on: VOLT_OVER, VOLT_UNDER or
 * -1 inside.  With an event open on side LIMIT, VC must be back inside
 * by the hysteresis to leave it; beyond the opposite limit it counts for
 * that limit.
 */
static int
side_of(const struct volt_conf *c, int open, int limit, double vc)
{
	if (vc > c->vmax)
		return VOLT_OVER;
	if (vc < c->vmin)
		return VOLT_UNDER;
	if (open && limit == VOLT_OVER && vc > c->vmax - c->hyst)
		return VOLT_OVER;
	if (open && limit == VOLT_UNDER && vc < c->vmin + c->hyst)
		return VOLT_UNDER;
	return -1;
}

static int
kind_of(const struct volt_conf *c, double i_a)
{
	if (i_a > c->min_current)
		return VOLT_CHARGE;
	if (i_a < -c->min_current)
		return VOLT_USE;
	return VOLT_REST;
}

static void
ev_begin(struct volt_event *ev, int limit, int kind, cw_time t0, double soc0)
{
	ev->limit = limit;
	ev->kind = kind;
	ev->start = ev->end = t0;
	ev->v_min = INFINITY;
	ev->v_max = -INFINITY;
	ev->charge_ah = ev->ah_in = 0.0;
	ev->soc_start = ev->soc_end = soc0;
	ev->rows = 0;
}

/* Add the row at T, cell voltage VC, that carried AH, to EV. */
static void
ev_row(struct volt_event *ev, cw_time t, double vc, double ah, double soc)
{
	ev->end = t;
	if (vc < ev->v_min)
		ev->v_min = vc;
	if (vc > ev->v_max)
		ev->v_max = vc;
	ev->charge_ah += ah;
	if (ev->kind == VOLT_CHARGE)
		ev->ah_in += ah;
	if (cw_isnum(soc)) {
		if (!cw_isnum(ev->soc_start))
			ev->soc_start = soc;
		ev->soc_end = soc;
	}
	ev->rows++;
}

/* Append TAIL, which follows EV, to it. */
static void
ev_join(struct volt_event *ev, const struct volt_event *tail)
{
	ev->end = tail->end;
	if (tail->v_min < ev->v_min)
		ev->v_min = tail->v_min;
	if (tail->v_max > ev->v_max)
		ev->v_max = tail->v_max;
	ev->charge_ah += tail->charge_ah;
	ev->ah_in += tail->ah_in;
	if (cw_isnum(tail->soc_end))
		ev->soc_end = tail->soc_end;
	ev->rows += tail->rows;
}

/*
 * End the event in progress, with a pending change of kind that did not
 * last: keep it, or drop it if short.
 */
static void
ev_close(struct volt_dev *d, const struct volt_conf *c)
{
	const struct volt_event *ev = &d->ev;

	if (d->tail_on)
		ev_join(&d->ev, &d->tail);
	d->tail_on = 0;
	d->open = 0;
	if (ev->end - ev->start < c->min_duration) {
		d->short_dropped++;
		return;
	}
	d->events[ev->limit][ev->kind]++;
	d->time[ev->limit] += ev->end - ev->start;
	d->ah_in[ev->limit] += ev->ah_in;
	if (c->emit != NULL)
		c->emit(c->ctx, d, ev);
}

void
volt_push(struct volt_dev *d, const struct volt_conf *c, cw_time t,
    double v, double i_a, double soc)
{
	struct volt_event *ev = &d->ev;
	cw_time t0;
	double ah, soc0, vc = CW_MISSING;
	int brk, side = -1, kind = VOLT_REST;

	/*
	 * A row stands for the interval since the previous row; the first
	 * row, and a row after a longer gap than max_gap, stands for its
	 * own instant and carries no charge.
	 */
	brk = !d->have_prev || t < d->prev_t || t - d->prev_t > c->max_gap;
	if (brk) {
		t0 = t;
		soc0 = soc;
		ah = 0.0;
		if (d->open)
			ev_close(d, c);
	} else {
		t0 = d->prev_t;
		soc0 = d->prev_soc;
		ah = charge_ah(i_a, d->prev_t, t, c->max_gap);
	}
	if (!d->have_prev)
		d->first = t;
	d->rows++;
	if (cw_isnum(v) && cw_isnum(i_a)) {
		vc = v / d->cells;
		if (vc < d->v_min)
			d->v_min = vc;
		if (vc > d->v_max)
			d->v_max = vc;
		side = side_of(c, d->open, ev->limit, vc);
		kind = kind_of(c, i_a);
	} else
		d->unjudged++;

	if (d->open && side != ev->limit)
		ev_close(d, c);
	if (side < 0)
		;
	else if (!d->open) {
		d->open = 1;
		ev_begin(ev, side, kind, t0, soc0);
		ev_row(ev, t, vc, ah, soc);
	} else if (kind == ev->kind) {
		if (d->tail_on)
			ev_join(ev, &d->tail);
		d->tail_on = 0;
		ev_row(ev, t, vc, ah, soc);
	} else {
		/*
		 * Another kind: it splits the event only once it has lasted
		 * the minimum duration, so a noisy current near
		 * --min-current does not cut a storage event into pieces.
		 */
		if (d->tail_on && d->tail.kind != kind) {
			ev_join(ev, &d->tail);
			d->tail_on = 0;
		}
		if (!d->tail_on) {
			d->tail_on = 1;
			ev_begin(&d->tail, side, kind, t0, soc0);
		}
		ev_row(&d->tail, t, vc, ah, soc);
		if (d->tail.end - d->tail.start >= c->min_duration) {
			d->tail_on = 0;
			ev_close(d, c);
			*ev = d->tail;
			d->open = 1;
		}
	}
	d->have_prev = 1;
	d->prev_t = t;
	d->prev_soc = soc;
}

void
volt_finish(struct volt_dev *d, const struct volt_conf *c)
{
	if (d->open)
		ev_close(d, c);
}
