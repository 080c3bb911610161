/* topoff.c: holds near full charge and top-off micro-cycles (topoff.h). */
#include <stddef.h>
#include <string.h>

#include "charge.h"
#include "statefmt.h"
#include "topoff.h"

/* Slack for comparisons of levels made of decimal readings. */
#define TOPOFF_EPS 1e-9

static void	hold_begin(struct topoff *st, int sig, cw_time t, double x,
		    int rest);
static void	hold_end(struct topoff *st, const struct topoff_conf *c);
static void	hold_row(struct topoff *st, const struct topoff_conf *c,
		    cw_time t, double x, int chg, int rest, int use, double ah);
static int	use_row(const struct topoff *st, const struct topoff_conf *c,
		    int sig, cw_time t, double x, double i_a);
static void	peak_reset(struct topoff *st, cw_time t, double x, int rest);
static int	recovered(const struct topoff *st);
static void	cycle_emit(struct topoff *st, const struct topoff_conf *c);

void
topoff_conf_default(struct topoff_conf *c)
{
	memset(c, 0, sizeof(*c));
	c->full_pct = TOPOFF_FULL_PCT;
	c->full_v = CW_MISSING;
	c->min_depth = TOPOFF_MIN_DEPTH;
	c->min_current = TOPOFF_MIN_CURRENT;
	c->max_gap = CHARGE_MAX_GAP;
	c->standby_a = TOPOFF_STANDBY_A;
	c->standby_fall = TOPOFF_STANDBY_FALL;
}

void
topoff_init(struct topoff *st)
{
	memset(st, 0, sizeof(*st));
	st->phase = TOPOFF_OUT;
	st->standby_a = CW_MISSING;
	st->standby_fall = CW_MISSING;
}

/* Start watching for a drop from level X at time T. */
static void
peak_reset(struct topoff *st, cw_time t, double x, int rest)
{
	st->phase = TOPOFF_WATCH;
	st->peak = x;
	st->peak_t = t;
	st->trough = x;
	st->idle = rest;
	st->dropped = 0;
	st->recharged = 0;
	st->cyc_ah = 0.0;
	st->used = 0;
}

static void
hold_begin(struct topoff *st, int sig, cw_time t, double x, int rest)
{
	memset(&st->hold, 0, sizeof(st->hold));
	st->hold.signal = sig;
	st->hold.start = t;
	st->hold.end = t;
	st->hold.rows = 1;
	st->lvl_top = sig == TOPOFF_SOC && x >= TOPOFF_AT_TOP_PCT - TOPOFF_EPS;
	st->rested = rest;
	peak_reset(st, t, x, rest);
}

/* The recharge has brought the level back up by half the drop or more. */
static int
recovered(const struct topoff *st)
{
	return st->rise >= st->peak - (st->peak - st->trough) / 2.0 -
	    TOPOFF_EPS;
}

static void
cycle_emit(struct topoff *st, const struct topoff_conf *c)
{
	struct topoff_cycle cy;

	cy.signal = st->hold.signal;
	cy.start = st->peak_t;
	cy.end = st->chg_t;
	cy.peak = st->peak;
	cy.trough = st->trough;
	cy.depth = st->peak - st->trough;
	cy.charge_ah = st->cyc_ah;
	cy.use = st->used;
	if (cy.use) {
		st->hold.use_dips++;
		if (c->on_use != NULL)
			c->on_use(c->ctx, st, &cy);
		return;
	}
	st->hold.cycles++;
	st->hold.depth_sum += cy.depth;
	if (cy.depth > st->hold.depth_max)
		st->hold.depth_max = cy.depth;
	if (c->on_cycle != NULL)
		c->on_cycle(c->ctx, st, &cy);
}

static void
hold_end(struct topoff *st, const struct topoff_conf *c)
{
	struct topoff_totals *tot = &st->tot;
	struct topoff_hold *h = &st->hold;
	cw_time d;

	if (st->phase == TOPOFF_OUT)
		return;
	if (st->phase == TOPOFF_RECHARGE && recovered(st))
		cycle_emit(st, c);
	st->phase = TOPOFF_OUT;
	d = h->end - h->start;
	tot->holds++;
	tot->cycles += h->cycles;
	tot->held += d;
	if (h->signal == TOPOFF_SOC)
		tot->soc_held += d;
	tot->at_top2 += h->at_top2;
	tot->depth_sum += h->depth_sum;
	if (h->depth_max > tot->depth_max)
		tot->depth_max = h->depth_max;
	tot->topoff_ah += h->topoff_ah;
	tot->use_dips += h->use_dips;
	if (c->on_hold != NULL)
		c->on_hold(c->ctx, st, h);
}

/*
 * Whether a row at time T with level X of signal SIG (NaN: none of its
 * own) and current I_A is a use row (topoff.h); called before the row's
 * level replaces the last one.
 */
static int
use_row(const struct topoff *st, const struct topoff_conf *c, int sig,
    cw_time t, double x, double i_a)
{
	double sa, fall;

	sa = cw_isnum(st->standby_a) ? st->standby_a : c->standby_a;
	if (cw_isnum(i_a))
		return i_a < -sa;
	fall = cw_isnum(st->standby_fall) ? st->standby_fall :
	    c->standby_fall;
	if (st->phase == TOPOFF_OUT || sig != TOPOFF_SOC ||
	    st->hold.signal != TOPOFF_SOC || !cw_isnum(x) ||
	    !(x < st->lvl - TOPOFF_EPS) || t <= st->lvl_since)
		return 0;
	return (st->lvl - x) * 3600.0 * CW_US_PER_S >
	    fall * (double)(t - st->lvl_since);
}

/*
 * A row inside the hold at level X (its own or the carried one); CHG and
 * REST tell whether it charges or rests, USE whether it is a use row, AH
 * is its charge.
 */
static void
hold_row(struct topoff *st, const struct topoff_conf *c, cw_time t,
    double x, int chg, int rest, int use, double ah)
{
	struct topoff_hold *h = &st->hold;
	int top;

	top = h->signal == TOPOFF_SOC && x >= TOPOFF_AT_TOP_PCT - TOPOFF_EPS;
	h->at_top2 += (t - h->end) * (cw_time)(st->lvl_top + top);
	st->lvl_top = top;
	h->end = t;
	h->rows++;
	if (chg && st->rested)
		h->topoff_ah += ah;
	if (rest)
		st->rested = 1;

	if (st->phase == TOPOFF_RECHARGE) {
		if (x < st->trough) {
			/* Still falling: the rise counts from here. */
			st->trough = x;
			st->rise = x;
			st->rise_t = t;
		} else if (x >= st->rise) {
			st->rise = x;
			st->rise_t = t;
		}
		if (chg) {
			st->cyc_ah += ah;
			st->chg_t = t;
			return;
		}
		if (!rest) {
			/* Current unknown: wait. */
			if (use)
				st->used = 1;
			return;
		}
		if (recovered(st)) {
			cycle_emit(st, c);
			peak_reset(st, st->rise_t, st->rise, 1);
		} else
			st->phase = TOPOFF_WATCH;
		/* This resting row is watched like any other below. */
	}

	if (x < st->peak) {
		if (x < st->trough) {
			/* A deeper trough: an earlier rise no longer counts. */
			st->trough = x;
			st->recharged = 0;
		}
		if (st->peak - st->trough >= c->min_depth - TOPOFF_EPS)
			st->dropped = 1;
	}
	if (rest)
		st->idle = 1;
	if (chg && st->dropped && st->idle) {
		if (!st->recharged || x > st->rise) {
			st->rise = x;
			st->rise_t = t;
		}
		st->recharged = 1;
		st->phase = TOPOFF_RECHARGE;
		st->cyc_ah += ah;
		st->chg_t = t;
	} else if (x >= st->peak) {
		peak_reset(st, t, x, rest);
		return;
	}
	if (use)
		st->used = 1;
}

void
topoff_push(struct topoff *st, const struct topoff_conf *c, cw_time t,
    double v, double i_a, double soc)
{
	double x, ah = 0.0;
	int sig, inb, chg, rest, gap, use;

	st->tot.rows++;
	gap = st->have_row && t - st->row_t > c->max_gap;
	if (st->have_row)
		ah = charge_ah(i_a, st->row_t, t, c->max_gap);
	st->row_t = t;
	st->have_row = 1;
	chg = i_a > c->min_current;
	rest = i_a <= c->min_current;	/* both 0 when I_A is NaN */

	if (cw_isnum(soc)) {
		sig = TOPOFF_SOC;
		x = soc;
		inb = soc >= c->full_pct;
		st->soc_t = t;
		st->have_soc = 1;
	} else if (cw_isnum(c->full_v) && cw_isnum(v) &&
	    !(st->have_soc && t - st->soc_t <= c->max_gap)) {
		/* Voltage only for a device without a recent SoC. */
		sig = TOPOFF_VOLTAGE;
		x = 100.0 * v / c->full_v;
		inb = v >= c->full_v;
	} else {
		/* No level: keep the hold's last one if it is fresh. */
		if (st->phase != TOPOFF_OUT && !gap &&
		    t - st->lvl_t <= c->max_gap) {
			st->tot.carried++;
			st->hold.carried++;
			hold_row(st, c, t, st->lvl, chg, rest,
			    use_row(st, c, 0, t, CW_MISSING, i_a), ah);
			return;
		}
		if (st->phase != TOPOFF_OUT) {
			if (gap)
				st->tot.gaps++;
			hold_end(st, c);
		}
		st->tot.unjudged++;
		return;
	}

	use = !gap && use_row(st, c, sig, t, x, i_a);
	if (st->phase == TOPOFF_OUT || sig != st->hold.signal || x != st->lvl)
		st->lvl_since = t;
	st->lvl = x;
	st->lvl_t = t;
	if (st->phase != TOPOFF_OUT &&
	    (gap || !inb || sig != st->hold.signal)) {
		if (gap)
			st->tot.gaps++;
		hold_end(st, c);
	}
	if (!inb)
		return;
	if (st->phase == TOPOFF_OUT)
		hold_begin(st, sig, t, x, rest);
	else
		hold_row(st, c, t, x, chg, rest, use, ah);
}

void
topoff_finish(struct topoff *st, const struct topoff_conf *c)
{
	hold_end(st, c);
}

#define TO_F(n, k, m, lo, hi, r, v) \
	{ n, k, offsetof(struct topoff, m), lo, hi, r, v }
#define TO_B(n, m, v)	TO_F(n, SFMT_INT, m, 0, 1, SFMT_R_ANY, v)
#define TO_T(n, m, v)	TO_F(n, SFMT_TIME, m, 0, 0, SFMT_R_TIME, v)
#define TO_X(n, m)	TO_F(n, SFMT_DBL, m, 0, 0, SFMT_R_ANY, 1)
#define TO_D(n, m)	TO_F(n, SFMT_DBL, m, 0, 0, SFMT_R_NONNEG, 1)
#define TO_U(n, m)	TO_F(n, SFMT_UL, m, 0, 0, SFMT_R_ROWS, 1)

/* The fields of a saved state, in the order of their columns. */
static const struct sfmt_spec topoff_fields[] = {
	TO_F("top_phase", SFMT_INT, phase, TOPOFF_OUT, TOPOFF_RECHARGE,
	    SFMT_R_ANY, 1),
	TO_B("top_have_row", have_row, 1),
	TO_T("top_row_t", row_t, 1),
	TO_T("top_lvl_t", lvl_t, 1),
	TO_X("top_lvl", lvl),
	TO_B("top_lvl_top", lvl_top, 1),
	TO_B("top_have_soc", have_soc, 1),
	TO_T("top_soc_t", soc_t, 1),
	TO_B("top_rested", rested, 1),
	TO_F("top_signal", SFMT_INT, hold.signal, 0, TOPOFF_VOLTAGE,
	    SFMT_R_ANY, 1),
	TO_T("top_hold_start", hold.start, 1),
	TO_T("top_hold_end", hold.end, 1),
	TO_U("top_hold_rows", hold.rows),
	TO_U("top_hold_carried", hold.carried),
	TO_U("top_hold_cycles", hold.cycles),
	TO_D("top_hold_depth_sum", hold.depth_sum),
	TO_D("top_hold_depth_max", hold.depth_max),
	TO_D("top_hold_topoff_ah", hold.topoff_ah),
	TO_F("top_hold_at_top2", SFMT_TIME, hold.at_top2, 0, 0, SFMT_R_ANY,
	    1),
	TO_X("top_peak", peak),
	TO_X("top_trough", trough),
	TO_T("top_peak_t", peak_t, 1),
	TO_B("top_idle", idle, 1),
	TO_B("top_dropped", dropped, 1),
	TO_B("top_recharged", recharged, 1),
	TO_X("top_rise", rise),
	TO_T("top_rise_t", rise_t, 1),
	TO_T("top_chg_t", chg_t, 1),
	TO_D("top_cyc_ah", cyc_ah),
	/* Revision 2: the use dips. */
	TO_B("top_used", used, 2),
	TO_T("top_lvl_since", lvl_since, 2)
};

const struct sfmt_spec *
topoff_state_fields(size_t *n)
{
	*n = sizeof(topoff_fields) / sizeof(topoff_fields[0]);
	return topoff_fields;
}

const char *
topoff_state_check(const struct topoff *st, cw_time last)
{
	if (st->hold.at_top2 < 0 || st->hold.start > st->hold.end ||
	    st->hold.at_top2 / 2 > st->hold.end - st->hold.start)
		return "top_hold_at_top2 is not within its hold";
	if (st->have_row != 1 || st->row_t != last ||
	    (st->phase != TOPOFF_OUT && st->hold.signal == 0))
		return "top-off detector inconsistent";
	return NULL;
}
