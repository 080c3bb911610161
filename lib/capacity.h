/*
 * capacity.h: measured capacity from the gauge's own records, by coulomb
 * counting over charge and discharge segments, and its trend per device.
 *
 * Charge is the integral of I dt in the convention of charge.h: the current
 * of a row holds over the interval that ends at the row, so row k carries
 * I_k (t_k - t_{k-1}), and an interval longer than the gap limit carries
 * nothing (and ends a segment here).
 *
 * A segment is a run of rows of one device whose current has one sign with
 * |I| >= min_current ("active" rows), allowing pauses (rows below
 * min_current, or of the other sign below min_current) of at most max_rest
 * in a row; the row before its first active row is its boundary.  A
 * segment ends, and is judged on the rows up to its last active row, when:
 * a row of the other sign above min_current comes (it starts a new
 * segment), a pause lasts longer than max_rest, two rows are more than
 * max_gap apart, a row has no SoC, a row's temperature is missing or
 * outside the window, or the SoC steps by more than the row's charge can
 * explain (a calibration jump or a full-charge reset; see cap_feed()).  So
 * no segment ever spans a gap, a jump, a reset or a missing SoC; the rows
 * after one begin a new segment.
 *
 * Inside a segment the measurement runs from the first to the last row at
 * which the reported SoC changes (a "step"), not from its first to its
 * last row: a gauge that rounds its SoC changes the reported value where
 * the true SoC crosses a rounding boundary, so the SoC difference between
 * two steps is exact up to the gauge's drift, and what remains of the
 * quantisation is the charge of the two step rows (resolution_pct).  The
 * estimate is capacity = 100 |Q| / |delta SoC| with Q the charge from the
 * first step (exclusive) to the last (inclusive).
 *
 * Memory: a fixed state per device; for the trend the estimates of a
 * device up to a cap, thinned evenly beyond it (dcir_series).
 */
#ifndef CAPACITY_H
#define CAPACITY_H

#include <stddef.h>
#include "cw.h"
#include "dcir.h"

/* Accepted estimates a device remembers for its jump test. */
#define CAP_RECENT	5

struct cap_conf {
	double min_current;	/* A, an active row has |I| >= this */
	cw_time max_gap;	/* rows further apart end a segment */
	cw_time max_rest;	/* longest pause inside a segment */
	int temp_any;		/* no temperature gate */
	double temp_lo, temp_hi;	/* C, the window */
	double min_swing;	/* points of SoC between the steps */
	double jump;		/* points a step may miss the charge by */
	/* With an OCV table (cap_ocv_feed): */
	cw_time ocv_rest;	/* rest before a voltage is an OCV point */
	cw_time ocv_span;	/* longest time between two points */
};

/* Defaults as SPEC.md and the manual page give them. */
void	cap_conf_default(struct cap_conf *c);

/* What became of each segment: its end, or CAP_OK. */
enum cap_reason {
	CAP_OK,			/* accepted */
	CAP_SWING,		/* ended normally, SoC moved too little */
	CAP_GAP,		/* ended by a gap, too short */
	CAP_JUMP,		/* ended by a SoC jump or reset, too short */
	CAP_NO_SOC,		/* ended by a row without SoC, too short */
	CAP_TEMP,		/* ended by a temperature outside, too short */
	CAP_NO_I,		/* ended by a row without current, too short */
	CAP_SIGN,		/* charge and SoC moved opposite ways */
	CAP_NREASON
};

/* Short names for -v and --rejects: "accepted", "swing", ... */
extern const char *const cap_reason_name[CAP_NREASON];

struct cap_counts {
	unsigned long n[CAP_NREASON];
	unsigned long cut[CAP_NREASON];	/* segments ended by GAP..NO_I,
					 * whatever their fate */
	/* Rows with a current of at least min_current whose SoC stepped
	 * the way of the current, and against it: a sign check. */
	unsigned long with, against;
};

/* A SoC step inside a segment. */
struct cap_step {
	cw_time t;
	double soc;
	double q;		/* charge since the boundary, up to this row */
	double dq;		/* charge of this row */
};

/* Segment state of one device; zeroed is the start state. */
struct cap_dev {
	int have_prev;		/* PREV_* hold the last row */
	cw_time prev_t;
	double prev_soc;	/* NaN when missing */
	int dir;		/* +1 charging, -1 discharging, 0 none */
	unsigned long rows;	/* rows up to the last active one */
	unsigned long prows;	/* pause rows since then */
	cw_time pause;		/* length of that pause */
	double q;		/* charge since the boundary */
	double tw, twt;		/* time-weighted temperature, committed */
	double ptw, ptwt;	/* the same over the pause */
	cw_time t_first, t_act;	/* first and last active row */
	double soc0, soc_act;	/* SoC at the boundary, at the last active */
	int has_a, has_b, has_pa, has_pb;
	struct cap_step a;	/* the first step */
	struct cap_step b;	/* the last step up to the last active row */
	struct cap_step pa, pb;	/* the first and last step in the pause */
	/* The jump test's capacity: the device's rating, else the median
	 * of its last accepted estimates. */
	double rated_ah;	/* NaN when unknown */
	double recent[CAP_RECENT];
	unsigned nrecent, recent_head;
	double recent_med;	/* their median, NaN without any */
};

/* One estimate, or a rejected segment (reason != CAP_OK). */
struct cap_est {
	enum cap_reason reason;
	int dir;
	cw_time start, end;	/* the first and the last step */
	double soc_from, soc_to;	/* reported SoC there, percent */
	double charge_ah;	/* signed, positive charging */
	double capacity_ah;	/* NaN when rejected */
	double temp_c;		/* time-weighted mean */
	unsigned long rows;	/* rows of the segment */
	double resolution_pct;	/* charge of the two step rows, % of Q */
};

/* Prepare D for a device rated RATED_AH (NaN when not known). */
void	cap_dev_init(struct cap_dev *d, double rated_ah);

/*
 * Feed a row (time T, current I_A, temperature TEMP_C, SoC SOC_PCT; NaN
 * when missing) of the device D.  A segment ended by this row is judged
 * into OUT[0]; returns the number of segments judged (0 or 1), each also
 * counted in CNT.  Segments that never saw a single active row are not
 * segments and not counted.
 */
int	cap_feed(const struct cap_conf *c, struct cap_dev *d, cw_time t,
	    double i_a, double temp_c, double soc_pct, struct cap_counts *cnt,
	    struct cap_est *out);
/* At the end of the input: judge the open segment, as cap_feed(). */
int	cap_finish(const struct cap_conf *c, struct cap_dev *d,
	    struct cap_counts *cnt, struct cap_est *out);

/*
 * The voltage-based variant, for gauges without a SoC: an OCV point is the
 * last row of a rest (rows below min_current, no gap) at least ocv_rest
 * long, whose cell voltage the OCV table turns into a SoC, inside the
 * temperature window.  Between two points at most ocv_span apart, with no
 * gap and no row without current between them, the charge is counted as
 * ever, and a SoC change of at least min_swing gives an estimate; a
 * smaller one keeps the earlier point, so small moves add up.  The
 * temperature between the points does not matter: both are rested states.
 */
struct ocv;

struct cap_pt {
	cw_time t;
	double soc, temp;
	double q;		/* charge since the state was reset */
	unsigned long rows;	/* rows since then */
};

struct cap_ocvdev {
	int have_prev;
	cw_time prev_t;
	double q;
	unsigned long rows;
	int resting;
	cw_time rest_start;
	int has_cand, has_anchor;
	struct cap_pt cand;	/* the last rested row of this rest */
	struct cap_pt anchor;	/* the point estimates start from */
};

/*
 * Feed a row of a device: cell voltage V_CELL, current, temperature (NaN
 * when missing), against the table O.  Returns 1 with *OUT when an
 * estimate (or a segment rejected for its sign) ends here, else 0.
 */
int	cap_ocv_feed(const struct cap_conf *c, const struct ocv *o,
	    struct cap_ocvdev *d, cw_time t, double v_cell, double i_a,
	    double temp_c, struct cap_counts *cnt, struct cap_est *out);
/* At the end of the input: a rest still open gives its point. */
int	cap_ocv_finish(const struct cap_conf *c, struct cap_ocvdev *d,
	    struct cap_counts *cnt, struct cap_est *out);

struct cap_trend_conf {
	unsigned long min_estimates;	/* fewer: no trend */
	double eol_pct;			/* end of life at this SoH */
	double conf;			/* confidence level of the slope */
};

void	cap_trend_conf_default(struct cap_trend_conf *c);

struct cap_trend {
	int fitted;		/* the estimates below are set */
	size_t used;		/* points in the fit */
	double slope, slope_lo, slope_hi;	/* Ah per day */
	double cap_start, cap_end;	/* the line at first and last */
	double fade_pct;	/* 100 (start - end) / start */
	double fade_30d;	/* percent of start per 30 days */
	double soh_pct;		/* 100 cap_end / rated, NaN without one */
	int has_eol;
	cw_time eol_t;		/* the line at eol_pct of rated */
};

/*
 * Fit the trend of the estimates S (times and capacities) of a device
 * rated RATED_AH (NaN: unknown).  Nothing is fitted with fewer than
 * min_estimates estimates or fewer than two distinct times.
 */
void	cap_trend_fit(const struct dcir_series *s, double rated_ah,
	    const struct cap_trend_conf *c, struct cap_trend *out);

#endif
