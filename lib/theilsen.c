/*
 * theilsen.c: the Theil-Sen line by slope selection; see theilsen.h.
 */
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "cw.h"
#include "theilsen.h"

#define SQRT2	1.41421356237309504880
#define SQRT2PI	2.50662827463100050242

struct xy {
	double x, y;
};

static int	cmp_xy(const void *, const void *);
static int	cmp_double(const void *, const void *);
static uint64_t	dkey(double);
static double	dval(uint64_t);
static unsigned long long msort(struct theil_pts *, double *, size_t *,
		    int);
static void	push_slope(struct theil_pts *, size_t, size_t);
static double	select_kth(double *, size_t, size_t);
static double	median_of(double *, size_t);
static double	tie_term(double *, size_t);
static uint64_t	rng_next(uint64_t *);

static int
cmp_xy(const void *a, const void *b)
{
	const struct xy *p = a, *q = b;

	if (p->x != q->x)
		return p->x < q->x ? -1 : 1;
	if (p->y != q->y)
		return p->y < q->y ? -1 : 1;
	return 0;
}

static int
cmp_double(const void *a, const void *b)
{
	double p = *(const double *)a, q = *(const double *)b;

	return (p > q) - (p < q);
}

/* An unsigned key that orders like the double it stands for. */
static uint64_t
dkey(double d)
{
	uint64_t u;

	memcpy(&u, &d, sizeof u);
	return (u >> 63) ? ~u : u | (1ULL << 63);
}

static double
dval(uint64_t k)
{
	uint64_t u = (k >> 63) ? k & ~(1ULL << 63) : ~k;
	double d;

	memcpy(&d, &u, sizeof d);
	return d;
}

/* A small deterministic generator (xorshift64*), so results repeat. */
static uint64_t
rng_next(uint64_t *s)
{
	*s ^= *s >> 12;
	*s ^= *s << 25;
	*s ^= *s >> 27;
	return *s * 0x2545F4914F6CDD1DULL;
}

int
theil_prep(struct theil_pts *p, const double *x, const double *y, size_t n)
{
	struct xy *v;
	double ymin, ymax, mindx;
	unsigned long long ties;
	size_t i, g;

	memset(p, 0, sizeof *p);
	p->brute_max = THEIL_BRUTE_MAX;
	if (n < 2)
		return -1;
	v = cw_malloc(n * sizeof *v);
	for (i = 0; i < n; i++) {
		v[i].x = x[i];
		v[i].y = y[i];
	}
	qsort(v, n, sizeof *v, cmp_xy);
	p->n = n;
	p->x = cw_malloc(n * sizeof *p->x);
	p->y = cw_malloc(n * sizeof *p->y);
	p->u = cw_malloc(n * sizeof *p->u);
	p->ubuf = cw_malloc(n * sizeof *p->ubuf);
	p->idx = cw_malloc(n * sizeof *p->idx);
	p->ibuf = cw_malloc(n * sizeof *p->ibuf);
	/* Slopes do not change with a shift of x; a small x rounds better. */
	for (i = 0; i < n; i++) {
		p->x[i] = v[i].x - v[0].x;
		p->y[i] = v[i].y;
	}
	free(v);

	ymin = ymax = p->y[0];
	mindx = HUGE_VAL;
	ties = 0;
	for (i = 0, g = 1; i < n; i++) {
		if (p->y[i] < ymin)
			ymin = p->y[i];
		if (p->y[i] > ymax)
			ymax = p->y[i];
		if (i == 0)
			continue;
		if (p->x[i] == p->x[i - 1]) {
			g++;
		} else {
			ties += (unsigned long long)g * (g - 1) / 2;
			g = 1;
			if (p->x[i] - p->x[i - 1] < mindx)
				mindx = p->x[i] - p->x[i - 1];
		}
	}
	ties += (unsigned long long)g * (g - 1) / 2;
	p->npairs = (unsigned long long)n * (n - 1) / 2 - ties;
	if (p->npairs == 0)
		return -1;
	p->bound = (ymax - ymin) / mindx;
	return 0;
}

void
theil_free(struct theil_pts *p)
{
	free(p->x);
	free(p->y);
	free(p->u);
	free(p->ubuf);
	free(p->idx);
	free(p->ibuf);
	free(p->slopes);
	memset(p, 0, sizeof *p);
}

/*
 * Bottom-up merge sort of V[0..n) (and ID alongside, when not NULL),
 * ascending and stable.  Returns the number of pairs i < j with
 * V[j] < V[i].  With LIST, every such pair whose first member has the
 * smaller point index (ID) is put on the slope list.
 */
static unsigned long long
msort(struct theil_pts *p, double *v, size_t *id, int list)
{
	double *a = v, *b = p->ubuf, *dt;
	size_t *ia = id, *ib = id != NULL ? p->ibuf : NULL, *it;
	size_t n = p->n, w, lo, mid, hi, i, j, k, m;
	unsigned long long inv = 0;

	for (w = 1; w < n; w *= 2) {
		for (lo = 0; lo < n; lo += 2 * w) {
			mid = lo + w < n ? lo + w : n;
			hi = lo + 2 * w < n ? lo + 2 * w : n;
			i = lo;
			j = mid;
			k = lo;
			while (i < mid && j < hi) {
				if (a[i] <= a[j]) {
					if (ia != NULL)
						ib[k] = ia[i];
					b[k++] = a[i++];
					continue;
				}
				inv += mid - i;
				if (list)
					for (m = i; m < mid; m++)
						if (ia[m] < ia[j])
							push_slope(p, ia[m],
							    ia[j]);
				if (ia != NULL)
					ib[k] = ia[j];
				b[k++] = a[j++];
			}
			while (i < mid) {
				if (ia != NULL)
					ib[k] = ia[i];
				b[k++] = a[i++];
			}
			while (j < hi) {
				if (ia != NULL)
					ib[k] = ia[j];
				b[k++] = a[j++];
			}
		}
		dt = a;
		a = b;
		b = dt;
		it = ia;
		ia = ib;
		ib = it;
	}
	if (a != v) {
		memcpy(v, a, n * sizeof *v);
		if (id != NULL)
			memcpy(id, ia, n * sizeof *id);
	}
	return inv;
}

static void
push_slope(struct theil_pts *p, size_t i, size_t j)
{
	if (p->x[i] == p->x[j])
		return;
	if (p->nslopes == p->slopecap) {
		p->slopecap = p->slopecap ? 2 * p->slopecap : 1024;
		p->slopes = cw_realloc(p->slopes,
		    p->slopecap * sizeof *p->slopes);
	}
	p->slopes[p->nslopes++] = (p->y[j] - p->y[i]) / (p->x[j] - p->x[i]);
}

unsigned long long
theil_count_below(struct theil_pts *p, double t)
{
	size_t i;

	/*
	 * For i < j in x order, slope_ij < t exactly when
	 * y_j - t x_j < y_i - t x_i: an inversion.  Points with equal x
	 * are sorted by y, so they never form one.
	 */
	for (i = 0; i < p->n; i++)
		p->u[i] = p->y[i] - t * p->x[i];
	return msort(p, p->u, NULL, 0);
}

/* Quickselect: the element of rank K of A[0..n), A reordered. */
static double
select_kth(double *a, size_t n, size_t k)
{
	size_t lo = 0, hi = n - 1, i, j;
	double piv, t;

	while (lo < hi) {
		/* Median of three as the pivot. */
		size_t m = lo + (hi - lo) / 2;
		double x = a[lo], y = a[m], z = a[hi];

		piv = x < y ? (y < z ? y : (x < z ? z : x)) :
		    (x < z ? x : (y < z ? z : y));
		i = lo;
		j = hi;
		while (i <= j) {
			while (a[i] < piv)
				i++;
			while (a[j] > piv)
				j--;
			if (i <= j) {
				t = a[i];
				a[i] = a[j];
				a[j] = t;
				i++;
				if (j == 0)
					break;
				j--;
			}
		}
		if (k <= j)
			hi = j;
		else if (k >= i)
			lo = i;
		else
			return a[k];
	}
	return a[k];
}

double
theil_kth(struct theil_pts *p, unsigned long long k)
{
	unsigned long long clo, chi, c, budget, m, r;
	uint64_t seed = 0x9E3779B97F4A7C15ULL, klo, khi;
	double lo, hi, mid, *u2;
	size_t i, j, n = p->n;

	if (k >= p->npairs)
		k = p->npairs - 1;
	p->nslopes = 0;
	if (p->npairs <= p->brute_max) {
		for (i = 0; i < n; i++)
			for (j = i + 1; j < n; j++)
				push_slope(p, i, j);
		return select_kth(p->slopes, p->nslopes, k);
	}

	/* Every slope lies in [-bound, bound]: start from wider than that. */
	lo = -2 * p->bound - 1;
	hi = 2 * p->bound + 1;
	clo = 0;
	chi = p->npairs;

	/*
	 * Bracket the rank from a sample of 4n random pairs: the sample's
	 * quantiles three standard errors either side of k / npairs.
	 */
	m = 4 * (unsigned long long)n;
	for (c = 0; c < 8 * m && p->nslopes < m; c++) {
		i = rng_next(&seed) % n;
		j = rng_next(&seed) % n;
		if (i < j)
			push_slope(p, i, j);
		else if (j < i)
			push_slope(p, j, i);
	}
	if (p->nslopes > 0) {
		double q = ((double)k + 0.5) / (double)p->npairs;
		double at = q * (double)p->nslopes;
		double d = 3 * sqrt((double)p->nslopes);
		double cand[2];
		int ci;

		qsort(p->slopes, p->nslopes, sizeof *p->slopes, cmp_double);
		cand[0] = at - d >= 0 ? p->slopes[(size_t)(at - d)] : lo;
		cand[1] = at + d < (double)p->nslopes ?
		    p->slopes[(size_t)(at + d)] : hi;
		for (ci = 0; ci < 2; ci++) {
			if (!(cand[ci] > lo && cand[ci] < hi))
				continue;
			c = theil_count_below(p, cand[ci]);
			if (c <= k) {
				lo = cand[ci];
				clo = c;
			} else {
				hi = cand[ci];
				chi = c;
			}
		}
	}

	/* Invariant: clo <= k < chi, and the slope of rank k is in [lo, hi). */
	budget = 16 * (unsigned long long)n;
	if (budget < 4096)
		budget = 4096;
	while (chi - clo > budget) {
		klo = dkey(lo);
		khi = dkey(hi);
		if (khi - klo <= 1)
			return lo;	/* a run of equal slopes */
		mid = dval(klo + (khi - klo) / 2);
		c = theil_count_below(p, mid);
		if (c <= k) {
			lo = mid;
			clo = c;
		} else {
			hi = mid;
			chi = c;
		}
	}

	/*
	 * List the pairs with a slope in [lo, hi): put the points in the
	 * order of y - lo x (ties by index, which is how count_below sees
	 * them), then the pairs that y - hi x inverts in that order are the
	 * ones whose order changes between lo and hi.
	 */
	for (i = 0; i < n; i++) {
		p->u[i] = p->y[i] - lo * p->x[i];
		p->idx[i] = i;
	}
	msort(p, p->u, p->idx, 0);
	u2 = p->u;
	for (i = 0; i < n; i++)
		u2[i] = p->y[p->idx[i]] - hi * p->x[p->idx[i]];
	p->nslopes = 0;
	msort(p, u2, p->idx, 1);
	if (p->nslopes == 0)
		return lo;
	r = k - clo;
	if (r >= p->nslopes)
		r = p->nslopes - 1;
	return select_kth(p->slopes, p->nslopes, (size_t)r);
}

/* The median of A[0..n), n > 0, as numpy.median (mean of the middle two). */
static double
median_of(double *a, size_t n)
{
	double hi, lo;
	size_t i;

	hi = select_kth(a, n, n / 2);
	if (n % 2)
		return hi;
	/* The lower middle is the largest of what select_kth left below. */
	lo = a[0];
	for (i = 1; i < n / 2; i++)
		if (a[i] > lo)
			lo = a[i];
	return (lo + hi) / 2;
}

/* Sum of g (g - 1) (2 g + 5) over the groups of equal values of A (sorted). */
static double
tie_term(double *a, size_t n)
{
	double s = 0, g = 1;
	size_t i;

	for (i = 1; i <= n; i++) {
		if (i < n && a[i] == a[i - 1]) {
			g++;
			continue;
		}
		s += g * (g - 1) * (2 * g + 5);
		g = 1;
	}
	return s;
}

int
theil_fit(const double *x, const double *y, size_t n, double conf,
    struct theil_fit *out)
{
	struct theil_pts p;
	unsigned long long nt, rl, ru;
	double *r, alpha, z, sigsq, sigma, dn, a;
	size_t i;

	out->slope = out->intercept = CW_MISSING;
	out->slope_lo = out->slope_hi = CW_MISSING;
	out->npairs = 0;
	if (theil_prep(&p, x, y, n) != 0) {
		theil_free(&p);
		return -1;
	}
	nt = p.npairs;
	out->npairs = nt;
	if (nt % 2)
		out->slope = theil_kth(&p, nt / 2);
	else
		out->slope = (theil_kth(&p, nt / 2 - 1) +
		    theil_kth(&p, nt / 2)) / 2;

	r = cw_malloc(n * sizeof *r);
	for (i = 0; i < n; i++)
		r[i] = y[i] - out->slope * x[i];
	out->intercept = median_of(r, n);

	/*
	 * Sen (1968), eq. 2.6: the variance of Kendall's S with ties in x
	 * and in y; the interval's ranks are (N -+ z sigma) / 2 rounded to
	 * nearest, ties to even, as scipy.stats.theilslopes forms them.
	 */
	alpha = conf > 0.5 ? 1 - conf : conf;
	z = theil_norm_quantile(alpha / 2);
	dn = (double)n;
	for (i = 0; i < n; i++)
		r[i] = y[i];
	qsort(r, n, sizeof *r, cmp_double);
	sigsq = dn * (dn - 1) * (2 * dn + 5) - tie_term(p.x, n) -
	    tie_term(r, n);
	sigsq /= 18;
	free(r);
	if (sigsq >= 0 && cw_isnum(z)) {
		sigma = sqrt(sigsq);
		a = nearbyint(((double)nt - z * sigma) / 2);
		ru = a < (double)(nt - 1) ? (unsigned long long)a : nt - 1;
		a = nearbyint(((double)nt + z * sigma) / 2) - 1;
		rl = a > 0 ? (unsigned long long)a : 0;
		out->slope_lo = theil_kth(&p, rl);
		out->slope_hi = theil_kth(&p, ru);
	}
	theil_free(&p);
	return 0;
}

double
theil_norm_quantile(double p)
{
	double z = 0, step, f;
	int k;

	if (!(p > 0 && p < 1))
		return CW_MISSING;
	if (p > 0.5)
		return -theil_norm_quantile(1 - p);
	/*
	 * Newton's method on Phi(z) = erfc(-z / sqrt 2) / 2 from z = 0:
	 * Phi is convex for z <= 0, so the iterates approach the root from
	 * the right and never overshoot.
	 */
	for (k = 0; k < 200; k++) {
		f = 0.5 * erfc(-z / SQRT2) - p;
		step = f / (exp(-z * z / 2) / SQRT2PI);
		z -= step;
		if (fabs(step) <= 1e-15 * (fabs(z) + 1e-300))
			break;
	}
	return z;
}
