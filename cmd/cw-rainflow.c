/*
 * cw-rainflow: rainflow cycle counting per device (ASTM E1049-85) over
 * the sample stream.  The counting is lib/rainflow.c; this is the glue.
 */
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "csvout.h"
#include "cw.h"
#include "devtab.h"
#include "finish.h"
#include "glue.h"
#include "opt.h"
#include "optab.h"
#include "outf.h"
#include "rainflow.h"
#include "sampin.h"

enum { OUT_CYCLES, OUT_HISTOGRAM, OUT_MATRIX, OUT_SUMMARY };

/* One device's state; the devtab header comes first. */
struct dev {
	struct devent e;
	int ready;		/* rf and hist initialised */
	struct rf_state rf;
	struct rf_hist hist;
	struct rf_sum sum;
	cw_time first, last;	/* of the samples with a numeric signal */
	unsigned long nsig;	/* how many */
};

struct run {
	const char *outpath;	/* -o FILE, or NULL */
	int out;		/* OUT_* */
	int residue;		/* RF_RESIDUE_* */
	int col;		/* the signal's sampin column */
	size_t at;		/* where its value is in a struct cw_sample */
	const char *signal;	/* its name */
	int efc;		/* the signal is SoC: write efc */
	double hyst, rw, mw;
	struct csvout w;
	struct devtab *devs;
	struct dev *cur;	/* the device emit() counts for */
	unsigned long nosig;	/* rows without a numeric signal */
};

enum {
	OPT_HISTOGRAM = OPTAB_LONG, OPT_HYSTERESIS, OPT_MATRIX, OPT_RESIDUE,
	OPT_SIGNAL
};

/* Where an option of the table is stored: a member of struct run. */
#define R(m)	offsetof(struct run, m)

static const struct optab opts[] = {
	{ "histogram", 0, "WIDTH", "one row per range bin of width WIDTH",
	    NULL, OPT_HISTOGRAM },
	{ "hysteresis", 0, "X", "ignore reversals smaller than X", "1",
	    OPT_HYSTERESIS },
	{ "matrix", 0, "WIDTH[,MEAN_WIDTH]", "the range-mean matrix, range "
	    "bins WIDTH wide and mean bins MEAN_WIDTH wide", "WIDTH",
	    OPT_MATRIX },
	OPTAB_OUTPUT(R(outpath)),
	{ "residue", 0, "half|full|repeat", "count the residue as half "
	    "cycles, full cycles, or as if the history repeated", "half",
	    OPT_RESIDUE },
	{ "summary", 's', NULL, "one row per device instead of one per cycle",
	    NULL, 0 },
	{ "signal", 0, "COLUMN", "count the cycles of COLUMN", "soc_pct",
	    OPT_SIGNAL },
	OPTAB_END
};

static const struct optool tool = OPTOOL_FILES("cw-rainflow",
    "Rainflow cycle counting of battery logs, per device (ASTM E1049-85).\n",
    "--histogram, --matrix and --summary exclude each other.\n",
    opts);

static int parse(struct run *, int, char *[]);
static double width_arg(const char *, const char *);
static double nonneg_arg(const char *, const char *);
static void matrix_arg(struct run *, const char *);
static void signal_arg(struct run *, const char *);
static int on_row(void *, void *, const struct cw_sample *);
static void emit(void *, const struct rf_cycle *);
static void write_device(struct run *, struct dev *);
static void write_summary(struct run *, struct dev *);

static double
width_arg(const char *opt, const char *s)
{
	double w = opt_num_arg(opt, s, -1e300, 1e300);

	if (!(w > 0))
		cw_usage_error("%s: the width must be above 0", opt);
	return w;
}

static double
nonneg_arg(const char *opt, const char *s)
{
	double x = opt_num_arg(opt, s, -1e300, 1e300);

	if (x < 0)
		cw_usage_error("%s: %s is below 0", opt, s);
	return x;
}

/* --matrix W or W,MW: range bin width, mean bin width (default W). */
static void
matrix_arg(struct run *r, const char *s)
{
	const char *comma = strchr(s, ',');
	char buf[64];

	if (comma == NULL) {
		r->rw = r->mw = width_arg("--matrix", s);
		return;
	}
	if ((size_t)(comma - s) >= sizeof(buf))
		cw_usage_error("--matrix: '%s' is not a width", s);
	memcpy(buf, s, (size_t)(comma - s));
	buf[comma - s] = '\0';
	r->rw = width_arg("--matrix", buf);
	r->mw = width_arg("--matrix", comma + 1);
}

/* --signal COLUMN: a numeric column of the stream, or the extra one. */
static void
signal_arg(struct run *r, const char *s)
{
	static const size_t at[SAMP_EXTRA + 1] = {
		[SAMP_VOLTAGE] = offsetof(struct cw_sample, v),
		[SAMP_CURRENT] = offsetof(struct cw_sample, i),
		[SAMP_TEMP] = offsetof(struct cw_sample, temp),
		[SAMP_SOC] = offsetof(struct cw_sample, soc),
		[SAMP_EXTRA] = offsetof(struct cw_sample, x)
	};
	int k;

	if (s[0] == '\0')
		cw_usage_error("--signal: empty column name");
	r->signal = s;
	for (k = 0; k < SAMP_EXTRA; k++)
		if (strcmp(s, sampin_colname[k]) == 0)
			break;
	if (k == SAMP_DEVICE || k == SAMP_TIME)
		cw_usage_error("--signal: '%s' is not a numeric column", s);
	r->col = k;		/* SAMP_EXTRA when not a stream column */
	r->at = at[k];
}

static void
emit(void *ctx, const struct rf_cycle *c)
{
	struct run *r = ctx;
	struct dev *d = r->cur;

	rf_sum_add(&d->sum, c);
	switch (r->out) {
	case OUT_CYCLES:
		csvout_strn(&r->w, d->e.name, d->e.namelen);
		csvout_num(&r->w, c->range);
		csvout_num(&r->w, c->mean);
		csvout_num(&r->w, c->count);
		csvout_time(&r->w, c->start);
		csvout_time(&r->w, c->end);
		csvout_num(&r->w, c->aux_mean);
		csvout_endrow(&r->w);
		break;
	case OUT_HISTOGRAM:
	case OUT_MATRIX:
		rf_hist_add(&d->hist, c);
		break;
	}
}

static int
on_row(void *ctx, void *dp, const struct cw_sample *s)
{
	struct run *r = ctx;
	struct dev *d = dp;
	double x;

	if (!d->ready) {
		rf_init(&d->rf, r->hyst);
		rf_hist_init(&d->hist, r->rw, r->out == OUT_MATRIX ? r->mw :
		    0);
		d->ready = 1;
	}
	x = *(const double *)(const void *)((const char *)s + r->at);
	if (!cw_isnum(x)) {
		r->nosig++;
		return 0;
	}
	if (d->nsig++ == 0)
		d->first = s->t;
	d->last = s->t;
	r->cur = d;
	rf_push(&d->rf, s->t, x, s->temp, emit, r);
	/* A write error stops the run; cw_finish() tells it. */
	return r->w.err ? CW_EXIT_DATA : 0;
}

/* The rows of one device at the end of the stream. */
static void
write_device(struct run *r, struct dev *d)
{
	struct rf_cell *c;
	size_t i, n;

	r->cur = d;
	rf_finish(&d->rf, r->residue, emit, r);
	if (r->out == OUT_SUMMARY) {
		write_summary(r, d);
		return;
	}
	if (r->out == OUT_CYCLES)
		return;
	c = rf_hist_sorted(&d->hist, &n);
	for (i = 0; i < n; i++) {
		csvout_strn(&r->w, d->e.name, d->e.namelen);
		csvout_num(&r->w, (double)c[i].ri * r->rw);
		csvout_num(&r->w, (double)(c[i].ri + 1) * r->rw);
		if (r->out == OUT_MATRIX) {
			csvout_num(&r->w, (double)c[i].mi * r->mw);
			csvout_num(&r->w, (double)(c[i].mi + 1) * r->mw);
		}
		csvout_num(&r->w, c[i].cycles);
		csvout_endrow(&r->w);
	}
	free(c);
}

static void
write_summary(struct run *r, struct dev *d)
{
	csvout_strn(&r->w, d->e.name, d->e.namelen);
	csvout_num(&r->w, d->sum.cycles);
	glue_num(&r->w, r->efc, d->sum.range_sum / 100);
	glue_num(&r->w, d->sum.cycles > 0, d->sum.max_range);
	csvout_num(&r->w, rf_sum_mean_range(&d->sum));
	glue_first_last(&r->w, d->nsig > 0, d->first, d->last);
	csvout_endrow(&r->w);
}

/*
 * The options into R, the output's path into *OUTPATH; the index of the
 * first operand.
 */
static int
parse(struct run *r, int argc, char *argv[])
{
	int ch, nout = 0;

	memset(r, 0, sizeof(*r));
	r->out = OUT_CYCLES;
	r->residue = RF_RESIDUE_HALF;
	r->hyst = 1;
	r->rw = 1;
	signal_arg(r, "soc_pct");
	while ((ch = optab_getopt(&tool, r, argc, argv)) != -1) {
		switch (ch) {
		case OPT_HISTOGRAM:
			r->out = OUT_HISTOGRAM;
			r->rw = width_arg("--histogram", optarg);
			nout++;
			break;
		case OPT_HYSTERESIS:
			r->hyst = nonneg_arg("--hysteresis", optarg);
			break;
		case OPT_MATRIX:
			r->out = OUT_MATRIX;
			matrix_arg(r, optarg);
			nout++;
			break;
		case OPT_RESIDUE:
			if ((r->residue = rf_residue_parse(optarg)) < 0)
				cw_usage_error("--residue: '%s' is not half, "
				    "full or repeat", optarg);
			break;
		case OPT_SIGNAL:
			signal_arg(r, optarg);
			break;
		case 's':
			r->out = OUT_SUMMARY;
			nout++;
			break;
		}
	}
	if (nout > 1)
		cw_usage_error("--histogram, --matrix and --summary exclude "
		    "each other");
	r->efc = strcmp(r->signal, "soc_pct") == 0;
	return optind;
}

int
main(int argc, char *argv[])
{
	static const char *const header[] = {
		"device,range,mean,count,start,end,temp_c",
		"device,range_lo,range_hi,cycles",
		"device,range_lo,range_hi,mean_lo,mean_hi,cycles",
		"device,cycles,efc,max_range,mean_range,first,last"
	};
	struct run r;
	struct glue g;
	void **sorted;
	size_t i, n;
	int rc, k;

	k = parse(&r, argc, argv);
	glue_open(&g, sizeof(struct dev), r.outpath, &r.w, header[r.out]);
	r.devs = g.devs;
	glue_sampin(&g, SAMP_BIT(r.col), 0, on_row, &r);
	g.sc.extra = r.col == SAMP_EXTRA ? r.signal : NULL;
	rc = glue_read(&g, argv + k, argc - k);
	if (rc != 0)
		/*
		 * Rows written to standard output stay (they are whole); an
		 * output file is not put in place.
		 */
		return glue_close(&g, rc);
	sorted = glue_sorted(&g, &n);
	for (i = 0; i < n; i++)
		write_device(&r, sorted[i]);
	if ((rc = cw_finish(&r.w, g.of, r.outpath, CW_EXIT_OK)) != 0)
		return rc;

	if (cw_verbose) {
		struct rf_sum all = { 0 };

		for (i = 0; i < n; i++) {
			struct dev *d = sorted[i];

			all.cycles += d->sum.cycles;
			all.full += d->sum.full;
			all.half += d->sum.half;
		}
		sampin_report(&g.st, g.sc.extra);
		cw_warn("%zu device%s, %g cycles (%lu full, %lu half)", n,
		    n == 1 ? "" : "s", all.cycles, all.full, all.half);
		cw_warn("%lu rows without a numeric %s value skipped",
		    r.nosig, r.signal);
	} else if (g.st.used > 0 && r.nosig == g.st.used)
		cw_warn("no row has a numeric %s value (%lu rows)", r.signal,
		    g.st.used);
	for (i = 0; i < n; i++) {
		struct dev *d = sorted[i];

		if (d->ready) {
			rf_free(&d->rf);
			rf_hist_free(&d->hist);
		}
	}
	free(sorted);
	devtab_free(r.devs);
	csvout_free(&r.w);
	return CW_EXIT_OK;
}
