/*
 * rainflow.h: streaming rainflow cycle counting, one state per device.
 *
 * A sample history passes two stages.
 *
 * 1. Turning points, with hysteresis H.  A reversal is a move back from
 *    the latest extreme; one smaller than H is ignored (a move of at least
 *    H, up to rounding, counts, and so does any move above zero when H is
 *    0).  A flat run is not a turning point: an extreme held over several
 *    samples counts once, at its first sample.  The first and last points
 *    of the history count as turning points, as ASTM E1049-85 has it;
 *    while the history has not yet moved by H in either direction the
 *    first turning point is the extreme opposite to the first move (the
 *    first sample when the history starts with a steady move), so a
 *    range is never understated by noise at the start.  The latest
 *    extreme is provisional until the history moves back from it by H:
 *    nothing depends on it before then.
 *
 * 2. The three-point rule of ASTM E1049-85 (reapproved 2017) section
 *    5.4.4: with Y the range of the two turning points before the newest
 *    and X the range from the previous one to the newest, X >= Y closes
 *    Y.  Y is a full cycle, handed to emit() at once, unless it holds the
 *    starting point S; then it is a half cycle and S moves on.  Those
 *    half cycles, and the ranges still open at the end, form the residue;
 *    rf_finish() counts it as the caller asks (RF_RESIDUE_HALF is the
 *    standard's step 6).  So the start side's half cycles reach emit()
 *    from rf_finish(), after the full cycles, whatever the residue mode.
 *    Two start-side half cycles in a row with the same range are the two
 *    halves of one cycle (the history came back to the value it left, so
 *    their means are equal too): they are counted at once as that full
 *    cycle and leave the residue.  Counts by range and mean are those of
 *    the standard; the rows are those of the four-point method, which
 *    closes such a cycle, and the start side stays short (its ranges
 *    strictly rise).
 *
 * Ranges are compared up to a few units in the last place of the values,
 * so decimal data (SoC in tenths of a percent) behaves as decimal.
 *
 * Memory: the residue only, O(residue) per device; it grows by doubling,
 * never per sample.  For a bounded signal the residue is bounded: its
 * ranges rise, then fall, each at least H.
 */
#ifndef RAINFLOW_H
#define RAINFLOW_H

#include <stddef.h>
#include "cw.h"
#include "statefmt.h"

/* One counted cycle or half cycle. */
struct rf_cycle {
	double range;		/* |difference| of its turning points */
	double mean;		/* their average */
	double count;		/* 0.5 or 1 */
	cw_time start, end;	/* times of the earlier and later of them */
	double aux_mean;	/* mean of their aux values (the numeric ones;
				   NaN when neither is) */
};

/* A turning point. */
struct rf_point {
	double x, aux;
	cw_time t;
};

/* What to do with the residue at the end of a history. */
enum {
	RF_RESIDUE_HALF,	/* each open range is half a cycle (ASTM) */
	RF_RESIDUE_FULL,	/* each open range is a full cycle */
	RF_RESIDUE_REPEAT	/* as if the history repeated: every range
				   closes, the largest last */
};

/*
 * The RF_RESIDUE_* value named by S ("half", "full" or "repeat", the
 * --residue option's words), or -1 for anything else.
 */
int	rf_residue_parse(const char *s);

typedef void rf_emit_fn(void *ctx, const struct rf_cycle *c);

/*
 * The state of one history.  Plain data, embeddable by value in a device
 * state; only pt is allocated.  Treat the fields as private.
 */
struct rf_state {
	double hyst;		/* hysteresis H, >= 0 */
	int dir;		/* RF_DIR_* in rainflow.c */
	struct rf_point lo, hi;	/* before the first move: the extremes */
	struct rf_point cand;	/* the provisional extreme */
	struct rf_point *pt;	/* residue: pt[0..start) the start side, */
	size_t n, cap, start;	/* pt[start..n) the open stack */
	int periodic;		/* internal: no starting point (repeat) */
	int raw_start;		/* equal start-side halves left unpaired
				   (see rf_join) */
	unsigned long nturn;	/* turning points confirmed so far */
};

/* Start an empty history with hysteresis HYST (>= 0, NaN taken as 0). */
void	rf_init(struct rf_state *s, double hyst);
/*
 * Add the sample X at time T (not before the previous sample), carrying
 * AUX (NaN if unknown).  A non-numeric X is ignored: the caller counts
 * it.  Every cycle this closes is handed to EMIT(CTX, cycle).
 */
void	rf_push(struct rf_state *s, cw_time t, double x, double aux,
	    rf_emit_fn *emit, void *ctx);
/*
 * End the history: the provisional extreme becomes the last turning
 * point, then the residue is counted by RESIDUE_MODE (RF_RESIDUE_*).  The
 * state is left empty, as after rf_init() with the same hysteresis.
 */
void	rf_finish(struct rf_state *s, int residue_mode, rf_emit_fn *emit,
	    void *ctx);
/*
 * Joining the states of two consecutive stretches of one history, each
 * counted from its own start (cw-wear --merge).  The cycles a state has
 * already emitted are final; what is left (the residue, the provisional
 * extreme, or the extremes of a history that has not moved yet) is
 * pushed through rf_push() into A, the state of the earlier stretch, in
 * time order, so the hysteresis and the three-point rule see it as a
 * single pass over both stretches would.  Every cycle this closes goes to
 * EMIT.  B is left as it was; free it as usual.
 *
 * For the join to count exactly what one pass counts, B must have been
 * counted with RAW_START set (before its first sample): it then keeps
 * both halves of an equal-range start-side cycle in its residue instead
 * of counting them as one cycle at once, since after A's samples they
 * may close with a different neighbour.  rf_join() into a fresh state
 * (rf_init() without RAW_START) turns such a state into the one a plain
 * pass would have reached, pairing the halves then.
 */
void	rf_join(struct rf_state *a, const struct rf_state *b,
	    rf_emit_fn *emit, void *ctx);
/*
 * Whether S is a state rf_push() could have left (for states read back
 * from a file): 0 if so, -1 if not.
 */
int	rf_check(const struct rf_state *s);
/*
 * The saved form of a state (cw-wear --state-out): the fields of struct
 * rf_state as a table of *N columns, offsets within the struct (the
 * hysteresis is a setting, saved by the caller), and the residue as one
 * field, "t:x:aux;..." (empty when there is none).  rf_state_get_residue()
 * reads that field into S, set up by rf_init() with an empty residue: 0,
 * or -1 when it is not one rf_state_put_residue() writes.
 */
const struct sfmt_spec *rf_state_fields(size_t *n);
void	rf_state_put_residue(struct sfmt_buf *b, const struct rf_state *s);
int	rf_state_get_residue(struct rf_state *s, const char *str, size_t n);
/* Release the residue's memory; rf_init() again before any further use. */
void	rf_free(struct rf_state *s);
/* Turning points in the residue now (for tests and memory checks). */
size_t	rf_residue_len(const struct rf_state *s);

/*
 * Bins for histograms and range-mean matrices.  Bin K of width W holds
 * the values V with K*W < V <= (K+1)*W (a value on an edge belongs to the
 * lower bin), decided up to rounding, so ranges, which are never 0, start
 * at bin 0, (0, W].  Indices are clamped to +-1e15 (or half of LONG_MAX).
 */
long	rf_bin_index(double v, double w);

struct rf_cell {
	long ri, mi;		/* range bin, mean bin (0 without means) */
	double cycles;		/* sum of counts; 0 marks an empty slot */
};

/* Cycles by range bin, or by range and mean bin: a small hash table. */
struct rf_hist {
	double rw, mw;		/* widths; mw 0: ranges only */
	struct rf_cell *cell;	/* open addressing, at most half full */
	size_t n, cap;
};

/* RANGE_WIDTH > 0; MEAN_WIDTH > 0 for a matrix, 0 for ranges only. */
void	rf_hist_init(struct rf_hist *h, double range_width,
	    double mean_width);
void	rf_hist_add(struct rf_hist *h, const struct rf_cycle *c);
/* A new array (free() it) of the N non-empty cells in range, then mean
 * bin order; NULL when N is 0. */
struct rf_cell *rf_hist_sorted(const struct rf_hist *h, size_t *n);
void	rf_hist_free(struct rf_hist *h);

/* Running totals for a summary row. */
struct rf_sum {
	double cycles;		/* sum of counts */
	double range_sum;	/* sum of count * range */
	double max_range;	/* 0 before the first cycle */
	unsigned long full, half;	/* how many of each were counted */
};

void	rf_sum_add(struct rf_sum *m, const struct rf_cycle *c);
/* Count-weighted mean range; NaN when nothing was counted. */
double	rf_sum_mean_range(const struct rf_sum *m);

#endif
