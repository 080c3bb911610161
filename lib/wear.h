/*
 * wear.h: wear stress and modelled fade of one device, accumulated row by
 * row from the sample stream (the engine of cw-wear).
 *
 * What each row adds:
 * - charge: the row's current over the interval that ends at it
 *   (charge.h); charging is current above min_current, and its Ah go to
 *   the thermal zone of the row's temperature (thermal.h);
 * - time at high SoC and at high temperature: between two rows that both
 *   know the value, linearly interpolated, so a crossing inside an
 *   interval counts in part;
 * - calendar damage: the model's calendar rate at the row's SoC and
 *   temperature, integrated by the trapezoid rule between consecutive
 *   rows that know both (never one mean SoC over the span);
 * - cycle damage: the SoC goes through rainflow counting (rainflow.h)
 *   with the temperature as the auxiliary value, and each counted cycle
 *   adds count * the model's cycle damage at its depth, its mean SoC and
 *   the mean temperature of its turning points;
 * - top-off micro-cycles: the cw-topoff detector (topoff.h).
 *
 * An interval longer than max_gap carries no charge (the current is not
 * known), but the pack still ages through it: the time measures and the
 * calendar term hold the state of the row before the gap (it is assumed
 * to have rested as last seen).  Such gaps are counted.
 *
 * Rows missing SoC or temperature are left out of the terms that need
 * them and counted.  A cycle whose turning points carry no temperature is
 * counted in efc and depth but left out of the damage, and counted.
 *
 * The totals (struct wear_acc) are plain sums, minima and maxima, kept
 * without the model's --cycle-life and --calendar-life scales, so that
 * totals of two spans can be added (wear_acc_merge) and reported later.
 *
 * Joining (wear_join) goes further: the whole state of a device over one
 * stretch of time, followed by its state over the next stretch, counted
 * on its own, gives the state one pass over both would have reached.  A
 * plain sum of totals would lose what lies across the boundary, so a
 * state also keeps:
 * - its first rows (the first row, the first with SoC, with temperature,
 *   with both): the join adds the intervals from the earlier state's last
 *   rows to them, for charge, time at high SoC and temperature, and the
 *   calendar term;
 * - the rainflow residue, joined through the three-point rule (rf_join);
 *   a joinable state (wear_conf.joinable) counts it with RAW_START;
 * - the first rows of the top-off detector, up to the first row after
 *   which the detector is in the same state whatever came before (a row
 *   with a SoC below the band, a row after a gap over max_gap, or a
 *   resting row at 100 % SoC): the join runs them through the earlier
 *   state's detector.  Rows that repeat the SoC and the kind of current
 *   (charging, resting, unknown) of the row before, within
 *   max_gap of the first of them, leave the detector as the first left
 *   it, so they are kept as one run, replayed as its first and last row.
 *   More than WEAR_PRE_MAX runs without such a row are not kept, and a
 *   join across them counts the micro-cycles of the two sides apart
 *   (acc.topoff_cut counts these joins).
 */
#ifndef WEAR_H
#define WEAR_H

#include "cw.h"
#include "model.h"
#include "rainflow.h"
#include "thermal.h"
#include "topoff.h"

/* End of life: 20 % fade, 80 % state of health (common practice). */
#define WEAR_EOL_FADE	0.20
/* cold-charge dominates at this share of all charge (SPEC.md). */
#define WEAR_COLD_SHARE	0.01
/* The least share that makes a cause dominant (SPEC.md). */
#define WEAR_DOMINANT	0.25
/* Runs of rows of the top-off prefix a state keeps for a join, at most. */
#define WEAR_PRE_MAX	512

/* The damage sums, unscaled, in the four forms of struct model_eval:
 * the full damage and its split (reference, SoC excess, heat excess). */
enum { WEAR_FULL, WEAR_REF, WEAR_SOC, WEAR_TEMP, WEAR_NFORM };

/*
 * What a pack had been through before its first row (SPEC.md, "Packs
 * already in service"), from the fleet file: a measured state of health,
 * or its time in service and its equivalent full cycles, taken at the
 * reference conditions.  Kept as the facts, not as damage, so that the
 * damage follows the model and its --cycle-life and --calendar-life
 * scales (wear_prior_damage).
 */
enum { WEAR_PRIOR_NEW, WEAR_PRIOR_SOH, WEAR_PRIOR_AGE, WEAR_PRIOR_NKIND };

struct wear_prior {
	int kind;		/* WEAR_PRIOR_* */
	double soh_pct;		/* measured at the first row (SOH) */
	double age_s;		/* seconds in service before it (AGE) */
	double efc;		/* full cycles before it (AGE) */
};

/* Totals of one device over a span: plain data, mergeable. */
struct wear_acc {
	int have;		/* at least one row */
	cw_time first, last;
	unsigned long rows;
	unsigned long rows_no_current;
	unsigned long rows_no_soc;	/* missing or outside 0..100 */
	unsigned long rows_no_temp;	/* missing or below absolute zero */
	unsigned long rows_model;	/* rows with both, in the model */
	/* Charge. */
	double charge_ah;	/* Ah charged: current above min_current */
	double charge_s;	/* seconds of those intervals */
	double max_charge_a;	/* highest charging current, 0 if none */
	struct thermal_ah zone_ah;	/* charge per zone of the row's temp */
	/* Time, seconds. */
	double soc_s, soc_high_s;	/* covered by SoC, and at >= full_pct */
	double temp_s, temp_high_s;	/* covered by temp, and at >= T3 */
	double model_s;			/* covered by the calendar term */
	double gap_s;			/* of that, in gaps over max_gap */
	unsigned long gaps;
	/* Rainflow: every cycle, and the count left out for no temp. */
	struct rf_sum rf;
	double cycles_no_temp;
	unsigned long topoff_cycles;
	unsigned long topoff_judged;	/* rows the detector could judge */
	unsigned long topoff_cut;	/* joins it could not replay */
	/* Damage, unscaled: cycle and calendar, in each form. */
	double cyc[WEAR_NFORM];
	double cal[WEAR_NFORM];
};

/* Settings shared by every device. */
struct wear_conf {
	const struct model *model;
	double cycle_scale;	/* multiplies the cycle damage (1) */
	double cal_scale;	/* multiplies the calendar damage (1) */
	struct thermal_limits lim;
	double min_current;	/* A; charging above it */
	cw_time max_gap;
	double hysteresis;	/* rainflow, % SoC */
	int residue;		/* RF_RESIDUE_* */
	struct topoff_conf topoff;
	int joinable;		/* new states keep a raw rainflow start side,
				   for a join before them (0) */
};

/* What the top-off prefix of a state holds (struct wear_dev, pre_state). */
enum {
	WEAR_PRE_OPEN,		/* every row so far, none synchronising */
	WEAR_PRE_DONE,		/* the rows up to the synchronising one */
	WEAR_PRE_LOST,		/* more than WEAR_PRE_MAX runs: none kept */
	WEAR_PRE_NSTATE
};

/* N rows alike to the top-off detector, from T to T_LAST, as the first. */
struct wear_run {
	cw_time t, t_last;
	unsigned long n;
	double v, i, soc;
};

/* The per-device streaming state; set it up with wear_init(). */
struct wear_dev {
	struct wear_acc acc;
	struct rf_state rf;
	struct topoff top;
	int have_prev;			/* the previous row, for charge */
	cw_time prev_t;
	int have_soc;			/* the last row with SoC */
	cw_time soc_t;
	double soc;
	int have_temp;			/* the last row with temperature */
	cw_time temp_t;
	double temp;
	int have_model;			/* the last row with both */
	cw_time model_t;
	struct model_eval rate;		/* its calendar rate */
	/* The first rows, for a join after an earlier state. */
	double head_i;			/* current of the first row */
	double head_temp;		/* its temperature, NaN if unusable */
	int have_soc0;			/* the first row with SoC */
	cw_time soc0_t;
	double soc0;
	int have_temp0;			/* the first row with temperature */
	cw_time temp0_t;
	double temp0;
	int have_model0;		/* the first row with both */
	cw_time model0_t;
	struct model_eval rate0;
	/* The top-off prefix: pre[0..pre_n), WEAR_PRE_* in pre_state. */
	int pre_state;
	size_t pre_n, pre_cap;
	struct wear_run *pre;
	unsigned long pre_cycles;	/* acc.topoff_cycles after it */
	unsigned long pre_judged;	/* acc.topoff_judged after it */
	/* Before the first row; a join keeps the earlier state's. */
	struct wear_prior prior;
};

/* A device's report: NaN (an empty field) for what is not known. */
struct wear_result {
	double days;
	double charge_ah;
	double efc;
	double max_depth_pct;
	double hours_near_full;	/* SoC at or above --full */
	double hours_hot;	/* temperature at or above T3 */
	double cold_charge_ah;	/* below T1 */
	double cool_charge_ah;	/* from T1 to T2 */
	double hot_charge_ah;	/* above T3 */
	double topoff_cycles;
	double share_age;
	double share_cycling;
	double share_high_soc;
	double share_heat;
	double fade_pct;	/* over the span, points of rated capacity */
	double soh_pct;		/* modelled, at the last row */
	double days_to_eol;
	const char *dominant;	/* "" when not known */
	const char *prior;	/* "new", "soh" or "age" */
	double damage;		/* the span's f, scaled */
	double damage_prior;	/* f0, the damage at the first row */
	double max_charge_c;	/* with a capacity, else NaN */
	double mean_charge_c;
	double fade_ah;
};

/* Defaults: xu2018 unscaled, thermal and topoff defaults, 0.05 A, 15 min,
 * hysteresis 1 %, residue as half cycles. */
void	wear_conf_default(struct wear_conf *c);
/*
 * Scale the cycle damage so that N full cycles at the model's reference
 * SoC and temperature give WEAR_EOL_FADE alone (a datasheet's cycle
 * rating), or the calendar damage so that DAYS at rest there do.
 */
void	wear_set_cycle_life(struct wear_conf *c, double n);
void	wear_set_calendar_life(struct wear_conf *c, double days);

void	wear_init(struct wear_dev *d, const struct wear_conf *c);
/* One row: time T (not before the previous row's), voltage V, current
 * I_A (positive while charging), TEMP_C and SOC (percent); NaN when
 * missing. */
void	wear_push(struct wear_dev *d, const struct wear_conf *c, cw_time t,
	    double v, double i_a, double temp_c, double soc);
/* The end of the device's rows: the rainflow residue and the open hold. */
void	wear_finish(struct wear_dev *d, const struct wear_conf *c);
void	wear_free(struct wear_dev *d);
/*
 * Join B, the state of the stretch that follows A's (B's first row not
 * before A's last), into A, which becomes the state of both.  B is left
 * empty (wear_free() on it is harmless).  Neither may have been finished.
 */
void	wear_join(struct wear_dev *a, struct wear_dev *b,
	    const struct wear_conf *c);
/*
 * Give up joinability for a state that will only ever be continued (a
 * cumulative --state file): a raw rainflow start side is paired as a
 * plain pass pairs it, so it stays short, and the top-off prefix is
 * dropped (WEAR_PRE_LOST).
 */
void	wear_compact(struct wear_dev *d, const struct wear_conf *c);

/* Add the totals of B to A (B's span may come before or after A's). */
void	wear_acc_merge(struct wear_acc *a, const struct wear_acc *b);
/* The damage f0 of prior P at the first row, scaled as C says. */
double	wear_prior_damage(const struct wear_conf *c, const struct wear_prior *p);
/* "new", "soh" or "age". */
const char *wear_prior_name(int kind);
/* The report of totals A after prior P (NULL: new); CAPACITY_AH > 0 adds
 * C-rates and Ah lost. */
void	wear_report(const struct wear_conf *c, const struct wear_acc *a,
	    const struct wear_prior *p, double capacity_ah,
	    struct wear_result *r);

#endif
