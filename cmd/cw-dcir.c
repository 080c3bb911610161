/*
 * cw-dcir: DC internal resistance from the current steps of the sample
 * stream, corrected to a reference temperature, one row per step; or with
 * --trend its growth per device.  The engine is lib/dcir.c (steps, the
 * Arrhenius correction, the trend) and lib/theilsen.c (the robust fit);
 * how saved states are joined, lib/dcirjoin.c.  This file holds the
 * options and the output.
 */
#include <errno.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "csvout.h"
#include "cw.h"
#include "finish.h"
#include "dcir.h"
#include "dcirjoin.h"
#include "dcirstate.h"
#include "glue.h"
#include "lock.h"
#include "devtab.h"
#include "opt.h"
#include "optab.h"
#include "outf.h"
#include "sampin.h"
#include "ts.h"

#define STEP_HEADER "device,time,soc_pct,temp_c,delta_i_a,delta_v_v," \
	"r_ohm,r_ref_ohm,dt_s,i_pre_a"
#define TREND_HEADER "device,steps,first,last,r_start_ohm,r_end_ohm," \
	"growth_pct,growth_pct_per_30d,eol_date,fit_steps," \
	"slope_ohm_per_day,slope_lo_ohm_per_day,slope_hi_ohm_per_day," \
	"soc_gate,growth_lo_pct_per_30d,growth_hi_pct_per_30d"

struct tool {
	struct dcir_conf conf;
	struct dcir_trend_conf tconf;
	struct dcir_counts cnt;
	struct csvout out;
	size_t max_points;
	int trend;
	int keep;		/* steps go to the series */
	int state_out;		/* the output is the state */
	struct dstate_conf sconf;
	struct djoin join;	/* the devices and their states */
	/* The options. */
	const char *outpath, *state;
	int merge;
	cw_time lock_wait;
};

enum {
	OPT_ALLOW_NO_SOC = OPTAB_LONG, OPT_CONFIDENCE, OPT_EA, OPT_EOL,
	OPT_LOCK_WAIT, OPT_MAX_DT, OPT_MAX_POINTS, OPT_MERGE, OPT_MIN_SPAN,
	OPT_MIN_STEP, OPT_MIN_STEPS, OPT_REF_TEMP, OPT_SOC, OPT_STATE,
	OPT_STATE_OUT, OPT_STEADY, OPT_STEADY_TOL, OPT_TEMP
};

/* Where an option of the table is stored: a member of struct tool. */
#define T(m)	offsetof(struct tool, m)

static const struct optab opts[] = {
	{ "allow-no-soc", 0, NULL, "keep steps whose SoC is unknown", NULL,
	    OPT_ALLOW_NO_SOC,
	    OPTAB_FLAG, T(conf.unknown_soc_ok), 0, 0 },
	{ "confidence", 0, "P", "confidence level of the slope's interval",
	    "0.95", OPT_CONFIDENCE,
	    OPTAB_OPEN, T(tconf.conf), 0.5, 1 },
	{ "ea", 0, "KJ", "activation energy in kJ/mol", "30", OPT_EA,
	    OPTAB_NUM, T(conf.ea_kj), 0, 1000 },
	{ "eol", 0, "PCT", "end of life at PCT percent of r_start_ohm", "200",
	    OPT_EOL },
	{ "lock-wait", 0, "DUR", "wait so long for another run on the "
	    "--state FILE", "1h; 0: refuse at once", OPT_LOCK_WAIT,
	    OPTAB_DUR, T(lock_wait), -1, 0 },
	{ "max-dt", 0, "DUR", "longest time between the samples of a step",
	    "15s", OPT_MAX_DT,
	    OPTAB_DUR, T(conf.max_dt), 0, 0 },
	{ "max-points", 0, "N", "points kept per device for the trend",
	    "2048", OPT_MAX_POINTS,
	    OPTAB_SIZE, T(max_points), 16, 1L << 24 },
	{ "merge", 0, NULL, "the files are states (--state-out): join them",
	    NULL, OPT_MERGE,
	    OPTAB_FLAG, T(merge), 0, 0 },
	{ "min-span", 0, "DUR", "shortest first-to-last span for a trend",
	    "7d", OPT_MIN_SPAN,
	    OPTAB_DUR, T(tconf.min_span), -1, 0 },
	{ "min-step", 0, "A", "smallest current step in amperes", "0.5",
	    OPT_MIN_STEP,
	    OPTAB_POS, T(conf.min_step), 0, 1e6 },
	{ "min-steps", 0, "N", "fewest steps for a trend", "10",
	    OPT_MIN_STEPS,
	    OPTAB_ULONG, T(tconf.min_steps), 2, 1000000000L },
	OPTAB_OUTPUT(T(outpath)),
	{ "ref-temp", 0, "T", "reference temperature", "25C", OPT_REF_TEMP },
	{ "soc", 0, "LO,HI|auto", "SoC window in percent; auto: per device, "
	    "the 30-point window with most steps", "20,80", OPT_SOC },
	{ "state", 0, "FILE", "go on from the state in FILE (if it exists) "
	    "and save it back there", NULL, OPT_STATE },
	{ "state-out", 0, NULL, "write the state instead of steps or trend",
	    NULL, OPT_STATE_OUT,
	    OPTAB_FLAG, T(state_out), 0, 0 },
	{ "steady", 0, "N", "steady samples before a step", "3", OPT_STEADY,
	    OPTAB_INT, T(conf.steady_n), 1, DCIR_HIST_MAX },
	{ "steady-tol", 0, "FRAC", "largest spread of those currents, as a "
	    "fraction of the step", "0.1", OPT_STEADY_TOL,
	    OPTAB_NUM, T(conf.steady_tol), 0, 100 },
	{ "temp", 0, "LO,HI", "temperature window", "10,45", OPT_TEMP },
	{ "trend", 't', NULL, "one row per device with the trend", NULL, 0,
	    OPTAB_FLAG, T(trend), 0, 0 },
	OPTAB_END
};

static const struct optool tool = OPTOOL_FILES("cw-dcir",
    "DC internal resistance from current steps, and its growth per "
    "device.\n",
    OPTAB_TEMPS OPTAB_DURATIONS,
    opts);

static int	on_row(void *ctx, void *dev, const struct cw_sample *s);
static void	write_step(struct tool *t, const struct djoin_dev *d,
		    const struct dcir_step *st);
static void	write_trend(struct tool *t, struct djoin_dev *d);
static void	write_states(struct outf *o, const char *path, struct tool *t,
		    void **devs, size_t n);
static void	report(const struct tool *t, const struct devtab *devs,
		    const struct sampin_stats *st);

static int
on_row(void *ctx, void *dev, const struct cw_sample *s)
{
	struct tool *t = ctx;
	struct djoin_dev *d = dev;
	struct dcir_step st;
	struct dcir_pt p;

	if (djoin_row(&t->join, d, s->t))
		return 0;
	p.t = s->t;
	p.v = s->v;
	p.i = s->i;
	p.temp = s->temp;
	p.soc = s->soc;
	if (dstate_feed(&d->ds, &t->conf, &p, &t->cnt, &st) != 1)
		return 0;
	if (t->keep)
		dcir_series_add(&d->ds.ser, st.t, st.r_ref, st.soc,
		    t->max_points);
	if (!t->trend && !t->state_out)
		write_step(t, d, &st);
	/* A write error stops the run; cw_finish() tells it. */
	return t->out.err ? CW_EXIT_DATA : 0;
}

static void
write_step(struct tool *t, const struct djoin_dev *d,
    const struct dcir_step *st)
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
write_trend(struct tool *t, struct djoin_dev *d)
{
	struct dcir_trend tr;
	struct csvout *w = &t->out;
	char gate[64];
	int lo = -1;

	if (t->conf.soc_auto) {
		lo = dcir_series_window(&d->ds.ser);
		if (lo < 0 && d->ds.ser.steps > 0)
			lo = DCIR_NBIN;	/* unknown SoC only: no bin */
	}
	dcir_trend_fit_window(&d->ds.ser, &t->tconf, lo, &tr);
	csvout_strn(w, d->e.name, d->e.namelen);
	csvout_int(w, (long long)tr.steps);
	glue_first_last(w, tr.steps > 0, tr.first, tr.last);
	csvout_num(w, tr.r_start);
	csvout_num(w, tr.r_end);
	csvout_num(w, tr.growth_pct);
	csvout_num(w, tr.growth_30d);
	glue_date(w, tr.has_eol, tr.eol_t);
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
}

/*
 * The states of N devices, sorted, with the header and end rows, to O;
 * PATH names it in messages.  Exits 1 on a write error.
 */
static void
write_states(struct outf *o, const char *path, struct tool *t, void **devs,
    size_t n)
{
	FILE *fp = outf_fp(o);
	size_t k;
	int bad;

	bad = dstate_write_header(fp, &t->sconf);
	for (k = 0; k < n && !bad; k++) {
		struct djoin_dev *d = devs[k];

		if (d->ds.rows > 0)
			bad = dstate_write_dev(fp, d->e.name, d->e.namelen,
			    &d->ds, &t->sconf);
	}
	if (!bad) {
		size_t m = 0;

		for (k = 0; k < n; k++)
			m += ((struct djoin_dev *)devs[k])->ds.rows > 0;
		bad = dstate_write_end(fp, (unsigned long)m);
	}
	if (bad || fflush(fp) != 0) {
		cw_write_error(path, errno);
		exit(CW_EXIT_DATA);
	}
}

/* Whether PATH names something that exists (a state to load). */
static int
exists(const char *path)
{
	FILE *fp = fopen(path, "r");

	if (fp == NULL)
		return 0;
	fclose(fp);
	return 1;
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
		const struct djoin_dev *d = devtab_at(devs, i);

		if (d->ds.ser.level > 0)
			thinned++;
		if (d->ds.ser.steps < t->tconf.min_steps ||
		    d->ds.ser.last - d->ds.ser.first < t->tconf.min_span)
			few++;
	}
	cw_warn("trend: %lu device%s without an estimate (too few steps or "
	    "too short a span), %lu thinned to at most %zu points", few,
	    few == 1 ? "" : "s", thinned, t->max_points);
}

/*
 * The options into T; the index of the first operand.  Exits 2 on a
 * usage error.
 */
static int
parse(struct tool *t, int argc, char *argv[])
{
	double w[2];
	int ch;

	memset(t, 0, sizeof(*t));
	dcir_conf_default(&t->conf);
	dcir_trend_conf_default(&t->tconf);
	t->max_points = DCIR_MAX_POINTS;
	t->lock_wait = LOCK_WAIT_DEFAULT;
	while ((ch = optab_getopt(&tool, t, argc, argv)) != -1) {
		switch (ch) {
		case OPT_EOL:
			t->tconf.eol_pct = opt_num_arg("--eol", optarg, 100,
			    100000);
			if (t->tconf.eol_pct <= 100)
				cw_usage_error("--eol: %s is not above 100 "
				    "(percent of r_start)", optarg);
			break;
		case OPT_STATE:
			if (optarg[0] == '\0')
				cw_usage_error("--state needs a file name");
			t->state = optarg;
			break;
		case OPT_REF_TEMP:
			t->conf.ref_temp_c = opt_temp_arg("--ref-temp",
			    optarg);
			if (t->conf.ref_temp_c <= -DCIR_KELVIN)
				cw_usage_error("--ref-temp: %s is not above "
				    "absolute zero", optarg);
			break;
		case OPT_SOC:
			if (strcmp(optarg, "auto") == 0) {
				t->conf.soc_auto = 1;
				break;
			}
			t->conf.soc_auto = 0;
			opt_list_arg("--soc", optarg, w, 2, 0, 1);
			if (w[0] < 0 || w[1] > 100)
				cw_usage_error("--soc: %s is not within "
				    "0..100", optarg);
			t->conf.soc_lo = w[0];
			t->conf.soc_hi = w[1];
			break;
		case OPT_TEMP:
			opt_list_arg("--temp", optarg, w, 2, 1, 1);
			if (w[0] <= -DCIR_KELVIN)
				cw_usage_error("--temp: %s: the window must "
				    "lie above absolute zero", optarg);
			t->conf.temp_lo = w[0];
			t->conf.temp_hi = w[1];
			break;
		}
	}
	if (t->state != NULL && t->outpath != NULL &&
	    strcmp(t->state, t->outpath) == 0)
		cw_usage_error("--state and -o name the same file");
	/* --merge has no steps to list: the trend, or the state. */
	if (t->merge && !t->state_out)
		t->trend = 1;
	t->keep = t->trend || t->state != NULL || t->state_out;
	t->sconf.c = &t->conf;
	t->sconf.max_points = t->max_points;
	return optind;
}

/*
 * The --state FILE, when there is one, locked from its read to its
 * rename, read and joined; rows then go on from each state.  Returns 0
 * or the exit status.
 */
static int
load_state(struct tool *t, struct dstate_read *rd)
{
	int rc;

	if (t->state == NULL)
		return 0;
	lock_state(t->state, t->lock_wait);
	if (!exists(t->state))
		return 0;
	if ((rc = dstate_read(rd, t->state, 1)) != 0 ||
	    (rc = djoin_flush(&t->join)) != 0)
		return rc;
	if (!t->merge)
		djoin_go_on(&t->join);
	return 0;
}

/* The states in PATH (glue_states()). */
static int
read_states(void *rd, const char *path, int whole)
{
	return dstate_read(rd, path, whole);
}

/*
 * --merge: the operands (standard input when none) are states, joined;
 * a file operand is a whole state, a stream may be sorted.  Returns 0 or
 * the exit status.
 */
static int
merge(struct tool *t, struct dstate_read *rd, char **argv, int argc)
{
	int rc;

	if ((rc = glue_states(argv, argc, 0, read_states, rd)) != 0 ||
	    (rc = djoin_flush(&t->join)) != 0)
		return rc;
	if (cw_verbose)
		cw_warn("%lu state rows read (%lu header, %lu end rows), %zu "
		    "devices, %lu steps found across joins", rd->rows,
		    rd->headers, rd->ends, devtab_count(t->join.devs),
		    t->join.joined);
	return 0;
}

/* The sample stream of the operands.  Returns 0 or the exit status. */
static int
samples(struct tool *t, char **argv, int argc)
{
	struct glue g;
	int rc;

	glue_reader(&g, t->join.devs);
	glue_sampin(&g, SAMP_BIT(SAMP_VOLTAGE) | SAMP_BIT(SAMP_CURRENT), 0,
	    on_row, t);
	rc = glue_read(&g, argv, argc);
	if (cw_verbose)
		report(t, g.devs, &g.st);
	if (rc == 0 && t->join.stale > 0)
		cw_warn("%lu rows not after the end of their device's state in "
		    "%s skipped (already in it)", t->join.stale, t->state);
	return rc;
}

int
main(int argc, char *argv[])
{
	struct tool t;
	struct outf *of, *sf = NULL;
	struct dstate_read rd;
	void **sorted;
	size_t i, n;
	int k, rc;

	k = parse(&t, argc, argv);
	argc -= k;
	argv += k;
	djoin_init(&t.join, &t.sconf);
	memset(&rd, 0, sizeof(rd));
	rd.sc = &t.sconf;
	rd.dev = djoin_state;
	rd.ctx = &t.join;
	if ((rc = load_state(&t, &rd)) != 0)
		return rc;
	if (t.state != NULL)
		sf = outf_open(t.state);
	of = outf_open(t.outpath);
	csvout_init(&t.out, outf_fp(of));
	/* Steps are written as they come; a merge writes after reading. */
	if (!t.state_out && !t.merge)
		csvout_header(&t.out, t.trend ? TREND_HEADER : STEP_HEADER);
	rc = t.merge ? merge(&t, &rd, argv, argc) : samples(&t, argv, argc);
	if (rc == 0 && !t.state_out && t.merge)
		csvout_header(&t.out, TREND_HEADER);
	sorted = devtab_sorted(t.join.devs);
	n = devtab_count(t.join.devs);
	if (rc == 0 && t.trend && !t.state_out)
		for (i = 0; i < n; i++)
			write_trend(&t, sorted[i]);
	/*
	 * After a data error, complete rows written so far stay; -o FILE
	 * is not committed and keeps its old contents.  The state moves on
	 * last, once the output is out.
	 */
	if (rc == 0 && t.state_out)
		write_states(of, t.outpath, &t, sorted, n);
	if (rc == 0 && sf != NULL)
		write_states(sf, t.state, &t, sorted, n);
	rc = cw_finish(&t.out, of, t.outpath, rc);
	if (rc == 0 && sf != NULL && outf_commit(sf) != 0)
		rc = CW_EXIT_DATA;
	free(sorted);
	csvout_free(&t.out);
	djoin_free(&t.join);
	return rc;
}
