/*
 * cw-capacity: measured capacity per charge or discharge segment of the
 * sample stream, by coulomb counting; or with --trend its fade per device
 * and the state of health against the rated capacity.  The engine is
 * lib/capacity.c (segments, the estimate, the trend) and lib/theilsen.c
 * (the robust fit); this file holds the options and the output.
 */
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "capacity.h"
#include "csvout.h"
#include "cw.h"
#include "dcir.h"
#include "devtab.h"
#include "finish.h"
#include "fleet.h"
#include "glue.h"
#include "ocv.h"
#include "opt.h"
#include "optab.h"
#include "outf.h"
#include "sampin.h"

#define EST_HEADER "device,start,end,direction,soc_from_pct,soc_to_pct," \
	"charge_ah,capacity_ah,temp_c,rows,resolution_pct"
#define REJECT_HEADER "device,start,end,direction,soc_from_pct," \
	"soc_to_pct,charge_ah,temp_c,rows,reason"
#define TREND_HEADER "device,estimates,first,last,capacity_start_ah," \
	"capacity_end_ah,fade_pct,fade_pct_per_30d,soh_pct,eol_date," \
	"slope_ah_per_day,slope_lo_ah_per_day,slope_hi_ah_per_day," \
	"fit_estimates,rated_ah"

/* The per-device state: the devent first, as devtab wants. */
struct dev {
	struct devent e;
	int init;
	int cells;
	struct cap_dev cd;
	struct cap_ocvdev od;
	struct dcir_series ser;
};

struct tool {
	const char *outpath, *rejpath;	/* -o FILE, --rejects FILE */
	const char *fleetpath, *ocvpath;	/* --fleet FILE, --ocv FILE */
	struct cap_conf conf;
	struct cap_trend_conf tconf;
	struct cap_counts cnt;
	struct csvout out;
	struct csvout rej;
	int has_rej;
	struct fleet *fleet;
	struct ocv *ocv;
	double rated;
	int cells;
	size_t max_points;
	int trend;
};

enum {
	OPT_CELLS = OPTAB_LONG, OPT_CONFIDENCE, OPT_EOL, OPT_FLEET, OPT_JUMP,
	OPT_MAX_GAP, OPT_MAX_POINTS, OPT_MAX_REST, OPT_MIN_CURRENT,
	OPT_MIN_ESTIMATES, OPT_MIN_SWING, OPT_OCV, OPT_OCV_REST, OPT_OCV_SPAN,
	OPT_RATED, OPT_REJECTS, OPT_TEMP
};

/* Where an option of the table is stored: a member of struct tool. */
#define T(m)	offsetof(struct tool, m)

static const struct optab opts[] = {
	{ "cells", 0, "N", "cells in series, for --ocv", "1", OPT_CELLS,
	    OPTAB_INT, T(cells), 1, 1000 },
	{ "confidence", 0, "P", "confidence level of the slope's interval",
	    "0.95", OPT_CONFIDENCE,
	    OPTAB_OPEN, T(tconf.conf), 0.5, 1 },
	{ "eol", 0, "PCT", "end of life at PCT percent of the rated "
	    "capacity", "80", OPT_EOL,
	    OPTAB_OPEN, T(tconf.eol_pct), 0, 100 },
	{ "fleet", 0, "FILE", "the fleet file; its capacity_ah is the rating",
	    NULL, OPT_FLEET,
	    OPTAB_STR, T(fleetpath), 0, 0 },
	{ "jump", 0, "PTS", "SoC points a step may differ from what its "
	    "charge explains before it is a jump", "2", OPT_JUMP,
	    OPTAB_NUM, T(conf.jump), 0, 100 },
	{ "max-gap", 0, "DUR", "rows further apart end a segment", "15m",
	    OPT_MAX_GAP,
	    OPTAB_DUR, T(conf.max_gap), 0, 0 },
	{ "max-points", 0, "N", "estimates kept per device for the trend",
	    "2048", OPT_MAX_POINTS,
	    OPTAB_SIZE, T(max_points), 16, 1L << 24 },
	{ "max-rest", 0, "DUR", "longest pause inside a segment", "5m",
	    OPT_MAX_REST,
	    OPTAB_DUR, T(conf.max_rest), 0, 0 },
	{ "min-current", 0, "A", "smallest current of a segment's rows",
	    "0.1", OPT_MIN_CURRENT,
	    OPTAB_POS, T(conf.min_current), 0, 1e6 },
	{ "min-estimates", 0, "N", "fewest estimates for a trend", "5",
	    OPT_MIN_ESTIMATES,
	    OPTAB_ULONG, T(tconf.min_estimates), 2, 1000000000L },
	{ "min-swing", 0, "PCT", "smallest SoC change of an estimate", "20",
	    OPT_MIN_SWING,
	    OPTAB_POS, T(conf.min_swing), 0, 100 },
	{ "ocv", 0, "FILE", "SoC from the rest voltage by this OCV table, not "
	    "from soc_pct", NULL, OPT_OCV,
	    OPTAB_STR, T(ocvpath), 0, 0 },
	{ "ocv-rest", 0, "DUR", "rest before a voltage is an OCV point",
	    "30m", OPT_OCV_REST,
	    OPTAB_DUR, T(conf.ocv_rest), 0, 0 },
	{ "ocv-span", 0, "DUR", "longest time between two OCV points", "1d",
	    OPT_OCV_SPAN,
	    OPTAB_DUR, T(conf.ocv_span), 0, 0 },
	OPTAB_OUTPUT(T(outpath)),
	{ "rated", 0, "AH", "rated capacity of every pack", "none",
	    OPT_RATED,
	    OPTAB_POS, T(rated), 0, 1e9 },
	{ "rejects", 0, "FILE", "write the rejected segments and why to FILE",
	    NULL, OPT_REJECTS,
	    OPTAB_STR, T(rejpath), 0, 0 },
	{ "trend", 't', NULL, "one row per device with the trend", NULL, 0,
	    OPTAB_FLAG, T(trend), 0, 0 },
	{ "temp", 0, "LO,HI | any", "temperature window; any: none",
	    "10,45", OPT_TEMP },
	OPTAB_END
};

static const struct optool tool = OPTOOL_FILES("cw-capacity",
    "Measured capacity by coulomb counting over charge and discharge\n"
    "segments, and its fade per device.\n",
    OPTAB_TEMPS OPTAB_DURATIONS,
    opts);

static int	on_row(void *ctx, void *dev, const struct cw_sample *s);
static int	on_est(struct tool *t, struct dev *d, const struct cap_est *e);
static void	write_est(struct csvout *w, const struct dev *d,
		    const struct cap_est *e, int reject);
static void	write_trend(struct tool *t, struct dev *d);
static void	report(const struct tool *t, const struct devtab *devs,
		    const struct sampin_stats *st);
static void	free_devs(struct devtab *devs);

static int
on_row(void *ctx, void *dev, const struct cw_sample *s)
{
	struct tool *t = ctx;
	struct dev *d = dev;
	struct cap_est e;

	if (!d->init) {
		d->init = 1;
		cap_dev_init(&d->cd, fleet_capacity(t->fleet, d->e.name,
		    d->e.namelen, t->rated));
		d->cells = fleet_cells(t->fleet, d->e.name, d->e.namelen,
		    t->cells);
	}
	if (t->ocv != NULL) {
		if (cap_ocv_feed(&t->conf, t->ocv, &d->od, s->t,
		    s->v / d->cells, s->i, s->temp, &t->cnt, &e) == 1)
			return on_est(t, d, &e);
		return 0;
	}
	if (cap_feed(&t->conf, &d->cd, s->t, s->i, s->temp, s->soc, &t->cnt,
	    &e) == 1)
		return on_est(t, d, &e);
	return 0;
}

/* An estimate or a rejected segment of D. */
static int
on_est(struct tool *t, struct dev *d, const struct cap_est *e)
{
	if (e->reason != CAP_OK) {
		if (t->has_rej)
			write_est(&t->rej, d, e, 1);
	} else if (t->trend)
		dcir_series_add(&d->ser, e->start + (e->end - e->start) / 2,
		    e->capacity_ah, CW_MISSING, t->max_points);
	else
		write_est(&t->out, d, e, 0);
	/* A write error stops the run; cw_finish() tells it. */
	return t->out.err || t->rej.err ? CW_EXIT_DATA : 0;
}

static void
write_est(struct csvout *w, const struct dev *d, const struct cap_est *e,
    int reject)
{
	csvout_strn(w, d->e.name, d->e.namelen);
	csvout_time(w, e->start);
	csvout_time(w, e->end);
	csvout_str(w, e->dir > 0 ? "charge" : "discharge");
	csvout_num(w, e->soc_from);
	csvout_num(w, e->soc_to);
	csvout_num(w, e->charge_ah);
	if (!reject)
		csvout_num(w, e->capacity_ah);
	csvout_num(w, e->temp_c);
	csvout_int(w, (long long)e->rows);
	if (reject)
		csvout_str(w, cap_reason_name[e->reason]);
	else
		csvout_num(w, e->resolution_pct);
	csvout_endrow(w);
}

static void
write_trend(struct tool *t, struct dev *d)
{
	struct cap_trend tr;
	struct csvout *w = &t->out;

	cap_trend_fit(&d->ser, d->cd.rated_ah, &t->tconf, &tr);
	csvout_strn(w, d->e.name, d->e.namelen);
	csvout_int(w, (long long)d->ser.steps);
	glue_first_last(w, d->ser.steps > 0, d->ser.first, d->ser.last);
	csvout_num(w, tr.cap_start);
	csvout_num(w, tr.cap_end);
	csvout_num(w, tr.fade_pct);
	csvout_num(w, tr.fade_30d);
	csvout_num(w, tr.soh_pct);
	glue_date(w, tr.has_eol, tr.eol_t);
	csvout_num(w, tr.slope);
	csvout_num(w, tr.slope_lo);
	csvout_num(w, tr.slope_hi);
	if (tr.fitted)
		csvout_int(w, (long long)tr.used);
	else
		csvout_empty(w);
	csvout_num(w, d->cd.rated_ah);
	csvout_endrow(w);
}

static void
report(const struct tool *t, const struct devtab *devs,
    const struct sampin_stats *st)
{
	const unsigned long *n = t->cnt.n, *cut = t->cnt.cut;
	unsigned long seg = 0, thinned = 0, few = 0;
	size_t i, nd = devtab_count(devs);
	int k;

	sampin_report(st, NULL);
	for (k = 0; k < CAP_NREASON; k++)
		seg += n[k];
	cw_warn("%zu device%s; %lu segments, %lu accepted", nd,
	    nd == 1 ? "" : "s", seg, n[CAP_OK]);
	cw_warn("rejected: %lu swing, %lu gap, %lu jump, %lu no-soc, "
	    "%lu temp, %lu no-current, %lu sign", n[CAP_SWING], n[CAP_GAP],
	    n[CAP_JUMP], n[CAP_NO_SOC], n[CAP_TEMP], n[CAP_NO_I],
	    n[CAP_SIGN]);
	cw_warn("segments ended by: %lu gap, %lu jump, %lu no-soc, %lu temp, "
	    "%lu no-current", cut[CAP_GAP], cut[CAP_JUMP], cut[CAP_NO_SOC],
	    cut[CAP_TEMP], cut[CAP_NO_I]);
	if (!t->trend)
		return;
	for (i = 0; i < nd; i++) {
		const struct dev *d = devtab_at(devs, i);

		if (d->ser.n < d->ser.steps)
			thinned++;
		if (d->ser.steps < t->tconf.min_estimates)
			few++;
	}
	cw_warn("trend: %lu device%s with fewer than %lu estimates, %lu "
	    "thinned to at most %zu", few, few == 1 ? "" : "s",
	    t->tconf.min_estimates, thinned, t->max_points);
}

static void
free_devs(struct devtab *devs)
{
	size_t i, n = devtab_count(devs);

	for (i = 0; i < n; i++)
		dcir_series_free(&((struct dev *)devtab_at(devs, i))->ser);
}

/*
 * The options into T, checked; the index of the first operand.  Exits 2
 * on a usage error.
 */
static int
parse(struct tool *t, int argc, char *argv[])
{
	double w[2];
	int ch;

	memset(t, 0, sizeof(*t));
	cap_conf_default(&t->conf);
	cap_trend_conf_default(&t->tconf);
	t->max_points = DCIR_MAX_POINTS;
	t->rated = CW_MISSING;
	t->cells = 1;
	while ((ch = optab_getopt(&tool, t, argc, argv)) != -1) {
		if (ch != OPT_TEMP)
			continue;
		if (strcmp(optarg, "any") == 0) {
			t->conf.temp_any = 1;
			continue;
		}
		opt_list_arg("--temp", optarg, w, 2, 1, 1);
		t->conf.temp_any = 0;
		t->conf.temp_lo = w[0];
		t->conf.temp_hi = w[1];
	}
	if (t->rejpath != NULL && strcmp(t->rejpath, "-") == 0)
		cw_usage_error("--rejects: standard output holds the "
		    "estimates; name a file");
	t->fleet = fleet_load(t->fleetpath);
	if (t->ocvpath != NULL)
		t->ocv = ocv_load(t->ocvpath);
	return optind;
}

int
main(int argc, char *argv[])
{
	struct tool t;
	struct glue g, rg;
	struct devtab *devs;
	struct cap_est e;
	void **sorted;
	size_t i, n;
	int rc, k;

	k = parse(&t, argc, argv);
	glue_open(&g, sizeof(struct dev), t.outpath, &t.out, t.trend ?
	    TREND_HEADER : EST_HEADER);
	devs = g.devs;
	if (t.rejpath != NULL) {
		glue_open(&rg, 0, t.rejpath, &t.rej, REJECT_HEADER);
		t.has_rej = 1;
	}
	glue_sampin(&g, SAMP_BIT(SAMP_CURRENT) | SAMP_BIT(t.ocv != NULL ?
	    SAMP_VOLTAGE : SAMP_SOC) | (t.conf.temp_any ? 0 :
	    SAMP_BIT(SAMP_TEMP)), 0, on_row, &t);
	rc = glue_read(&g, argv + k, argc - k);
	if (rc == 0) {
		/* The segments still open at the end of the input, in the
		 * order the devices came. */
		n = devtab_count(devs);
		for (i = 0; i < n && rc == 0; i++) {
			struct dev *d = devtab_at(devs, i);

			if (d->init && (t.ocv != NULL ? cap_ocv_finish(&t.conf,
			    &d->od, &t.cnt, &e) : cap_finish(&t.conf, &d->cd,
			    &t.cnt, &e)) == 1)
				rc = on_est(&t, d, &e);
		}
	}
	if (cw_verbose)
		report(&t, devs, &g.st);
	if (t.cnt.against >= 100 && t.cnt.against > 2 * t.cnt.with)
		cw_warn("the SoC stepped against the current on %lu rows, with "
		    "it on %lu: is current_a positive while charging? "
		    "(cw-clean --charge-negative)", t.cnt.against,
		    t.cnt.with);
	if (rc == 0 && t.trend) {
		sorted = devtab_sorted(devs);
		n = devtab_count(devs);
		for (i = 0; i < n; i++)
			write_trend(&t, sorted[i]);
		free(sorted);
	}
	/* After a data error, complete rows written so far stay; -o FILE
	 * is not committed and keeps its old contents. */
	if (t.has_rej)
		rc = glue_close(&rg, rc);
	free_devs(devs);
	rc = glue_close(&g, rc);
	fleet_free(t.fleet);
	ocv_free(t.ocv);
	return rc;
}
