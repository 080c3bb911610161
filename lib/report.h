/*
 * report.h: the attention list of cw-report.  It reads the per-device CSVs
 * the analysis tools wrote (cw-wear, cw-thermal --summary, cw-topoff
 * --summary, cw-dcir --trend, cw-capacity --trend, cw-volt --summary),
 * each recognised by its header, finds the packs that need attention and
 * why, ranks them, most urgent first, and writes the list as text or CSV.
 * Memory grows with devices (one state each, a few findings each), never
 * with rows.
 */
#ifndef REPORT_H
#define REPORT_H

#include <stdio.h>
#include "cw.h"
#include "fleet.h"

/* What --by rolls the list up by. */
enum {
	REPORT_BY_PACK = 0,
	REPORT_BY_SITE,
	REPORT_BY_MODEL
};

/*
 * The reasons, most urgent first: the order of the list.  Tiers: 1 no
 * charging allowed, or the cells' voltage window left; 2 charging
 * outside the protocol; 3 measured capacity or resistance; 4 the
 * modelled life.
 */
enum report_reason {
	REPORT_CHARGE_BELOW_MIN,
	REPORT_CHARGE_ABOVE_MAX,
	REPORT_CELL_OVER_VOLTAGE,
	REPORT_CELL_UNDER_VOLTAGE,
	REPORT_COOL_OVER_CURRENT,
	REPORT_WARM_OVER_VOLTAGE,
	REPORT_CAPACITY_LOW,
	REPORT_CAPACITY_FADING,
	REPORT_RESISTANCE_HIGH,
	REPORT_RESISTANCE_RISING,
	REPORT_SHORT_LIFE,
	REPORT_NREASON
};

struct report_conf {
	double lim[4];		/* T1..T4 of cw-thermal's --limits, C */
	double soh_min;		/* --soh: measured SoH below it, % */
	double growth_max;	/* --growth: resistance growth, percent */
	double horizon_d;	/* --horizon: days ahead for a projection */
	double life_d;		/* --life: modelled days to end of life */
	double min_days;	/* --min-days: log span a life needs */
	double topoff_day;	/* --topoff: micro-cycles a day shown */
	long tz_s;		/* --tz: offset of the dates, seconds east */
	int by;			/* REPORT_BY_ */
	int csv;		/* --csv */
	long top;		/* --top: packs or groups listed, 0 all */
};

/* One reason for one pack, as ranked. */
struct report_finding {
	const void *dev;	/* the pack (opaque) */
	int reason;		/* enum report_reason */
	double mag;		/* severity in the reason, larger first */
	int isnew;		/* not in the --since report */
	size_t rank;		/* the pack's (or group's) place, from 1 */
	char detail[256];	/* why, with the numbers */
};

struct report;

void	report_conf_default(struct report_conf *c);
/* FLEET may be NULL (no sites, no rated capacities). */
struct report *report_new(const struct report_conf *c,
	    const struct fleet *fleet);
/* Read one tool output ("-": standard input); 0 or CW_EXIT_DATA, reported. */
int	report_read(struct report *r, const char *path);
/* Read an earlier --csv report; 0 or CW_EXIT_DATA, reported. */
int	report_since(struct report *r, const char *path);
/* Find and rank the reasons; returns the number of packs listed. */
size_t	report_rank(struct report *r);
/* The ranked findings, NFOUND of them (after report_rank). */
const struct report_finding *report_findings(const struct report *r,
	    size_t *nfound);
/* Write the list as configured (text or CSV); 0, or -1 on a write error. */
int	report_write(struct report *r, FILE *fp);
const char *report_reason_name(int reason);
/* 1..4, the tier of a reason. */
int	report_reason_tier(int reason);
/*
 * The order of the list: A before B (negative), after (positive).  By
 * tier and reason, then by severity, then by device name.
 */
int	report_cmp(const struct report_finding *a,
	    const struct report_finding *b, const char *name_a,
	    const char *name_b);
void	report_free(struct report *r);

#endif
