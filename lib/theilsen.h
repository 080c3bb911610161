/*
 * theilsen.h: the Theil-Sen line, a robust straight-line fit.  The slope is
 * the median of the slopes (y_j - y_i) / (x_j - x_i) over all pairs with
 * x_i < x_j (Theil 1950, Sen 1968); a sensor glitch moves it no more than
 * any other single point does, whatever its size.  The confidence interval
 * of the slope is Sen's (1968, eq. 2.6), from the ranks of the pairwise
 * slopes, with the tie corrections for repeated x and y.
 *
 * The pairwise slopes are never all stored.  A slope of a given rank is
 * selected by counting, for a trial value t, the pairs whose slope is below
 * t: that is the number of inversions of y - t x taken in the order of x,
 * counted by merge sort in O(n log n).  Bisection on t (over the ordered
 * bit patterns of doubles, so at most 64 rounds, usually far fewer after a
 * bracket from a random sample of pairs) narrows the interval until few
 * pairs remain in it; those are listed, again by merge sort, and the rank
 * is selected among them.  Small inputs simply list every pair.  Memory is
 * O(n) plus a bounded list; the result equals that of listing every pair
 * up to the rounding of the comparison y - t x.
 */
#ifndef THEILSEN_H
#define THEILSEN_H

#include <stddef.h>

struct theil_fit {
	double slope;		/* median pairwise slope */
	double intercept;	/* median of y - slope x */
	double slope_lo;	/* Sen's confidence interval of the slope, */
	double slope_hi;	/* NaN when it cannot be formed */
	unsigned long long npairs;	/* pairs with distinct x */
};

/*
 * Points prepared for slope selection: sorted by x (then y), with the
 * scratch space every count needs.  BRUTE_MAX: when there are at most this
 * many pairs, all are listed (THEIL_BRUTE_MAX by default; tests set it
 * low to exercise the counting path).
 */
#define THEIL_BRUTE_MAX 65536ULL

struct theil_pts {
	size_t n;
	double *x, *y;		/* sorted by x, then y */
	unsigned long long npairs;
	double bound;		/* every slope lies in [-bound, bound] */
	unsigned long long brute_max;
	/* Scratch. */
	double *u, *ubuf, *slopes;
	size_t *idx, *ibuf;
	size_t nslopes, slopecap;
};

/*
 * Copy X[0..N), Y[0..N) into P, sorted.  Returns 0, or -1 when fewer than
 * two distinct x exist (no slope is defined); P must be freed either way.
 */
int	theil_prep(struct theil_pts *p, const double *x, const double *y,
	    size_t n);
void	theil_free(struct theil_pts *p);
/* The slope of rank K (from 0) among the P->npairs pairwise slopes. */
double	theil_kth(struct theil_pts *p, unsigned long long k);
/* The number of pairwise slopes strictly below T. */
unsigned long long theil_count_below(struct theil_pts *p, double t);

/*
 * The whole fit of X, Y with a two-sided confidence level CONF (such as
 * 0.95) for the slope interval.  Returns 0, or -1 when fewer than two
 * distinct x exist (OUT then holds NaNs and no pairs).
 */
int	theil_fit(const double *x, const double *y, size_t n, double conf,
	    struct theil_fit *out);

/* The standard normal quantile: Phi^-1(P) for 0 < P < 1. */
double	theil_norm_quantile(double p);

#endif
