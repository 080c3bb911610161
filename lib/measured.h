/*
 * measured.h: measured capacity fade from a cw-capacity --trend output,
 * set beside cw-wear's modelled fade, and the least-squares fit of the
 * model's cycle and calendar scales to it (cw-wear --measured,
 * --fit-scales).
 *
 * The measured fade of a pack over cw-wear's span [first, last] is the
 * drop of its Theil-Sen line over that span, in points of the rated
 * capacity R:
 *   measured_fade_pct = -slope_ah_per_day * days(first, last) / R * 100.
 * It is not known (MEAS_*, below) when the pack has no trend row, no
 * slope (fewer estimates than cw-capacity's --min-estimates), a slope
 * whose Sen interval holds zero (no sure fade), or estimates that cover
 * less than MEAS_COVER of cw-wear's span (the line would be carried too
 * far beyond its points).
 */
#ifndef MEASURED_H
#define MEASURED_H

#include <stddef.h>
#include "cw.h"
#include "devtab.h"
#include "wear.h"

/* The least part of cw-wear's span the estimates must cover. */
#define MEAS_COVER	0.5

/* Why a pack has no measured fade, or MEAS_OK. */
enum {
	MEAS_OK, MEAS_NOROW, MEAS_NOSLOPE, MEAS_UNSURE, MEAS_SPAN, MEAS_NWHY
};

struct meas_pack {
	struct devent de;	/* de.name: the device */
	unsigned long line;
	int have_slope;		/* slope and its interval given */
	cw_time first, last;	/* of the estimates */
	double cap_start_ah;	/* NaN when not given */
	double rated_ah;	/* NaN when not given */
	double slope, slope_lo, slope_hi;	/* Ah per day */
};

struct meas;

/*
 * Read PATH, a cw-capacity --trend output (recognised by its header; any
 * other file is an error).  On an error it reports FILE:LINE and exits
 * with CW_EXIT_DATA.
 */
struct meas *meas_load(const char *path);
const struct meas_pack *meas_find(const struct meas *m, const char *name,
	    size_t len);
size_t	meas_count(const struct meas *m);
void	meas_free(struct meas *m);

/*
 * The measured fade (percentage points of RATED_AH, or when that is not
 * above 0, of the file's rated_ah, else of its capacity_start_ah) of P
 * (NULL: no row) over FIRST..LAST into *PCT; returns MEAS_OK or why not
 * (then *PCT is NaN).
 */
int	meas_fade(const struct meas_pack *p, cw_time first, cw_time last,
	    double rated_ah, double *pct);
/* A word for MEAS_* (for -v counts). */
const char *meas_why(int why);

/* One pack of a fit: its totals, its prior, its measured fade. */
struct meas_obs {
	const struct wear_acc *acc;
	const struct wear_prior *prior;
	double capacity_ah;	/* for wear_report, 0 if none */
	double measured_pct;
};

/* What a fit found: the scales before (C's) and after, with errors. */
struct meas_fit {
	size_t n;		/* packs in the fit */
	int common;		/* 1: one factor for both (not separable) */
	int converged;
	double scale[2][2];	/* [before, after][cycle, calendar] */
	double se[2];		/* standard errors of the fitted scales */
	double corr;		/* their correlation, NaN if not known */
	double rms[2], bias[2];	/* model minus measured, points */
	double eol_median[2];	/* median days_to_eol over the packs */
	size_t eol_n[2];	/* packs with a days_to_eol */
};

/*
 * Ordinary least squares of the N packs' modelled fade (wear_report's
 * fade_pct) on their measured fade over the model's cycle and calendar
 * scales, by Levenberg-Marquardt on their logarithms (the scales stay
 * above 0).  Needs N >= 2 (else returns -1); the standard errors need
 * N >= 3.  When the packs do not tell the two apart (the cycle and the
 * calendar columns of the Jacobian are parallel), one common factor of
 * C's scales is fitted instead and FIT->common set.
 */
int	meas_fit_scales(const struct wear_conf *c, const struct meas_obs *obs,
	    size_t n, struct meas_fit *fit);

#endif
