/*
 * report.c: the attention list.  Each input file is recognised by its
 * header: it must hold every column the tool writes (more may follow, in
 * any order).  Each row fills the device's state; report_rank() turns the
 * states into findings, one per pack and reason, and sorts them: packs by
 * their most urgent finding, a pack's findings together.
 */
#include <errno.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "csvin.h"
#include "csvout.h"
#include "devtab.h"
#include "num.h"
#include "report.h"
#include "ts.h"

/* The inputs, by the tool that wrote them. */
enum kind {
	K_WEAR, K_THERMAL, K_TOPOFF, K_DCIR, K_CAPACITY, K_VOLT, K_N
};

/* The columns each tool writes on this version, as its header has them. */
static const char *const kind_header[K_N] = {
	"device,first,last,days,charge_ah,efc,max_depth_pct,hours_near_full,"
	"hours_hot,cold_charge_ah,cool_charge_ah,hot_charge_ah,topoff_cycles,"
	"share_age,share_cycling,share_high_soc,share_heat,fade_pct,soh_pct,"
	"days_to_eol,dominant,prior,damage,damage_prior",
	"device,first,last,charge_ah,ah_below_min,ah_cool,ah_normal,ah_warm,"
	"ah_above_max,ah_no_temp,outside_pct,charge_events,below_min_events,"
	"cool_events,warm_events,above_max_events,use_events,use_cold_events,"
	"use_hot_events,unjudged_rows,events_within,events_over_current,"
	"events_over_voltage,events_no_charge_allowed,events_unknown_protocol",
	"device,first,last,holds,hours_held,share_held,micro_cycles,"
	"micro_cycles_per_day,share_at_100,topoff_ah,mean_depth_pct,"
	"max_depth_pct,longest_hold_h,unjudged_rows,"
	"micro_cycles_per_held_hour,use_dips,standby_a",
	"device,steps,first,last,r_start_ohm,r_end_ohm,growth_pct,"
	"growth_pct_per_30d,eol_date,fit_steps,slope_ohm_per_day,"
	"slope_lo_ohm_per_day,slope_hi_ohm_per_day,soc_gate,"
	"growth_lo_pct_per_30d,growth_hi_pct_per_30d",
	"device,estimates,first,last,capacity_start_ah,capacity_end_ah,"
	"fade_pct,fade_pct_per_30d,soh_pct,eol_date,slope_ah_per_day,"
	"slope_lo_ah_per_day,slope_hi_ah_per_day,fit_estimates,rated_ah",
	"device,first,last,cells,v_cell_min,v_cell_max,events_over,hours_over,"
	"ah_charged_over,events_under,hours_under,over_charge_events,"
	"over_use_events,over_rest_events,under_charge_events,"
	"under_use_events,under_rest_events,unjudged_rows"
};

static const char *const kind_name[K_N] = {
	"cw-wear", "cw-thermal --summary", "cw-topoff --summary",
	"cw-dcir --trend", "cw-capacity --trend", "cw-volt --summary"
};

/* The columns read, each of one kind. */
enum field {
	/* cw-wear */
	W_FIRST, W_LAST, W_DAYS, W_CHARGE, W_COLD, W_FADE, W_SOH, W_EOL,
	W_DOMINANT,
	/* cw-thermal --summary */
	T_FIRST, T_LAST, T_AH_BELOW, T_AH_COOL, T_AH_WARM, T_AH_ABOVE,
	T_EV_BELOW, T_EV_ABOVE, T_EV_OC, T_EV_OV,
	/* cw-topoff --summary */
	O_FIRST, O_LAST, O_PER_DAY, O_HOURS,
	/* cw-dcir --trend */
	D_FIRST, D_LAST, D_RSTART, D_REND, D_GROWTH, D_SLOPE, D_LO, D_HI,
	/* cw-capacity --trend */
	C_FIRST, C_LAST, C_CEND, C_SOH, C_SLOPE, C_LO, C_HI, C_RATED,
	/* cw-volt --summary */
	V_FIRST, V_LAST, V_MIN, V_MAX, V_EV_OVER, V_H_OVER, V_AH_OVER,
	V_EV_UNDER, V_H_UNDER,
	F_N
};

static const struct {
	int kind;
	const char *name;
	int type;	/* 'n' number, 't' time, 's' string */
} field_def[F_N] = {
	{ K_WEAR, "first", 't' }, { K_WEAR, "last", 't' },
	{ K_WEAR, "days", 'n' }, { K_WEAR, "charge_ah", 'n' },
	{ K_WEAR, "cold_charge_ah", 'n' }, { K_WEAR, "fade_pct", 'n' },
	{ K_WEAR, "soh_pct", 'n' }, { K_WEAR, "days_to_eol", 'n' },
	{ K_WEAR, "dominant", 's' },
	{ K_THERMAL, "first", 't' }, { K_THERMAL, "last", 't' },
	{ K_THERMAL, "ah_below_min", 'n' }, { K_THERMAL, "ah_cool", 'n' },
	{ K_THERMAL, "ah_warm", 'n' }, { K_THERMAL, "ah_above_max", 'n' },
	{ K_THERMAL, "below_min_events", 'n' },
	{ K_THERMAL, "above_max_events", 'n' },
	{ K_THERMAL, "events_over_current", 'n' },
	{ K_THERMAL, "events_over_voltage", 'n' },
	{ K_TOPOFF, "first", 't' }, { K_TOPOFF, "last", 't' },
	{ K_TOPOFF, "micro_cycles_per_day", 'n' },
	{ K_TOPOFF, "hours_held", 'n' },
	{ K_DCIR, "first", 't' }, { K_DCIR, "last", 't' },
	{ K_DCIR, "r_start_ohm", 'n' }, { K_DCIR, "r_end_ohm", 'n' },
	{ K_DCIR, "growth_pct", 'n' }, { K_DCIR, "slope_ohm_per_day", 'n' },
	{ K_DCIR, "slope_lo_ohm_per_day", 'n' },
	{ K_DCIR, "slope_hi_ohm_per_day", 'n' },
	{ K_CAPACITY, "first", 't' }, { K_CAPACITY, "last", 't' },
	{ K_CAPACITY, "capacity_end_ah", 'n' }, { K_CAPACITY, "soh_pct", 'n' },
	{ K_CAPACITY, "slope_ah_per_day", 'n' },
	{ K_CAPACITY, "slope_lo_ah_per_day", 'n' },
	{ K_CAPACITY, "slope_hi_ah_per_day", 'n' },
	{ K_CAPACITY, "rated_ah", 'n' },
	{ K_VOLT, "first", 't' }, { K_VOLT, "last", 't' },
	{ K_VOLT, "v_cell_min", 'n' }, { K_VOLT, "v_cell_max", 'n' },
	{ K_VOLT, "events_over", 'n' }, { K_VOLT, "hours_over", 'n' },
	{ K_VOLT, "ah_charged_over", 'n' }, { K_VOLT, "events_under", 'n' },
	{ K_VOLT, "hours_under", 'n' }
};

static const struct {
	const char *name;
	int tier;
} reason_def[REPORT_NREASON] = {
	{ "charge-below-min", 1 }, { "charge-above-max", 1 },
	{ "cell-over-voltage", 1 }, { "cell-under-voltage", 1 },
	{ "cool-over-current", 2 }, { "warm-over-voltage", 2 },
	{ "capacity-low", 3 }, { "capacity-fading", 3 },
	{ "resistance-high", 3 }, { "resistance-rising", 3 },
	{ "short-life", 4 }
};

/* What cw-wear's dominant column says of cold charge. */
#define DOMINANT_COLD "cold-charge"
#define DAY_US (86400.0 * CW_US_PER_S)

/* A pack: what each input said of it.  The devent first, as devtab asks. */
struct rdev {
	struct devent e;
	unsigned have;			/* 1 << kind of each input seen */
	const char *src[K_N];		/* where, for a repeated device */
	unsigned long line[K_N];
	double x[F_N];			/* numbers, NaN when empty */
	cw_time t[F_N];			/* times, when x[] of it is 0 */
	int cold_dominant;		/* cw-wear's dominant: cold-charge */
	size_t rank;			/* place in the list, 0 none */
};

struct report {
	struct report_conf c;
	const struct fleet *fleet;
	struct devtab *devs;
	struct devtab *since;		/* "device\037reason" of --since */
	int have_since;
	/* The file being read. */
	int kind;			/* enum kind, -1 before its header */
	int col[F_N];
	int dcol;			/* its device column */
	int since_dev, since_reason;
	struct report_finding *f;
	size_t nf, fcap;
	size_t npacks;			/* packs listed */
	cw_time first, last;		/* span of the logs, 0: unknown */
	char *buf;			/* a growing line (device lists) */
	size_t buflen, bufcap;
};

static int	rd_header(void *, const struct csvin_rec *);
static int	rd_row(void *, const struct csvin_rec *);
static int	rd_bad(void *, const struct csvin_rec *, const char *);
static int	sn_header(void *, const struct csvin_rec *);
static int	sn_row(void *, const struct csvin_rec *);
static int	has_all(const struct csvin_rec *, const char *);
static void	field_str(const struct csvin_rec *, int, const char **,
		    size_t *);
static struct report_finding *add(struct report *, const struct rdev *,
		    int, double);
static void	find_pack(struct report *, const struct rdev *);
static void	find_projection(struct report *, const struct rdev *);
static void	date_of(const struct report *, cw_time, char *);
static void	field_date(const struct report *, const struct rdev *, int,
		    double, char *);
static const char *site_of(const struct report *, const struct rdev *);
static const char *group_of(const struct report *, const struct rdev *);
static int	cmp_found(const void *, const void *);
static int	cmp_ranked(const void *, const void *);
static void	write_text(struct report *, FILE *);
static void	write_text_by(struct report *, FILE *);
static void	write_csv(struct report *, struct csvout *);
static void	write_csv_by(struct report *, struct csvout *);
static void	write_footer(FILE *);
static void	buf_reset(struct report *);
static void	buf_add(struct report *, const char *, size_t);
static void	tz_name(long, char *);
static const char *plural(double);
static double	count_of(double);
static int	shown(const struct report *, const struct report_finding *);
static const char **groups(struct report *, size_t *);
static size_t	group_reason(struct report *, const char *, int, size_t *);
static size_t	group_packs(const struct report *, const char *);
static const char *by_name(const struct report *);

void
report_conf_default(struct report_conf *c)
{
	memset(c, 0, sizeof(*c));
	c->lim[0] = 0;
	c->lim[1] = 10;
	c->lim[2] = 45;
	c->lim[3] = 60;
	c->soh_min = 80;
	c->growth_max = 100;
	c->horizon_d = 90;
	c->life_d = 365;
	c->min_days = 7;
	c->topoff_day = 10;
}

struct report *
report_new(const struct report_conf *c, const struct fleet *fleet)
{
	struct report *r = cw_calloc(1, sizeof(*r));

	r->c = *c;
	r->fleet = fleet;
	r->devs = devtab_new(sizeof(struct rdev));
	r->since = devtab_new(sizeof(struct devent));
	return r;
}

const char *
report_reason_name(int reason)
{
	if (reason < 0 || reason >= REPORT_NREASON)
		return "?";
	return reason_def[reason].name;
}

int
report_reason_tier(int reason)
{
	if (reason < 0 || reason >= REPORT_NREASON)
		return 0;
	return reason_def[reason].tier;
}

/* Does header R hold every name of the comma-separated list NAMES? */
static int
has_all(const struct csvin_rec *r, const char *names)
{
	char name[64];
	const char *p = names, *e;
	size_t n;

	for (;;) {
		e = strchr(p, ',');
		n = e != NULL ? (size_t)(e - p) : strlen(p);
		if (n >= sizeof(name))
			return 0;
		memcpy(name, p, n);
		name[n] = '\0';
		if (csvin_find(r, name) < 0)
			return 0;
		if (e == NULL)
			return 1;
		p = e + 1;
	}
}

int
report_read(struct report *r, const char *path)
{
	static const struct csvin_ops ops = {
		rd_header, rd_row, rd_bad, csvin_skip_blank
	};
	struct csvin *in;
	int rc;

	r->kind = -1;
	in = csvin_new('\0', &ops, r);
	rc = csvin_file(in, path);
	if (rc == 0 && csvin_stats(in)->headers == 0) {
		cw_warn("%s: empty file (no header)", path);
		rc = CW_EXIT_DATA;
	}
	csvin_free(in);
	return rc;
}


static int
rd_header(void *ctx, const struct csvin_rec *h)
{
	struct report *r = ctx;
	const char *hint = "";
	int k, i;

	for (k = 0; k < K_N; k++)
		if (has_all(h, kind_header[k]))
			break;
	if (k < K_N) {
		r->kind = k;
		r->dcol = csvin_find(h, "device");
		for (i = 0; i < F_N; i++)
			r->col[i] = field_def[i].kind == k ?
			    csvin_find(h, field_def[i].name) : -1;
		if (cw_verbose)
			cw_warn("%s: %s output", h->src, kind_name[k]);
		return 0;
	}
	/* Say what it looks like when it is a tool's other form. */
	if (csvin_find(h, "device") < 0)
		hint = " (no device column: a --by summary, or not a tool's "
		    "output)";
	else if (csvin_find(h, "reason") >= 0)
		hint = " (a cw-report --csv: give it with --since)";
	else if (csvin_find(h, "zone") >= 0)
		hint = " (cw-thermal events: run it with --summary)";
	else if (csvin_find(h, "limit") >= 0)
		hint = " (cw-volt events: run it with --summary)";
	else if (csvin_find(h, "r_ohm") >= 0)
		hint = " (cw-dcir steps: run it with --trend)";
	else if (csvin_find(h, "direction") >= 0)
		hint = " (cw-capacity estimates: run it with --trend)";
	else if (csvin_find(h, "depth_pct") >= 0 ||
	    csvin_find(h, "micro_cycles") >= 0)
		hint = " (cw-topoff holds or events: run it with --summary)";
	else if (csvin_find(h, "soc_lo") >= 0)
		hint = " (cw-wear --dwell: run it without --dwell)";
	else if (csvin_find(h, "site") >= 0 ||
	    csvin_find(h, "capacity_ah") >= 0 || csvin_find(h, "model") >= 0)
		hint = " (a fleet file: give it with --fleet)";
	cw_warn_at(h->src, h->line, "unknown header: not the output of "
	    "cw-wear, cw-thermal --summary, cw-topoff --summary, cw-dcir "
	    "--trend, cw-capacity --trend or cw-volt --summary%s", hint);
	return CW_EXIT_DATA;
}

/* Field K of R, or an empty one when the row is short. */
static void
field_str(const struct csvin_rec *r, int k, const char **s, size_t *n)
{
	if (k < 0 || (size_t)k >= r->nf) {
		*s = "";
		*n = 0;
		return;
	}
	*s = r->f[k];
	*n = r->len[k];
}

static int
rd_row(void *ctx, const struct csvin_rec *rec)
{
	struct report *r = ctx;
	struct rdev *d;
	const char *s;
	size_t n;
	int isnew, i, k = r->kind, st;

	field_str(rec, r->dcol, &s, &n);
	if (n == 0) {
		cw_warn_at(rec->src, rec->line, "row without a device");
		return CW_EXIT_DATA;
	}
	d = devtab_get(r->devs, s, n, &isnew);
	if (d->have & (1u << k)) {
		cw_warn_at(rec->src, rec->line, "device \"%.*s\" again in %s "
		    "output (first at %s:%lu)", (int)n, s, kind_name[k],
		    d->src[k], d->line[k]);
		return CW_EXIT_DATA;
	}
	d->have |= 1u << k;
	d->src[k] = rec->src;
	d->line[k] = rec->line;
	for (i = 0; i < F_N; i++) {
		if (field_def[i].kind != k)
			continue;
		field_str(rec, r->col[i], &s, &n);
		d->x[i] = CW_MISSING;
		switch (field_def[i].type) {
		case 'n':
			st = num_parse(s, n, '.', &d->x[i]);
			if (st == NUM_EMPTY)
				d->x[i] = CW_MISSING;
			else if (st != NUM_OK) {
				cw_warn_at(rec->src, rec->line, "%s: %s: "
				    "\"%.*s\"", field_def[i].name,
				    num_strerror(st), (int)n, s);
				return CW_EXIT_DATA;
			}
			break;
		case 't':
			if (n == 0)
				break;
			if (ts_parse(s, n, TS_AUTO, 0, &d->t[i]) != 0) {
				cw_warn_at(rec->src, rec->line, "%s: not a "
				    "time: \"%.*s\"", field_def[i].name,
				    (int)n, s);
				return CW_EXIT_DATA;
			}
			d->x[i] = 0;
			break;
		default:
			/* The one string read: cw-wear's dominant. */
			d->cold_dominant = n == strlen(DOMINANT_COLD) &&
			    memcmp(s, DOMINANT_COLD, n) == 0;
			break;
		}
	}
	return 0;
}

static int
rd_bad(void *ctx, const struct csvin_rec *rec, const char *why)
{
	(void)ctx;
	cw_warn_at(rec->src, rec->line, "%s", why);
	return CW_EXIT_DATA;
}

int
report_since(struct report *r, const char *path)
{
	static const struct csvin_ops ops = {
		sn_header, sn_row, rd_bad, csvin_skip_blank
	};
	struct csvin *in;
	int rc;

	r->have_since = 1;
	in = csvin_new('\0', &ops, r);
	rc = csvin_file(in, path);
	/* An empty file is an earlier report that held nothing. */
	csvin_free(in);
	return rc;
}

static int
sn_header(void *ctx, const struct csvin_rec *h)
{
	struct report *r = ctx;

	r->since_dev = csvin_find(h, "device");
	r->since_reason = csvin_find(h, "reason");
	if (r->since_dev < 0 || r->since_reason < 0) {
		cw_warn_at(h->src, h->line, "not a cw-report --csv report "
		    "(it needs the columns device and reason)");
		return CW_EXIT_DATA;
	}
	return 0;
}

static int
sn_row(void *ctx, const struct csvin_rec *rec)
{
	struct report *r = ctx;
	const char *dv, *rs;
	size_t dn, rn;

	field_str(rec, r->since_dev, &dv, &dn);
	field_str(rec, r->since_reason, &rs, &rn);
	if (dn == 0 || rn == 0) {
		cw_warn_at(rec->src, rec->line, "row without a device or a "
		    "reason");
		return CW_EXIT_DATA;
	}
	buf_reset(r);
	buf_add(r, dv, dn);
	buf_add(r, "\037", 1);
	buf_add(r, rs, rn);
	(void)devtab_get(r->since, r->buf, r->buflen, NULL);
	return 0;
}

static void
buf_reset(struct report *r)
{
	r->buflen = 0;
	if (r->buf != NULL)
		r->buf[0] = '\0';
}

static void
buf_add(struct report *r, const char *s, size_t n)
{
	if (r->buflen + n + 1 > r->bufcap) {
		r->bufcap = 2 * (r->buflen + n + 1) + 64;
		r->buf = cw_realloc(r->buf, r->bufcap);
	}
	memcpy(r->buf + r->buflen, s, n);
	r->buflen += n;
	r->buf[r->buflen] = '\0';
}

/* YYYY-MM-DD of T at the --tz offset, into BUF[11]. */
static void
date_of(const struct report *r, cw_time t, char *buf)
{
	const cw_time day = 86400 * CW_US_PER_S;
	cw_time l = t + (cw_time)r->c.tz_s * CW_US_PER_S;
	long days = (long)(l / day), y;
	unsigned m, dd;

	if (l % day < 0)
		days--;
	ts_civil_from_days(days, &y, &m, &dd);
	if (y < 0 || y > 9999) {
		strcpy(buf, "?");
		return;
	}
	ts_format_date(y, m, dd, buf);
	buf[10] = '\0';
}

/* The date of time field K of D plus DAYS, or "?" when it is empty. */
static void
field_date(const struct report *r, const struct rdev *d, int k, double days,
    char *buf)
{
	if (!cw_isnum(d->x[k])) {
		strcpy(buf, "?");
		return;
	}
	date_of(r, d->t[k] + (cw_time)(days * DAY_US), buf);
}

/* "UTC" or "UTC+01:00" of an offset, into BUF[16]. */
static void
tz_name(long s, char *buf)
{
	long a = s < 0 ? -s : s;

	if (s == 0)
		strcpy(buf, "UTC");
	else
		snprintf(buf, 16, "UTC%c%02ld:%02ld", s < 0 ? '-' : '+',
		    a / 3600 % 100, a / 60 % 60);
}

static const char *
site_of(const struct report *r, const struct rdev *d)
{
	const struct fleet_pack *p = fleet_find(r->fleet, d->e.name,
	    d->e.namelen);

	return p != NULL ? p->site : "";
}

static const char *
group_of(const struct report *r, const struct rdev *d)
{
	const struct fleet_pack *p = fleet_find(r->fleet, d->e.name,
	    d->e.namelen);

	if (p == NULL)
		return "";
	return r->c.by == REPORT_BY_MODEL ? p->model : p->site;
}

static struct report_finding *
add(struct report *r, const struct rdev *d, int reason, double mag)
{
	struct report_finding *f;

	if (r->nf == r->fcap) {
		r->fcap = r->fcap ? 2 * r->fcap : 64;
		r->f = cw_realloc(r->f, r->fcap * sizeof(*r->f));
	}
	f = &r->f[r->nf++];
	memset(f, 0, sizeof(*f));
	f->dev = d;
	f->reason = reason;
	f->mag = mag;
	f->isnew = 1;
	if (r->have_since) {
		buf_reset(r);
		buf_add(r, d->e.name, d->e.namelen);
		buf_add(r, "\037", 1);
		buf_add(r, reason_def[reason].name,
		    strlen(reason_def[reason].name));
		f->isnew = devtab_find(r->since, r->buf, r->buflen) == NULL;
	}
	return f;
}

/* "s" unless N is 1. */
static const char *
plural(double n)
{
	return n == 1 ? "" : "s";
}

/* X when it is a number above 0, else 0: counts of events. */
static double
count_of(double x)
{
	return x > 0 ? x : 0;
}

/* Charging, voltage and modelled life: the reasons read off one row. */
static void
find_pack(struct report *r, const struct rdev *d)
{
	static const struct {
		int reason;
		int ev, ah;		/* fields of the events, the Ah */
		int lo, hi;		/* the zone's limits, T1..T4 as 0..3 */
		const char *what;
	} th[4] = {
		{ REPORT_CHARGE_BELOW_MIN, T_EV_BELOW, T_AH_BELOW, 0, -1,
		    "below-min, no charging allowed" },
		{ REPORT_CHARGE_ABOVE_MAX, T_EV_ABOVE, T_AH_ABOVE, 3, -1,
		    "above-max, no charging allowed" },
		{ REPORT_COOL_OVER_CURRENT, T_EV_OC, T_AH_COOL, 0, 1,
		    "cool, above the protocol's reduced current" },
		{ REPORT_WARM_OVER_VOLTAGE, T_EV_OV, T_AH_WARM, 2, 3,
		    "warm, above the protocol's reduced charge voltage" }
	};
	const double *x = d->x;
	const double *lim = r->c.lim;
	struct report_finding *f;
	char a[11], b[11], zone[48];
	int k;

	if (d->have & (1u << K_THERMAL)) {
		field_date(r, d, T_FIRST, 0, a);
		field_date(r, d, T_LAST, 0, b);
		for (k = 0; k < 4; k++) {
			const double n = count_of(x[th[k].ev]);
			const double ah = count_of(x[th[k].ah]);

			if (n == 0)
				continue;
			if (th[k].hi < 0)
				snprintf(zone, sizeof(zone), "%s %g C",
				    th[k].lo == 0 ? "below" : "above",
				    lim[th[k].lo]);
			else
				snprintf(zone, sizeof(zone), "at %g to %g C",
				    lim[th[k].lo], lim[th[k].hi]);
			/* No charging allowed: by Ah; the protocol: by events. */
			f = add(r, d, th[k].reason, k < 2 ? ah : n);
			/* The summary holds the zone's Ah, not the events':
			 * say so where some events may be within. */
			snprintf(f->detail, sizeof(f->detail), "%.0f charge "
			    "event%s %s (%s); %.3g Ah charged in the zone in "
			    "all%s, %s to %s", n, plural(n), zone, th[k].what,
			    ah, k < 2 ? "" : " (events within the protocol "
			    "included)", a, b);
		}
	} else if ((d->have & (1u << K_WEAR)) && d->cold_dominant) {
		/* No cw-thermal summary: cw-wear's count of cold charge. */
		field_date(r, d, W_FIRST, 0, a);
		field_date(r, d, W_LAST, 0, b);
		f = add(r, d, REPORT_CHARGE_BELOW_MIN, count_of(x[W_COLD]));
		snprintf(f->detail, sizeof(f->detail), "%.3g Ah of %.3g Ah "
		    "charged below %g C (cw-wear: cold-charge), %s to %s",
		    count_of(x[W_COLD]), count_of(x[W_CHARGE]), lim[0], a, b);
	}
	if (d->have & (1u << K_VOLT)) {
		if (count_of(x[V_EV_OVER]) > 0) {
			f = add(r, d, REPORT_CELL_OVER_VOLTAGE,
			    count_of(x[V_H_OVER]));
			snprintf(f->detail, sizeof(f->detail), "cell voltage "
			    "up to %.3f V in %.0f event%s over the limit, "
			    "%.3g h, %.3g Ah charged over it", x[V_MAX],
			    x[V_EV_OVER], plural(x[V_EV_OVER]),
			    count_of(x[V_H_OVER]),
			    count_of(x[V_AH_OVER]));
		}
		if (count_of(x[V_EV_UNDER]) > 0) {
			f = add(r, d, REPORT_CELL_UNDER_VOLTAGE,
			    count_of(x[V_H_UNDER]));
			snprintf(f->detail, sizeof(f->detail), "cell voltage "
			    "down to %.3f V in %.0f event%s under the limit "
			    "(over-discharge), %.3g h", x[V_MIN],
			    x[V_EV_UNDER], plural(x[V_EV_UNDER]),
			    count_of(x[V_H_UNDER]));
		}
	}
	/* A pace taken from less than --min-days of log is not a life. */
	if ((d->have & (1u << K_WEAR)) && cw_isnum(x[W_EOL]) &&
	    x[W_EOL] < r->c.life_d && x[W_DAYS] >= r->c.min_days) {
		field_date(r, d, W_LAST, x[W_EOL], a);
		f = add(r, d, REPORT_SHORT_LIFE, -x[W_EOL]);
		snprintf(f->detail, sizeof(f->detail), "modelled end of life "
		    "(80 %% SoH) in %.0f days, by %s, at this pace (modelled "
		    "SoH %.1f %%, fade %.2f points in %.1f days)", x[W_EOL],
		    a, x[W_SOH], x[W_FADE], x[W_DAYS]);
	}
}

/* Measured capacity and resistance: past the threshold, or heading there. */
static void
find_projection(struct report *r, const struct rdev *d)
{
	const double *x = d->x;
	struct report_finding *f;
	double rated, soh, rate, days, target;
	char a[11];

	if (d->have & (1u << K_CAPACITY)) {
		rated = x[C_RATED];
		if (!(rated > 0))
			rated = fleet_capacity(r->fleet, d->e.name,
			    d->e.namelen, CW_MISSING);
		soh = x[C_SOH];
		if (!cw_isnum(soh) && rated > 0 && cw_isnum(x[C_CEND]))
			soh = 100 * x[C_CEND] / rated;
		if (soh < r->c.soh_min) {
			f = add(r, d, REPORT_CAPACITY_LOW, -soh);
			snprintf(f->detail, sizeof(f->detail), "measured SoH "
			    "%.1f %% (%.3g of %.3g Ah), below %g %%", soh,
			    x[C_CEND], rated, r->c.soh_min);
		} else if (cw_isnum(soh) && rated > 0 && x[C_HI] < 0 &&
		    x[C_SLOPE] < 0) {
			/* A sure fade: the whole Sen interval below zero. */
			rate = -100 * x[C_SLOPE] / rated;
			days = (soh - r->c.soh_min) / rate;
			if (days <= r->c.horizon_d) {
				field_date(r, d, C_LAST, days, a);
				f = add(r, d, REPORT_CAPACITY_FADING, -days);
				snprintf(f->detail, sizeof(f->detail),
				    "measured SoH %.1f %%, losing %.2f points "
				    "per 30 days (Sen interval %.2f to %.2f): "
				    "%g %% by %s, in %.0f days", soh,
				    30 * rate, -3000 * x[C_HI] / rated,
				    -3000 * x[C_LO] / rated, r->c.soh_min, a,
				    days);
			}
		}
	}
	if ((d->have & (1u << K_DCIR)) && x[D_RSTART] > 0 &&
	    cw_isnum(x[D_REND])) {
		double g = 100 * (x[D_REND] - x[D_RSTART]) / x[D_RSTART];

		if (cw_isnum(x[D_GROWTH]))
			g = x[D_GROWTH];
		field_date(r, d, D_FIRST, 0, a);
		if (g >= r->c.growth_max) {
			f = add(r, d, REPORT_RESISTANCE_HIGH, g);
			snprintf(f->detail, sizeof(f->detail), "resistance "
			    "%+.1f %% since %s (%.4g to %.4g ohm at the "
			    "reference temperature), at or above %+g %%", g,
			    a, x[D_RSTART], x[D_REND], r->c.growth_max);
		} else if (x[D_LO] > 0 && x[D_SLOPE] > 0) {
			/* A sure growth: the whole Sen interval above zero. */
			char b[11];

			target = x[D_RSTART] * (1 + r->c.growth_max / 100);
			days = (target - x[D_REND]) / x[D_SLOPE];
			if (days <= r->c.horizon_d) {
				field_date(r, d, D_LAST, days, b);
				f = add(r, d, REPORT_RESISTANCE_RISING, -days);
				snprintf(f->detail, sizeof(f->detail),
				    "resistance %+.1f %% since %s, %+.2f %% "
				    "per 30 days (Sen interval %+.2f to "
				    "%+.2f): %+g %% by %s, in %.0f days", g, a,
				    3000 * x[D_SLOPE] / x[D_RSTART],
				    3000 * x[D_LO] / x[D_RSTART],
				    3000 * x[D_HI] / x[D_RSTART],
				    r->c.growth_max, b, days);
			}
		}
	}
}

int
report_cmp(const struct report_finding *a, const struct report_finding *b,
    const char *name_a, const char *name_b)
{
	int ta = report_reason_tier(a->reason);
	int tb = report_reason_tier(b->reason);

	if (ta != tb)
		return ta < tb ? -1 : 1;
	if (a->reason != b->reason)
		return a->reason < b->reason ? -1 : 1;
	if (a->mag != b->mag)
		return a->mag > b->mag ? -1 : 1;
	return strcmp(name_a, name_b);
}

static int
cmp_found(const void *pa, const void *pb)
{
	const struct report_finding *a = pa, *b = pb;

	return report_cmp(a, b, ((const struct rdev *)a->dev)->e.name,
	    ((const struct rdev *)b->dev)->e.name);
}

static int
cmp_ranked(const void *pa, const void *pb)
{
	const struct report_finding *a = pa, *b = pb;

	if (a->rank != b->rank)
		return a->rank < b->rank ? -1 : 1;
	return cmp_found(pa, pb);
}

size_t
report_rank(struct report *r)
{
	size_t i, n = devtab_count(r->devs);
	struct rdev *d;

	r->nf = 0;
	r->first = r->last = 0;
	for (i = 0; i < n; i++) {
		d = devtab_at(r->devs, i);
		d->rank = 0;
		find_pack(r, d);
		find_projection(r, d);
		/* The span of the logs, from the tools that read them all. */
		for (int k = 0; k < F_N; k++) {
			if (field_def[k].type != 't' || !cw_isnum(d->x[k]) ||
			    !(d->have & (1u << field_def[k].kind)))
				continue;
			if (field_def[k].kind == K_DCIR ||
			    field_def[k].kind == K_CAPACITY)
				continue;
			if (r->first == 0 || d->t[k] < r->first)
				r->first = d->t[k];
			if (r->last == 0 || d->t[k] > r->last)
				r->last = d->t[k];
		}
	}
	if (r->nf > 1)
		qsort(r->f, r->nf, sizeof(*r->f), cmp_found);
	r->npacks = 0;
	for (i = 0; i < r->nf; i++) {
		d = (struct rdev *)(uintptr_t)r->f[i].dev;
		if (d->rank == 0)
			d->rank = ++r->npacks;
		r->f[i].rank = d->rank;
	}
	if (r->nf > 1)
		qsort(r->f, r->nf, sizeof(*r->f), cmp_ranked);
	return r->npacks;
}

const struct report_finding *
report_findings(const struct report *r, size_t *nfound)
{
	*nfound = r->nf;
	return r->f;
}

/* Is finding F listed under --top? */
static int
shown(const struct report *r, const struct report_finding *f)
{
	return r->c.top == 0 || f->rank <= (size_t)r->c.top;
}

static void
write_footer(FILE *fp)
{
	fputs("\n"
"These tools advise; they are not a safety system.  Charging a lithium-ion\n"
"cell below its minimum temperature can plate lithium; charging or holding\n"
"it hot, or outside its voltage window, can swell or ignite it.  Take a\n"
"pack charged where no charging is allowed, or one swollen, hot or damaged,\n"
"out of service as its maker and the local rules direct, and check the\n"
"charger that did it.  The cell maker's data sheet, local codes and\n"
"licensed practice take precedence over these thresholds.\n", fp);
}

static void
write_text(struct report *r, FILE *fp)
{
	const struct rdev *d;
	const char *site;
	char a[11], b[11], tz[16];
	size_t i, last = 0, nshown = 0;

	tz_name(r->c.tz_s, tz);
	date_of(r, r->first, a);
	date_of(r, r->last, b);
	fprintf(fp, "Attention: %zu of %zu packs", r->npacks,
	    devtab_count(r->devs));
	if (r->first != 0)
		fprintf(fp, ", logs %s to %s", a, b);
	fprintf(fp, " (dates %s)\n", tz);
	fputs("Most urgent first: charging where none is allowed and the "
	    "cells' voltage\nwindow, then charging outside the protocol, then "
	    "measured capacity and\nresistance, then the modelled life.\n",
	    fp);
	for (i = 0; r->have_since && i < r->nf; i++)
		if (r->f[i].isnew && shown(r, &r->f[i])) {
			fputs("[new]: not in the earlier report.\n", fp);
			break;
		}
	for (i = 0; i < r->nf; i++) {
		const struct report_finding *f = &r->f[i];

		if (!shown(r, f))
			continue;
		d = f->dev;
		if (f->rank != last) {
			last = f->rank;
			nshown++;
			site = site_of(r, d);
			fprintf(fp, "\n%3zu. %.*s%s%s%s\n", f->rank,
			    (int)d->e.namelen, d->e.name, *site ? " at " : "",
			    site, "");
		}
		fprintf(fp, "     %s: %s%s\n", reason_def[f->reason].name,
		    f->detail, r->have_since && f->isnew ? " [new]" : "");
		/* Context the engineer asks next: top-off while held. */
		if ((i + 1 == r->nf || r->f[i + 1].rank != f->rank) &&
		    (d->have & (1u << K_TOPOFF)) &&
		    d->x[O_PER_DAY] >= r->c.topoff_day)
			fprintf(fp, "     also: %.0f top-off micro-cycles a "
			    "day while held near full\n", d->x[O_PER_DAY]);
	}
	if (nshown < r->npacks)
		fprintf(fp, "\n%zu more packs need attention (not shown: "
		    "--top %ld).\n", r->npacks - nshown, r->c.top);
	write_footer(fp);
}

/*
 * The groups of --by in the order of their most urgent pack, into
 * GROUPS (a new array of NG names; free() it).
 */
static const char **
groups(struct report *r, size_t *ng)
{
	const char **g = cw_malloc((r->nf + 1) * sizeof(*g));
	size_t i, k, n = 0;

	for (i = 0; i < r->nf; i++) {
		const char *name = group_of(r, r->f[i].dev);

		for (k = 0; k < n && strcmp(g[k], name) != 0; k++)
			continue;
		if (k == n)
			g[n++] = name;
	}
	*ng = n;
	return g;
}

/*
 * Reason REASON in group G: the packs (a space-separated list in r->buf),
 * how many, how many new.  0 when none.
 */
static size_t
group_reason(struct report *r, const char *g, int reason, size_t *nnew)
{
	size_t i, n = 0;

	buf_reset(r);
	*nnew = 0;
	for (i = 0; i < r->nf; i++) {
		const struct report_finding *f = &r->f[i];
		const struct rdev *d = f->dev;

		if (f->reason != reason || strcmp(group_of(r, d), g) != 0)
			continue;
		if (n++ > 0)
			buf_add(r, " ", 1);
		buf_add(r, d->e.name, d->e.namelen);
		*nnew += f->isnew;
	}
	return n;
}

/* Packs of group G in the list. */
static size_t
group_packs(const struct report *r, const char *g)
{
	size_t i, n = 0, last = 0;

	for (i = 0; i < r->nf; i++)
		if (r->f[i].rank != last &&
		    strcmp(group_of(r, r->f[i].dev), g) == 0) {
			last = r->f[i].rank;
			n++;
		}
	return n;
}

static const char *
by_name(const struct report *r)
{
	return r->c.by == REPORT_BY_MODEL ? "model" : "site";
}

static void
write_text_by(struct report *r, FILE *fp)
{
	const char **g;
	size_t ng, k, n, nnew, np;
	int reason;

	g = groups(r, &ng);
	fprintf(fp, "Attention by %s: %zu of %zu packs, in %zu %s%s\n",
	    by_name(r), r->npacks, devtab_count(r->devs), ng, by_name(r),
	    ng == 1 ? "" : "s");
	for (k = 0; k < ng && (r->c.top == 0 || k < (size_t)r->c.top); k++) {
		np = group_packs(r, g[k]);
		fprintf(fp, "\n%3zu. %s: %zu pack%s\n", k + 1,
		    *g[k] ? g[k] : "(none given)", np, np == 1 ? "" : "s");
		for (reason = 0; reason < REPORT_NREASON; reason++) {
			n = group_reason(r, g[k], reason, &nnew);
			if (n == 0)
				continue;
			fprintf(fp, "     %s: %zu (%s)",
			    reason_def[reason].name, n, r->buf);
			if (r->have_since && nnew > 0)
				fprintf(fp, " [%zu new]", nnew);
			fputc('\n', fp);
		}
	}
	if (k < ng)
		fprintf(fp, "\n%zu more %ss (not shown: --top %ld).\n", ng - k,
		    by_name(r), r->c.top);
	free(g);
	write_footer(fp);
}

static void
write_csv(struct report *r, struct csvout *w)
{
	size_t i;

	csvout_header(w, "rank,device,site,reason,detail,new,tier");
	for (i = 0; i < r->nf; i++) {
		const struct report_finding *f = &r->f[i];
		const struct rdev *d = f->dev;

		if (!shown(r, f))
			continue;
		csvout_int(w, (long long)f->rank);
		csvout_strn(w, d->e.name, d->e.namelen);
		csvout_str(w, site_of(r, d));
		csvout_str(w, reason_def[f->reason].name);
		csvout_str(w, f->detail);
		csvout_int(w, f->isnew);
		csvout_int(w, reason_def[f->reason].tier);
		csvout_endrow(w);
	}
}

static void
write_csv_by(struct report *r, struct csvout *w)
{
	const char **g;
	size_t ng, k, n, nnew;
	int reason;

	g = groups(r, &ng);
	csvout_header(w, r->c.by == REPORT_BY_MODEL ?
	    "rank,model,reason,packs,devices,new,tier" :
	    "rank,site,reason,packs,devices,new,tier");
	for (k = 0; k < ng && (r->c.top == 0 || k < (size_t)r->c.top); k++)
		for (reason = 0; reason < REPORT_NREASON; reason++) {
			n = group_reason(r, g[k], reason, &nnew);
			if (n == 0)
				continue;
			csvout_int(w, (long long)(k + 1));
			csvout_str(w, g[k]);
			csvout_str(w, reason_def[reason].name);
			csvout_int(w, (long long)n);
			csvout_str(w, r->buf);
			csvout_int(w, (long long)nnew);
			csvout_int(w, reason_def[reason].tier);
			csvout_endrow(w);
		}
	free(g);
}

int
report_write(struct report *r, FILE *fp)
{
	struct csvout w;
	int rc;

	if (r->c.csv) {
		csvout_init(&w, fp);
		if (r->c.by != REPORT_BY_PACK)
			write_csv_by(r, &w);
		else
			write_csv(r, &w);
		rc = csvout_flush(&w);
		csvout_free(&w);
		return rc;
	}
	/* A healthy fleet: an empty report, so cron has nothing to mail. */
	if (r->npacks > 0) {
		if (r->c.by != REPORT_BY_PACK)
			write_text_by(r, fp);
		else
			write_text(r, fp);
	}
	return ferror(fp) ? -1 : 0;
}

void
report_free(struct report *r)
{
	if (r == NULL)
		return;
	devtab_free(r->devs);
	devtab_free(r->since);
	free(r->f);
	free(r->buf);
	free(r);
}
