/*
 * cw-thermal: charging (and discharge) outside the temperature window,
 * as events per device or as a summary per device.  The engine is
 * lib/thermal.c; this file holds the options and the output.
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
#include "thermal.h"

#define EVENT_HEADER "device,kind,zone,start,end,duration_s,temp_min_c," \
	"temp_max_c,charge_ah,soc_start_pct,soc_end_pct,i_max_a,v_cell_max," \
	"protocol"
#define SUMMARY_HEADER "device,first,last,charge_ah,ah_below_min,ah_cool," \
	"ah_normal,ah_warm,ah_above_max,ah_no_temp,outside_pct," \
	"charge_events,below_min_events,cool_events,warm_events," \
	"above_max_events,use_events,use_cold_events,use_hot_events," \
	"unjudged_rows,events_within,events_over_current," \
	"events_over_voltage,events_no_charge_allowed,events_unknown_protocol"

/* The per-device state: the devent first, as devtab wants. */
struct dev {
	struct devent e;
	struct thermal_dev th;
};

struct tool {
	struct thermal_conf conf;
	struct csvout out;
	const struct fleet *fleet;
	double cap_ah;		/* --capacity; NaN: unknown */
	int cells;		/* --cells; 0: unknown */
	int summary;
};

enum {
	OPT_CAPACITY = 256, OPT_CELLS, OPT_COOL_MARGIN, OPT_COOL_RATE,
	OPT_FLEET, OPT_HYST, OPT_LIMITS, OPT_MAX_GAP, OPT_MERGE,
	OPT_MIN_CURRENT, OPT_MIN_DURATION, OPT_USE_LIMITS, OPT_VERSION,
	OPT_WARM_MARGIN, OPT_WARM_VOLTAGE
};

static void	usage(FILE *fp);
static int	on_row(void *ctx, void *dev, const struct cw_sample *s);
static void	on_event(void *ctx, struct thermal_dev *th,
		    const struct thermal_event *ev);
static void	write_summary(struct tool *t, const struct dev *d);
static void	report(const struct devtab *devs,
		    const struct sampin_stats *st);

static void
usage(FILE *fp)
{
	fprintf(fp,
	    "usage: cw-thermal [-hsv] [--capacity AH] [--cells N] "
	    "[--cool-margin PCT]\n"
	    "                  [--cool-rate C] [--fleet FILE] "
	    "[--hysteresis DT]\n"
	    "                  [--limits T1,T2,T3,T4] [--max-gap DUR] "
	    "[--merge DUR]\n"
	    "                  [--min-current A] [--min-duration DUR] "
	    "[-o FILE]\n"
	    "                  [--use-limits LO,HI] [--version] "
	    "[--warm-margin V]\n"
	    "                  [--warm-voltage V] [FILE ...]\n");
	fputs(
"\n"
"Charging outside the safe temperature window, as events per device,\n"
"judged by the charge protocol of the JEITA scheme.\n"
"\n"
"      --capacity AH         rated capacity, for the cool-zone current\n"
"                            (unset: unknown)\n"
"      --cells N             cells in series, for the warm-zone voltage\n"
"                            (unset: unknown)\n"
"      --cool-margin PCT     current allowed above the cool rate\n"
"                            (default 5)\n"
"      --cool-rate C         C-rate allowed in the cool zone (default 0.5)\n"
"      --fleet FILE          the fleet file; its capacity_ah and cells\n"
"                            override --capacity and --cells per pack\n"
"  -h, --help                print this help and exit 0\n"
"      --hysteresis DT       come back inside by DT to end an event\n"
"                            (default 0.5)\n"
"      --limits T1,T2,T3,T4  the four zone thresholds (default 0,10,45,60)\n"
"      --max-gap DUR         a longer interval ends an event (default 15m)\n"
"      --merge DUR           join events at most DUR apart (default 2m)\n"
"      --min-current A       charging above A, discharge below -A\n"
"                            (default 0.05)\n"
"      --min-duration DUR    drop events shorter than DUR (default 60s)\n"
"  -o, --output FILE         write to FILE atomically, not standard output\n"
"  -s, --summary             one row per device instead of one per event\n"
"      --use-limits LO,HI    the window for discharge (default -20,60)\n"
"  -v, --verbose             report counts on standard error\n"
"      --version             print the version and exit 0\n"
"      --warm-margin V       voltage per cell allowed above the warm\n"
"                            voltage (default 0.02)\n"
"      --warm-voltage V      charge voltage per cell allowed in the warm\n"
"                            zone (default 4.10)\n"
"\n"
"The protocol's defaults are from memory of the JEITA guideline; the cell\n"
"maker's data sheet rules.\n"
"Temperatures take a unit suffix: 10, 10C, 50F, 283.15K (C without one);\n"
"DT is a difference (C and K count the same, 0.9F is 0.5 C).\n"
"Durations take 90, 90s, 15m, 2h, 1d.\n"
"--hysteresis 0 and --merge 0 turn hysteresis and merging off.\n", fp);
}

static int
on_row(void *ctx, void *dev, const struct cw_sample *s)
{
	struct tool *t = ctx;
	struct dev *d = dev;

	if (d->e.nrows == 1) {
		thermal_init(&d->th);
		d->th.cap_ah = fleet_capacity(t->fleet, d->e.name,
		    d->e.namelen, t->cap_ah);
		d->th.cells = fleet_cells(t->fleet, d->e.name, d->e.namelen,
		    t->cells);
	}
	thermal_push_v(&d->th, &t->conf, s->t, s->i, s->temp, s->soc, s->v);
	return t->out.err ? CW_EXIT_DATA : 0;
}

static void
on_event(void *ctx, struct thermal_dev *th, const struct thermal_event *ev)
{
	struct tool *t = ctx;
	const struct dev *d;

	if (t->summary)
		return;
	d = (const struct dev *)(const void *)((const char *)th -
	    offsetof(struct dev, th));
	csvout_strn(&t->out, d->e.name, d->e.namelen);
	csvout_str(&t->out, thermal_kind_name(ev->kind));
	csvout_str(&t->out, thermal_zone_name(ev->zone));
	csvout_time(&t->out, ev->start);
	csvout_time(&t->out, ev->end);
	csvout_num(&t->out, (double)(ev->end - ev->start) / CW_US_PER_S);
	csvout_num(&t->out, ev->temp_min);
	csvout_num(&t->out, ev->temp_max);
	csvout_num(&t->out, ev->charge_ah);
	csvout_num(&t->out, ev->soc_start);
	csvout_num(&t->out, ev->soc_end);
	if (ev->kind == THERMAL_CHARGE) {
		csvout_num(&t->out, ev->i_max);
		if (d->th.cells > 0)
			csvout_num(&t->out, ev->v_max / d->th.cells);
		else
			csvout_empty(&t->out);
		csvout_str(&t->out, thermal_protocol_name(ev->protocol));
	} else {
		csvout_empty(&t->out);
		csvout_empty(&t->out);
		csvout_empty(&t->out);
	}
	csvout_endrow(&t->out);
}

static void
write_summary(struct tool *t, const struct dev *d)
{
	const struct thermal_dev *th = &d->th;
	const unsigned long *ce = th->events[THERMAL_CHARGE];
	const unsigned long *ue = th->events[THERMAL_USE];
	double total = th->ah.no_temp, known;
	int z;

	for (z = 0; z < THERMAL_NZONE; z++)
		total += th->ah.zone[z];
	known = total - th->ah.no_temp;
	csvout_strn(&t->out, d->e.name, d->e.namelen);
	csvout_time(&t->out, th->first);
	csvout_time(&t->out, th->prev_t);
	csvout_num(&t->out, total);
	for (z = 0; z < THERMAL_NZONE; z++)
		csvout_num(&t->out, th->ah.zone[z]);
	csvout_num(&t->out, th->ah.no_temp);
	if (known > 0)
		csvout_num(&t->out, 100.0 * (known -
		    th->ah.zone[THERMAL_NORMAL]) / known);
	else
		csvout_empty(&t->out);
	csvout_int(&t->out, (long long)(ce[THERMAL_BELOW_MIN] +
	    ce[THERMAL_COOL] + ce[THERMAL_WARM] + ce[THERMAL_ABOVE_MAX]));
	csvout_int(&t->out, (long long)ce[THERMAL_BELOW_MIN]);
	csvout_int(&t->out, (long long)ce[THERMAL_COOL]);
	csvout_int(&t->out, (long long)ce[THERMAL_WARM]);
	csvout_int(&t->out, (long long)ce[THERMAL_ABOVE_MAX]);
	csvout_int(&t->out, (long long)(ue[THERMAL_BELOW_MIN] +
	    ue[THERMAL_ABOVE_MAX]));
	csvout_int(&t->out, (long long)ue[THERMAL_BELOW_MIN]);
	csvout_int(&t->out, (long long)ue[THERMAL_ABOVE_MAX]);
	csvout_int(&t->out, (long long)th->unjudged);
	for (z = 0; z < THERMAL_NPROTO; z++)
		csvout_int(&t->out, (long long)th->protocol[z]);
	csvout_endrow(&t->out);
}

static void
report(const struct devtab *devs, const struct sampin_stats *st)
{
	unsigned long ev[THERMAL_NKIND] = { 0, 0 }, unjudged = 0, dropped = 0;
	unsigned long merges = 0;
	size_t i, n = devtab_count(devs);
	int k, z;

	for (i = 0; i < n; i++) {
		const struct dev *d = devtab_at(devs, i);

		for (k = 0; k < THERMAL_NKIND; k++)
			for (z = 0; z < THERMAL_NZONE; z++)
				ev[k] += d->th.events[k][z];
		unjudged += d->th.unjudged;
		dropped += d->th.short_dropped;
		merges += d->th.merges;
	}
	sampin_report(st, NULL);
	cw_warn("%zu device%s; %lu rows without temperature or current not "
	    "judged", n, n == 1 ? "" : "s", unjudged);
	cw_warn("%lu charge events, %lu use events; %lu shorter than "
	    "--min-duration dropped; %lu joined by --merge",
	    ev[THERMAL_CHARGE], ev[THERMAL_USE], dropped, merges);
}

int
main(int argc, char *argv[])
{
	static const struct option longopts[] = {
		{ "capacity", required_argument, NULL, OPT_CAPACITY },
		{ "cells", required_argument, NULL, OPT_CELLS },
		{ "cool-margin", required_argument, NULL, OPT_COOL_MARGIN },
		{ "cool-rate", required_argument, NULL, OPT_COOL_RATE },
		{ "fleet", required_argument, NULL, OPT_FLEET },
		{ "help", no_argument, NULL, 'h' },
		{ "hysteresis", required_argument, NULL, OPT_HYST },
		{ "limits", required_argument, NULL, OPT_LIMITS },
		{ "max-gap", required_argument, NULL, OPT_MAX_GAP },
		{ "merge", required_argument, NULL, OPT_MERGE },
		{ "min-current", required_argument, NULL, OPT_MIN_CURRENT },
		{ "min-duration", required_argument, NULL, OPT_MIN_DURATION },
		{ "output", required_argument, NULL, 'o' },
		{ "summary", no_argument, NULL, 's' },
		{ "use-limits", required_argument, NULL, OPT_USE_LIMITS },
		{ "verbose", no_argument, NULL, 'v' },
		{ "version", no_argument, NULL, OPT_VERSION },
		{ "warm-margin", required_argument, NULL, OPT_WARM_MARGIN },
		{ "warm-voltage", required_argument, NULL, OPT_WARM_VOLTAGE },
		{ NULL, 0, NULL, 0 }
	};
	struct tool t;
	struct sampin_conf sc;
	struct sampin_stats st;
	struct devtab *devs;
	struct outf *of;
	struct fleet *fleet = NULL;
	const char *outpath = NULL, *fleetpath = NULL;
	double use[2];
	void **sorted;
	size_t i, n;
	int ch, rc;

	cw_setprog("cw-thermal");
	memset(&t, 0, sizeof(t));
	thermal_conf_default(&t.conf);
	t.cap_ah = CW_MISSING;
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
		case OPT_CAPACITY:
			t.cap_ah = opt_num_arg("--capacity", optarg, 0.001,
			    1e6);
			break;
		case OPT_CELLS:
			t.cells = (int)opt_long_arg("--cells", optarg, 1, 1000);
			break;
		case OPT_COOL_MARGIN:
			t.conf.cool_margin = opt_num_arg("--cool-margin",
			    optarg, 0, 100);
			break;
		case OPT_COOL_RATE:
			t.conf.cool_rate = opt_num_arg("--cool-rate", optarg,
			    0, 100);
			break;
		case OPT_FLEET:
			fleetpath = optarg;
			break;
		case OPT_HYST:
			t.conf.lim.hyst = opt_tempdiff_arg("--hysteresis",
			    optarg);
			break;
		case OPT_LIMITS:
			opt_list_arg("--limits", optarg, t.conf.lim.t, 4, 1, 1);
			break;
		case OPT_MAX_GAP:
			t.conf.max_gap = opt_dur_arg("--max-gap", optarg, 0);
			break;
		case OPT_MERGE:
			t.conf.merge = opt_dur_arg("--merge", optarg, 1);
			break;
		case OPT_MIN_CURRENT:
			t.conf.min_current = opt_num_arg("--min-current",
			    optarg, 0, 1e6);
			break;
		case OPT_MIN_DURATION:
			t.conf.min_duration = opt_dur_arg("--min-duration",
			    optarg, 1);
			break;
		case OPT_USE_LIMITS:
			opt_list_arg("--use-limits", optarg, use, 2, 1, 1);
			t.conf.lim.use_lo = use[0];
			t.conf.lim.use_hi = use[1];
			break;
		case OPT_WARM_MARGIN:
			t.conf.warm_margin = opt_num_arg("--warm-margin",
			    optarg, 0, 1);
			break;
		case OPT_WARM_VOLTAGE:
			t.conf.warm_v = opt_num_arg("--warm-voltage", optarg,
			    0.001, 100);
			break;
		case OPT_VERSION:
			cw_print_version();
		default:
			opt_getopt_fail(ch, argv);
		}
	}
	argc -= optind;
	argv += optind;

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
	    SAMP_BIT(SAMP_CURRENT) | SAMP_BIT(SAMP_TEMP);
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
		thermal_finish(&((struct dev *)sorted[i])->th, &t.conf);
	if (t.summary)
		for (i = 0; i < n; i++)
			write_summary(&t, sorted[i]);
	free(sorted);
	if (cw_verbose)
		report(devs, &st);
	if (csvout_flush(&t.out) != 0) {
		cw_warn("%s: write error: %s", outpath != NULL ? outpath :
		    "standard output", strerror(errno));
		return CW_EXIT_DATA;
	}
	if (outf_commit(of) != 0)
		return CW_EXIT_DATA;
	csvout_free(&t.out);
	devtab_free(devs);
	fleet_free(fleet);
	return CW_EXIT_OK;
}
