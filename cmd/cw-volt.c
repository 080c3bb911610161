/*
 * cw-volt: charge, use and rest outside the cells' voltage window, as
 * events per device or as a summary per device.  The engine is
 * lib/volt.c; this file holds the options and the output.
 */
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "csvout.h"
#include "cw.h"
#include "devtab.h"
#include "finish.h"
#include "fleet.h"
#include "glue.h"
#include "opt.h"
#include "optab.h"
#include "outf.h"
#include "sampin.h"
#include "volt.h"

#define EVENT_HEADER "device,kind,limit,start,end,duration_s,v_cell_min," \
	"v_cell_max,charge_ah,soc_start_pct,soc_end_pct,cells"
#define SUMMARY_HEADER "device,first,last,cells,v_cell_min,v_cell_max," \
	"events_over,hours_over,ah_charged_over,events_under,hours_under," \
	"over_charge_events,over_use_events,over_rest_events," \
	"under_charge_events,under_use_events,under_rest_events," \
	"unjudged_rows"

/* The per-device state: the devent first, as devtab wants. */
struct dev {
	struct devent e;
	struct volt_dev v;
};

struct tool {
	const char *outpath, *fleetpath;	/* -o FILE, --fleet FILE */
	struct volt_conf conf;
	struct csvout out;
	struct fleet *fleet;
	int cells;
	int summary;
};

enum {
	OPT_CELLS = OPTAB_LONG, OPT_FLEET, OPT_HYST, OPT_MAX, OPT_MAX_GAP,
	OPT_MIN, OPT_MIN_CURRENT, OPT_MIN_DURATION
};

static int	on_row(void *ctx, void *dev, const struct cw_sample *s);
static void	on_event(void *ctx, struct volt_dev *vd,
		    const struct volt_event *ev);
static void	write_summary(struct tool *t, const struct dev *d);
static void	end_dev(void *ctx, void *dev);
static void	report(const struct devtab *devs,
		    const struct sampin_stats *st);

/* Where an option of the table is stored: a member of struct tool. */
#define T(m)	offsetof(struct tool, m)

static const struct optab opts[] = {
	{ "cells", 0, "N", "cells in series: the cell voltage is the pack "
	    "voltage over N", "1", OPT_CELLS,
	    OPTAB_INT, T(cells), 1, 1000 },
	{ "fleet", 0, "FILE", "the fleet file; its cells column overrides "
	    "--cells per pack", NULL, OPT_FLEET,
	    OPTAB_STR, T(fleetpath), 0, 0 },
	{ "hysteresis", 0, "V", "come back inside by V per cell to end an "
	    "event", "0.02", OPT_HYST,
	    OPTAB_NUM, T(conf.hyst), 0, 10 },
	{ "max", 0, "V", "over-voltage above V per cell", "4.25", OPT_MAX,
	    OPTAB_NUM, T(conf.vmax), 0.001, 100 },
	{ "max-gap", 0, "DUR", "a longer interval ends an event", "15m",
	    OPT_MAX_GAP,
	    OPTAB_DUR, T(conf.max_gap), 0, 0 },
	{ "min", 0, "V", "over-discharge below V per cell", "2.50", OPT_MIN,
	    OPTAB_NUM, T(conf.vmin), 0, 100 },
	{ "min-current", 0, "A", "charge above A, use below -A, rest between",
	    "0.05", OPT_MIN_CURRENT,
	    OPTAB_NUM, T(conf.min_current), 0, 1e6 },
	{ "min-duration", 0, "DUR", "drop events shorter than DUR", "30s",
	    OPT_MIN_DURATION,
	    OPTAB_DUR, T(conf.min_duration), -1, 0 },
	OPTAB_OUTPUT(T(outpath)),
	{ "summary", 's', NULL, "one row per device instead of one per event",
	    NULL, 0,
	    OPTAB_FLAG, T(summary), 0, 0 },
	OPTAB_END
};

static const struct optool tool = OPTOOL_FILES("cw-volt",
    "Charge, use and rest outside the cells' voltage window, as events\n"
    "per device.\n",
    "The default limits are typical of NMC and LCO cells, from memory;\n"
    "LFP cells need others (e.g. --max 3.65 --min 2.50).  The cell\n"
    "maker's data sheet rules.  Durations take 90, 90s, 15m, 2h, 1d.\n",
    opts);

static int
on_row(void *ctx, void *dev, const struct cw_sample *s)
{
	struct tool *t = ctx;
	struct dev *d = dev;

	if (d->e.nrows == 1)
		volt_init(&d->v, fleet_cells(t->fleet, d->e.name, d->e.namelen,
		    t->cells));
	volt_push(&d->v, &t->conf, s->t, s->v, s->i, s->soc);
	return t->out.err ? CW_EXIT_DATA : 0;
}

static void
on_event(void *ctx, struct volt_dev *vd, const struct volt_event *ev)
{
	struct tool *t = ctx;
	const struct dev *d;

	if (t->summary)
		return;
	d = CW_CONTAINER(vd, struct dev, v);
	glue_event(&t->out, &d->e, volt_kind_name(ev->kind),
	    volt_limit_name(ev->limit), ev->start, ev->end, ev->v_min,
	    ev->v_max, ev->charge_ah, ev->soc_start, ev->soc_end);
	csvout_int(&t->out, vd->cells);
	csvout_endrow(&t->out);
}

/* The end of the stream for device DEV: its open event, its summary. */
static void
end_dev(void *ctx, void *dev)
{
	struct tool *t = ctx;
	struct dev *d = dev;

	volt_finish(&d->v, &t->conf);
	if (t->summary)
		write_summary(t, d);
}

static void
write_summary(struct tool *t, const struct dev *d)
{
	const struct volt_dev *v = &d->v;
	const double h = 3600.0 * CW_US_PER_S;
	int k, l;

	csvout_strn(&t->out, d->e.name, d->e.namelen);
	csvout_time(&t->out, v->first);
	csvout_time(&t->out, v->prev_t);
	csvout_int(&t->out, v->cells);
	/* A limit no row set is still infinite: an empty field. */
	glue_num(&t->out, v->v_min > -1e308 && v->v_min < 1e308, v->v_min);
	glue_num(&t->out, v->v_max > -1e308 && v->v_max < 1e308, v->v_max);
	for (l = 0; l < VOLT_NLIMIT; l++) {
		unsigned long n = 0;

		for (k = 0; k < VOLT_NKIND; k++)
			n += v->events[l][k];
		csvout_int(&t->out, (long long)n);
		csvout_num(&t->out, (double)v->time[l] / h);
		if (l == VOLT_OVER)
			csvout_num(&t->out, v->ah_in[l]);
	}
	for (l = 0; l < VOLT_NLIMIT; l++)
		for (k = 0; k < VOLT_NKIND; k++)
			csvout_int(&t->out, (long long)v->events[l][k]);
	csvout_int(&t->out, (long long)v->unjudged);
	csvout_endrow(&t->out);
}

static void
report(const struct devtab *devs, const struct sampin_stats *st)
{
	unsigned long ev[VOLT_NLIMIT] = { 0, 0 }, unjudged = 0, dropped = 0;
	size_t i, n = devtab_count(devs);
	int k, l;

	for (i = 0; i < n; i++) {
		const struct dev *d = devtab_at(devs, i);

		for (l = 0; l < VOLT_NLIMIT; l++)
			for (k = 0; k < VOLT_NKIND; k++)
				ev[l] += d->v.events[l][k];
		unjudged += d->v.unjudged;
		dropped += d->v.short_dropped;
	}
	sampin_report(st, NULL);
	cw_warn("%zu device%s; %lu rows without voltage or current not "
	    "judged", n, n == 1 ? "" : "s", unjudged);
	cw_warn("%lu over-voltage events, %lu under-voltage events; %lu "
	    "shorter than --min-duration dropped", ev[VOLT_OVER],
	    ev[VOLT_UNDER], dropped);
}

/*
 * The options into T, checked; the index of the first operand.  Exits 2
 * on a usage error.
 */
static int
parse(struct tool *t, int argc, char *argv[])
{
	int k;

	memset(t, 0, sizeof(*t));
	volt_conf_default(&t->conf);
	t->cells = 1;
	k = optab_parse(&tool, t, argc, argv);
	if (t->conf.vmin >= t->conf.vmax)
		cw_usage_error("--min (%g V) must be below --max (%g V)",
		    t->conf.vmin, t->conf.vmax);
	if (t->conf.hyst >= t->conf.vmax - t->conf.vmin)
		cw_usage_error("--hysteresis (%g V) must be below --max minus "
		    "--min (%g V)", t->conf.hyst, t->conf.vmax - t->conf.vmin);
	t->fleet = fleet_load(t->fleetpath);
	return k;
}

int
main(int argc, char *argv[])
{
	struct tool t;
	struct glue g;
	int rc, k;

	k = parse(&t, argc, argv);
	glue_open(&g, sizeof(struct dev), t.outpath, &t.out, t.summary ?
	    SUMMARY_HEADER : EVENT_HEADER);
	t.conf.emit = on_event;
	t.conf.ctx = &t;
	glue_sampin(&g, SAMP_BIT(SAMP_VOLTAGE) | SAMP_BIT(SAMP_CURRENT), 0,
	    on_row, &t);
	/* What is still open ends with the stream, in name order. */
	rc = glue_run(&g, argv + k, argc - k, end_dev, &t);
	rc = glue_finish(&g, rc, report);
	fleet_free(t.fleet);
	return rc;
}
