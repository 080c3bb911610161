/*
 * volt.h: a streaming detector of cell voltages outside the cells' window
 * (over-voltage above the maximum, over-discharge below the minimum).
 *
 * The cell voltage of a row is its pack voltage divided by the cells in
 * series (the mean cell: a gauge that reports only the pack cannot see
 * one cell drifting from the others).  It is over when above VMAX and
 * under when below VMIN.  An event is a run of rows on the same side of
 * the window and of the same kind: charge (current above the minimum
 * current), use (below minus it) or rest (in between).  A run enters an
 * event at the first row beyond a limit and leaves it only at a row back
 * inside by at least the hysteresis (a Schmitt trigger), so noise at a
 * limit gives one event instead of a burst of fragments.  A change of
 * kind that lasts at least the minimum duration ends the event and starts
 * the next where the change began, so that each event has one kind; a
 * shorter change (a noisy current near the minimum current) stays in the
 * event.  A row that cannot be judged (no voltage or no current) ends an
 * event.
 *
 * A row stands for the interval since the previous row of its device, as
 * its current does (charge.h): an event starts at the time of the row
 * before its first row (or at its first row after a gap longer than the
 * gap limit, or at the device's first row) and ends at its last row.
 * Events shorter than the minimum duration are dropped.
 */
#ifndef VOLT_H
#define VOLT_H

#include "cw.h"

/* Defaults, volts per cell: typical of NMC and LCO cells (volt.c). */
#define VOLT_MAX 4.25
#define VOLT_MIN 2.50
#define VOLT_HYST 0.02

enum volt_limit { VOLT_OVER, VOLT_UNDER, VOLT_NLIMIT };
enum volt_kind { VOLT_CHARGE, VOLT_USE, VOLT_REST, VOLT_NKIND };

/* "over" or "under"; "charge", "use" or "rest"; "?" otherwise. */
const char *volt_limit_name(int limit);
const char *volt_kind_name(int kind);

/*
 * One event.  V_MIN and V_MAX are the lowest and highest cell voltage of
 * its rows.  CHARGE_AH is the net charge over START..END, positive into
 * the battery; AH_IN only the charge of its charging rows.  SOC_START and
 * SOC_END are the SoC at START and END, or the nearest known inside the
 * event, or NaN.
 */
struct volt_event {
	int limit;
	int kind;
	cw_time start, end;
	double v_min, v_max;
	double charge_ah, ah_in;
	double soc_start, soc_end;
	unsigned long rows;
};

struct volt_dev;

/*
 * The detector's settings.  EMIT receives every event kept, with the
 * device state it belongs to (embedded by value in the caller's state).
 */
struct volt_conf {
	double vmax, vmin;	/* V per cell; vmin < vmax */
	double hyst;		/* V per cell, >= 0, below vmax - vmin */
	double min_current;	/* A: charge above it, use below -it */
	cw_time min_duration;	/* shorter events are dropped */
	cw_time max_gap;	/* a longer interval ends an event */
	void	(*emit)(void *ctx, struct volt_dev *dev,
		    const struct volt_event *ev);
	void	*ctx;
};

/* Defaults: 4.25 V, 2.50 V, 0.02 V, 0.05 A, 30 s, 15 min. */
void	volt_conf_default(struct volt_conf *c);

/*
 * The per-device state: the detector and what a summary needs.  Set it
 * up with volt_init(); CELLS is the divisor of its pack voltage (>= 1).
 */
struct volt_dev {
	int cells;
	int open;			/* an event is in progress in EV */
	struct volt_event ev;
	int tail_on;			/* rows of another kind follow EV */
	struct volt_event tail;
	int have_prev;
	cw_time first, prev_t;
	double prev_soc;
	double v_min, v_max;		/* extreme cell voltage, all rows */
	unsigned long rows, unjudged;
	unsigned long events[VOLT_NLIMIT][VOLT_NKIND];	/* kept */
	cw_time time[VOLT_NLIMIT];	/* total duration of kept events */
	double ah_in[VOLT_NLIMIT];	/* their charging rows' charge */
	unsigned long short_dropped;
};

void	volt_init(struct volt_dev *d, int cells);
/*
 * One row: time T (not before the previous row's), pack voltage V (NaN
 * when missing), current I_A (positive while charging) and SOC (either
 * may be NaN).  Finished events go to C->emit.
 */
void	volt_push(struct volt_dev *d, const struct volt_conf *c, cw_time t,
	    double v, double i_a, double soc);
/* The end of the device's rows: finish and emit what is open. */
void	volt_finish(struct volt_dev *d, const struct volt_conf *c);

#endif
