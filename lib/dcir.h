/*
 * dcir.h: DC internal resistance from the current steps of a field log,
 * its correction to a reference temperature, and its trend per device.
 *
 * A step is a pair of consecutive samples of one device, "pre" and "post",
 * with |I_post - I_pre| >= min_step and 0 < t_post - t_pre <= max_dt, the
 * current steady before it: the steady_n samples ending with pre all have
 * a current, follow each other at most max_dt apart, and span no more than
 * steady_tol * |I_post - I_pre| from lowest to highest current.  Then
 * R = (V_post - V_pre) / (I_post - I_pre), current positive while charging,
 * so a healthy cell gives R > 0 for a step either way.  The SoC and the
 * temperature of a step are those of pre (of post when pre has none); the
 * step is kept only inside the SoC and temperature windows and with R > 0.
 *
 * Memory: a ring of the last samples per device (fixed size) for the
 * detector; for the trend, the steps per 1-point SoC bin (counts and
 * times) and the points of a device up to a cap, thinned by time buckets
 * beyond it (see struct dcir_series).
 */
#ifndef DCIR_H
#define DCIR_H

#include <stddef.h>
#include "cw.h"

/* The molar gas constant, J/(mol K): CODATA 2018 (exact since the 2019 SI). */
#define DCIR_RGAS	8.314462618
#define DCIR_KELVIN	273.15
/* The most samples the steadiness test can look back over. */
#define DCIR_HIST_MAX	32

struct dcir_conf {
	double min_step;	/* A, |delta I| at least this */
	cw_time max_dt;		/* samples of a step at most this far apart */
	int steady_n;		/* samples before a step that must be steady */
	double steady_tol;	/* their current spread, a fraction of |dI| */
	double soc_lo, soc_hi;	/* SoC window, percent */
	double temp_lo, temp_hi;	/* temperature window, C */
	int unknown_soc_ok;	/* keep steps whose SoC is unknown */
	int soc_auto;		/* no SoC window here: the trend chooses one */
	double ref_temp_c;	/* Arrhenius reference temperature, C */
	double ea_kj;		/* activation energy, kJ/mol */
};

/* Defaults as cw-dcir(1) gives them. */
void	dcir_conf_default(struct dcir_conf *c);

struct dcir_pt {
	cw_time t;
	double v, i, temp, soc;	/* NaN when missing */
};

/* Detector state of one device; zeroed is the start state. */
struct dcir_dev {
	struct dcir_pt hist[DCIR_HIST_MAX];
	unsigned head;		/* slot of the next sample */
	unsigned n;		/* samples held, at most DCIR_HIST_MAX */
};

/* What became of each candidate: the first gate it failed, or DCIR_OK. */
enum dcir_reason {
	DCIR_OK,		/* accepted */
	DCIR_NO_I,		/* a sample pair with a current missing */
	DCIR_GAP,		/* a step across more than max_dt */
	DCIR_UNSTEADY,		/* current not steady before the step */
	DCIR_NO_V,		/* voltage missing on either side */
	DCIR_SOC_UNKNOWN,	/* no SoC on either side */
	DCIR_SOC_OUT,		/* SoC outside the window */
	DCIR_TEMP_UNKNOWN,	/* no temperature on either side */
	DCIR_TEMP_OUT,		/* temperature outside the window */
	DCIR_NONPOS,		/* R <= 0: not a resistance */
	DCIR_NREASON
};

struct dcir_counts {
	unsigned long n[DCIR_NREASON];
};

/* Short names of the reasons, for -v: "accepted", "no-current", ... */
extern const char *const dcir_reason_name[DCIR_NREASON];

struct dcir_step {
	cw_time t;		/* time of the post sample */
	double soc, temp;	/* of the step, as above */
	double di, dv;		/* I_post - I_pre, V_post - V_pre */
	double i_pre;		/* I_pre, A */
	cw_time dt;		/* t_post - t_pre */
	double r;		/* dv / di, ohm */
	double r_ref;		/* r at the reference temperature */
};

/*
 * Feed sample S of the device with state D.  Returns 1 and fills *OUT when
 * S completes an accepted step, else 0.  Every pair of samples that shows
 * a step, or cannot be tested for one because a current is missing, adds
 * one to exactly one count of *CNT.
 */
int	dcir_feed(const struct dcir_conf *c, struct dcir_dev *d,
	    const struct dcir_pt *s, struct dcir_counts *cnt,
	    struct dcir_step *out);

/*
 * Arrhenius correction of R measured at TEMP_C to REF_C:
 * R_ref = R * exp(-(Ea / Rg) * (1 / T - 1 / T_ref)), T in kelvin,
 * Ea = EA_KJ * 1000 J/mol, Rg = DCIR_RGAS.
 */
double	dcir_arrhenius(double r, double temp_c, double ref_c, double ea_kj);

/*
 * SoC bins of 1 point: bin k holds SoC in [k, k + 1), bin 99 also 100;
 * bin DCIR_NBIN the steps of unknown SoC.  A --soc auto window is
 * DCIR_WINDOW bins wide.
 */
#define DCIR_NBIN	100
#define DCIR_WINDOW	30
/*
 * Thinning levels: up to DCIR_LEVEL_TIME, buckets of 2^level seconds
 * (2^40 s, 35,000 years, at the top) and 1-point SoC bins; above it, one
 * bucket for the whole history and SoC bins merged pairwise per level
 * (bins of 2^(level - DCIR_LEVEL_TIME) points), the steps of unknown SoC
 * still apart.  At DCIR_LEVEL_MAX all known SoC is one bin, so at most 2
 * points are left, within any cap.
 */
#define DCIR_LEVEL_TIME	40
#define DCIR_LEVEL_MAX	(DCIR_LEVEL_TIME + 7)

struct dcir_bin {
	unsigned long n;	/* steps */
	cw_time first, last;	/* times of the first and last */
};

struct dcir_kpt {
	cw_time t;
	double r;		/* r_ref */
	int bin;		/* 0..DCIR_NBIN */
};

/*
 * The steps of one device kept for the trend; zeroed is empty.
 *
 * Thinning, split-invariant: time is cut into buckets of 2^level seconds
 * aligned to the epoch, and of the steps in one bucket and one SoC group
 * only the earliest is kept (the first added, on equal times).  Whenever
 * more than MAXPTS points are kept, level goes up by one and buckets
 * merge pairwise (the earlier point of the two stays); above
 * DCIR_LEVEL_TIME the whole history is one bucket and the SoC groups
 * merge pairwise instead (a group is one 1-point bin up to
 * DCIR_LEVEL_TIME).  Each level's partition is a coarsening of the one
 * below, so the points kept are those of level L*, the lowest level at
 * which the whole history leaves at most MAXPTS points, whatever way the
 * history was cut into pieces and joined (dcir_series_join); MAXPTS is a
 * true bound (at DCIR_LEVEL_MAX at most 2 points are left).
 */
struct dcir_series {
	unsigned long steps;	/* accepted steps, all of them */
	cw_time first, last;	/* times of the first and last step */
	struct dcir_bin *bin;	/* DCIR_NBIN + 1, made with the first step */
	struct dcir_kpt *pt;	/* kept points, in time order */
	size_t n, cap;
	int level;		/* thinning level, 0..DCIR_LEVEL_MAX */
};

/* The points a series keeps unless told otherwise (--max-points). */
#define DCIR_MAX_POINTS	2048

/* The bin of SOC (NaN: DCIR_NBIN). */
int	dcir_soc_bin(double soc);
/* Add a step; MAXPTS (>= 2) caps the points kept. */
void	dcir_series_add(struct dcir_series *s, cw_time t, double r_ref,
	    double soc, size_t maxpts);
/*
 * Join B, whose steps all come at or after A's, into A, thinned as one
 * history would be; B is freed.
 */
void	dcir_series_join(struct dcir_series *a, struct dcir_series *b,
	    size_t maxpts);
void	dcir_series_free(struct dcir_series *s);
/* Thin S until it keeps at most MAXPTS (>= 2) points. */
void	dcir_series_cap(struct dcir_series *s, size_t maxpts);
/*
 * The --soc auto window of S: the first bin LO of the DCIR_WINDOW bins
 * holding most steps (ties: the window whose middle is nearest 50 %,
 * then the lower); -1 when S has no step of known SoC.
 */
int	dcir_series_window(const struct dcir_series *s);

struct dcir_trend_conf {
	unsigned long min_steps;	/* fewer steps: no estimate */
	cw_time min_span;		/* shorter first..last: no estimate */
	double eol_pct;			/* end of life at this % of r_start */
	double conf;			/* confidence level of the slope */
};

void	dcir_trend_conf_default(struct dcir_trend_conf *c);

struct dcir_trend {
	int fitted;		/* the estimates below are set */
	size_t used;		/* points in the fit */
	double slope;		/* ohm per day, Theil-Sen */
	double slope_lo, slope_hi;	/* its confidence interval */
	double r_start, r_end;	/* the fitted line at first and last */
	double growth_pct;	/* 100 (r_end - r_start) / r_start */
	double growth_30d;	/* percent of r_start per 30 days */
	double growth_lo_30d, growth_hi_30d;	/* the same of the interval */
	unsigned long steps;	/* steps in the window */
	cw_time first, last;	/* their first and last time */
	int has_eol;		/* eol_t is set */
	cw_time eol_t;		/* when the line reaches eol_pct of r_start */
};

/*
 * Fit the trend of S over the steps of SoC bins LO..LO + DCIR_WINDOW - 1
 * and those of unknown SoC (LO < 0: every step).  Estimates are NaN
 * (fitted 0) when the window has too few steps, too short a span or
 * fewer than two distinct times.  eol_t is set only when the whole
 * interval of the slope is above zero.
 */
void	dcir_trend_fit_window(const struct dcir_series *s,
	    const struct dcir_trend_conf *c, int lo, struct dcir_trend *out);
/* The same over every step. */
void	dcir_trend_fit(const struct dcir_series *s,
	    const struct dcir_trend_conf *c, struct dcir_trend *out);

#endif
