/*
 * cw-wear: wear stress and modelled capacity fade per device, one row
 * each, from the sample stream.  The engine is lib/wear.c; the models are
 * in lib/model.c; how saved states are joined, lib/wearjoin.c.
 */
#include <errno.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

#include "csvout.h"
#include "cw.h"
#include "devtab.h"
#include "dwell.h"
#include "finish.h"
#include "fleet.h"
#include "glue.h"
#include "measured.h"
#include "lock.h"
#include "model.h"
#include "opt.h"
#include "optab.h"
#include "outf.h"
#include "sampin.h"
#include "ts.h"
#include "wear.h"
#include "wearjoin.h"
#include "wearstate.h"

#define HEADER "device,first,last,days,charge_ah,efc,max_depth_pct," \
	"hours_near_full,hours_hot,cold_charge_ah,cool_charge_ah," \
	"hot_charge_ah,topoff_cycles,share_age,share_cycling," \
	"share_high_soc,share_heat,fade_pct,soh_pct,days_to_eol,dominant," \
	"prior,damage,damage_prior"
#define HEADER_CAP ",max_charge_c,mean_charge_c,fade_ah"
#define HEADER_MEAS ",measured_fade_pct,model_error_pct"
#define HEADER_FIT "quantity,before,after,stderr"
#define HEADER_DWELL "device,soc_lo,soc_hi,temp_lo_c,temp_hi_c,hours," \
	"idle_hours"
#define MAXWARN WJOIN_MAXWARN

/* A device's state with --dwell. */
struct ddev {
	struct devent e;
	struct dwell_dev d;
};

struct run {
	struct wear_conf conf;
	double capacity;	/* Ah, 0 when not given */
	struct fleet *fleet;	/* --fleet, or NULL */
	struct meas *meas;	/* --measured, or NULL */
	unsigned long meas_why[MEAS_NWHY];	/* packs by why (not) */
	unsigned long late_service;	/* in_service after the first row */
	struct wjoin join;	/* the devices and their states */
	struct wstate_read rd;
	/* The options. */
	const char *out, *state, *fleet_path, *measured;
	double cycle_life, calendar_life;	/* 0: not given */
	int merge, state_out, dwell, fitting, partition;
	cw_time lock_wait;
	unsigned fixed;		/* WSTATE_SET_*: settings given */
};

enum {
	OPT_CALENDAR_LIFE = OPTAB_LONG, OPT_CAPACITY, OPT_CYCLE_LIFE,
	OPT_DWELL, OPT_FIT_SCALES, OPT_FLEET, OPT_FULL, OPT_FULL_VOLTAGE,
	OPT_HYSTERESIS, OPT_LIMITS, OPT_LOCK_WAIT, OPT_MAX_GAP, OPT_MERGE,
	OPT_MEASURED, OPT_MIN_CURRENT, OPT_MIN_DEPTH, OPT_MODEL,
	OPT_PARTITION, OPT_RESIDUE, OPT_STATE, OPT_STATE_OUT
};

/* Where an option of the table is stored: a member of struct run. */
#define R(m)	offsetof(struct run, m)

static const struct optab opts[] = {
	{ "calendar-life", 0, "DAYS", "DAYS at rest at 25 C, 50 % SoC give "
	    "20 % fade (unset: the published constant)", NULL,
	    OPT_CALENDAR_LIFE,
	    OPTAB_NUM, R(calendar_life), 1e-3, 1e9 },
	{ "capacity", 0, "AH", "rated capacity, for C-rates and Ah lost",
	    NULL, OPT_CAPACITY,
	    OPTAB_NUM, R(capacity), 1e-6, 1e9 },
	{ "cycle-life", 0, "N", "N full cycles at 25 C, 50 % SoC give 20 % "
	    "fade (unset: the published constants)", NULL, OPT_CYCLE_LIFE,
	    OPTAB_NUM, R(cycle_life), 1e-3, 1e9 },
	{ "dwell", 0, NULL, "hours by SoC and temperature band instead", NULL,
	    OPT_DWELL,
	    OPTAB_FLAG, R(dwell), 0, 0 },
	{ "fit-scales", 0, NULL, "fit the cycle and calendar scales to "
	    "--measured (least squares over packs) and print them", NULL,
	    OPT_FIT_SCALES,
	    OPTAB_FLAG, R(fitting), 0, 0 },
	{ "fleet", 0, "FILE", "the fleet file: soh_pct, in_service, "
	    "efc_prior, capacity_ah per pack", NULL, OPT_FLEET,
	    OPTAB_STR, R(fleet_path), 0, 0 },
	{ "full", 0, "PCT", "near full at PCT % SoC or more", "95",
	    OPT_FULL, OPTAB_NUM | OPTAB_TELL, R(conf.topoff.full_pct), 0, 100 },
	{ "full-voltage", 0, "V", "judge rows without SoC by voltage", NULL,
	    OPT_FULL_VOLTAGE, OPTAB_NUM | OPTAB_TELL, R(conf.topoff.full_v),
	    1e-3, 1e6 },
	{ "hysteresis", 0, "PCT", "rainflow ignores smaller reversals", "1",
	    OPT_HYSTERESIS, OPTAB_NUM | OPTAB_TELL, R(conf.hysteresis), 0,
	    100 },
	{ "limits", 0, "T1,T2,T3,T4", "the zone thresholds", "0,10,45,60",
	    OPT_LIMITS },
	{ "lock-wait", 0, "DUR", "wait so long for another run on the "
	    "--state FILE", "1h; 0: refuse at once", OPT_LOCK_WAIT,
	    OPTAB_DUR, R(lock_wait), -1, 0 },
	{ "max-gap", 0, "DUR", "a longer interval carries no charge", "15m",
	    OPT_MAX_GAP, OPTAB_DUR | OPTAB_TELL, R(conf.max_gap), 0, 0 },
	{ "measured", 0, "FILE", "add measured_fade_pct and model_error_pct "
	    "from a cw-capacity --trend output", NULL, OPT_MEASURED,
	    OPTAB_STR, R(measured), 0, 0 },
	{ "merge", 0, NULL, "the operands are states: join and report", NULL,
	    OPT_MERGE,
	    OPTAB_FLAG, R(merge), 0, 0 },
	{ "min-current", 0, "A", "charging above A, idle below", "0.05",
	    OPT_MIN_CURRENT, OPTAB_NUM | OPTAB_TELL, R(conf.min_current), 0,
	    1e6 },
	{ "min-depth", 0, "PCT", "the smallest top-off micro-cycle", "0.5",
	    OPT_MIN_DEPTH, OPTAB_NUM | OPTAB_TELL, R(conf.topoff.min_depth),
	    1e-6, 100 },
	{ "model", 0, "NAME", "the degradation model", "xu2018", OPT_MODEL },
	OPTAB_OUTPUT(R(out)),
	{ "partition", 0, NULL, "with --merge, standard input holds the "
	    "states of some devices only (a reducer's share): end rows "
	    "checked for form, not for the rows they count (unset: whole "
	    "states, row counts checked)", NULL, OPT_PARTITION,
	    OPTAB_FLAG, R(partition), 0, 0 },
	{ "residue", 0, "half|full|repeat", "the open cycles at the end",
	    "half", OPT_RESIDUE },
	{ "state", 0, "FILE", "go on from the states in FILE and write them "
	    "back", NULL, OPT_STATE },
	{ "state-out", 0, NULL, "write the states instead of the report",
	    NULL, OPT_STATE_OUT,
	    OPTAB_FLAG, R(state_out), 0, 0 },
	OPTAB_END
};

static const struct optool tool = OPTOOL_FILES("cw-wear",
    "Wear stress, modelled fade and its causes per pack, from the sample\n"
    "stream.\n",
    "Temperatures take a unit suffix: 10, 10C, 50F, 283.15K; durations "
    "90, 90s,\n15m, 2h, 1d.  The tools advise; they are not a safety "
    "system.\n",
    opts);

static int on_row(void *, void *, const struct cw_sample *);
static void write_row(struct csvout *, const struct run *,
    const struct wjoin_dev *, const struct wear_result *);
static void write_states(struct outf *, const char *, struct run *,
    struct wjoin_dev **, size_t);
static void report(const struct run *, struct wjoin_dev **, size_t);
static void set_prior(struct run *, struct wjoin_dev *);
static int on_dwell(void *, void *, const struct cw_sample *);
static int dwell_run(struct run *, char **, int);
static void fit_row(struct csvout *, const char *, double, double, double);
static void fit_run(struct run *, struct wjoin_dev **, size_t, struct csvout *);
static int exists(const char *);

static int
on_row(void *ctx, void *state, const struct cw_sample *s)
{
	struct run *r = ctx;
	struct wjoin_dev *d = state;

	if (wjoin_row(&r->join, d, s->t) == 0)
		wear_push(&d->w, &r->conf, s->t, s->v, s->i, s->temp,
		    s->soc);
	return 0;
}

static void
write_row(struct csvout *w, const struct run *r, const struct wjoin_dev *d,
    const struct wear_result *x)
{
	csvout_strn(w, d->e.name, d->e.namelen);
	csvout_time(w, d->w.acc.first);
	csvout_time(w, d->w.acc.last);
	csvout_num(w, x->days);
	csvout_num(w, x->charge_ah);
	csvout_num(w, x->efc);
	csvout_num(w, x->max_depth_pct);
	csvout_num(w, x->hours_near_full);
	csvout_num(w, x->hours_hot);
	csvout_num(w, x->cold_charge_ah);
	csvout_num(w, x->cool_charge_ah);
	csvout_num(w, x->hot_charge_ah);
	csvout_num(w, x->topoff_cycles);
	csvout_num(w, x->share_age);
	csvout_num(w, x->share_cycling);
	csvout_num(w, x->share_high_soc);
	csvout_num(w, x->share_heat);
	csvout_num(w, x->fade_pct);
	csvout_num(w, x->soh_pct);
	csvout_num(w, x->days_to_eol);
	csvout_str(w, x->dominant);
	csvout_str(w, x->prior);
	csvout_num(w, x->damage);
	csvout_num(w, x->damage_prior);
	if (r->capacity > 0 || r->fleet != NULL) {
		csvout_num(w, x->max_charge_c);
		csvout_num(w, x->mean_charge_c);
		csvout_num(w, x->fade_ah);
	}
	if (r->meas != NULL) {
		double m;

		meas_fade(meas_find(r->meas, d->e.name, d->e.namelen),
		    d->w.acc.first, d->w.acc.last, fleet_capacity(r->fleet,
		    d->e.name, d->e.namelen, r->capacity), &m);
		csvout_num(w, m);
		csvout_num(w, cw_isnum(m) ? x->fade_pct - m : CW_MISSING);
	}
	csvout_endrow(w);
}

/*
 * The states of N devices, sorted, with the header and end rows, to O;
 * PATH names it in messages.  Exits 1 on a write error.
 */
static void
write_states(struct outf *o, const char *path, struct run *r,
    struct wjoin_dev **devs, size_t n)
{
	FILE *fp = outf_fp(o);
	size_t k;
	int bad;

	bad = wstate_write_header(fp);
	for (k = 0; k < n && bad == 0; k++)
		bad = wstate_write_dev(fp, devs[k]->e.name, devs[k]->e.namelen,
		    &devs[k]->w, &r->conf);
	if (bad == 0)
		bad = wstate_write_end(fp, (unsigned long)n);
	if (bad != 0) {
		cw_write_error(path, errno);
		exit(CW_EXIT_DATA);
	}
}

/* With -v: what was left out of which term, over all devices. */
static void
report(const struct run *r, struct wjoin_dev **devs, size_t n)
{
	struct wear_acc t;
	unsigned long kind[WEAR_PRIOR_NKIND] = { 0 };
	size_t k;

	memset(&t, 0, sizeof(t));
	for (k = 0; k < n; k++) {
		wear_acc_merge(&t, &devs[k]->w.acc);
		if (devs[k]->w.prior.kind >= 0 &&
		    devs[k]->w.prior.kind < WEAR_PRIOR_NKIND)
			kind[devs[k]->w.prior.kind]++;
	}
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
	if (r->fleet != NULL || kind[WEAR_PRIOR_NEW] < n)
		cw_warn("prior damage: %lu packs by measured SoH, %lu by age "
		    "and cycles, %lu new", kind[WEAR_PRIOR_SOH],
		    kind[WEAR_PRIOR_AGE], kind[WEAR_PRIOR_NEW]);
	if (r->meas != NULL)
		cw_warn("--measured: %zu packs in the file; of the %zu here, "
		    "%lu with a measured fade, %lu %s, %lu %s, %lu %s, %lu %s",
		    meas_count(r->meas), n, r->meas_why[MEAS_OK],
		    r->meas_why[MEAS_NOROW], meas_why(MEAS_NOROW),
		    r->meas_why[MEAS_NOSLOPE], meas_why(MEAS_NOSLOPE),
		    r->meas_why[MEAS_UNSURE], meas_why(MEAS_UNSURE),
		    r->meas_why[MEAS_SPAN], meas_why(MEAS_SPAN));
	if (r->join.joins > 0)
		cw_warn("%lu states joined to the one before or after them",
		    r->join.joins);
	if (t.topoff_cut > 0)
		cw_warn("%lu joins across a hold near full that ran over %d "
		    "rows without a row that settles the top-off detector: "
		    "micro-cycles there counted on each side apart",
		    t.topoff_cut, WEAR_PRE_MAX);
}

/*
 * The prior of device D from the fleet file, unless its state has one
 * (the state's first row is the one the prior was taken for): a measured
 * SoH first, else its time in service before the first row and its
 * equivalent full cycles.
 */
static void
set_prior(struct run *r, struct wjoin_dev *d)
{
	const struct fleet_pack *p;
	struct wear_prior *w = &d->w.prior;
	char t[2][TS_FMTMAX];

	p = fleet_find(r->fleet, d->e.name, d->e.namelen);
	if (p == NULL || w->kind != WEAR_PRIOR_NEW || !d->w.acc.have)
		return;
	if (p->have & FLEET_SOH) {
		w->kind = WEAR_PRIOR_SOH;
		w->soh_pct = p->soh_pct;
		return;
	}
	if (!(p->have & (FLEET_IN_SERVICE | FLEET_EFC_PRIOR)))
		return;
	w->kind = WEAR_PRIOR_AGE;
	if (p->have & FLEET_EFC_PRIOR)
		w->efc = p->efc_prior;
	if (!(p->have & FLEET_IN_SERVICE))
		return;
	if (p->in_service <= d->w.acc.first) {
		w->age_s = (double)(d->w.acc.first - p->in_service) /
		    CW_US_PER_S;
		return;
	}
	if (r->late_service++ < MAXWARN) {
		ts_format(p->in_service, t[0]);
		ts_format(d->w.acc.first, t[1]);
		cw_warn_at(r->fleet_path, p->line, "%.*s entered service at "
		    "%s, after its first row at %s: taken as no time in "
		    "service", (int)d->e.namelen, d->e.name, t[0], t[1]);
	}
}

static int
on_dwell(void *ctx, void *state, const struct cw_sample *s)
{
	const struct dwell_conf *c = ctx;
	struct ddev *d = state;

	dwell_push(&d->d, c, s->t, s->i, s->temp, s->soc);
	return 0;
}

/*
 * --dwell: the hours of every device by SoC and temperature band, the
 * cells with time in them only, devices in name order, to -o.  Returns
 * the exit status.
 */
static int
dwell_run(struct run *r, char **argv, int argc)
{
	struct dwell_conf dc;
	struct glue g;
	struct csvout w;
	struct ddev **v;
	unsigned long skipped = 0, empty = 0;
	size_t n, k;
	int rc, s, t;

	dwell_conf_set(&dc, &r->conf.lim, r->conf.min_current,
	    r->conf.max_gap);
	glue_open(&g, sizeof(struct ddev), r->out, &w, NULL);
	glue_sampin(&g, SAMP_BIT(SAMP_SOC) | SAMP_BIT(SAMP_TEMP), 0, on_dwell,
	    &dc);
	rc = glue_read(&g, argv, argc);
	if (cw_verbose)
		sampin_report(&g.st, NULL);
	if (rc != 0)
		return glue_close(&g, rc);
	v = (struct ddev **)glue_sorted(&g, &n);
	csvout_header(&w, HEADER_DWELL);
	for (k = 0; k < n; k++) {
		const struct dwell_dev *d = &v[k]->d;

		skipped += d->rows_skipped;
		empty += !(d->covered_h > 0);
		for (s = 0; s < DWELL_NSOC; s++)
			for (t = 0; t < dc.ntemp; t++) {
				if (!(d->hours[s][t] > 0))
					continue;
				csvout_strn(&w, v[k]->e.name, v[k]->e.namelen);
				csvout_num(&w, dc.soc_edge[s]);
				csvout_num(&w, dc.soc_edge[s + 1]);
				csvout_num(&w, dwell_temp_lo(&dc, t));
				csvout_num(&w, dwell_temp_hi(&dc, t));
				csvout_num(&w, d->hours[s][t]);
				csvout_num(&w, d->idle_hours[s][t]);
				csvout_endrow(&w);
			}
	}
	free(v);
	rc = glue_close(&g, 0);
	if (rc == 0 && cw_verbose)
		cw_warn("%zu devices, %lu of them without two rows with SoC "
		    "and temperature (no rows); %lu rows without SoC or "
		    "temperature passed over", n, empty, skipped);
	return rc;
}

/* One row of the fit's table. */
static void
fit_row(struct csvout *w, const char *q, double before, double after,
    double se)
{
	csvout_str(w, q);
	csvout_num(w, before);
	csvout_num(w, after);
	csvout_num(w, se);
	csvout_endrow(w);
}

/*
 * --fit-scales: the model's cycle and calendar scales fitted to the
 * measured fade of the N devices (lib/measured.c), and their effect, as
 * rows of quantity,before,after,stderr to W.
 */
static void
fit_run(struct run *r, struct wjoin_dev **devs, size_t n, struct csvout *w)
{
	static const char *const life[2] = { "cycle_life", "calendar_life_days" };
	struct meas_obs *o;
	struct meas_fit f;
	struct wear_result x;
	struct model_eval e;
	double cap, ref[2];
	size_t k, m = 0;
	int j;

	o = cw_calloc(n > 0 ? n : 1, sizeof(*o));
	for (k = 0; k < n; k++) {
		cap = fleet_capacity(r->fleet, devs[k]->e.name,
		    devs[k]->e.namelen, r->capacity);
		wear_report(&r->conf, &devs[k]->w.acc, &devs[k]->w.prior, cap,
		    &x);
		if (meas_fade(meas_find(r->meas, devs[k]->e.name,
		    devs[k]->e.namelen), devs[k]->w.acc.first,
		    devs[k]->w.acc.last, cap, &o[m].measured_pct) != MEAS_OK ||
		    !cw_isnum(x.fade_pct))
			continue;
		o[m].acc = &devs[k]->w.acc;
		o[m].prior = &devs[k]->w.prior;
		o[m].capacity_ah = cap;
		m++;
	}
	if (meas_fit_scales(&r->conf, o, m, &f) != 0)
		cw_die(CW_EXIT_DATA, "--fit-scales: %zu pack%s with both a "
		    "measured and a modelled fade; the fit needs 2 at least",
		    m, m == 1 ? "" : "s");
	if (f.common)
		cw_warn("--fit-scales: the packs do not tell cycling from "
		    "calendar aging apart (their modelled fades grow alike "
		    "with either scale): one factor fitted for both");
	if (!f.converged)
		cw_warn("--fit-scales: no convergence in 200 steps; the last "
		    "step's scales are printed");
	/* The damage of one rated life at reference, to give the scales as
	 * --cycle-life and --calendar-life. */
	r->conf.model->cycle(1.0, r->conf.model->ref_soc,
	    r->conf.model->ref_temp_c, &e);
	ref[0] = r->conf.model->damage_at(WEAR_EOL_FADE) / e.full;
	r->conf.model->calendar(r->conf.model->ref_soc,
	    r->conf.model->ref_temp_c, &e);
	ref[1] = r->conf.model->damage_at(WEAR_EOL_FADE) / (e.full * 86400.0);
	csvout_header(w, HEADER_FIT);
	fit_row(w, "packs", (double)f.n, (double)f.n, CW_MISSING);
	fit_row(w, "cycle_scale", f.scale[0][0], f.scale[1][0], f.se[0]);
	fit_row(w, "calendar_scale", f.scale[0][1], f.scale[1][1], f.se[1]);
	/* A life is ref / scale; its error by the first-order rule. */
	for (j = 0; j < 2; j++)
		fit_row(w, life[j], ref[j] / f.scale[0][j],
		    ref[j] / f.scale[1][j], f.se[j] * ref[j] /
		    (f.scale[1][j] * f.scale[1][j]));
	fit_row(w, "scale_correlation", CW_MISSING, f.corr, CW_MISSING);
	fit_row(w, "rms_error_pct", f.rms[0], f.rms[1], CW_MISSING);
	fit_row(w, "mean_error_pct", f.bias[0], f.bias[1], CW_MISSING);
	fit_row(w, "median_days_to_eol", f.eol_median[0], f.eol_median[1],
	    CW_MISSING);
	free(o);
}

/* Whether PATH names something that exists (a state to load). */
static int
exists(const char *path)
{
	struct stat sb;

	if (stat(path, &sb) == 0)
		return 1;
	if (errno != ENOENT)
		cw_die(CW_EXIT_DATA, "%s: %s", path, strerror(errno));
	return 0;
}

/*
 * The WSTATE_SET_* bit of a setting a state keeps (stored by the table,
 * OPTAB_TELL), so that the state notes it was given; 0 for the others.
 */
static unsigned
given(int id)
{
	static const int bit[][2] = {
		{ OPT_FULL, WSTATE_SET_FULL }, { OPT_HYSTERESIS,
		WSTATE_SET_HYSTERESIS }, { OPT_FULL_VOLTAGE,
		WSTATE_SET_FULL_VOLTAGE }, { OPT_MAX_GAP, WSTATE_SET_MAX_GAP },
		{ OPT_MIN_CURRENT, WSTATE_SET_MIN_CURRENT }, { OPT_MIN_DEPTH,
		WSTATE_SET_MIN_DEPTH }
	};
	size_t i;

	for (i = 0; i < sizeof(bit) / sizeof(bit[0]); i++)
		if (bit[i][0] == id)
			return (unsigned)bit[i][1];
	return 0;
}

/*
 * The options into R; the index of the first operand.  Exits 2 on a
 * usage error.
 */
static int
parse(struct run *r, int argc, char *argv[])
{
	int ch;

	wear_conf_default(&r->conf);
	r->lock_wait = LOCK_WAIT_DEFAULT;
	while ((ch = optab_getopt(&tool, r, argc, argv)) != -1) {
		switch (ch) {
		case OPT_LIMITS:
			opt_list_arg("--limits", optarg, r->conf.lim.t, 4, 1,
			    1);
			r->fixed |= WSTATE_SET_LIMITS;
			break;
		case OPT_MODEL:
			r->conf.model = model_find(optarg);
			if (r->conf.model == NULL)
				cw_usage_error("--model: no model '%s' (there "
				    "is: %s)", optarg, model_table[0]->name);
			r->fixed |= WSTATE_SET_MODEL;
			break;
		case OPT_RESIDUE:
			if ((r->conf.residue = rf_residue_parse(optarg)) < 0)
				cw_usage_error("--residue: '%s' is not half, "
				    "full or repeat", optarg);
			break;
		case OPT_STATE:
			if (optarg[0] == '\0' || strcmp(optarg, "-") == 0)
				cw_usage_error("--state needs a file name");
			r->state = optarg;
			break;
		default:
			r->fixed |= given(ch);
		}
	}
	/* The top-off engine counts charge by the same gap and current. */
	if (r->fixed & WSTATE_SET_MAX_GAP)
		r->conf.topoff.max_gap = r->conf.max_gap;
	if (r->fixed & WSTATE_SET_MIN_CURRENT)
		r->conf.topoff.min_current = r->conf.min_current;
	if (r->state != NULL && r->out != NULL && strcmp(r->out, "-") != 0 &&
	    outf_same(r->state, r->out))
		cw_usage_error("--state and -o name the same file");
	if (r->partition && !r->merge)
		cw_usage_error("--partition goes with --merge");
	if (r->dwell && (r->state != NULL || r->state_out || r->merge))
		cw_usage_error("--dwell does not go with --state, --state-out "
		    "or --merge (a dwell table is not kept in a state)");
	if (r->fitting && r->measured == NULL)
		cw_usage_error("--fit-scales needs --measured FILE");
	if ((r->fitting || r->measured != NULL) && (r->dwell ||
	    r->state_out))
		cw_usage_error("--measured and --fit-scales go with the report, "
		    "not with --dwell or --state-out");
	return optind;
}

/*
 * The --state FILE, when there is one: a regular file, locked from its
 * read to its rename, read and joined; samples then go on from each
 * state.  Returns 0 or the exit status.
 */
static int
load_state(struct run *r)
{
	int rc;

	if (r->state == NULL)
		return 0;
	outf_check_state(r->state);
	lock_state(r->state, r->lock_wait);
	if (!exists(r->state)) {
		cw_warn("%s: no such state: a new history starts (as on the "
		    "first night)", r->state);
		return 0;
	}
	if ((rc = wstate_read(&r->rd, r->state, 1)) != 0 ||
	    (rc = wjoin_flush(&r->join)) != 0)
		return rc;
	if (!r->merge)
		wjoin_go_on(&r->join);
	return 0;
}

/* The states in PATH (glue_states()). */
static int
read_states(void *rd, const char *path, int whole)
{
	return wstate_read(rd, path, whole);
}

/*
 * --merge: the operands (standard input when none) are states, joined.
 * A file operand is a whole state; a stream may be sorted or, with
 * --partition, a share of the devices.  Returns 0 or the exit status.
 */
static int
merge(struct run *r, char **argv, int argc)
{
	int rc;

	if ((rc = glue_states(argv, argc, !r->partition, read_states,
	    &r->rd)) != 0 || (rc = wjoin_flush(&r->join)) != 0)
		return rc;
	if (r->join.straddles > 0)
		cw_warn("%lu states overlapped the one before or after them "
		    "by a little, and were joined all the same",
		    r->join.straddles);
	if (cw_verbose)
		cw_warn("%lu state rows read (%lu header, %lu end rows), %zu "
		    "devices", r->rd.rows, r->rd.headers, r->rd.ends,
		    devtab_count(r->join.devs));
	return 0;
}

/* The sample stream of the operands.  Returns 0 or the exit status. */
static int
samples(struct run *r, char **argv, int argc)
{
	struct glue g;
	int rc;

	glue_reader(&g, r->join.devs);
	glue_sampin(&g, 0, SAMP_BIT(SAMP_SOC) | SAMP_BIT(SAMP_TEMP), on_row,
	    r);
	rc = glue_read(&g, argv, argc);
	if (cw_verbose)
		sampin_report(&g.st, NULL);
	if (rc == 0 && r->state != NULL)
		wjoin_stale_check(&r->join, r->state);
	return rc;
}

/*
 * The report of the N devices (or, with --fit-scales, the fit) to -o,
 * opened as O.  Returns the exit status.
 */
static int
write_report(struct run *r, struct wjoin_dev **devs, size_t n,
    struct outf *o)
{
	struct wear_result x;
	struct csvout w;
	size_t k;
	double m;
	int rc;

	csvout_init(&w, outf_fp(o));
	/* --fit-scales: the fit's table, not the rows. */
	if (!r->fitting)
		csvout_header(&w, r->capacity > 0 || r->fleet != NULL ?
		    (r->meas != NULL ? HEADER HEADER_CAP HEADER_MEAS :
		    HEADER HEADER_CAP) : r->meas != NULL ?
		    HEADER HEADER_MEAS : HEADER);
	for (k = 0; k < n; k++) {
		wear_finish(&devs[k]->w, &r->conf);
		wear_report(&r->conf, &devs[k]->w.acc, &devs[k]->w.prior,
		    fleet_capacity(r->fleet, devs[k]->e.name,
		    devs[k]->e.namelen, r->capacity), &x);
		if (!r->fitting)
			write_row(&w, r, devs[k], &x);
		if (r->meas != NULL)
			r->meas_why[meas_fade(meas_find(r->meas,
			    devs[k]->e.name, devs[k]->e.namelen),
			    devs[k]->w.acc.first, devs[k]->w.acc.last, 1,
			    &m)]++;
	}
	if (r->fitting)
		fit_run(r, devs, n, &w);
	/* Not committed yet: the state moves on first. */
	rc = 0;
	if (csvout_flush(&w) != 0) {
		cw_write_error(r->out, w.errnum != 0 ? w.errnum : EIO);
		rc = CW_EXIT_DATA;
	}
	csvout_free(&w);
	return rc;
}

/*
 * What the run ends with, for the N devices: the --state FILE written
 * to SF, then the states (--state-out) or the report to O.  Returns the
 * exit status.
 */
static int
finish(struct run *r, struct outf *sf, struct outf *o)
{
	struct wjoin_dev **sorted;
	size_t n, k;
	int rc = 0;

	/* The scales depend on the model, which a state may have set. */
	if (r->cycle_life > 0)
		wear_set_cycle_life(&r->conf, r->cycle_life);
	if (r->calendar_life > 0)
		wear_set_calendar_life(&r->conf, r->calendar_life);
	sorted = (struct wjoin_dev **)devtab_sorted(r->join.devs);
	n = devtab_count(r->join.devs);
	for (k = 0; k < n; k++)
		set_prior(r, sorted[k]);
	if (r->late_service > MAXWARN)
		cw_warn("%lu packs in all entered service after their first "
		    "row", r->late_service);
	if (sf != NULL) {
		for (k = 0; k < n; k++)
			wear_compact(&sorted[k]->w, &r->conf);
		write_states(sf, r->state, r, sorted, n);
	}
	if (r->state_out)
		write_states(o, r->out, r, sorted, n);
	else
		rc = write_report(r, sorted, n, o);
	if (rc == 0 && cw_verbose)
		report(r, sorted, n);
	for (k = 0; k < n; k++)
		wear_free(&sorted[k]->w);
	free(sorted);
	return rc;
}

int
main(int argc, char *argv[])
{
	static struct run r;
	struct outf *of, *sf = NULL;
	int k, rc;

	k = parse(&r, argc, argv);
	argc -= k;
	argv += k;
	if (r.dwell)
		return dwell_run(&r, argv, argc);
	/*
	 * A state to be joined before another keeps a raw rainflow start
	 * side; one that is only ever continued (--state) stays compact.
	 */
	r.conf.joinable = r.state_out && r.state == NULL;
	r.fleet = fleet_load(r.fleet_path);
	if (r.measured != NULL)
		r.meas = meas_load(r.measured);
	wjoin_init(&r.join, &r.conf);
	r.rd.conf = &r.conf;
	r.rd.fixed = r.fixed;
	r.rd.dev = wjoin_state;
	r.rd.ctx = &r.join;
	if ((rc = load_state(&r)) != 0)
		return rc;
	if (r.state != NULL)
		sf = outf_open_state(r.state);
	of = r.state_out ? outf_open_state(r.out) : outf_open(r.out);
	rc = r.merge ? merge(&r, argv, argc) : samples(&r, argv, argc);
	if (rc == 0)
		rc = finish(&r, sf, of);
	wjoin_free(&r.join);
	fleet_free(r.fleet);
	meas_free(r.meas);
	/* The state moves on last, once the report is out. */
	if (rc == 0 && (outf_commit(of) != 0 || (sf != NULL &&
	    outf_commit(sf) != 0)))
		rc = CW_EXIT_DATA;
	return rc;
}
