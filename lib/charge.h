/*
 * charge.h: charge bookkeeping shared by the analysis tools.
 *
 * The sample stream's convention: the current of a row stands for the
 * interval that ends at the row, (t_prev, t], which is exactly what
 * cw-clean --step writes (the mean over the interval) and a fair reading
 * of raw logs.  So the charge of row k is I_k * (t_k - t_{k-1}), and an
 * interval longer than the gap limit carries no charge (the data is not
 * there to say what happened).
 */
#ifndef CHARGE_H
#define CHARGE_H

#include "cw.h"

/* Default gap beyond which nothing is interpolated or integrated. */
#define CHARGE_MAX_GAP (15 * 60 * CW_US_PER_S)

/* Ah carried by current I_A over (T0, T1]; 0 when the interval is not
 * positive, longer than MAX_GAP, or I_A is missing. */
static inline double
charge_ah(double i_a, cw_time t0, cw_time t1, cw_time max_gap)
{
	cw_time dt = t1 - t0;

	if (dt <= 0 || dt > max_gap || !cw_isnum(i_a))
		return 0.0;
	return i_a * (double)dt / (3600.0 * CW_US_PER_S);
}

#endif
