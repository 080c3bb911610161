/*
 * topoff.h: a streaming detector of holds near full charge and of the
 * top-off micro-cycles a charger makes while it holds a pack there.
 *
 * The level followed is the SoC of a row (percent), or, for a row without
 * SoC when a full voltage is set, 100 * voltage / full voltage, so that
 * depths of a voltage hold are in percent of the full voltage; but a
 * device that reported a SoC within max_gap is not judged by voltage (a
 * gauge that reports SoC on some rows only stays a SoC gauge).  A row
 * with neither keeps, inside a hold, the level of the last row that had one,
 * for up to max_gap (gauges often report SoC less often than current);
 * outside a hold it is not judged, only counted.
 *
 * A hold is a run of judged rows at or above the band (level >= full_pct,
 * or voltage >= full_v); it starts at its first row and ends at its last.
 * A row below the band, an interval between rows longer than max_gap, a
 * level older than max_gap, or a change from SoC to voltage (or back)
 * ends it.
 *
 * Inside a hold the detector follows the peak, the highest level since the
 * hold began or since the last micro-cycle ended, and the trough, the
 * lowest level after the peak.  A micro-cycle is counted when all of these
 * happen in turn:
 *
 *	1. the charger rests: a row with current at or below min_current;
 *	2. the level falls at least min_depth below the peak;
 *	3. the charger takes over again: a row with current above
 *	   min_current (the recharge);
 *	4. the recharge brings the level back up from the trough by at least
 *	   half the drop, to peak - depth / 2 or higher (the levels that
 *	   count are those of the charging rows and of the resting row that
 *	   ends them, after the trough: a rebound without charge does not);
 *
 * and it ends at the last charging row of the recharge, that is when a
 * row with current at or below min_current follows, or when the hold ends.
 *
 * A dip so found is a top-off micro-cycle only when standby drain or
 * self-discharge made it; a dip driven by use (the pack taken off the
 * charger for a ride, its lights or motor on) is a use dip, counted apart
 * and passed to on_use instead of on_cycle.  A dip is a use dip when a row
 * after its peak (up to the end of its recharge) is a use row:
 *
 *	- a row with a current discharges more than the standby level,
 *	  I < -standby_a;
 *	- a row of a SoC hold without a current, whose SoC is below the
 *	  previous SoC, is a use row when the SoC fell faster than
 *	  standby_fall percent per hour, timed from the first row that
 *	  showed the previous SoC to this row (so that the whole-percent
 *	  steps of a coarse gauge are timed over the time they took, not
 *	  over one interval).  Voltage holds have no such fallback: a
 *	  voltage relaxing after the charge falls fast without any use.
 *
 * A new peak starts the judgement over.
 * A new peak (the level at or above the peak) before step 3 starts over.
 * Step 1 keeps noise during the main charge from counting; step 4 keeps
 * regenerative braking or a brief plug-in during use from counting.  A
 * recharge that stops before step 4 does not end the drop: a later one
 * may still complete it (pulsed chargers).
 *
 * A row's current stands for the interval that ends at the row (charge.h).
 * A micro-cycle's charge is that of its charging rows (current above
 * min_current) from the start of the recharge.  A hold's top-off charge is
 * that of every charging row after the charger first rested in the hold,
 * so it also holds the top-ups too small for the gauge to show.
 *
 * The state is plain data (no pointers), embedded by value in a caller's
 * per-device state; the callbacks receive it, so the caller can find its
 * own state from it (offsetof).
 */
#ifndef TOPOFF_H
#define TOPOFF_H

#include "cw.h"
#include "statefmt.h"

/* Defaults (cw-topoff(1)). */
#define TOPOFF_FULL_PCT		95.0
#define TOPOFF_MIN_DEPTH	0.5
#define TOPOFF_MIN_CURRENT	0.05
/*
 * Standby level: discharge up to this is standby drain (the pack's own
 * electronics, a dock's load), more is use.  0.5 A is above the standby
 * draw of light-vehicle packs and below any ride (common practice, no
 * source).  The fall rate, percent of SoC per hour, is the fallback for
 * rows without a current: 5 %/h is 0.7 A on a 14 Ah pack (common
 * practice, no source).
 */
#define TOPOFF_STANDBY_A	0.5
#define TOPOFF_STANDBY_FALL	5.0
/* A SoC at or above this counts as "at 100 %" (an integer gauge's 100). */
#define TOPOFF_AT_TOP_PCT	99.5

enum topoff_signal { TOPOFF_SOC = 1, TOPOFF_VOLTAGE = 2 };

/* One micro-cycle.  Depths in percent (see the top of this file). */
struct topoff_cycle {
	int signal;		/* enum topoff_signal */
	cw_time start;		/* last row at the peak before the drop */
	cw_time end;		/* last charging row of the recharge */
	double peak;		/* level at START */
	double trough;		/* lowest level of the drop */
	double depth;		/* peak - trough */
	double charge_ah;	/* charge of the recharge */
	int use;		/* a use dip, not a top-off micro-cycle */
};

/* One hold, as emitted when it ends. */
struct topoff_hold {
	int signal;		/* enum topoff_signal */
	cw_time start, end;	/* first and last row in the band */
	unsigned long rows;	/* rows in it */
	unsigned long carried;	/* of them, rows that kept the last level */
	unsigned long cycles;	/* micro-cycles counted in it */
	double depth_sum;	/* sum of their depths */
	double depth_max;	/* the deepest, 0 when none */
	double topoff_ah;	/* charge after the charger first rested */
	/*
	 * Twice the time (us) at TOPOFF_AT_TOP_PCT or more, by the trapezoid
	 * rule over the indicator (an interval with one end at the top counts
	 * half); 0 for voltage holds, which cannot tell.
	 */
	cw_time at_top2;
	unsigned long use_dips;	/* dips driven by use, not in CYCLES */
};

/* Sums over every hold the state has emitted. */
struct topoff_totals {
	unsigned long holds;
	unsigned long cycles;
	cw_time held;		/* sum of hold durations, us */
	cw_time soc_held;	/* the same, SoC holds only */
	cw_time at_top2;	/* sum of the holds' at_top2 */
	double depth_sum, depth_max;
	double topoff_ah;
	unsigned long rows;	/* rows pushed */
	unsigned long unjudged;	/* rows with no level, outside holds */
	unsigned long carried;	/* rows with no level that kept one */
	unsigned long gaps;	/* holds ended by an interval > max_gap */
	unsigned long use_dips;	/* dips driven by use */
};

struct topoff;

/*
 * The settings.  FULL_V: volts, or NaN (CW_MISSING) for SoC only.
 * MIN_DEPTH: percent, > 0.  MIN_CURRENT: A, >= 0.  MAX_GAP: us, > 0.
 * STANDBY_A: A, >= 0; STANDBY_FALL: percent per hour, > 0 (a device's
 * own values in struct topoff, when set, override them).  ON_HOLD,
 * ON_CYCLE and ON_USE (any may be NULL) receive every hold, every top-off
 * micro-cycle and every use dip with CTX and the state they come from; a
 * dip is emitted before the hold that holds it.
 */
struct topoff_conf {
	double full_pct;
	double full_v;
	double min_depth;
	double min_current;
	cw_time max_gap;
	double standby_a;
	double standby_fall;
	void	(*on_hold)(void *ctx, struct topoff *st,
		    const struct topoff_hold *h);
	void	(*on_cycle)(void *ctx, struct topoff *st,
		    const struct topoff_cycle *c);
	void	(*on_use)(void *ctx, struct topoff *st,
		    const struct topoff_cycle *c);
	void	*ctx;
};

/* Defaults: 95 %, no full voltage, 0.5 %, 0.05 A, 15 min, standby 0.5 A
 * and 5 %/h, no callbacks. */
void	topoff_conf_default(struct topoff_conf *c);

enum topoff_phase { TOPOFF_OUT, TOPOFF_WATCH, TOPOFF_RECHARGE };

/* The per-device state; private but for TOT.  Zero it with topoff_init(). */
struct topoff {
	int phase;		/* enum topoff_phase */
	int have_row;		/* ROW_T is set */
	cw_time row_t;		/* last row pushed, for charge */
	cw_time lvl_t;		/* last row with a level of its own */
	double lvl;		/* that level */
	int lvl_top;		/* the hold's last row was at the top */
	int have_soc;		/* SOC_T is set */
	cw_time soc_t;		/* last row with a SoC */
	int rested;		/* the charger rested in this hold */
	struct topoff_hold hold;	/* the hold in progress */
	double peak, trough;	/* the micro-cycle being watched */
	cw_time peak_t;
	int idle;		/* the charger rested since the peak */
	int dropped;		/* the level went min_depth below the peak */
	int recharged;		/* a charging row came after the trough */
	double rise;		/* highest level since then, charging rows and
				 * the resting row that ends a recharge */
	cw_time rise_t;
	cw_time chg_t;		/* last charging row of the recharge */
	double cyc_ah;		/* charge of the recharge so far */
	int used;		/* a use row came after the peak */
	cw_time lvl_since;	/* first row that showed LVL */
	/* This device's standby level and fall rate; NaN: the conf's. */
	double standby_a, standby_fall;
	struct topoff_totals tot;
};

void	topoff_init(struct topoff *st);
/*
 * The saved form of a state (cw-wear --state-out): the fields of struct
 * topoff as a table of *N columns, offsets within the struct; revision 2
 * of it added the use dips' fields (since 2).  The totals, and the
 * standby level of a device, are not saved: the caller keeps its own.
 * topoff_state_check() tells whether ST, read back, is one topoff_push()
 * could have left with LAST its last row: NULL, or what is wrong.
 */
const struct sfmt_spec *topoff_state_fields(size_t *n);
const char *topoff_state_check(const struct topoff *st, cw_time last);
/*
 * One row of the device: time T (not before the previous row's), voltage
 * V, current I_A (positive while charging) and SOC; any may be NaN.
 */
void	topoff_push(struct topoff *st, const struct topoff_conf *c, cw_time t,
	    double v, double i_a, double soc);
/* The end of the device's rows: the open hold ends and is emitted. */
void	topoff_finish(struct topoff *st, const struct topoff_conf *c);

#endif
