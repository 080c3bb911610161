/*
 * thermal.h: temperature zones for charging and a streaming detector of
 * charging (and discharging) outside the temperature window.
 *
 * Zones come from four thresholds T1 <= T2 <= T3 <= T4, by default 0, 10,
 * 45 and 60 C: the scheme of the JEITA guideline for charging lithium-ion
 * cells in portable equipment, as charger ICs commonly implement it.  The
 * boundary rule: a temperature exactly at a threshold belongs to the zone
 * nearer the normal window, so
 *
 *	T <  T1		below-min	(no charging should happen)
 *	T1 <= T <  T2	cool
 *	T2 <= T <= T3	normal
 *	T3 <  T <= T4	warm
 *	T >  T4		above-max	(no charging should happen)
 *
 * The event detector follows one device's rows in time order.  A charge
 * event is a run of charging rows (current above the minimum) outside
 * T2..T3; a use event is a run of discharging rows (current below minus
 * the minimum) outside the use limits.  A run enters an event as soon as
 * a row is out of the window and leaves it only when a row is back inside
 * by at least the hysteresis (a Schmitt trigger, as charger ICs do), so
 * noise at a threshold yields one event instead of a burst of fragments.
 * A row stands for the interval since the previous row of its device, as
 * its current does (charge.h), so an event starts at the time of the row
 * before its first row, unless that interval is longer than the gap limit.
 * Events closer than the merge time are joined, then events shorter than
 * the minimum duration are dropped.
 *
 * Charge events are then judged by the charge protocol of the JEITA
 * scheme: in the cool zone the charge current should be reduced (to at
 * most COOL_RATE times the capacity), in the warm zone the charge voltage
 * (to at most WARM_V per cell); below-min and above-max allow no charging
 * at all.  The default values, 0.5 C and 4.10 V, are from memory of the
 * guideline as charger ICs commonly implement it; the cell maker's data
 * sheet rules.  The margins (5 % of the current, 0.02 V per cell) leave
 * room for the gauge's and the charger's accuracy: common practice, no
 * source.
 */
#ifndef THERMAL_H
#define THERMAL_H

#include "cw.h"

enum thermal_zone {
	THERMAL_BELOW_MIN, THERMAL_COOL, THERMAL_NORMAL, THERMAL_WARM,
	THERMAL_ABOVE_MAX, THERMAL_NZONE
};

/* Defaults, degrees Celsius (see the top of this file). */
#define THERMAL_T1 0.0
#define THERMAL_T2 10.0
#define THERMAL_T3 45.0
#define THERMAL_T4 60.0
#define THERMAL_USE_LO (-20.0)
#define THERMAL_USE_HI 60.0
#define THERMAL_HYST 0.5

/*
 * T: T1..T4 (nondecreasing; opt_list_arg(opt, s, l->t, 4, 1, 1) parses
 * the --limits form).  USE_LO, USE_HI: the window for discharge.  HYST:
 * how far back inside a window a run must come to end an event (>= 0;
 * opt_tempdiff_arg() parses it).  Both parsers round to 1e-9 C, so a
 * limit given in F or K sits exactly on its decimal value in C (26.6F is
 * -3, not -2.999999999999999) and tools sharing --limits agree.
 */
struct thermal_limits {
	double t[4];
	double use_lo, use_hi;
	double hyst;
};

void	thermal_limits_default(struct thermal_limits *l);
/* The zone of TEMP_C, an enum thermal_zone; THERMAL_NORMAL for NaN. */
int	thermal_zone_of(const struct thermal_limits *l, double temp_c);
/* "below-min", "cool", "normal", "warm", "above-max"; "?" otherwise. */
const char *thermal_zone_name(int zone);
/* 2 for below-min and above-max, 1 for cool and warm, 0 for normal. */
int	thermal_zone_severity(int zone);

/*
 * Ah charged per zone, for summaries (cw-thermal --summary, cw-wear).
 * thermal_ah_add() adds AH to the zone of TEMP_C, or to no_temp when
 * TEMP_C is NaN.
 */
struct thermal_ah {
	double zone[THERMAL_NZONE];
	double no_temp;
};

void	thermal_ah_add(struct thermal_ah *a, const struct thermal_limits *l,
	    double temp_c, double ah);

enum thermal_kind { THERMAL_CHARGE, THERMAL_USE, THERMAL_NKIND };

/* "charge" or "use". */
const char *thermal_kind_name(int kind);

/* The verdict on a charge event (thermal_protocol()). */
enum thermal_protocol {
	THERMAL_P_WITHIN, THERMAL_P_OVER_CURRENT, THERMAL_P_OVER_VOLTAGE,
	THERMAL_P_NO_CHARGE, THERMAL_P_UNKNOWN, THERMAL_NPROTO
};

/* Defaults of the protocol (see the top of this file). */
#define THERMAL_COOL_RATE 0.5
#define THERMAL_WARM_V 4.10
#define THERMAL_COOL_MARGIN 5.0
#define THERMAL_WARM_MARGIN 0.02

/*
 * "within", "over-current", "over-voltage", "no-charge-allowed",
 * "unknown"; "?" otherwise.
 */
const char *thermal_protocol_name(int protocol);

/*
 * One event.  ZONE is the most severe zone reached; for use events it is
 * THERMAL_BELOW_MIN (colder than use_lo) or THERMAL_ABOVE_MAX (hotter than
 * use_hi).  CHARGE_AH is the net charge over START..END, positive into
 * the battery (so negative for use events).  SOC_START and SOC_END are
 * the SoC at START and END, or the nearest known inside the event, or NaN.
 */
struct thermal_event {
	int kind;
	int zone;
	cw_time start, end;
	double temp_min, temp_max;
	double charge_ah;
	double soc_start, soc_end;
	unsigned long rows;	/* rows inside the event, merged gaps too */
	unsigned long parts;	/* runs merged into it, 1 when none */
	/*
	 * Charge events: the highest current and pack voltage of the rows
	 * of its runs outside T2..T3 (not of the rows of the hysteresis
	 * band, nor of those between merged parts), NaN when none was
	 * known, and the verdict, an enum thermal_protocol, set before
	 * the event is emitted; use events: NaN, NaN, -1.
	 */
	double i_max, v_max;
	int protocol;
};

struct thermal_dev;

/*
 * The detector's settings.  EMIT receives every finished event with the
 * device it belongs to and CTX; since a struct thermal_dev is embedded by
 * value in the caller's device state, EMIT can find that state from DEV.
 */
struct thermal_conf {
	struct thermal_limits lim;
	double min_current;	/* A; charging above it, discharge below -it */
	cw_time min_duration;	/* shorter events are dropped */
	cw_time merge;		/* events at most this far apart are joined;
				   0: never */
	cw_time max_gap;	/* a longer interval ends an event */
	double cool_rate;	/* C-rate allowed in the cool zone */
	double cool_margin;	/* percent of it allowed above */
	double warm_v;		/* V per cell allowed in the warm zone */
	double warm_margin;	/* V per cell allowed above */
	void	(*emit)(void *ctx, struct thermal_dev *dev,
		    const struct thermal_event *ev);
	void	*ctx;
};

/*
 * Defaults: thermal_limits_default(), 0.05 A, 60 s, 2 min, 15 min, and
 * the protocol's (THERMAL_COOL_RATE ...).
 */
void	thermal_conf_default(struct thermal_conf *c);

/* The state of one kind of run; private to thermal.c. */
struct thermal_run {
	int open;		/* an event is in progress in EV */
	int side;		/* -1 cold, +1 hot, for EV */
	struct thermal_event ev;
	int pending;		/* PEND ended, may still be merged */
	int pend_side;
	struct thermal_event pend;
	double gap_ah;		/* charge since PEND ended */
	double gap_tmin, gap_tmax;
	double gap_soc0;	/* first known SoC since PEND ended, or NaN */
	double gap_soc;		/* last known SoC since PEND ended, or NaN */
	unsigned long gap_rows;
};

/*
 * The per-device state; set it up with thermal_init() (all-zero memory is
 * the same state, so a zeroed devtab entry will do).  Besides the
 * detector it keeps what a summary needs: the first and last time, the Ah
 * charged per zone (rows with current above the minimum, each in the zone
 * of its own temperature, no hysteresis) and the events emitted per kind
 * and zone.
 */
struct thermal_dev {
	struct thermal_run run[THERMAL_NKIND];
	int have_prev;
	cw_time first, prev_t;
	double prev_soc;
	struct thermal_ah ah;
	unsigned long rows;		/* rows pushed */
	unsigned long unjudged;		/* without temperature or current */
	unsigned long events[THERMAL_NKIND][THERMAL_NZONE];	/* emitted */
	unsigned long short_dropped;	/* shorter than min_duration */
	unsigned long merges;		/* joins made */
	/* The pack, for the protocol: set after thermal_init(). */
	double cap_ah;			/* rated capacity; NaN or 0: unknown */
	int cells;			/* in series; 0: unknown */
	unsigned long protocol[THERMAL_NPROTO];	/* charge events emitted */
};

/* All-zero but for the SoC, capacity and cells, which are unknown. */
void	thermal_init(struct thermal_dev *d);
/*
 * The verdict of the protocol on charge event EV of a pack of CAP_AH
 * (NaN or not above 0: unknown) and CELLS (0: unknown): an enum
 * thermal_protocol.  below-min and above-max: no-charge-allowed; cool:
 * over-current when i_max is above cool_rate * cap_ah plus the margin;
 * warm: over-voltage when v_max / cells is above warm_v plus the margin;
 * unknown when what the zone needs is not known.
 */
int	thermal_protocol(const struct thermal_conf *c,
	    const struct thermal_event *ev, double cap_ah, int cells);
/*
 * One row: time T (not before the previous row's), current I_A (positive
 * while charging), TEMP_C, SOC and pack voltage V (any may be NaN).
 * Finished events go to C->emit.  thermal_push() is the same without a
 * voltage.
 */
void	thermal_push_v(struct thermal_dev *d, const struct thermal_conf *c,
	    cw_time t, double i_a, double temp_c, double soc, double v);
void	thermal_push(struct thermal_dev *d, const struct thermal_conf *c,
	    cw_time t, double i_a, double temp_c, double soc);
/* The end of the device's rows: finish and emit what is open. */
void	thermal_finish(struct thermal_dev *d, const struct thermal_conf *c);

#endif
