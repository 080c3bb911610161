/*
 * cw-wear: wear stress and modelled capacity fade per device, one row
 * each, from the sample stream.  The engine is lib/wear.c; the models are
 * in lib/model.c.
 */
#include <getopt.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "csvout.h"
#include "cw.h"
#include "devtab.h"
#include "model.h"
#include "opt.h"
#include "outf.h"
#include "sampin.h"
#include "wear.h"

#define HEADER "device,first,last,days,charge_ah,efc,max_depth_pct," \
	"hours_soc_ge_95,hours_temp_ge_45,cold_charge_ah,hot_charge_ah," \
	"topoff_cycles,share_cycling,share_high_soc,share_heat,fade_pct," \
	"days_to_eol,dominant,damage"
#define HEADER_CAP ",max_charge_c,mean_charge_c,fade_ah"

/* A device's state in the devtab: the devent first, as devtab.h asks. */
struct dev {
	struct devent e;
	int started;
	struct wear_dev w;
};

struct run {
	struct wear_conf conf;
	double capacity;	/* Ah, 0 when not given */
};

enum {
	OPT_CALENDAR_LIFE = 256, OPT_CAPACITY, OPT_CYCLE_LIFE, OPT_FULL,
	OPT_FULL_VOLTAGE, OPT_HYSTERESIS, OPT_LIMITS, OPT_MAX_GAP,
	OPT_MIN_CURRENT, OPT_MIN_DEPTH, OPT_MODEL, OPT_RESIDUE, OPT_VERSION
};

static const struct option longopts[] = {
	{ "calendar-life", required_argument, NULL, OPT_CALENDAR_LIFE },
	{ "capacity", required_argument, NULL, OPT_CAPACITY },
	{ "cycle-life", required_argument, NULL, OPT_CYCLE_LIFE },
	{ "full", required_argument, NULL, OPT_FULL },
	{ "full-voltage", required_argument, NULL, OPT_FULL_VOLTAGE },
	{ "help", no_argument, NULL, 'h' },
	{ "hysteresis", required_argument, NULL, OPT_HYSTERESIS },
	{ "limits", required_argument, NULL, OPT_LIMITS },
	{ "max-gap", required_argument, NULL, OPT_MAX_GAP },
	{ "min-current", required_argument, NULL, OPT_MIN_CURRENT },
	{ "min-depth", required_argument, NULL, OPT_MIN_DEPTH },
	{ "model", required_argument, NULL, OPT_MODEL },
	{ "output", required_argument, NULL, 'o' },
	{ "residue", required_argument, NULL, OPT_RESIDUE },
	{ "verbose", no_argument, NULL, 'v' },
	{ "version", no_argument, NULL, OPT_VERSION },
	{ NULL, 0, NULL, 0 }
};

static void usage(FILE *);
static int on_row(void *, void *, const struct cw_sample *);
static void write_row(struct csvout *, const struct run *,
    const struct dev *, const struct wear_result *);
static void report(const struct run *, struct dev **, size_t);

static void
usage(FILE *fp)
{
	fprintf(fp,
	    "usage: cw-wear [-hv] [--calendar-life DAYS] [--capacity AH] "
	    "[--cycle-life N]\n"
	    "               [--full PCT] [--full-voltage V] "
	    "[--hysteresis PCT]\n"
	    "               [--limits T1,T2,T3,T4] [--max-gap DUR] "
	    "[--min-current A]\n"
	    "               [--min-depth PCT] [--model NAME] [-o FILE]\n"
	    "               [--residue half|full|repeat] [--version] "
	    "[file ...]\n");
}

static int
on_row(void *ctx, void *state, const struct cw_sample *s)
{
	struct run *r = ctx;
	struct dev *d = state;

	if (!d->started) {
		wear_init(&d->w, &r->conf);
		d->started = 1;
	}
	wear_push(&d->w, &r->conf, s->t, s->v, s->i, s->temp, s->soc);
	return 0;
}

static void
write_row(struct csvout *w, const struct run *r, const struct dev *d,
    const struct wear_result *x)
{
	csvout_strn(w, d->e.name, d->e.namelen);
	csvout_time(w, d->w.acc.first);
	csvout_time(w, d->w.acc.last);
	csvout_num(w, x->days);
	csvout_num(w, x->charge_ah);
	csvout_num(w, x->efc);
	csvout_num(w, x->max_depth_pct);
	csvout_num(w, x->hours_soc_ge_95);
	csvout_num(w, x->hours_temp_ge_45);
	csvout_num(w, x->cold_charge_ah);
	csvout_num(w, x->hot_charge_ah);
	csvout_num(w, x->topoff_cycles);
	csvout_num(w, x->share_cycling);
	csvout_num(w, x->share_high_soc);
	csvout_num(w, x->share_heat);
	csvout_num(w, x->fade_pct);
	csvout_num(w, x->days_to_eol);
	csvout_str(w, x->dominant);
	csvout_num(w, x->damage);
	if (r->capacity > 0) {
		csvout_num(w, x->max_charge_c);
		csvout_num(w, x->mean_charge_c);
		csvout_num(w, x->fade_ah);
	}
	csvout_endrow(w);
}

/* With -v: what was left out of which term, over all devices. */
static void
report(const struct run *r, struct dev **devs, size_t n)
{
	struct wear_acc t;
	size_t k;

	memset(&t, 0, sizeof(t));
	for (k = 0; k < n; k++)
		wear_acc_merge(&t, &devs[k]->w.acc);
	cw_warn("model %s: %s; cycle scale %g, calendar scale %g",
	    r->conf.model->name, r->conf.model->title, r->conf.cycle_scale,
	    r->conf.cal_scale);
	cw_warn("%zu devices; %lu rows in the model, %lu without SoC, "
	    "%lu without temperature (left out of the model)", n,
	    t.rows_model, t.rows_no_soc, t.rows_no_temp);
	if (t.rows_no_current > 0)
		cw_warn("%lu rows without current (no charge)",
		    t.rows_no_current);
	if (t.cycles_no_temp > 0)
		cw_warn("%g cycles without temperature left out of the cycle "
		    "damage (still in efc)", t.cycles_no_temp);
	if (t.zone_ah.no_temp > 0)
		cw_warn("%g Ah charged without temperature, in no zone",
		    t.zone_ah.no_temp);
	if (t.gaps > 0)
		cw_warn("gaps over --max-gap: %lu, %g h in all, the state "
		    "before each held through it", t.gaps, t.gap_s / 3600.0);
}

int
main(int argc, char *argv[])
{
	static struct run r;
	struct sampin_conf sc;
	struct sampin_stats st;
	struct wear_result x;
	struct csvout w;
	struct outf *of;
	struct dev **sorted;
	const char *out = NULL;
	double cycle_life = 0, calendar_life = 0;
	size_t n, k;
	int ch, rc;

	cw_setprog("cw-wear");
	wear_conf_default(&r.conf);
	opterr = 0;
	while ((ch = getopt_long(argc, argv, ":ho:v", longopts, NULL)) != -1) {
		switch (ch) {
		case 'h':
			usage(stdout);
			exit(fflush(stdout) == 0 ? CW_EXIT_OK : CW_EXIT_DATA);
		case 'o':
			out = optarg;
			break;
		case 'v':
			cw_verbose = 1;
			break;
		case OPT_CALENDAR_LIFE:
			calendar_life = opt_num_arg("--calendar-life", optarg,
			    1e-3, 1e9);
			break;
		case OPT_CAPACITY:
			r.capacity = opt_num_arg("--capacity", optarg, 1e-6,
			    1e9);
			break;
		case OPT_CYCLE_LIFE:
			cycle_life = opt_num_arg("--cycle-life", optarg, 1e-3,
			    1e9);
			break;
		case OPT_FULL:
			r.conf.topoff.full_pct = opt_num_arg("--full", optarg,
			    0, 100);
			break;
		case OPT_FULL_VOLTAGE:
			r.conf.topoff.full_v = opt_num_arg("--full-voltage",
			    optarg, 1e-3, 1e6);
			break;
		case OPT_HYSTERESIS:
			r.conf.hysteresis = opt_num_arg("--hysteresis", optarg,
			    0, 100);
			break;
		case OPT_LIMITS:
			opt_list_arg("--limits", optarg, r.conf.lim.t, 4, 1, 1);
			break;
		case OPT_MAX_GAP:
			r.conf.max_gap = opt_dur_arg("--max-gap", optarg, 0);
			r.conf.topoff.max_gap = r.conf.max_gap;
			break;
		case OPT_MIN_CURRENT:
			r.conf.min_current = opt_num_arg("--min-current",
			    optarg, 0, 1e6);
			r.conf.topoff.min_current = r.conf.min_current;
			break;
		case OPT_MIN_DEPTH:
			r.conf.topoff.min_depth = opt_num_arg("--min-depth",
			    optarg, 1e-6, 100);
			break;
		case OPT_MODEL:
			r.conf.model = model_find(optarg);
			if (r.conf.model == NULL)
				cw_usage_error("--model: no model '%s' (there "
				    "is: %s)", optarg, model_table[0]->name);
			break;
		case OPT_RESIDUE:
			if (strcmp(optarg, "half") == 0)
				r.conf.residue = RF_RESIDUE_HALF;
			else if (strcmp(optarg, "full") == 0)
				r.conf.residue = RF_RESIDUE_FULL;
			else if (strcmp(optarg, "repeat") == 0)
				r.conf.residue = RF_RESIDUE_REPEAT;
			else
				cw_usage_error("--residue: '%s' is not half, "
				    "full or repeat", optarg);
			break;
		case OPT_VERSION:
			cw_print_version();
		case ':':
			cw_usage_error("option '%s' needs a value",
			    argv[optind - 1]);
		default:
			if (optopt != 0 && optopt < 256)
				cw_usage_error("unknown option '-%c'", optopt);
			cw_usage_error("unknown option '%s'",
			    argv[optind - 1]);
		}
	}
	argc -= optind;
	argv += optind;
	/* The scales depend on the model, so they come after every option. */
	if (cycle_life > 0)
		wear_set_cycle_life(&r.conf, cycle_life);
	if (calendar_life > 0)
		wear_set_calendar_life(&r.conf, calendar_life);

	memset(&sc, 0, sizeof(sc));
	sc.need = SAMP_BIT(SAMP_DEVICE) | SAMP_BIT(SAMP_TIME);
	sc.need_any = SAMP_BIT(SAMP_SOC) | SAMP_BIT(SAMP_TEMP);
	sc.row = on_row;
	sc.ctx = &r;
	sc.devs = devtab_new(sizeof(struct dev));
	of = outf_open(out);
	rc = sampin_run(&sc, argv, argc, &st);
	if (cw_verbose)
		sampin_report(&st, NULL);
	if (rc != 0)
		exit(rc);

	csvout_init(&w, outf_fp(of));
	csvout_header(&w, r.capacity > 0 ? HEADER HEADER_CAP : HEADER);
	sorted = (struct dev **)devtab_sorted(sc.devs);
	n = devtab_count(sc.devs);
	for (k = 0; k < n; k++) {
		wear_finish(&sorted[k]->w, &r.conf);
		wear_report(&r.conf, &sorted[k]->w.acc, r.capacity, &x);
		write_row(&w, &r, sorted[k], &x);
	}
	if (cw_verbose)
		report(&r, sorted, n);
	for (k = 0; k < n; k++)
		wear_free(&sorted[k]->w);
	free(sorted);
	devtab_free(sc.devs);
	if (csvout_flush(&w) != 0) {
		csvout_free(&w);
		cw_die(CW_EXIT_DATA, "write error");
	}
	csvout_free(&w);
	if (outf_commit(of) != 0)
		exit(CW_EXIT_DATA);
	return CW_EXIT_OK;
}
