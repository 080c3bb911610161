/*
 * cw-volt: charge, use and rest outside the cells' voltage window, as
 * events per device or as a summary per device.  The engine is
 * lib/volt.c; this file holds the options and the output.
 */
#include <errno.h>
#include <getopt.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "csvout.h"
#include "cw.h"
#include "devtab.h"
#include "fleet.h"
#include "opt.h"
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
	struct volt_conf conf;
	struct csvout out;
	const struct fleet *fleet;
	int cells;
	int summary;
};

enum {
	OPT_CELLS = 256, OPT_FLEET, OPT_HYST, OPT_MAX, OPT_MAX_GAP, OPT_MIN,
	OPT_MIN_CURRENT, OPT_MIN_DURATION, OPT_VERSION
};

static void	usage(FILE *fp);
static int	on_row(void *ctx, void *dev, const struct cw_sample *s);
static void	on_event(void *ctx, struct volt_dev *vd,
		    const struct volt_event *ev);
static void	num_or_empty(struct csvout *o, double x);
static void	write_summary(struct tool *t, const struct dev *d);
static void	report(const struct devtab *devs,
		    const struct sampin_stats *st);

static void
usage(FILE *fp)
{
	fprintf(fp,
	    "usage: cw-volt [-hsv] [--cells N] [--fleet FILE] "
	    "[--hysteresis V] [--max V]\n"
	    "               [--max-gap DUR] [--min V] [--min-current A] "
	    "[--min-duration DUR]\n"
	    "               [-o FILE] [--version] [FILE ...]\n");
	fputs(
"\n"
"Charge, use and rest outside the cells' voltage window, as events per\n"
"device.\n"
"\n"
"      --cells N           cells in series: the cell voltage is the pack\n"
"                          voltage over N (default 1)\n"
"      --fleet FILE        the fleet file; its cells column overrides\n"
"                          --cells per pack\n"
"  -h, --help              print this help and exit 0\n"
"      --hysteresis V      come back inside by V per cell to end an event\n"
"                          (default 0.02)\n"
"      --max V             over-voltage above V per cell (default 4.25)\n"
"      --max-gap DUR       a longer interval ends an event (default 15m)\n"
"      --min V             over-discharge below V per cell (default 2.50)\n"
"      --min-current A     charge above A, use below -A, rest between\n"
"                          (default 0.05)\n"
"      --min-duration DUR  drop events shorter than DUR (default 30s)\n"
"  -o, --output FILE       write to FILE atomically, not standard output\n"
"  -s, --summary           one row per device instead of one per event\n"
"  -v, --verbose           report counts on standard error\n"
"      --version           print the version and exit 0\n"
"\n"
"The default limits are typical of NMC and LCO cells, from memory; LFP\n"
"cells need others (e.g. --max 3.65 --min 2.50).  The cell maker's data\n"
"sheet rules.  Durations take 90, 90s, 15m, 2h, 1d.\n", fp);
}

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
	d = (const struct dev *)(const void *)((const char *)vd -
	    offsetof(struct dev, v));
	csvout_strn(&t->out, d->e.name, d->e.namelen);
	csvout_str(&t->out, volt_kind_name(ev->kind));
	csvout_str(&t->out, volt_limit_name(ev->limit));
	csvout_time(&t->out, ev->start);
	csvout_time(&t->out, ev->end);
	csvout_num(&t->out, (double)(ev->end - ev->start) / CW_US_PER_S);
	csvout_num(&t->out, ev->v_min);
	csvout_num(&t->out, ev->v_max);
	csvout_num(&t->out, ev->charge_ah);
	csvout_num(&t->out, ev->soc_start);
	csvout_num(&t->out, ev->soc_end);
	csvout_int(&t->out, vd->cells);
	csvout_endrow(&t->out);
}

/* X, or an empty field when no row set it (still infinite). */
static void
num_or_empty(struct csvout *o, double x)
{
	if (x > -1e308 && x < 1e308)
		csvout_num(o, x);
	else
		csvout_empty(o);
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
	num_or_empty(&t->out, v->v_min);
	num_or_empty(&t->out, v->v_max);
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

int
main(int argc, char *argv[])
{
	static const struct option longopts[] = {
		{ "cells", required_argument, NULL, OPT_CELLS },
		{ "fleet", required_argument, NULL, OPT_FLEET },
		{ "help", no_argument, NULL, 'h' },
		{ "hysteresis", required_argument, NULL, OPT_HYST },
		{ "max", required_argument, NULL, OPT_MAX },
		{ "max-gap", required_argument, NULL, OPT_MAX_GAP },
		{ "min", required_argument, NULL, OPT_MIN },
		{ "min-current", required_argument, NULL, OPT_MIN_CURRENT },
		{ "min-duration", required_argument, NULL, OPT_MIN_DURATION },
		{ "output", required_argument, NULL, 'o' },
		{ "summary", no_argument, NULL, 's' },
		{ "verbose", no_argument, NULL, 'v' },
		{ "version", no_argument, NULL, OPT_VERSION },
		{ NULL, 0, NULL, 0 }
	};
	struct tool t;
	struct sampin_conf sc;
	struct sampin_stats st;
	struct devtab *devs;
	struct fleet *fleet = NULL;
	struct outf *of;
	const char *outpath = NULL, *fleetpath = NULL;
	void **sorted;
	size_t i, n;
	int ch, rc;

	cw_setprog("cw-volt");
	memset(&t, 0, sizeof(t));
	volt_conf_default(&t.conf);
	t.cells = 1;
	opterr = 0;
	while ((ch = getopt_long(argc, argv, ":ho:sv", longopts, NULL)) !=
	    -1) {
		switch (ch) {
		case 'h':
			usage(stdout);
			return fflush(stdout) == 0 ? CW_EXIT_OK : CW_EXIT_DATA;
		case 'o':
			outpath = optarg;
			break;
		case 's':
			t.summary = 1;
			break;
		case 'v':
			cw_verbose = 1;
			break;
		case OPT_CELLS:
			t.cells = (int)opt_long_arg("--cells", optarg, 1, 1000);
			break;
		case OPT_FLEET:
			fleetpath = optarg;
			break;
		case OPT_HYST:
			t.conf.hyst = opt_num_arg("--hysteresis", optarg, 0,
			    10);
			break;
		case OPT_MAX:
			t.conf.vmax = opt_num_arg("--max", optarg, 0.001, 100);
			break;
		case OPT_MAX_GAP:
			t.conf.max_gap = opt_dur_arg("--max-gap", optarg, 0);
			break;
		case OPT_MIN:
			t.conf.vmin = opt_num_arg("--min", optarg, 0, 100);
			break;
		case OPT_MIN_CURRENT:
			t.conf.min_current = opt_num_arg("--min-current",
			    optarg, 0, 1e6);
			break;
		case OPT_MIN_DURATION:
			t.conf.min_duration = opt_dur_arg("--min-duration",
			    optarg, 1);
			break;
		case OPT_VERSION:
			cw_print_version();
		default:
			opt_getopt_fail(ch, argv);
		}
	}
	argc -= optind;
	argv += optind;
	if (t.conf.vmin >= t.conf.vmax)
		cw_usage_error("--min (%g V) must be below --max (%g V)",
		    t.conf.vmin, t.conf.vmax);
	if (t.conf.hyst >= t.conf.vmax - t.conf.vmin)
		cw_usage_error("--hysteresis (%g V) must be below --max minus "
		    "--min (%g V)", t.conf.hyst, t.conf.vmax - t.conf.vmin);

	if (fleetpath != NULL)
		fleet = fleet_load(fleetpath);
	t.fleet = fleet;
	devs = devtab_new(sizeof(struct dev));
	of = outf_open(outpath);
	csvout_init(&t.out, outf_fp(of));
	csvout_header(&t.out, t.summary ? SUMMARY_HEADER : EVENT_HEADER);
	t.conf.emit = on_event;
	t.conf.ctx = &t;

	memset(&sc, 0, sizeof(sc));
	sc.need = SAMP_BIT(SAMP_DEVICE) | SAMP_BIT(SAMP_TIME) |
	    SAMP_BIT(SAMP_VOLTAGE) | SAMP_BIT(SAMP_CURRENT);
	sc.row = on_row;
	sc.ctx = &t;
	sc.devs = devs;
	rc = sampin_run(&sc, argv, argc, &st);
	if (rc != 0) {
		/* Complete rows written so far stay; the output is not
		 * committed, so -o FILE keeps its old contents. */
		csvout_flush(&t.out);
		if (cw_verbose)
			report(devs, &st);
		csvout_free(&t.out);
		devtab_free(devs);
		fleet_free(fleet);
		return rc;
	}

	/* What is still open ends with the stream, in device name order. */
	sorted = devtab_sorted(devs);
	n = devtab_count(devs);
	for (i = 0; i < n; i++)
		volt_finish(&((struct dev *)sorted[i])->v, &t.conf);
	if (t.summary)
		for (i = 0; i < n; i++)
			write_summary(&t, sorted[i]);
	free(sorted);
	if (cw_verbose)
		report(devs, &st);
	rc = CW_EXIT_OK;
	if (csvout_flush(&t.out) != 0) {
		cw_warn("%s: write error: %s", outpath != NULL ? outpath :
		    "standard output", strerror(errno));
		rc = CW_EXIT_DATA;
	} else if (outf_commit(of) != 0)
		rc = CW_EXIT_DATA;
	csvout_free(&t.out);
	devtab_free(devs);
	fleet_free(fleet);
	return rc;
}
