/*
 * cw-thermal: charging (and discharge) outside the temperature window,
 * as events per device or as a summary per device.  The engine is
 * lib/thermal.c; this file holds the options and the output.
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
	struct byval *val;	/* --by: the value of its last row */
};

/*
 * --by: one value of the column, with what the summary counts for it.
 * Its tag (thermal_dev.tag) is its insertion index plus 1.
 */
struct byval {
	struct devent e;
	struct thermal_ah ah;
	unsigned long events[THERMAL_NKIND][THERMAL_NZONE];
	unsigned long protocol[THERMAL_NPROTO];
	unsigned long devices;	/* with a row at this value */
};

struct tool {
	const char *outpath, *fleetpath;	/* -o FILE, --fleet FILE */
	struct thermal_conf conf;
	struct csvout out;
	struct fleet *fleet;
	double cap_ah;		/* --capacity; NaN: unknown */
	int cells;		/* --cells; 0: unknown */
	int summary;
	const char *by;		/* --by COL, or NULL */
	struct devtab *vals;	/* --by: struct byval by value */
	struct devtab *pairs;	/* --by: value and device seen together */
};

enum {
	OPT_CAPACITY = OPTAB_LONG, OPT_CELLS, OPT_COOL_MARGIN, OPT_COOL_RATE,
	OPT_BY, OPT_FLEET, OPT_HYST, OPT_LIMITS, OPT_MAX_GAP, OPT_MERGE,
	OPT_MIN_CURRENT, OPT_MIN_DURATION, OPT_USE_LIMITS, OPT_WARM_MARGIN,
	OPT_WARM_VOLTAGE
};

/* Where an option of the table is stored: a member of struct tool. */
#define T(m)	offsetof(struct tool, m)

static const struct optab opts[] = {
	{ "by", 0, "COL", "a stream column (a dock, charger or site that "
	    "cw-clean --keep carried): its value at each event's start ends "
	    "the event row, and --summary is one row per value", NULL,
	    OPT_BY },
	{ "capacity", 0, "AH", "rated capacity, for the cool-zone current "
	    "(unset: unknown)", NULL, OPT_CAPACITY,
	    OPTAB_NUM, T(cap_ah), 0.001, 1e6 },
	{ "cells", 0, "N", "cells in series, for the warm-zone voltage "
	    "(unset: unknown)", NULL, OPT_CELLS,
	    OPTAB_INT, T(cells), 1, 1000 },
	{ "cool-margin", 0, "PCT", "current allowed above the cool rate", "5",
	    OPT_COOL_MARGIN,
	    OPTAB_NUM, T(conf.cool_margin), 0, 100 },
	{ "cool-rate", 0, "C", "C-rate allowed in the cool zone", "0.5",
	    OPT_COOL_RATE,
	    OPTAB_NUM, T(conf.cool_rate), 0, 100 },
	{ "fleet", 0, "FILE", "the fleet file; its capacity_ah and cells "
	    "override --capacity and --cells per pack", NULL, OPT_FLEET,
	    OPTAB_STR, T(fleetpath), 0, 0 },
	{ "hysteresis", 0, "DT", "come back inside by DT to end an event",
	    "0.5", OPT_HYST,
	    OPTAB_TEMPDIFF, T(conf.lim.hyst), 0, 0 },
	{ "limits", 0, "T1,T2,T3,T4", "the four zone thresholds",
	    "0,10,45,60", OPT_LIMITS },
	{ "max-gap", 0, "DUR", "a longer interval ends an event", "15m",
	    OPT_MAX_GAP,
	    OPTAB_DUR, T(conf.max_gap), 0, 0 },
	{ "merge", 0, "DUR", "join events at most DUR apart", "2m",
	    OPT_MERGE,
	    OPTAB_DUR, T(conf.merge), -1, 0 },
	{ "min-current", 0, "A", "charging above A, discharge below -A",
	    "0.05", OPT_MIN_CURRENT,
	    OPTAB_NUM, T(conf.min_current), 0, 1e6 },
	{ "min-duration", 0, "DUR", "drop events shorter than DUR", "60s",
	    OPT_MIN_DURATION,
	    OPTAB_DUR, T(conf.min_duration), -1, 0 },
	OPTAB_OUTPUT(T(outpath)),
	{ "summary", 's', NULL, "one row per device (per value with --by) "
	    "instead of one per event", NULL, 0,
	    OPTAB_FLAG, T(summary), 0, 0 },
	{ "use-limits", 0, "LO,HI", "the window for discharge", "-20,60",
	    OPT_USE_LIMITS },
	{ "warm-margin", 0, "V", "voltage per cell allowed above the warm "
	    "voltage", "0.02", OPT_WARM_MARGIN,
	    OPTAB_NUM, T(conf.warm_margin), 0, 1 },
	{ "warm-voltage", 0, "V", "charge voltage per cell allowed in the "
	    "warm zone", "4.10", OPT_WARM_VOLTAGE,
	    OPTAB_NUM, T(conf.warm_v), 0.001, 100 },
	OPTAB_END
};

static const struct optool tool = OPTOOL_FILES("cw-thermal",
    "Charging outside the safe temperature window, as events per device,\n"
    "judged by the charge protocol of the JEITA scheme.\n",
    "The protocol's defaults are from memory of the JEITA guideline; the\n"
    "cell maker's data sheet rules.\n"
    "Temperatures take a unit suffix: 10, 10C, 50F, 283.15K (C without\n"
    "one); DT is a difference (C and K count the same, 0.9F is 0.5 C).\n"
    OPTAB_DURATIONS
    "--hysteresis 0 and --merge 0 turn hysteresis and merging off.\n",
    opts);

static int	parse(struct tool *t, int argc, char *argv[]);
static void	write_header(struct tool *t);
static int	on_row(void *ctx, void *dev, const struct cw_sample *s);
static void	on_event(void *ctx, struct thermal_dev *th,
		    const struct thermal_event *ev);
static void	write_summary(struct tool *t, const struct dev *d);
static void	end_dev(void *ctx, void *dev);
static struct byval *by_value(struct tool *t, struct dev *d,
		    const struct cw_sample *s);
static void	write_by_header(struct tool *t);
static double	ah_total(const struct thermal_ah *a);
static void	write_outside(struct tool *t, const struct thermal_ah *a);
static void	write_by_summary(struct tool *t, const struct byval *v);
static void	report(const struct devtab *devs,
		    const struct sampin_stats *st, const char *by);

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
	if (t->by != NULL) {
		struct byval *v = by_value(t, d, s);

		d->th.tag = (int)v->e.index + 1;
		d->th.tag_ah = &v->ah;
	}
	thermal_push_v(&d->th, &t->conf, s->t, s->i, s->temp, s->soc, s->v);
	return t->out.err ? CW_EXIT_DATA : 0;
}

/*
 * --by: the value of row S of device D, and the first time the device is
 * seen at it, one more device there.  The device's last value is looked
 * at first, since a pack stays at a dock for many rows.
 */
static struct byval *
by_value(struct tool *t, struct dev *d, const struct cw_sample *s)
{
	struct byval *v = d->val;
	char key[48];
	int isnew, n;

	if (v != NULL && v->e.namelen == s->taglen &&
	    memcmp(v->e.name, s->tag, s->taglen) == 0)
		return v;
	v = devtab_get(t->vals, s->tag, s->taglen, NULL);
	d->val = v;
	/* The pair's key: the device's and the value's index. */
	n = snprintf(key, sizeof(key), "%zu:%zu", d->e.index, v->e.index);
	(void)devtab_get(t->pairs, key, (size_t)n, &isnew);
	if (isnew)
		v->devices++;
	return v;
}

static void
on_event(void *ctx, struct thermal_dev *th, const struct thermal_event *ev)
{
	struct tool *t = ctx;
	const struct dev *d;

	if (t->by != NULL) {
		struct byval *v = devtab_at(t->vals, (size_t)ev->tag - 1);

		v->events[ev->kind][ev->zone]++;
		if (ev->kind == THERMAL_CHARGE)
			v->protocol[ev->protocol]++;
	}
	if (t->summary)
		return;
	d = CW_CONTAINER(th, struct dev, th);
	glue_event(&t->out, &d->e, thermal_kind_name(ev->kind),
	    thermal_zone_name(ev->zone), ev->start, ev->end, ev->temp_min,
	    ev->temp_max, ev->charge_ah, ev->soc_start, ev->soc_end);
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
	if (t->by != NULL) {
		const struct byval *v = devtab_at(t->vals,
		    (size_t)ev->tag - 1);

		csvout_strn(&t->out, v->e.name, v->e.namelen);
	}
	csvout_endrow(&t->out);
}

/* All the charge of A, the part without a temperature included. */
static double
ah_total(const struct thermal_ah *a)
{
	double total = a->no_temp;
	int z;

	for (z = 0; z < THERMAL_NZONE; z++)
		total += a->zone[z];
	return total;
}

/* outside_pct: the share of A of known temperature outside T2..T3. */
static void
write_outside(struct tool *t, const struct thermal_ah *a)
{
	double known = ah_total(a) - a->no_temp;

	if (known > 0)
		csvout_num(&t->out, 100.0 * (known - a->zone[THERMAL_NORMAL]) /
		    known);
	else
		csvout_empty(&t->out);
}

/* The header of the rows of --by: the columns cw-thermal(1) lists first. */
static void
write_by_header(struct tool *t)
{
	static const char *const cols[] = {
		"devices", "events_below_min", "events_cool", "events_warm",
		"events_above_max", "ah_below_min", "ah_cool", "ah_warm",
		"ah_above_max", "charge_ah", "ah_normal", "ah_no_temp",
		"outside_pct", "use_cold_events", "use_hot_events",
		"events_within", "events_over_current", "events_over_voltage",
		"events_no_charge_allowed", "events_unknown_protocol"
	};
	size_t k;

	csvout_str(&t->out, t->by);
	for (k = 0; k < sizeof(cols) / sizeof(cols[0]); k++)
		csvout_str(&t->out, cols[k]);
	csvout_endrow(&t->out);
}

/* One row of --by --summary: the value V of the column. */
static void
write_by_summary(struct tool *t, const struct byval *v)
{
	static const int zones[] = { THERMAL_BELOW_MIN, THERMAL_COOL,
	    THERMAL_WARM, THERMAL_ABOVE_MAX };
	const unsigned long *ce = v->events[THERMAL_CHARGE];
	size_t k;
	int z;

	csvout_strn(&t->out, v->e.name, v->e.namelen);
	csvout_int(&t->out, (long long)v->devices);
	for (k = 0; k < 4; k++)
		csvout_int(&t->out, (long long)ce[zones[k]]);
	for (k = 0; k < 4; k++)
		csvout_num(&t->out, v->ah.zone[zones[k]]);
	csvout_num(&t->out, ah_total(&v->ah));
	csvout_num(&t->out, v->ah.zone[THERMAL_NORMAL]);
	csvout_num(&t->out, v->ah.no_temp);
	write_outside(t, &v->ah);
	csvout_int(&t->out, (long long)v->events[THERMAL_USE]
	    [THERMAL_BELOW_MIN]);
	csvout_int(&t->out, (long long)v->events[THERMAL_USE]
	    [THERMAL_ABOVE_MAX]);
	for (z = 0; z < THERMAL_NPROTO; z++)
		csvout_int(&t->out, (long long)v->protocol[z]);
	csvout_endrow(&t->out);
}

/* The end of the stream for device DEV: its open event, its summary. */
static void
end_dev(void *ctx, void *dev)
{
	struct tool *t = ctx;
	struct dev *d = dev;

	thermal_finish(&d->th, &t->conf);
	if (t->summary && t->by == NULL)
		write_summary(t, d);
}

static void
write_summary(struct tool *t, const struct dev *d)
{
	const struct thermal_dev *th = &d->th;
	const unsigned long *ce = th->events[THERMAL_CHARGE];
	const unsigned long *ue = th->events[THERMAL_USE];
	int z;

	csvout_strn(&t->out, d->e.name, d->e.namelen);
	csvout_time(&t->out, th->first);
	csvout_time(&t->out, th->prev_t);
	csvout_num(&t->out, ah_total(&th->ah));
	for (z = 0; z < THERMAL_NZONE; z++)
		csvout_num(&t->out, th->ah.zone[z]);
	csvout_num(&t->out, th->ah.no_temp);
	write_outside(t, &th->ah);
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
report(const struct devtab *devs, const struct sampin_stats *st,
    const char *by)
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
	sampin_report_tag(st, NULL, by);
	cw_warn("%zu device%s; %lu rows without temperature or current not "
	    "judged", n, n == 1 ? "" : "s", unjudged);
	cw_warn("%lu charge events, %lu use events; %lu shorter than "
	    "--min-duration dropped; %lu joined by --merge",
	    ev[THERMAL_CHARGE], ev[THERMAL_USE], dropped, merges);
}

/*
 * The options into T, checked; the index of the first operand.  Exits 2
 * on a usage error.
 */
static int
parse(struct tool *t, int argc, char *argv[])
{
	double use[2];
	int ch;

	memset(t, 0, sizeof(*t));
	thermal_conf_default(&t->conf);
	t->cap_ah = CW_MISSING;
	while ((ch = optab_getopt(&tool, t, argc, argv)) != -1) {
		switch (ch) {
		case OPT_BY:
			if (optarg[0] == '\0')
				cw_usage_error("--by: empty column name");
			t->by = optarg;
			break;
		case OPT_LIMITS:
			opt_list_arg("--limits", optarg, t->conf.lim.t, 4, 1,
			    1);
			break;
		case OPT_USE_LIMITS:
			opt_list_arg("--use-limits", optarg, use, 2, 1, 1);
			t->conf.lim.use_lo = use[0];
			t->conf.lim.use_hi = use[1];
			break;
		}
	}
	t->fleet = fleet_load(t->fleetpath);
	return optind;
}

/* The header: the summary's or the events', with --by's column. */
static void
write_header(struct tool *t)
{
	char names[] = EVENT_HEADER, *p, *save = NULL;

	if (t->by != NULL && t->summary) {
		write_by_header(t);
		return;
	}
	if (t->by == NULL) {
		csvout_header(&t->out, t->summary ? SUMMARY_HEADER :
		    EVENT_HEADER);
		return;
	}
	/* The event columns, then COL, quoted as CSV needs. */
	for (p = strtok_r(names, ",", &save); p != NULL;
	    p = strtok_r(NULL, ",", &save))
		csvout_str(&t->out, p);
	csvout_str(&t->out, t->by);
	csvout_endrow(&t->out);
}

int
main(int argc, char *argv[])
{
	struct tool t;
	struct glue g;
	void **sorted;
	size_t i, n;
	int rc, k;

	k = parse(&t, argc, argv);
	glue_open(&g, sizeof(struct dev), t.outpath, &t.out, NULL);
	write_header(&t);
	t.conf.emit = on_event;
	t.conf.ctx = &t;
	glue_sampin(&g, SAMP_BIT(SAMP_CURRENT) | SAMP_BIT(SAMP_TEMP), 0,
	    on_row, &t);
	if (t.by != NULL) {
		g.sc.tag = t.by;
		g.sc.need |= SAMP_BIT(SAMP_TAG);
		t.vals = devtab_new(sizeof(struct byval));
		t.pairs = devtab_new(sizeof(struct devent));
	}
	/* What is still open ends with the stream, in name order. */
	rc = glue_run(&g, argv + k, argc - k, end_dev, &t);
	if (rc == 0 && t.summary && t.by != NULL) {
		sorted = devtab_sorted(t.vals);
		n = devtab_count(t.vals);
		for (i = 0; i < n; i++)
			write_by_summary(&t, sorted[i]);
		free(sorted);
	}
	if (cw_verbose)
		report(g.devs, &g.st, t.by);
	rc = glue_close(&g, rc);
	if (t.by != NULL) {
		devtab_free(t.vals);
		devtab_free(t.pairs);
	}
	fleet_free(t.fleet);
	return rc;
}
