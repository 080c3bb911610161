/*
 * cw-topoff: holds near full charge and the top-off micro-cycles a
 * charger makes during them, per hold, per micro-cycle or per device.
 * The engine is lib/topoff.c; this file holds the options and the output.
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
#include "topoff.h"

#define HOLD_HEADER "device,start,end,duration_s,micro_cycles," \
	"mean_depth_pct,max_depth_pct,topoff_ah,use_dips"
#define EVENT_HEADER "device,start,end,depth_pct,charge_ah,kind"
#define SUMMARY_HEADER "device,first,last,holds,hours_held,share_held," \
	"micro_cycles,micro_cycles_per_day,share_at_100,topoff_ah," \
	"mean_depth_pct,max_depth_pct,longest_hold_h,unjudged_rows," \
	"micro_cycles_per_held_hour,use_dips,standby_a"

/* The per-device state: the devent first, as devtab wants. */
struct dev {
	struct devent e;
	cw_time first;		/* time of the first row */
	cw_time longest;	/* the longest hold, us */
	struct topoff top;
};

enum mode { MODE_HOLDS, MODE_EVENTS, MODE_SUMMARY };

struct tool {
	const char *outpath, *fleetpath;	/* -o FILE, --fleet FILE */
	struct topoff_conf conf;
	struct csvout out;
	int mode;		/* enum mode */
	int use_dips;		/* -e lists use dips too */
	double capacity;	/* --capacity, Ah; 0: not given */
	double standby_rate;	/* --standby-rate, C; 0: not given */
	int fall_set;		/* --standby-fall was given */
	struct fleet *fleet;
};

enum {
	OPT_CAPACITY = OPTAB_LONG, OPT_FLEET, OPT_FULL, OPT_FULL_VOLTAGE,
	OPT_MAX_GAP, OPT_MIN_CURRENT, OPT_MIN_DEPTH, OPT_STANDBY_CURRENT,
	OPT_STANDBY_FALL, OPT_STANDBY_RATE, OPT_USE_DIPS
};

/* Where an option of the table is stored: a member of struct tool. */
#define T(m)	offsetof(struct tool, m)

static const struct optab opts[] = {
	{ "capacity", 0, "AH", "capacity of every pack, for --standby-rate "
	    "(unset; the fleet file's capacity_ah overrides)", NULL,
	    OPT_CAPACITY,
	    OPTAB_POS, T(capacity), 0, 1e6 },
	{ "events", 'e', NULL, "one row per micro-cycle instead of one per "
	    "hold", NULL, 0 },
	{ "fleet", 0, "FILE", "the fleet file (asset register): capacity_ah",
	    NULL, OPT_FLEET,
	    OPTAB_STR, T(fleetpath), 0, 0 },
	{ "full", 0, "PCT", "a SoC at or above PCT is near full", "95",
	    OPT_FULL,
	    OPTAB_NUM, T(conf.full_pct), 0, 100 },
	{ "full-voltage", 0, "V", "judge rows without SoC by voltage: at or "
	    "above V volts is near full (unset: not judged)", NULL,
	    OPT_FULL_VOLTAGE,
	    OPTAB_NUM, T(conf.full_v), 0.001, 10000 },
	{ "max-gap", 0, "DUR", "a longer interval ends a hold", "15m",
	    OPT_MAX_GAP,
	    OPTAB_DUR, T(conf.max_gap), 0, 0 },
	{ "min-current", 0, "A", "charging means current above A", "0.05",
	    OPT_MIN_CURRENT,
	    OPTAB_NUM, T(conf.min_current), 0, 1e6 },
	{ "min-depth", 0, "PCT", "the smallest drop below the peak that "
	    "counts", "0.5", OPT_MIN_DEPTH,
	    OPTAB_NUM, T(conf.min_depth), 0.001, 100 },
	OPTAB_OUTPUT(T(outpath)),
	{ "summary", 's', NULL, "one row per device (-e and -s exclude each "
	    "other)", NULL, 0 },
	{ "standby-current", 0, "A", "discharge up to A amperes is standby "
	    "drain, more is use", "0.5", OPT_STANDBY_CURRENT,
	    OPTAB_NUM, T(conf.standby_a), 0, 1e6 },
	{ "standby-fall", 0, "PCT", "rows without current: a SoC falling "
	    "faster than PCT percent per hour is use",
	    "5, or 100 * standby current / capacity when known",
	    OPT_STANDBY_FALL },
	{ "standby-rate", 0, "C", "the standby level as a C-rate, for packs "
	    "whose capacity is known (unset: --standby-current)", NULL,
	    OPT_STANDBY_RATE,
	    OPTAB_POS, T(standby_rate), 0, 100 },
	{ "use-dips", 0, NULL, "with -e, list use dips too (kind use)", NULL,
	    OPT_USE_DIPS,
	    OPTAB_FLAG, T(use_dips), 0, 0 },
	OPTAB_END
};

static const struct optool tool = OPTOOL_FILES("cw-topoff",
    "Holds near full charge and top-off micro-cycles, per device; dips\n"
    "driven by use (discharge above the standby level) are counted\n"
    "apart.\n",
    OPTAB_DURATIONS,
    opts);

static int	on_row(void *ctx, void *dev, const struct cw_sample *s);
static void	dev_start(struct tool *t, struct dev *d);
static void	on_cycle(void *ctx, struct topoff *top,
		    const struct topoff_cycle *cy);
static void	on_hold(void *ctx, struct topoff *top,
		    const struct topoff_hold *h);
static void	write_depth(struct csvout *w, unsigned long n, double sum,
		    double max);
static void	write_summary(struct tool *t, const struct dev *d);
static void	end_dev(void *ctx, void *dev);
static void	report(const struct devtab *devs,
		    const struct sampin_stats *st);
static int
on_row(void *ctx, void *dev, const struct cw_sample *s)
{
	struct tool *t = ctx;
	struct dev *d = dev;

	if (d->e.nrows == 1) {
		dev_start(t, d);
		d->first = s->t;
	}
	topoff_push(&d->top, &t->conf, s->t, s->v, s->i, s->soc);
	return t->out.err ? CW_EXIT_DATA : 0;
}

/*
 * A device's first row: its detector, with its own standby level and
 * fall rate when its capacity is known.
 */
static void
dev_start(struct tool *t, struct dev *d)
{
	double cap;

	topoff_init(&d->top);
	cap = fleet_capacity(t->fleet, d->e.name, d->e.namelen, t->capacity);
	if (!(cap > 0))
		return;
	if (t->standby_rate > 0)
		d->top.standby_a = t->standby_rate * cap;
	if (!t->fall_set)
		d->top.standby_fall = 100.0 * (cw_isnum(d->top.standby_a) ?
		    d->top.standby_a : t->conf.standby_a) / cap;
	if (!(d->top.standby_fall > 0))
		d->top.standby_fall = CW_MISSING;
}

static void
on_cycle(void *ctx, struct topoff *top, const struct topoff_cycle *cy)
{
	struct tool *t = ctx;
	const struct dev *d = CW_CONTAINER(top, struct dev, top);

	if (t->mode != MODE_EVENTS || (cy->use && !t->use_dips))
		return;
	csvout_strn(&t->out, d->e.name, d->e.namelen);
	csvout_time(&t->out, cy->start);
	csvout_time(&t->out, cy->end);
	csvout_num(&t->out, cy->depth);
	csvout_num(&t->out, cy->charge_ah);
	csvout_str(&t->out, cy->use ? "use" : "topoff");
	csvout_endrow(&t->out);
}

static void
on_hold(void *ctx, struct topoff *top, const struct topoff_hold *h)
{
	struct tool *t = ctx;
	struct dev *d = CW_CONTAINER(top, struct dev, top);

	if (h->end - h->start > d->longest)
		d->longest = h->end - h->start;
	if (t->mode != MODE_HOLDS)
		return;
	csvout_strn(&t->out, d->e.name, d->e.namelen);
	glue_span(&t->out, h->start, h->end);
	csvout_int(&t->out, (long long)h->cycles);
	write_depth(&t->out, h->cycles, h->depth_sum, h->depth_max);
	csvout_num(&t->out, h->topoff_ah);
	csvout_int(&t->out, (long long)h->use_dips);
	csvout_endrow(&t->out);
}

/*
 * mean_depth_pct and max_depth_pct of N micro-cycles of depths adding up
 * to SUM, the deepest MAX: two empty fields when there are none.
 */
static void
write_depth(struct csvout *w, unsigned long n, double sum, double max)
{
	if (n > 0) {
		csvout_num(w, sum / (double)n);
		csvout_num(w, max);
	} else {
		csvout_empty(w);
		csvout_empty(w);
	}
}

/* The end of the stream for device DEV: its open hold, its summary. */
static void
end_dev(void *ctx, void *dev)
{
	struct tool *t = ctx;
	struct dev *d = dev;

	topoff_finish(&d->top, &t->conf);
	if (t->mode == MODE_SUMMARY)
		write_summary(t, d);
}

static void
write_summary(struct tool *t, const struct dev *d)
{
	const struct topoff_totals *tot = &d->top.tot;
	double hours = (double)tot->held / (3600.0 * CW_US_PER_S);
	cw_time span = d->e.last_t - d->first;

	csvout_strn(&t->out, d->e.name, d->e.namelen);
	csvout_time(&t->out, d->first);
	csvout_time(&t->out, d->e.last_t);
	csvout_int(&t->out, (long long)tot->holds);
	csvout_num(&t->out, hours);
	if (span > 0)
		csvout_num(&t->out, (double)tot->held / (double)span);
	else
		csvout_empty(&t->out);
	csvout_int(&t->out, (long long)tot->cycles);
	/* Per calendar day of the device's span, held or not. */
	if (span > 0)
		csvout_num(&t->out, (double)tot->cycles * 86400.0 *
		    CW_US_PER_S / (double)span);
	else
		csvout_empty(&t->out);
	if (tot->soc_held > 0)
		csvout_num(&t->out, (double)tot->at_top2 / 2.0 /
		    (double)tot->soc_held);
	else
		csvout_empty(&t->out);
	csvout_num(&t->out, tot->topoff_ah);
	write_depth(&t->out, tot->cycles, tot->depth_sum, tot->depth_max);
	csvout_num(&t->out, (double)d->longest / (3600.0 * CW_US_PER_S));
	csvout_int(&t->out, (long long)tot->unjudged);
	if (tot->held > 0)
		csvout_num(&t->out, (double)tot->cycles / hours);
	else
		csvout_empty(&t->out);
	csvout_int(&t->out, (long long)tot->use_dips);
	csvout_num(&t->out, cw_isnum(d->top.standby_a) ? d->top.standby_a :
	    t->conf.standby_a);
	csvout_endrow(&t->out);
}

static void
report(const struct devtab *devs, const struct sampin_stats *st)
{
	unsigned long holds = 0, cycles = 0, unjudged = 0, carried = 0;
	unsigned long gaps = 0, use = 0;
	size_t i, n = devtab_count(devs);

	for (i = 0; i < n; i++) {
		const struct topoff_totals *tot =
		    &((const struct dev *)devtab_at(devs, i))->top.tot;

		holds += tot->holds;
		cycles += tot->cycles;
		unjudged += tot->unjudged;
		carried += tot->carried;
		gaps += tot->gaps;
		use += tot->use_dips;
	}
	sampin_report(st, NULL);
	cw_warn("%zu devices, %lu holds, %lu micro-cycles, %lu use dips; %lu "
	    "holds ended by a gap longer than --max-gap", n, holds, cycles,
	    use, gaps);
	cw_warn("%lu rows without SoC (nor voltage with --full-voltage) not "
	    "judged; %lu such rows kept the level of their hold",
	    unjudged, carried);
}

/*
 * The options into T, checked; the index of the first operand.  Exits 2
 * on a usage error.
 */
static int
parse(struct tool *t, int argc, char *argv[])
{
	int events = 0, summary = 0;
	int ch;

	memset(t, 0, sizeof(*t));
	topoff_conf_default(&t->conf);
	while ((ch = optab_getopt(&tool, t, argc, argv)) != -1) {
		switch (ch) {
		case 'e':
			events = 1;
			break;
		case 's':
			summary = 1;
			break;
		case OPT_STANDBY_FALL:
			t->conf.standby_fall = opt_pos_arg("--standby-fall",
			    optarg, 1e6);
			t->fall_set = 1;
			break;
		}
	}
	if (events && summary)
		cw_usage_error("-e (--events) and -s (--summary) exclude each "
		    "other");
	t->mode = events ? MODE_EVENTS : summary ? MODE_SUMMARY : MODE_HOLDS;
	if (t->use_dips && !events)
		cw_usage_error("--use-dips lists dips with -e (--events)");
	t->fleet = fleet_load(t->fleetpath);
	return optind;
}

int
main(int argc, char *argv[])
{
	static const char *const header[] = { HOLD_HEADER, EVENT_HEADER,
	    SUMMARY_HEADER };
	struct tool t;
	struct glue g;
	int rc, k;

	k = parse(&t, argc, argv);
	glue_open(&g, sizeof(struct dev), t.outpath, &t.out, header[t.mode]);
	t.conf.on_cycle = on_cycle;
	t.conf.on_hold = on_hold;
	t.conf.on_use = on_cycle;
	t.conf.ctx = &t;
	glue_sampin(&g, SAMP_BIT(SAMP_CURRENT), SAMP_BIT(SAMP_SOC) |
	    (cw_isnum(t.conf.full_v) ? SAMP_BIT(SAMP_VOLTAGE) : 0), on_row,
	    &t);
	/* Holds still open end with the stream, in name order. */
	rc = glue_run(&g, argv + k, argc - k, end_dev, &t);
	rc = glue_finish(&g, rc, report);
	fleet_free(t.fleet);
	return rc;
}
