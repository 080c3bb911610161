/* dwell.c: hours by SoC band and temperature band (see dwell.h). */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "dwell.h"

/* Crossings of one interval: at most one per edge. */
#define MAXCUT	(DWELL_NSOC + 1 + DWELL_NTEMP + 1)

static int soc_band(const struct dwell_conf *, double);
static int temp_band(const struct dwell_conf *, double);
static int cut_cmp(const void *, const void *);
static int cuts(double, double, const double *, int, double *, int);
static void add(struct dwell_dev *, int, int, double, int);

void
dwell_conf_set(struct dwell_conf *c, const struct thermal_limits *lim,
    double min_current, cw_time max_gap)
{
	static const double soc[DWELL_NSOC + 1] = { 0, 20, 40, 60, 80, 95,
	    100 };
	double e[DWELL_NTEMP - 1];
	int i, n = 0;

	memset(c, 0, sizeof(*c));
	memcpy(c->soc_edge, soc, sizeof(soc));
	e[0] = lim->t[0];
	e[1] = lim->t[1];
	e[2] = 25;
	e[3] = 35;
	e[4] = lim->t[2];
	qsort(e, DWELL_NTEMP - 1, sizeof(e[0]), cut_cmp);
	for (i = 0; i < DWELL_NTEMP - 1; i++)
		if (n == 0 || e[i] != c->temp_edge[n - 1])
			c->temp_edge[n++] = e[i];
	c->ntemp = n + 1;
	c->min_current = min_current;
	c->max_gap = max_gap;
}

double
dwell_temp_lo(const struct dwell_conf *c, int k)
{
	return k > 0 ? c->temp_edge[k - 1] : CW_MISSING;
}

double
dwell_temp_hi(const struct dwell_conf *c, int k)
{
	return k < c->ntemp - 1 ? c->temp_edge[k] : CW_MISSING;
}

static int
soc_band(const struct dwell_conf *c, double s)
{
	int k;

	for (k = DWELL_NSOC - 1; k > 0; k--)
		if (s >= c->soc_edge[k])
			break;
	return k;
}

static int
temp_band(const struct dwell_conf *c, double x)
{
	int k;

	for (k = c->ntemp - 1; k > 0; k--)
		if (x >= c->temp_edge[k - 1])
			break;
	return k;
}

static int
cut_cmp(const void *pa, const void *pb)
{
	double a = *(const double *)pa, b = *(const double *)pb;

	return a < b ? -1 : a > b;
}

/* Where, as a fraction in (0, 1), a value going from A to B crosses each
 * of the N edges E; appended to U[K..], the new count returned. */
static int
cuts(double a, double b, const double *e, int n, double *u, int k)
{
	double x;
	int i;

	for (i = 0; i < n; i++) {
		if ((a < e[i]) == (b < e[i]))
			continue;
		/* In halves, so that no finite value overflows. */
		x = (e[i] * 0.5 - a * 0.5) / (b * 0.5 - a * 0.5);
		if (x > 0 && x < 1)
			u[k++] = x;
	}
	return k;
}

static void
add(struct dwell_dev *d, int s, int t, double h, int idle)
{
	d->hours[s][t] += h;
	if (idle)
		d->idle_hours[s][t] += h;
	d->covered_h += h;
}

void
dwell_push(struct dwell_dev *d, const struct dwell_conf *c, cw_time t,
    double i_a, double temp_c, double soc)
{
	double u[MAXCUT + 2], h, m;
	int idle, n, k;

	idle = cw_isnum(i_a) && fabs(i_a) < c->min_current;
	if (!(cw_isnum(soc) && soc >= 0 && soc <= 100 && cw_isnum(temp_c) &&
	    temp_c > -273.15)) {
		d->rows_skipped++;
		d->idle = d->idle && idle;
		return;
	}
	if (d->have && t > d->t) {
		h = (double)(t - d->t) / CW_US_PER_S / 3600.0;
		if (t - d->t > c->max_gap)
			add(d, soc_band(c, d->soc), temp_band(c, d->temp), h, 1);
		else {
			idle = d->idle && idle;
			n = 0;
			u[n++] = 0;
			n = cuts(d->soc, soc, c->soc_edge + 1, DWELL_NSOC - 1,
			    u, n);
			n = cuts(d->temp, temp_c, c->temp_edge, c->ntemp - 1,
			    u, n);
			u[n++] = 1;
			qsort(u, (size_t)n, sizeof(u[0]), cut_cmp);
			for (k = 0; k + 1 < n; k++) {
				if (!(u[k + 1] > u[k]))
					continue;
				m = (u[k] + u[k + 1]) / 2;
				add(d, soc_band(c, d->soc * (1 - m) + soc * m),
				    temp_band(c, d->temp * (1 - m) + temp_c * m),
				    h * (u[k + 1] - u[k]), idle);
			}
		}
	}
	d->have = 1;
	d->t = t;
	d->soc = soc;
	d->temp = temp_c;
	d->idle = 1;
}
