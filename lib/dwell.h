/*
 * dwell.h: hours per device by SoC band and temperature band, and the
 * idle hours among them (cw-wear --dwell), the table a storage policy or
 * a charge limit is audited with.
 *
 * SoC bands have the edges 0, 20, 40, 60, 80, 95 and 100 % (SPEC.md); a
 * value on an edge belongs to the band above it, and 100 % to the top
 * band.  Temperature bands have the edges T1, T2, 25, 35 and T3 C (T1..T3
 * of --limits, sorted, a repeated edge once), with one open band below
 * the first and one above the last.
 *
 * Time is counted between consecutive rows that both know SoC and
 * temperature (rows missing either are passed over), the two going
 * linearly from one row to the next, so an interval that crosses an edge
 * is split where it crosses.  An interval longer than max_gap holds the
 * state of the row before it, as cw-wear's other measures do.  An
 * interval is idle when every row that ends a part of it has a current
 * of magnitude below min_current (charge.h: a row's current holds over
 * the interval that ends at it); an interval over max_gap is taken as
 * rest, idle.
 */
#ifndef DWELL_H
#define DWELL_H

#include "cw.h"
#include "thermal.h"

#define DWELL_NSOC	6
#define DWELL_NTEMP	6	/* at most: five edges */

struct dwell_conf {
	double soc_edge[DWELL_NSOC + 1];
	double temp_edge[DWELL_NTEMP - 1];
	int ntemp;		/* temperature bands, 2..DWELL_NTEMP */
	double min_current;
	cw_time max_gap;
};

/* The per-device state, plain data; zero it to start. */
struct dwell_dev {
	int have;		/* a previous row with SoC and temperature */
	cw_time t;
	double soc, temp;
	int idle;		/* every row since then idle */
	double hours[DWELL_NSOC][DWELL_NTEMP];
	double idle_hours[DWELL_NSOC][DWELL_NTEMP];
	double covered_h;	/* the sum of hours */
	unsigned long rows_skipped;	/* without SoC or temperature */
};

/* The bands from limits LIM; MIN_CURRENT in A, MAX_GAP. */
void	dwell_conf_set(struct dwell_conf *c, const struct thermal_limits *lim,
	    double min_current, cw_time max_gap);
/* One row: time T (not before the previous row's), current I_A, TEMP_C,
 * SOC (percent); NaN when missing. */
void	dwell_push(struct dwell_dev *d, const struct dwell_conf *c, cw_time t,
	    double i_a, double temp_c, double soc);
/* The edges of temperature band K: NaN for the open side. */
double	dwell_temp_lo(const struct dwell_conf *c, int k);
double	dwell_temp_hi(const struct dwell_conf *c, int k);

#endif
