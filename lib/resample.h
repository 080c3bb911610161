/*
 * resample.h: one device's samples onto a regular grid.  Grid points are
 * the multiples of STEP since the epoch.  Voltage, temperature and SoC are
 * interpolated linearly between the samples around a grid point; current
 * is the mean over (g - STEP, g] of the piecewise-constant current of the
 * sample stream (a row's current holds over the interval ending at it), so
 * the charge of the resampled stream equals the charge of the input.
 * Nothing is interpolated across an interval longer than MAX_GAP: the grid
 * starts again after it.  A run of samples is framed by the grid points
 * around it: the one at or before its first sample and the one at or after
 * its last (at a gap, or rs_flush() at the end of input), which hold the
 * first and last sample's voltage, temperature and SoC.  A grid point's
 * current is the charge of its interval divided by STEP (the first point:
 * the first sample's own), so the stream's convention (charge_ah() of each
 * row after the first) gives back the input's charge exactly.
 */
#ifndef RESAMPLE_H
#define RESAMPLE_H

#include "cw.h"

/*
 * KEY is the caller's: a grid point gets the key of the last sample at or
 * before it (the sample whose interval it closes, or the one held), so a
 * caller can carry values that are not interpolated (cw-clean --keep).
 */
struct rs_point {
	cw_time t;
	double v, i, temp, soc;
	unsigned long key;
};

/* What a row reads first comes first: the prev sample, read whole, last. */
struct rs_state {
	int have;		/* prev holds a sample */
	cw_time g_next;		/* next grid point to emit */
	cw_time acc_pos;	/* charge accumulated up to here */
	double acc;		/* integral of current, A*us, since the
				 * current grid interval began */
	struct rs_point prev;
};

typedef void (*rs_emit_fn)(void *ctx, const struct rs_point *p);

void	rs_push(struct rs_state *s, const struct rs_point *p, cw_time step,
	    cw_time max_gap, rs_emit_fn emit, void *ctx);
/* End the current run (end of input). */
void	rs_flush(struct rs_state *s, cw_time step, rs_emit_fn emit,
	    void *ctx);

#endif
