/*
 * cw-wear: wear stress and modelled capacity fade per device, one row
 * each, from the sample stream.  The engine is lib/wear.c; the models are
 * in lib/model.c.
 */
#include <errno.h>
#include <getopt.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

#include "csvout.h"
#include "cw.h"
#include "devtab.h"
#include "dwell.h"
#include "fleet.h"
#include "measured.h"
#include "lock.h"
#include "model.h"
#include "opt.h"
#include "outf.h"
#include "sampin.h"
#include "ts.h"
#include "wear.h"
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
#define MAXWARN 10	/* messages of one kind, then only a count */

/* A device's state in the devtab: the devent first, as devtab.h asks. */
struct dev {
	struct devent e;
	int started;
	int loaded;		/* from a --state file, up to UPTO */
	int past;		/* a row after UPTO came */
	int seen_end;		/* a row at UPTO came: the state's last */
	cw_time upto;
	cw_time stale_first, stale_last;	/* rows up to UPTO */
	unsigned long nstale;
	struct wear_dev w;
};

/* A device's state with --dwell. */
struct ddev {
	struct devent e;
	struct dwell_dev d;
};

/* A state read back, with where it came from. */
struct piece {
	struct wear_dev w;
	unsigned long line;
	char src[256];
};

struct run {
	struct wear_conf conf;
	double capacity;	/* Ah, 0 when not given */
	struct fleet *fleet;	/* --fleet, or NULL */
	const char *fleet_path;
	struct meas *meas;	/* --measured, or NULL */
	unsigned long meas_why[MEAS_NWHY];	/* packs by why (not) */
	unsigned long late_service;	/* in_service after the first row */
	struct devtab *devs;
	unsigned long joins;	/* states joined after or before another */
	unsigned long stale;	/* rows already in a loaded state */
	unsigned long stale_devs;
	unsigned long straddles;	/* states overlapping by a little */
	/* States read for RUN_DEV, not joined yet. */
	struct dev *run_dev;
	struct piece *piece;
	size_t npiece, piececap;
};

enum {
	OPT_CALENDAR_LIFE = 256, OPT_CAPACITY, OPT_CYCLE_LIFE, OPT_DWELL,
	OPT_FIT_SCALES, OPT_FLEET, OPT_FULL,
	OPT_FULL_VOLTAGE, OPT_HYSTERESIS, OPT_LIMITS, OPT_LOCK_WAIT,
	OPT_MAX_GAP, OPT_MERGE, OPT_MEASURED, OPT_MIN_CURRENT, OPT_MIN_DEPTH,
	OPT_MODEL, OPT_PARTITION, OPT_RESIDUE, OPT_STATE,
	OPT_STATE_OUT, OPT_VERSION
};

static const struct option longopts[] = {
	{ "calendar-life", required_argument, NULL, OPT_CALENDAR_LIFE },
	{ "capacity", required_argument, NULL, OPT_CAPACITY },
	{ "cycle-life", required_argument, NULL, OPT_CYCLE_LIFE },
	{ "dwell", no_argument, NULL, OPT_DWELL },
	{ "fit-scales", no_argument, NULL, OPT_FIT_SCALES },
	{ "fleet", required_argument, NULL, OPT_FLEET },
	{ "full", required_argument, NULL, OPT_FULL },
	{ "full-voltage", required_argument, NULL, OPT_FULL_VOLTAGE },
	{ "help", no_argument, NULL, 'h' },
	{ "hysteresis", required_argument, NULL, OPT_HYSTERESIS },
	{ "limits", required_argument, NULL, OPT_LIMITS },
	{ "lock-wait", required_argument, NULL, OPT_LOCK_WAIT },
	{ "max-gap", required_argument, NULL, OPT_MAX_GAP },
	{ "measured", required_argument, NULL, OPT_MEASURED },
	{ "merge", no_argument, NULL, OPT_MERGE },
	{ "min-current", required_argument, NULL, OPT_MIN_CURRENT },
	{ "partition", no_argument, NULL, OPT_PARTITION },
	{ "min-depth", required_argument, NULL, OPT_MIN_DEPTH },
	{ "model", required_argument, NULL, OPT_MODEL },
	{ "output", required_argument, NULL, 'o' },
	{ "residue", required_argument, NULL, OPT_RESIDUE },
	{ "state", required_argument, NULL, OPT_STATE },
	{ "state-out", no_argument, NULL, OPT_STATE_OUT },
	{ "verbose", no_argument, NULL, 'v' },
	{ "version", no_argument, NULL, OPT_VERSION },
	{ NULL, 0, NULL, 0 }
};

static void usage(FILE *);
static int on_row(void *, void *, const struct cw_sample *);
static int on_state(void *, const char *, unsigned long, const char *,
    size_t, struct wear_dev *);
static int piece_cmp(const void *, const void *);
static void straddle(struct run *, const struct piece *,
    const struct dev *, const char *);
static int flush(struct run *);
static int exists(const char *);
static void stale_check(struct run *, const char *);
static void write_row(struct csvout *, const struct run *,
    const struct dev *, const struct wear_result *);
static void write_states(struct outf *, const char *, struct run *,
    struct dev **, size_t);
static void report(const struct run *, struct dev **, size_t);
static void set_prior(struct run *, struct dev *);
static int on_dwell(void *, void *, const struct cw_sample *);
static void dwell_run(struct run *, char **, int, const char *);
static void fit_row(struct csvout *, const char *, double, double, double);
static void fit_run(struct run *, struct dev **, size_t, struct csvout *);

static void
usage(FILE *fp)
{
	fprintf(fp,
	    "usage: cw-wear [-hv] [--calendar-life DAYS] [--capacity AH] "
	    "[--cycle-life N]\n"
	    "               [--dwell] [--fit-scales] [--fleet FILE] "
	    "[--full PCT]\n"
	    "               [--full-voltage V] [--hysteresis PCT] "
	    "[--limits T1,T2,T3,T4]\n"
	    "               [--lock-wait DUR] [--max-gap DUR] "
	    "[--measured FILE] [--merge]\n"
	    "               [--min-current A] [--min-depth PCT] "
	    "[--model NAME]\n"
	    "               [-o FILE] [--partition] [--residue half|full|repeat]\n"
	    "               [--state FILE] [--state-out] [--version] "
	    "[file ...]\n"
	    "\n"
	    "Wear stress, modelled fade and its causes per pack, from the "
	    "sample stream.\n"
	    "\n"
	    "      --calendar-life DAYS  DAYS at rest at 25 C, 50 %% SoC give "
	    "20 %% fade\n"
	    "                            (default: the published constant)\n"
	    "      --capacity AH         rated capacity, for C-rates and Ah "
	    "lost\n"
	    "      --cycle-life N        N full cycles at 25 C, 50 %% SoC give "
	    "20 %% fade\n"
	    "                            (default: the published constants)\n"
	    "      --dwell               hours by SoC and temperature band "
	    "instead\n"
	    "      --fit-scales          fit the cycle and calendar scales to "
	    "--measured\n"
	    "                            (least squares over packs) and "
	    "print them\n"
	    "      --fleet FILE          the fleet file: soh_pct, in_service, "
	    "efc_prior,\n"
	    "                            capacity_ah per pack\n"
	    "      --full PCT            near full at PCT %% SoC or more "
	    "(default 95)\n"
	    "      --full-voltage V      judge rows without SoC by voltage\n"
	    "  -h, --help                print this help and exit 0\n"
	    "      --hysteresis PCT      rainflow ignores smaller reversals "
	    "(default 1)\n"
	    "      --limits T1,T2,T3,T4  the zone thresholds "
	    "(default 0,10,45,60)\n"
	    "      --lock-wait DUR       wait so long for another run on the "
	    "--state FILE\n"
	    "                            (default 1h; 0: refuse at once)\n"
	    "      --max-gap DUR         a longer interval carries no charge "
	    "(default 15m)\n"
	    "      --measured FILE       add measured_fade_pct and "
	    "model_error_pct from a\n"
	    "                            cw-capacity --trend output\n"
	    "      --merge               the operands are states: join and "
	    "report\n"
	    "      --min-current A       charging above A, idle below "
	    "(default 0.05)\n"
	    "      --min-depth PCT       the smallest top-off micro-cycle "
	    "(default 0.5)\n"
	    "      --model NAME          the degradation model "
	    "(default xu2018)\n"
	    "      --partition           with --merge, standard input holds the "
	    "states\n"
	    "                            of some devices only (a reducer's "
	    "share): end\n"
	    "                            rows checked for form, not for the "
	    "rows they count\n"
	    "                            (default: whole states, row counts "
	    "checked)\n"
	    "  -o, --output FILE         write to FILE atomically, not "
	    "standard output\n"
	    "      --residue half|full|repeat\n"
	    "                            the open cycles at the end "
	    "(default half)\n"
	    "      --state FILE          go on from the states in FILE and "
	    "write them back\n"
	    "      --state-out           write the states instead of the "
	    "report\n"
	    "  -v, --verbose             report counts on standard error\n"
	    "      --version             print the version and exit 0\n"
	    "\n"
	    "Temperatures take a unit suffix: 10, 10C, 50F, 283.15K; "
	    "durations 90, 90s,\n"
	    "15m, 2h, 1d.  The tools advise; they are not a safety system.\n");
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
	if (d->loaded) {
		/*
		 * Rows up to the end of the state are in it already when
		 * they come with its last row (the same day again); see
		 * stale_check() for the others.
		 */
		if (s->t <= d->upto) {
			if (d->nstale++ == 0)
				d->stale_first = s->t;
			d->stale_last = s->t;
			d->seen_end |= s->t == d->upto;
			return 0;
		}
		d->loaded = 0;
		d->past = 1;
	}
	wear_push(&d->w, &r->conf, s->t, s->v, s->i, s->temp, s->soc);
	return 0;
}

/*
 * A device state read back.  The states of one device that come one after
 * the other (a stream sorted or grouped by device, such as a reducer's
 * input, in which a device's states may come in any time order) are
 * gathered, then joined in time order when another device comes; each
 * must be after or before what its device holds, never overlap it.
 */
static int
on_state(void *ctx, const char *src, unsigned long line, const char *name,
    size_t len, struct wear_dev *w)
{
	struct run *r = ctx;
	struct dev *d;
	struct piece *p;
	int rc;

	d = devtab_get(r->devs, name, len, NULL);
	if (d != r->run_dev && (rc = flush(r)) != 0) {
		wear_free(w);
		return rc;
	}
	r->run_dev = d;
	if (r->npiece == r->piececap) {
		r->piececap = r->piececap ? 2 * r->piececap : 16;
		r->piece = cw_realloc(r->piece, r->piececap *
		    sizeof(*r->piece));
	}
	p = &r->piece[r->npiece++];
	p->w = *w;
	p->line = line;
	snprintf(p->src, sizeof(p->src), "%s", src);
	return 0;
}

static int
piece_cmp(const void *pa, const void *pb)
{
	const struct piece *a = pa, *b = pb;

	if (a->w.acc.first != b->w.acc.first)
		return a->w.acc.first < b->w.acc.first ? -1 : 1;
	if (a->w.acc.last != b->w.acc.last)
		return a->w.acc.last < b->w.acc.last ? -1 : 1;
	return a->line < b->line ? -1 : a->line > b->line;
}

/*
 * State P of device D overlaps the one D holds by a little, at its end or
 * its beginning (WHERE): a clock that went back across the boundary of
 * two files.  It is joined all the same, after or before, and counted.
 */
static void
straddle(struct run *r, const struct piece *p, const struct dev *d,
    const char *where)
{
	char t[3][TS_FMTMAX];

	if (r->straddles++ >= MAXWARN)
		return;
	ts_format(p->w.acc.first, t[0]);
	ts_format(p->w.acc.last, t[1]);
	ts_format(where[0] == 'e' ? d->w.acc.last : d->w.acc.first, t[2]);
	cw_warn_at(p->src, p->line, "the state of %s from %s to %s overlaps "
	    "the one joined so far, which %s at %s: joined all the same, its "
	    "rows on the other side of %s counted (one pass over the rows "
	    "would skip them as going back in time)%s", d->e.name, t[0],
	    t[1], where, t[2], t[2], r->straddles == MAXWARN ?
	    " (further ones only counted)" : "");
}

/* Join the gathered states of R->run_dev into it, in time order. */
static int
flush(struct run *r)
{
	struct dev *d = r->run_dev;
	struct wear_dev *w;
	char t[4][TS_FMTMAX];
	size_t k;

	if (r->npiece == 0)
		return 0;
	qsort(r->piece, r->npiece, sizeof(*r->piece), piece_cmp);
	for (k = 0; k < r->npiece; k++) {
		w = &r->piece[k].w;
		if (!d->started) {
			d->w = *w;
			d->started = 1;
		} else if (w->acc.first >= d->w.acc.last) {
			wear_join(&d->w, w, &r->conf);
			r->joins++;
		} else if (w->acc.last <= d->w.acc.first) {
			wear_join(w, &d->w, &r->conf);
			d->w = *w;
			r->joins++;
		} else if (w->acc.first > d->w.acc.first &&
		    w->acc.last > d->w.acc.last) {
			/* It begins before the end: a clock gone back. */
			straddle(r, &r->piece[k], d, "ends");
			wear_join(&d->w, w, &r->conf);
			r->joins++;
		} else if (w->acc.first < d->w.acc.first &&
		    w->acc.last < d->w.acc.last) {
			straddle(r, &r->piece[k], d, "begins");
			wear_join(w, &d->w, &r->conf);
			d->w = *w;
			r->joins++;
		} else {
			ts_format(w->acc.first, t[0]);
			ts_format(w->acc.last, t[1]);
			ts_format(d->w.acc.first, t[2]);
			ts_format(d->w.acc.last, t[3]);
			cw_warn_at(r->piece[k].src, r->piece[k].line, "the "
			    "state of %s from %s to %s overlaps the one joined "
			    "so far, from %s to %s: the same rows twice, or a "
			    "state that falls between two joined before it",
			    d->e.name, t[0], t[1], t[2], t[3]);
			for (; k < r->npiece; k++)
				wear_free(&r->piece[k].w);
			r->npiece = 0;
			return CW_EXIT_DATA;
		}
		d->e.last_t = d->w.acc.last;
	}
	r->npiece = 0;
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
    struct dev **devs, size_t n)
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
	if (bad != 0)
		cw_die(CW_EXIT_DATA, "%s: write error: %s", path != NULL ?
		    path : "standard output", strerror(errno));
}

/* With -v: what was left out of which term, over all devices. */
static void
report(const struct run *r, struct dev **devs, size_t n)
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
	if (r->joins > 0)
		cw_warn("%lu states joined to the one before or after them",
		    r->joins);
	if (t.topoff_cut > 0)
		cw_warn("%lu joins across a hold near full that ran over %d "
		    "rows without a row that settles the top-off detector: "
		    "micro-cycles there counted on each side apart",
		    t.topoff_cut, WEAR_PRE_MAX);
}

/*
 * Rows of a device at or before the end of its state STATE: the same rows
 * again when its last row is among them (skipped, counted); a clock gone
 * back across the boundary when they are within --max-gap of the end and
 * newer rows follow (skipped, counted apart); otherwise rows the state does
 * not hold (a day that came late): an error, nothing written.
 */
static void
stale_check(struct run *r, const char *state)
{
	char t[3][TS_FMTMAX];
	unsigned long late = 0, late_devs = 0, back = 0, back_devs = 0;
	size_t k;

	for (k = 0; k < devtab_count(r->devs); k++) {
		struct dev *d = devtab_at(r->devs, k);

		if (d->nstale == 0)
			continue;
		if (d->seen_end) {
			r->stale += d->nstale;
			r->stale_devs++;
			continue;
		}
		if (d->past && d->stale_first >= d->upto - r->conf.max_gap) {
			back += d->nstale;
			back_devs++;
			continue;
		}
		late += d->nstale;
		if (late_devs++ >= MAXWARN)
			continue;
		ts_format(d->stale_first, t[0]);
		ts_format(d->stale_last, t[1]);
		ts_format(d->upto, t[2]);
		cw_warn("%s: %.*s: %lu rows from %s to %s come before the end "
		    "of its state (%s) but not with its last row: not in the "
		    "state", state, (int)d->e.namelen, d->e.name, d->nstale,
		    t[0], t[1], t[2]);
	}
	if (late > 0)
		cw_die(CW_EXIT_DATA, "%s: %lu rows of %lu devices are older "
		    "than the state and not in it (a day that came late?); "
		    "nothing written, the state is as it was.  To fold them "
		    "in, rebuild the state from every day in time order, with "
		    "each day's cw-wear --state-out and one cw-wear --merge "
		    "(README, \"A day that comes late\")", state, late,
		    late_devs);
	if (back > 0)
		cw_warn("%s: %lu rows of %lu devices within --max-gap before "
		    "the end of their state, followed by newer rows (a clock "
		    "gone back across the boundary?): not in the state, "
		    "skipped", state, back, back_devs);
	if (r->stale > 0)
		cw_warn("%s: %lu rows of %lu devices up to the end of their "
		    "state came again, its last row among them: already in "
		    "it, skipped", state, r->stale, r->stale_devs);
}

/*
 * The prior of device D from the fleet file, unless its state has one
 * (the state's first row is the one the prior was taken for): a measured
 * SoH first, else its time in service before the first row and its
 * equivalent full cycles.
 */
static void
set_prior(struct run *r, struct dev *d)
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
 * cells with time in them only, devices in name order, to OUT.
 */
static void
dwell_run(struct run *r, char **argv, int argc, const char *out)
{
	struct dwell_conf dc;
	struct sampin_conf sc;
	struct sampin_stats st;
	struct csvout w;
	struct outf *of;
	struct ddev **v;
	unsigned long skipped = 0, empty = 0;
	size_t n, k;
	int rc, s, t;

	dwell_conf_set(&dc, &r->conf.lim, r->conf.min_current,
	    r->conf.max_gap);
	r->devs = devtab_new(sizeof(struct ddev));
	of = outf_open(out);
	memset(&sc, 0, sizeof(sc));
	sc.need = SAMP_BIT(SAMP_DEVICE) | SAMP_BIT(SAMP_TIME) |
	    SAMP_BIT(SAMP_SOC) | SAMP_BIT(SAMP_TEMP);
	sc.row = on_dwell;
	sc.ctx = &dc;
	sc.devs = r->devs;
	rc = sampin_run(&sc, argv, argc, &st);
	if (cw_verbose)
		sampin_report(&st, NULL);
	if (rc != 0)
		exit(rc);
	v = (struct ddev **)devtab_sorted(r->devs);
	n = devtab_count(r->devs);
	csvout_init(&w, outf_fp(of));
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
	if (csvout_flush(&w) != 0) {
		int e = errno;

		csvout_free(&w);
		cw_die(CW_EXIT_DATA, "%s: write error: %s", out != NULL ?
		    out : "standard output", strerror(e));
	}
	csvout_free(&w);
	if (cw_verbose)
		cw_warn("%zu devices, %lu of them without two rows with SoC "
		    "and temperature (no rows); %lu rows without SoC or "
		    "temperature passed over", n, empty, skipped);
	free(v);
	devtab_free(r->devs);
	if (outf_commit(of) != 0)
		exit(CW_EXIT_DATA);
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
fit_run(struct run *r, struct dev **devs, size_t n, struct csvout *w)
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

int
main(int argc, char *argv[])
{
	static struct run r;
	struct sampin_conf sc;
	struct sampin_stats st;
	struct wstate_read rd;
	struct wear_result x;
	struct csvout w;
	struct outf *of, *sf = NULL;
	struct dev **sorted;
	const char *out = NULL, *state = NULL, *fleet = NULL;
	double cycle_life = 0, calendar_life = 0;
	size_t n, k;
	unsigned fixed = 0;
	const char *measured = NULL;
	int ch, rc, merge = 0, state_out = 0, dwell = 0, fitting = 0;
	int partition = 0;
	cw_time lock_wait = LOCK_WAIT_DEFAULT;

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
		case OPT_DWELL:
			dwell = 1;
			break;
		case OPT_FIT_SCALES:
			fitting = 1;
			break;
		case OPT_FLEET:
			fleet = optarg;
			break;
		case OPT_FULL:
			r.conf.topoff.full_pct = opt_num_arg("--full", optarg,
			    0, 100);
			fixed |= WSTATE_SET_FULL;
			break;
		case OPT_FULL_VOLTAGE:
			r.conf.topoff.full_v = opt_num_arg("--full-voltage",
			    optarg, 1e-3, 1e6);
			fixed |= WSTATE_SET_FULL_VOLTAGE;
			break;
		case OPT_HYSTERESIS:
			r.conf.hysteresis = opt_num_arg("--hysteresis", optarg,
			    0, 100);
			fixed |= WSTATE_SET_HYSTERESIS;
			break;
		case OPT_LIMITS:
			opt_list_arg("--limits", optarg, r.conf.lim.t, 4, 1, 1);
			fixed |= WSTATE_SET_LIMITS;
			break;
		case OPT_LOCK_WAIT:
			lock_wait = opt_dur_arg("--lock-wait", optarg, 1);
			break;
		case OPT_MAX_GAP:
			r.conf.max_gap = opt_dur_arg("--max-gap", optarg, 0);
			r.conf.topoff.max_gap = r.conf.max_gap;
			fixed |= WSTATE_SET_MAX_GAP;
			break;
		case OPT_MEASURED:
			measured = optarg;
			break;
		case OPT_MERGE:
			merge = 1;
			break;
		case OPT_PARTITION:
			partition = 1;
			break;
		case OPT_MIN_CURRENT:
			r.conf.min_current = opt_num_arg("--min-current",
			    optarg, 0, 1e6);
			r.conf.topoff.min_current = r.conf.min_current;
			fixed |= WSTATE_SET_MIN_CURRENT;
			break;
		case OPT_MIN_DEPTH:
			r.conf.topoff.min_depth = opt_num_arg("--min-depth",
			    optarg, 1e-6, 100);
			fixed |= WSTATE_SET_MIN_DEPTH;
			break;
		case OPT_MODEL:
			r.conf.model = model_find(optarg);
			if (r.conf.model == NULL)
				cw_usage_error("--model: no model '%s' (there "
				    "is: %s)", optarg, model_table[0]->name);
			fixed |= WSTATE_SET_MODEL;
			break;
		case OPT_RESIDUE:
			if ((r.conf.residue = rf_residue_parse(optarg)) < 0)
				cw_usage_error("--residue: '%s' is not half, "
				    "full or repeat", optarg);
			break;
		case OPT_STATE:
			if (optarg[0] == '\0' || strcmp(optarg, "-") == 0)
				cw_usage_error("--state needs a file name");
			state = optarg;
			break;
		case OPT_STATE_OUT:
			state_out = 1;
			break;
		case OPT_VERSION:
			cw_print_version();
		default:
			opt_getopt_fail(ch, argv);
		}
	}
	argc -= optind;
	argv += optind;
	if (state != NULL && out != NULL && strcmp(out, "-") != 0 &&
	    outf_same(state, out))
		cw_usage_error("--state and -o name the same file");
	if (partition && !merge)
		cw_usage_error("--partition goes with --merge");
	if (dwell && (state != NULL || state_out || merge))
		cw_usage_error("--dwell does not go with --state, --state-out "
		    "or --merge (a dwell table is not kept in a state)");
	if (fitting && measured == NULL)
		cw_usage_error("--fit-scales needs --measured FILE");
	if ((fitting || measured != NULL) && (dwell || state_out))
		cw_usage_error("--measured and --fit-scales go with the report, "
		    "not with --dwell or --state-out");
	if (dwell) {
		dwell_run(&r, argv, argc, out);
		return CW_EXIT_OK;
	}

	/*
	 * A state to be joined before another keeps a raw rainflow start
	 * side; one that is only ever continued (--state) stays compact.
	 */
	r.conf.joinable = state_out && state == NULL;
	if (fleet != NULL) {
		r.fleet = fleet_load(fleet);
		r.fleet_path = fleet;
	}
	if (measured != NULL)
		r.meas = meas_load(measured);
	r.devs = devtab_new(sizeof(struct dev));
	memset(&rd, 0, sizeof(rd));
	rd.conf = &r.conf;
	rd.fixed = fixed;
	rd.dev = on_state;
	rd.ctx = &r;
	/*
	 * A state must be a regular file; one run at a time on it, from its
	 * read to its rename.
	 */
	if (state != NULL) {
		outf_check_state(state);
		lock_state(state, lock_wait);
	}
	if (state != NULL && !exists(state))
		cw_warn("%s: no such state: a new history starts (as on the "
		    "first night)", state);
	else if (state != NULL) {
		if ((rc = wstate_read(&rd, state, 1)) != 0 ||
		    (rc = flush(&r)) != 0)
			exit(rc);
		/* Samples go on from each state, in order from there. */
		for (k = 0; !merge && k < devtab_count(r.devs); k++) {
			struct dev *d = devtab_at(r.devs, k);

			d->loaded = 1;
			d->upto = d->w.acc.last;
			d->e.last_t = INT64_MIN;
		}
	}
	if (state != NULL)
		sf = outf_open_state(state);
	of = state_out ? outf_open_state(out) : outf_open(out);
	if (merge) {
		/* File operands are whole states; a stream may be sorted. */
		for (k = 0; k < (size_t)argc; k++) {
			rc = wstate_read(&rd, argv[k],
			    strcmp(argv[k], "-") != 0 || !partition);
			if (rc != 0)
				exit(rc);
		}
		if (argc == 0 && (rc = wstate_read(&rd, "-", !partition)) !=
		    0)
			exit(rc);
		if ((rc = flush(&r)) != 0)
			exit(rc);
		if (r.straddles > 0)
			cw_warn("%lu states overlapped the one before or "
			    "after them by a little, and were joined all the "
			    "same", r.straddles);
		if (cw_verbose)
			cw_warn("%lu state rows read (%lu header, %lu end "
			    "rows), %zu devices", rd.rows, rd.headers,
			    rd.ends, devtab_count(r.devs));
	} else {
		memset(&sc, 0, sizeof(sc));
		sc.need = SAMP_BIT(SAMP_DEVICE) | SAMP_BIT(SAMP_TIME);
		sc.need_any = SAMP_BIT(SAMP_SOC) | SAMP_BIT(SAMP_TEMP);
		sc.row = on_row;
		sc.ctx = &r;
		sc.devs = r.devs;
		rc = sampin_run(&sc, argv, argc, &st);
		if (cw_verbose)
			sampin_report(&st, NULL);
		if (rc != 0)
			exit(rc);
		if (state != NULL)
			stale_check(&r, state);
	}
	/* The scales depend on the model, which a state may have set. */
	if (cycle_life > 0)
		wear_set_cycle_life(&r.conf, cycle_life);
	if (calendar_life > 0)
		wear_set_calendar_life(&r.conf, calendar_life);

	sorted = (struct dev **)devtab_sorted(r.devs);
	n = devtab_count(r.devs);
	for (k = 0; k < n; k++)
		set_prior(&r, sorted[k]);
	if (r.late_service > MAXWARN)
		cw_warn("%lu packs in all entered service after their first "
		    "row", r.late_service);
	if (state != NULL) {
		for (k = 0; k < n; k++)
			wear_compact(&sorted[k]->w, &r.conf);
		write_states(sf, state, &r, sorted, n);
	}
	if (state_out)
		write_states(of, out, &r, sorted, n);
	else {
		csvout_init(&w, outf_fp(of));
		/* --fit-scales: the fit's table, not the rows. */
		if (!fitting)
			csvout_header(&w, r.capacity > 0 || r.fleet != NULL ?
			    (r.meas != NULL ? HEADER HEADER_CAP HEADER_MEAS :
			    HEADER HEADER_CAP) : r.meas != NULL ?
			    HEADER HEADER_MEAS : HEADER);
		for (k = 0; k < n; k++) {
			wear_finish(&sorted[k]->w, &r.conf);
			wear_report(&r.conf, &sorted[k]->w.acc,
			    &sorted[k]->w.prior, fleet_capacity(r.fleet,
			    sorted[k]->e.name, sorted[k]->e.namelen,
			    r.capacity), &x);
			if (!fitting)
				write_row(&w, &r, sorted[k], &x);
			if (r.meas != NULL) {
				double m;

				r.meas_why[meas_fade(meas_find(r.meas,
				    sorted[k]->e.name, sorted[k]->e.namelen),
				    sorted[k]->w.acc.first,
				    sorted[k]->w.acc.last, 1, &m)]++;
			}
		}
		if (fitting)
			fit_run(&r, sorted, n, &w);
		if (csvout_flush(&w) != 0) {
			int e = errno;

			csvout_free(&w);
			cw_die(CW_EXIT_DATA, "%s: write error: %s", out != NULL ?
			    out : "standard output", strerror(e));
		}
		csvout_free(&w);
	}
	if (cw_verbose)
		report(&r, sorted, n);
	for (k = 0; k < n; k++)
		wear_free(&sorted[k]->w);
	free(sorted);
	free(r.piece);
	devtab_free(r.devs);
	fleet_free(r.fleet);
	meas_free(r.meas);
	/* The state moves on last, once the report is out. */
	if (outf_commit(of) != 0 || (sf != NULL && outf_commit(sf) != 0))
		exit(CW_EXIT_DATA);
	return CW_EXIT_OK;
}
