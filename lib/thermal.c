/*
 * thermal.c: temperature zones and the streaming event detector; see
 * thermal.h for the rules.
 */
#include <math.h>
#include <string.h>

#include "charge.h"
#include "thermal.h"

static int	active(const struct thermal_conf *c, int kind, double i_a);
static int	out_side(const struct thermal_conf *c, int kind, int side,
		    double temp_c);
static void	ev_start(struct thermal_event *ev, int kind, int side,
		    cw_time t0, double soc0);
static void	ev_add(struct thermal_event *ev, const struct thermal_limits *l,
		    cw_time t, double ah, double temp_c, double soc,
		    double i_a, double v);
static void	run_close(struct thermal_run *r);
static void	run_join(struct thermal_dev *d, struct thermal_run *r);
static void	run_flush(struct thermal_dev *d, const struct thermal_conf *c,
		    struct thermal_run *r);
static void	gap_add(struct thermal_run *r, double ah, double temp_c,
		    double soc);

static const char *const zone_names[THERMAL_NZONE] = {
	"below-min", "cool", "normal", "warm", "above-max"
};

static const char *const kind_names[THERMAL_NKIND] = { "charge", "use" };

static const char *const protocol_names[THERMAL_NPROTO] = {
	"within", "over-current", "over-voltage", "no-charge-allowed",
	"unknown"
};

void
thermal_limits_default(struct thermal_limits *l)
{
	l->t[0] = THERMAL_T1;
	l->t[1] = THERMAL_T2;
	l->t[2] = THERMAL_T3;
	l->t[3] = THERMAL_T4;
	l->use_lo = THERMAL_USE_LO;
	l->use_hi = THERMAL_USE_HI;
	l->hyst = THERMAL_HYST;
}

int
thermal_zone_of(const struct thermal_limits *l, double temp_c)
{
	if (!cw_isnum(temp_c))
		return THERMAL_NORMAL;
	if (temp_c < l->t[0])
		return THERMAL_BELOW_MIN;
	if (temp_c < l->t[1])
		return THERMAL_COOL;
	if (temp_c <= l->t[2])
		return THERMAL_NORMAL;
	if (temp_c <= l->t[3])
		return THERMAL_WARM;
	return THERMAL_ABOVE_MAX;
}

const char *
thermal_zone_name(int zone)
{
	if (zone < 0 || zone >= THERMAL_NZONE)
		return "?";
	return zone_names[zone];
}

int
thermal_zone_severity(int zone)
{
	switch (zone) {
	case THERMAL_BELOW_MIN:
	case THERMAL_ABOVE_MAX:
		return 2;
	case THERMAL_COOL:
	case THERMAL_WARM:
		return 1;
	default:
		return 0;
	}
}

void
thermal_ah_add(struct thermal_ah *a, const struct thermal_limits *l,
    double temp_c, double ah)
{
	if (cw_isnum(temp_c))
		a->zone[thermal_zone_of(l, temp_c)] += ah;
	else
		a->no_temp += ah;
}

const char *
thermal_kind_name(int kind)
{
	if (kind < 0 || kind >= THERMAL_NKIND)
		return "?";
	return kind_names[kind];
}

const char *
thermal_protocol_name(int protocol)
{
	if (protocol < 0 || protocol >= THERMAL_NPROTO)
		return "?";
	return protocol_names[protocol];
}

int
thermal_protocol(const struct thermal_conf *c, const struct thermal_event *ev,
    double cap_ah, int cells)
{
	switch (ev->zone) {
	case THERMAL_BELOW_MIN:
	case THERMAL_ABOVE_MAX:
		return THERMAL_P_NO_CHARGE;
	case THERMAL_COOL:
		if (!(cap_ah > 0) || !cw_isnum(ev->i_max))
			return THERMAL_P_UNKNOWN;
		return ev->i_max > c->cool_rate * cap_ah *
		    (1.0 + c->cool_margin / 100.0) ? THERMAL_P_OVER_CURRENT :
		    THERMAL_P_WITHIN;
	case THERMAL_WARM:
		if (cells < 1 || !cw_isnum(ev->v_max))
			return THERMAL_P_UNKNOWN;
		return ev->v_max / cells > c->warm_v + c->warm_margin ?
		    THERMAL_P_OVER_VOLTAGE : THERMAL_P_WITHIN;
	default:
		return THERMAL_P_WITHIN;
	}
}

void
thermal_conf_default(struct thermal_conf *c)
{
	memset(c, 0, sizeof(*c));
	thermal_limits_default(&c->lim);
	c->min_current = 0.05;
	c->min_duration = 60 * CW_US_PER_S;
	c->merge = 2 * 60 * CW_US_PER_S;
	c->max_gap = CHARGE_MAX_GAP;
	c->cool_rate = THERMAL_COOL_RATE;
	c->cool_margin = THERMAL_COOL_MARGIN;
	c->warm_v = THERMAL_WARM_V;
	c->warm_margin = THERMAL_WARM_MARGIN;
}

void
thermal_init(struct thermal_dev *d)
{
	memset(d, 0, sizeof(*d));
	d->prev_soc = CW_MISSING;
	d->cap_ah = CW_MISSING;
}

/* Whether current I_A makes a row part of a run of KIND. */
static int
active(const struct thermal_conf *c, int kind, double i_a)
{
	if (kind == THERMAL_CHARGE)
		return i_a > c->min_current;
	return i_a < -c->min_current;
}

/*
 * Which side of the window of KIND a temperature is on: -1 cold, +1 hot,
 * 0 inside.  SIDE is the side of the event in progress (0 when none): to
 * leave it, the temperature must be back inside by the hysteresis.  A
 * reading beyond the opposite edge always counts for that edge.
 */
static int
out_side(const struct thermal_conf *c, int kind, int side, double temp_c)
{
	double lo, hi, h = c->lim.hyst;

	if (kind == THERMAL_CHARGE) {
		lo = c->lim.t[1];
		hi = c->lim.t[2];
	} else {
		lo = c->lim.use_lo;
		hi = c->lim.use_hi;
	}
	if (side < 0) {
		if (temp_c > hi)
			return 1;
		return temp_c < lo + h ? -1 : 0;
	}
	if (side > 0) {
		if (temp_c < lo)
			return -1;
		return temp_c > hi - h ? 1 : 0;
	}
	if (temp_c < lo)
		return -1;
	if (temp_c > hi)
		return 1;
	return 0;
}

static void
ev_start(struct thermal_event *ev, int kind, int side, cw_time t0,
    double soc0)
{
	ev->kind = kind;
	if (kind == THERMAL_CHARGE)
		ev->zone = THERMAL_NORMAL;
	else
		ev->zone = side < 0 ? THERMAL_BELOW_MIN : THERMAL_ABOVE_MAX;
	ev->start = ev->end = t0;
	ev->temp_min = INFINITY;
	ev->temp_max = -INFINITY;
	ev->charge_ah = 0.0;
	ev->soc_start = ev->soc_end = soc0;
	ev->rows = 0;
	ev->parts = 1;
	ev->i_max = ev->v_max = CW_MISSING;
	ev->protocol = -1;
}

/*
 * Add the row at T, which carried AH over its interval at current I_A,
 * with pack voltage V, to EV.
 */
static void
ev_add(struct thermal_event *ev, const struct thermal_limits *l, cw_time t,
    double ah, double temp_c, double soc, double i_a, double v)
{
	int z;

	ev->end = t;
	ev->charge_ah += ah;
	if (cw_isnum(temp_c)) {
		if (temp_c < ev->temp_min)
			ev->temp_min = temp_c;
		if (temp_c > ev->temp_max)
			ev->temp_max = temp_c;
		if (ev->kind == THERMAL_CHARGE) {
			z = thermal_zone_of(l, temp_c);
			if (thermal_zone_severity(z) >
			    thermal_zone_severity(ev->zone))
				ev->zone = z;
		}
	}
	if (cw_isnum(soc)) {
		if (!cw_isnum(ev->soc_start))
			ev->soc_start = soc;
		ev->soc_end = soc;
	}
	/* The protocol applies to the rows outside the window, not to the
	 * rows of the hysteresis band. */
	if (ev->kind == THERMAL_CHARGE &&
	    thermal_zone_of(l, temp_c) != THERMAL_NORMAL) {
		if (cw_isnum(i_a) && !(i_a <= ev->i_max))
			ev->i_max = i_a;
		if (cw_isnum(v) && !(v <= ev->v_max))
			ev->v_max = v;
	}
	ev->rows++;
}

/* End the event in progress; it waits as pending for a possible merge. */
static void
run_close(struct thermal_run *r)
{
	r->pend = r->ev;
	r->pend_side = r->side;
	r->pending = 1;
	r->open = 0;
	r->gap_ah = 0.0;
	r->gap_tmin = INFINITY;
	r->gap_tmax = -INFINITY;
	r->gap_soc0 = r->gap_soc = CW_MISSING;
	r->gap_rows = 0;
}

/* Reopen the pending event, the rows since its end included. */
static void
run_join(struct thermal_dev *d, struct thermal_run *r)
{
	struct thermal_event *ev = &r->ev;

	*ev = r->pend;
	ev->charge_ah += r->gap_ah;
	if (r->gap_tmin < ev->temp_min)
		ev->temp_min = r->gap_tmin;
	if (r->gap_tmax > ev->temp_max)
		ev->temp_max = r->gap_tmax;
	if (!cw_isnum(ev->soc_start))
		ev->soc_start = r->gap_soc0;
	if (cw_isnum(r->gap_soc))
		ev->soc_end = r->gap_soc;
	ev->rows += r->gap_rows;
	ev->parts++;
	r->pending = 0;
	d->merges++;
}

/* The pending event can no longer grow: emit it, or drop it if short. */
static void
run_flush(struct thermal_dev *d, const struct thermal_conf *c,
    struct thermal_run *r)
{
	struct thermal_event *ev = &r->pend;

	r->pending = 0;
	if (ev->end - ev->start < c->min_duration) {
		d->short_dropped++;
		return;
	}
	d->events[ev->kind][ev->zone]++;
	if (ev->kind == THERMAL_CHARGE) {
		ev->protocol = thermal_protocol(c, ev, d->cap_ah, d->cells);
		d->protocol[ev->protocol]++;
	}
	if (c->emit != NULL)
		c->emit(c->ctx, d, ev);
}

static void
gap_add(struct thermal_run *r, double ah, double temp_c, double soc)
{
	r->gap_ah += ah;
	if (cw_isnum(temp_c)) {
		if (temp_c < r->gap_tmin)
			r->gap_tmin = temp_c;
		if (temp_c > r->gap_tmax)
			r->gap_tmax = temp_c;
	}
	if (cw_isnum(soc)) {
		if (!cw_isnum(r->gap_soc0))
			r->gap_soc0 = soc;
		r->gap_soc = soc;
	}
	r->gap_rows++;
}

void
thermal_push(struct thermal_dev *d, const struct thermal_conf *c, cw_time t,
    double i_a, double temp_c, double soc)
{
	thermal_push_v(d, c, t, i_a, temp_c, soc, CW_MISSING);
}

void
thermal_push_v(struct thermal_dev *d, const struct thermal_conf *c,
    cw_time t, double i_a, double temp_c, double soc, double v)
{
	struct thermal_run *r;
	cw_time t0;
	double ah, soc0;
	int brk, judged, k, side;

	/*
	 * A row stands for the interval since the previous row.  The first
	 * row, and a row after a longer gap than max_gap (or a step back in
	 * time, which the reader should have refused), stands for its own
	 * instant and carries no charge.
	 */
	brk = !d->have_prev || t < d->prev_t || t - d->prev_t > c->max_gap;
	if (brk) {
		t0 = t;
		soc0 = soc;
		ah = 0.0;
	} else {
		t0 = d->prev_t;
		soc0 = d->prev_soc;
		ah = charge_ah(i_a, d->prev_t, t, c->max_gap);
	}
	if (!d->have_prev)
		d->first = t;
	judged = cw_isnum(temp_c) && cw_isnum(i_a);
	d->rows++;
	if (!judged)
		d->unjudged++;
	if (cw_isnum(i_a) && i_a > c->min_current)
		thermal_ah_add(&d->ah, &c->lim, temp_c, ah);

	for (k = 0; k < THERMAL_NKIND; k++) {
		r = &d->run[k];
		if (brk) {
			if (r->open)
				run_close(r);
			if (r->pending)
				run_flush(d, c, r);
		}
		side = 0;
		if (judged && active(c, k, i_a))
			side = out_side(c, k, r->open ? r->side : 0, temp_c);
		if (r->open && side != r->side)
			run_close(r);
		if (r->open) {
			ev_add(&r->ev, &c->lim, t, ah, temp_c, soc, i_a, v);
			continue;
		}
		if (side != 0) {
			if (r->pending && r->pend_side == side &&
			    c->merge > 0 && t0 - r->pend.end <= c->merge) {
				run_join(d, r);
			} else {
				if (r->pending)
					run_flush(d, c, r);
				ev_start(&r->ev, k, side, t0, soc0);
			}
			r->open = 1;
			r->side = side;
			ev_add(&r->ev, &c->lim, t, ah, temp_c, soc, i_a, v);
			continue;
		}
		if (r->pending) {
			gap_add(r, ah, temp_c, soc);
			if (t - r->pend.end > c->merge)
				run_flush(d, c, r);
		}
	}
	d->have_prev = 1;
	d->prev_t = t;
	d->prev_soc = soc;
}

void
thermal_finish(struct thermal_dev *d, const struct thermal_conf *c)
{
	struct thermal_run *r;
	int k;

	for (k = 0; k < THERMAL_NKIND; k++) {
		r = &d->run[k];
		if (r->open)
			run_close(r);
		if (r->pending)
			run_flush(d, c, r);
	}
}
