/*
 * cw-dcir: DC internal resistance from the current steps of the sample
 * stream, corrected to a reference temperature, one row per step; or with
 * --trend its growth per device.  The engine is lib/dcir.c (steps, the
 * Arrhenius correction, the trend) and lib/theilsen.c (the robust fit);
 * this file holds the options and the output.
 */
#include <errno.h>
#include <getopt.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "csvout.h"
#include "cw.h"
#include "dcir.h"
#include "devtab.h"
#include "opt.h"
#include "outf.h"
#include "sampin.h"

#define STEP_HEADER "device,time,soc_pct,temp_c,delta_i_a,delta_v_v," \
	"r_ohm,r_ref_ohm,dt_s,i_pre_a"
#define TREND_HEADER "device,steps,first,last,r_start_ohm,r_end_ohm," \
	"growth_pct,growth_pct_per_30d,eol_date,fit_steps," \
	"slope_ohm_per_day,slope_lo_ohm_per_day,slope_hi_ohm_per_day," \
	"soc_gate,growth_lo_pct_per_30d,growth_hi_pct_per_30d"

/* Points kept per device for the trend before thinning sets in. */
#define MAX_POINTS_DEFAULT 2048

/* The per-device state: the devent first, as devtab wants. */
struct dev {
	struct devent e;
	struct dcir_dev det;
	struct dcir_series ser;
};

struct tool {
	struct dcir_conf conf;
	struct dcir_trend_conf tconf;
	struct dcir_counts cnt;
	struct csvout out;
	size_t max_points;
	int trend;
};

enum {
	OPT_ALLOW_NO_SOC = 256, OPT_CONFIDENCE, OPT_EA, OPT_EOL, OPT_MAX_DT,
	OPT_MAX_POINTS, OPT_MIN_SPAN, OPT_MIN_STEP, OPT_MIN_STEPS,
	OPT_REF_TEMP, OPT_SOC, OPT_STEADY, OPT_STEADY_TOL, OPT_TEMP,
	OPT_VERSION
};

static void	usage(FILE *fp);
static int	on_row(void *ctx, void *dev, const struct cw_sample *s);
static void	write_step(struct tool *t, const struct dev *d,
		    const struct dcir_step *st);
static void	write_trend(struct tool *t, struct dev *d);
static void	report(const struct tool *t, const struct devtab *devs,
		    const struct sampin_stats *st);

static void
usage(FILE *fp)
{
	fprintf(fp,
	    "usage: cw-dcir [-htv] [--allow-no-soc] [--confidence P] "
	    "[--ea KJ] [--eol PCT]\n"
	    "               [--max-dt DUR] [--max-points N] "
	    "[--min-span DUR] [--min-step A]\n"
	    "               [--min-steps N] [-o FILE] [--ref-temp T] "
	    "[--soc LO,HI|auto]\n"
	    "               [--steady N] [--steady-tol FRAC] "
	    "[--temp LO,HI] [--version]\n"
	    "               [FILE ...]\n");
	fputs(
"\n"
"DC internal resistance from current steps, and its growth per device.\n"
"\n"
"      --allow-no-soc      keep steps whose SoC is unknown\n"
"      --confidence P      confidence level of the slope's interval\n"
"                          (default 0.95)\n"
"      --ea KJ             activation energy in kJ/mol (default 30)\n"
"      --eol PCT           end of life at PCT percent of r_start_ohm\n"
"                          (default 200)\n"
"  -h, --help              print this help and exit\n"
"      --max-dt DUR        longest time between the samples of a step\n"
"                          (default 15s)\n"
"      --max-points N      points kept per device for the trend\n"
"                          (default 2048)\n"
"      --min-span DUR      shortest first-to-last span for a trend\n"
"                          (default 7d)\n"
"      --min-step A        smallest current step in amperes (default 0.5)\n"
"      --min-steps N       fewest steps for a trend (default 10)\n"
"  -o, --output FILE       write to FILE atomically, not standard output\n"
"      --ref-temp T        reference temperature (default 25C)\n"
"      --soc LO,HI|auto    SoC window in percent (default 20,80); auto: per\n"
"                          device, the 30-point window with most steps\n"
"      --steady N          steady samples before a step (default 3)\n"
"      --steady-tol FRAC   largest spread of those currents, as a fraction\n"
"                          of the step (default 0.1)\n"
"  -t, --trend             one row per device with the trend\n"
"      --temp LO,HI        temperature window (default 10,45)\n"
"  -v, --verbose           report counts on standard error\n"
"      --version           print the version and exit\n"
"\n"
"Temperatures take a unit suffix: 10, 10C, 50F, 283.15K (C without one).\n"
"Durations take 90, 90s, 15m, 2h, 1d.\n", fp);
}

static int
on_row(void *ctx, void *dev, const struct cw_sample *s)
{
	struct tool *t = ctx;
	struct dev *d = dev;
	struct dcir_step st;
	struct dcir_pt p;

	p.t = s->t;
	p.v = s->v;
	p.i = s->i;
	p.temp = s->temp;
	p.soc = s->soc;
	if (dcir_feed(&t->conf, &d->det, &p, &t->cnt, &st) != 1)
		return 0;
	if (t->trend)
		dcir_series_add(&d->ser, st.t, st.r_ref, st.soc,
		    t->max_points);
	else
		write_step(t, d, &st);
	if (t->out.err) {
		/* Say so here: sampin_run() only passes the exit code on. */
		cw_warn("write error: %s", strerror(errno));
		return CW_EXIT_DATA;
	}
	return 0;
}

static void
write_step(struct tool *t, const struct dev *d, const struct dcir_step *st)
{
	csvout_strn(&t->out, d->e.name, d->e.namelen);
	csvout_time(&t->out, st->t);
	csvout_num(&t->out, st->soc);
	csvout_num(&t->out, st->temp);
	csvout_num(&t->out, st->di);
	csvout_num(&t->out, st->dv);
	csvout_num(&t->out, st->r);
	csvout_num(&t->out, st->r_ref);
	csvout_num(&t->out, (double)st->dt / CW_US_PER_S);
	csvout_num(&t->out, st->i_pre);
	csvout_endrow(&t->out);
}

static void
write_trend(struct tool *t, struct dev *d)
{
	struct dcir_trend tr;
	struct csvout *w = &t->out;
	char gate[64];
	int lo = -1;

	if (t->conf.soc_auto) {
		lo = dcir_series_window(&d->ser);
		if (lo < 0 && d->ser.steps > 0)
			lo = DCIR_NBIN;	/* unknown SoC only: no bin */
	}
	dcir_trend_fit_window(&d->ser, &t->tconf, lo, &tr);
	csvout_strn(w, d->e.name, d->e.namelen);
	csvout_int(w, (long long)tr.steps);
	if (tr.steps > 0) {
		csvout_time(w, tr.first);
		csvout_time(w, tr.last);
	} else {
		csvout_empty(w);
		csvout_empty(w);
	}
	csvout_num(w, tr.r_start);
	csvout_num(w, tr.r_end);
	csvout_num(w, tr.growth_pct);
	csvout_num(w, tr.growth_30d);
	if (tr.has_eol)
		csvout_date(w, tr.eol_t);
	else
		csvout_empty(w);
	if (tr.fitted)
		csvout_int(w, (long long)tr.used);
	else
		csvout_empty(w);
	csvout_num(w, tr.slope);
	csvout_num(w, tr.slope_lo);
	csvout_num(w, tr.slope_hi);
	if (!t->conf.soc_auto)
		snprintf(gate, sizeof gate, "%g-%g", t->conf.soc_lo,
		    t->conf.soc_hi);
	else if (lo >= 0 && lo < DCIR_NBIN)
		snprintf(gate, sizeof gate, "%d-%d", lo, lo + DCIR_WINDOW);
	else
		gate[0] = '\0';
	csvout_str(w, gate);
	csvout_num(w, tr.growth_lo_30d);
	csvout_num(w, tr.growth_hi_30d);
	csvout_endrow(w);
	dcir_series_free(&d->ser);
}

static void
report(const struct tool *t, const struct devtab *devs,
    const struct sampin_stats *st)
{
	const unsigned long *n = t->cnt.n;
	unsigned long cand = 0, thinned = 0, few = 0;
	size_t i, nd = devtab_count(devs);
	int k;

	sampin_report(st, NULL);
	for (k = 0; k < DCIR_NREASON; k++)
		if (k != DCIR_NO_I)
			cand += n[k];
	cw_warn("%zu device%s; %lu steps of at least %g A, %lu accepted",
	    nd, nd == 1 ? "" : "s", cand, t->conf.min_step, n[DCIR_OK]);
	cw_warn("rejected: %lu gap, %lu unsteady, %lu no-voltage, "
	    "%lu soc-unknown, %lu soc-outside, %lu temp-unknown, "
	    "%lu temp-outside, %lu non-positive", n[DCIR_GAP],
	    n[DCIR_UNSTEADY], n[DCIR_NO_V], n[DCIR_SOC_UNKNOWN],
	    n[DCIR_SOC_OUT], n[DCIR_TEMP_UNKNOWN], n[DCIR_TEMP_OUT],
	    n[DCIR_NONPOS]);
	cw_warn("%lu sample pairs not tested for a step: a current missing",
	    n[DCIR_NO_I]);
	if (!t->trend)
		return;
	for (i = 0; i < nd; i++) {
		const struct dev *d = devtab_at(devs, i);

		if (d->ser.level > 0)
			thinned++;
		if (d->ser.steps < t->tconf.min_steps ||
		    d->ser.last - d->ser.first < t->tconf.min_span)
			few++;
	}
	cw_warn("trend: %lu device%s without an estimate (too few steps or "
	    "too short a span), %lu thinned to at most %zu points", few,
	    few == 1 ? "" : "s", thinned, t->max_points);
}

int
main(int argc, char *argv[])
{
	static const struct option longopts[] = {
		{ "allow-no-soc", no_argument, NULL, OPT_ALLOW_NO_SOC },
		{ "confidence", required_argument, NULL, OPT_CONFIDENCE },
		{ "ea", required_argument, NULL, OPT_EA },
		{ "eol", required_argument, NULL, OPT_EOL },
		{ "help", no_argument, NULL, 'h' },
		{ "max-dt", required_argument, NULL, OPT_MAX_DT },
		{ "max-points", required_argument, NULL, OPT_MAX_POINTS },
		{ "min-span", required_argument, NULL, OPT_MIN_SPAN },
		{ "min-step", required_argument, NULL, OPT_MIN_STEP },
		{ "min-steps", required_argument, NULL, OPT_MIN_STEPS },
		{ "output", required_argument, NULL, 'o' },
		{ "ref-temp", required_argument, NULL, OPT_REF_TEMP },
		{ "soc", required_argument, NULL, OPT_SOC },
		{ "steady", required_argument, NULL, OPT_STEADY },
		{ "steady-tol", required_argument, NULL, OPT_STEADY_TOL },
		{ "temp", required_argument, NULL, OPT_TEMP },
		{ "trend", no_argument, NULL, 't' },
		{ "verbose", no_argument, NULL, 'v' },
		{ "version", no_argument, NULL, OPT_VERSION },
		{ NULL, 0, NULL, 0 }
	};
	struct tool t;
	struct sampin_conf sc;
	struct sampin_stats st;
	struct devtab *devs;
	struct outf *of;
	const char *outpath = NULL;
	double w[2];
	void **sorted;
	size_t i, n;
	int ch, rc;

	cw_setprog("cw-dcir");
	memset(&t, 0, sizeof(t));
	dcir_conf_default(&t.conf);
	dcir_trend_conf_default(&t.tconf);
	t.max_points = MAX_POINTS_DEFAULT;
	opterr = 0;
	while ((ch = getopt_long(argc, argv, ":ho:tv", longopts, NULL)) !=
	    -1) {
		switch (ch) {
		case 'h':
			usage(stdout);
			return fflush(stdout) == 0 ? CW_EXIT_OK : CW_EXIT_DATA;
		case 'o':
			outpath = optarg;
			break;
		case 't':
			t.trend = 1;
			break;
		case 'v':
			cw_verbose = 1;
			break;
		case OPT_ALLOW_NO_SOC:
			t.conf.unknown_soc_ok = 1;
			break;
		case OPT_CONFIDENCE:
			t.tconf.conf = opt_num_arg("--confidence", optarg,
			    0.5, 1);
			if (t.tconf.conf <= 0.5 || t.tconf.conf >= 1)
				cw_usage_error("--confidence: %s is not "
				    "between 0.5 and 1 (exclusive)", optarg);
			break;
		case OPT_EA:
			t.conf.ea_kj = opt_num_arg("--ea", optarg, 0, 1000);
			break;
		case OPT_EOL:
			t.tconf.eol_pct = opt_num_arg("--eol", optarg, 100,
			    100000);
			if (t.tconf.eol_pct <= 100)
				cw_usage_error("--eol: %s is not above 100 "
				    "(percent of r_start)", optarg);
			break;
		case OPT_MAX_DT:
			t.conf.max_dt = opt_dur_arg("--max-dt", optarg, 0);
			break;
		case OPT_MAX_POINTS:
			t.max_points = (size_t)opt_long_arg("--max-points",
			    optarg, 16, 1L << 24);
			break;
		case OPT_MIN_SPAN:
			t.tconf.min_span = opt_dur_arg("--min-span", optarg,
			    1);
			break;
		case OPT_MIN_STEP:
			t.conf.min_step = opt_num_arg("--min-step", optarg, 0,
			    1e6);
			if (t.conf.min_step <= 0)
				cw_usage_error("--min-step: %s is not above 0",
				    optarg);
			break;
		case OPT_MIN_STEPS:
			t.tconf.min_steps = (unsigned long)opt_long_arg(
			    "--min-steps", optarg, 2, 1000000000L);
			break;
		case OPT_REF_TEMP:
			t.conf.ref_temp_c = opt_temp_arg("--ref-temp", optarg);
			if (t.conf.ref_temp_c <= -DCIR_KELVIN)
				cw_usage_error("--ref-temp: %s is not above "
				    "absolute zero", optarg);
			break;
		case OPT_SOC:
			if (strcmp(optarg, "auto") == 0) {
				t.conf.soc_auto = 1;
				break;
			}
			t.conf.soc_auto = 0;
			opt_list_arg("--soc", optarg, w, 2, 0, 1);
			if (w[0] < 0 || w[1] > 100)
				cw_usage_error("--soc: %s is not within "
				    "0..100", optarg);
			t.conf.soc_lo = w[0];
			t.conf.soc_hi = w[1];
			break;
		case OPT_STEADY:
			t.conf.steady_n = (int)opt_long_arg("--steady", optarg,
			    1, DCIR_HIST_MAX);
			break;
		case OPT_STEADY_TOL:
			t.conf.steady_tol = opt_num_arg("--steady-tol", optarg,
			    0, 100);
			break;
		case OPT_TEMP:
			opt_list_arg("--temp", optarg, w, 2, 1, 1);
			if (w[0] <= -DCIR_KELVIN)
				cw_usage_error("--temp: %s: the window must "
				    "lie above absolute zero", optarg);
			t.conf.temp_lo = w[0];
			t.conf.temp_hi = w[1];
			break;
		case OPT_VERSION:
			cw_print_version();
		default:
			opt_getopt_fail(ch, argv);
		}
	}
	argc -= optind;
	argv += optind;

	devs = devtab_new(sizeof(struct dev));
	of = outf_open(outpath);
	csvout_init(&t.out, outf_fp(of));
	csvout_header(&t.out, t.trend ? TREND_HEADER : STEP_HEADER);

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
			report(&t, devs, &st);
		n = devtab_count(devs);
		for (i = 0; i < n; i++)
			dcir_series_free(&((struct dev *)devtab_at(devs,
			    i))->ser);
		csvout_free(&t.out);
		devtab_free(devs);
		return rc;
	}
	if (cw_verbose)
		report(&t, devs, &st);

	if (t.trend) {
		sorted = devtab_sorted(devs);
		n = devtab_count(devs);
		for (i = 0; i < n; i++)
			write_trend(&t, sorted[i]);
		free(sorted);
	}
	if (csvout_flush(&t.out) != 0) {
		cw_warn("%s: write error: %s", outpath != NULL ? outpath :
		    "standard output", strerror(errno));
		return CW_EXIT_DATA;
	}
	if (outf_commit(of) != 0)
		return CW_EXIT_DATA;
	csvout_free(&t.out);
	devtab_free(devs);
	return CW_EXIT_OK;
}
