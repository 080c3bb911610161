/*
 * cw-clean: raw gauge logs in, the cellwear sample stream out.
 */
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "clean.h"
#include "csvout.h"
#include "cw.h"
#include "finish.h"
#include "gzsrc.h"
#include "opt.h"
#include "optab.h"
#include "outf.h"
#include "ts.h"

/* The options, before they become the engine's configuration. */
struct opts {
	struct clean_conf c;
	const char *outpath, *rejpath;
	double max_reject;	/* --max-reject */
	double cells;		/* --cells */
	double full_v;		/* --full-voltage, 0: 4.15 V per cell */
	int set[CM_NFIELD];	/* --bounds given for the field */
};

enum {
	OPT_BOUNDS = OPTAB_LONG, OPT_CELLS, OPT_CHARGE_NEGATIVE,
	OPT_CHARGE_SIGN, OPT_DECIMAL_COMMA, OPT_DEVICE, OPT_FULL_VOLTAGE,
	OPT_GROWING, OPT_KEEP, OPT_MAX_GAP, OPT_MAX_JUMP, OPT_MAX_REJECT,
	OPT_MAX_TIME, OPT_NOW, OPT_REJECTS, OPT_REORDER, OPT_SENTINEL,
	OPT_SKIP_JUNK, OPT_SOC_FROM_CHARGE, OPT_STEP, OPT_TZ
};

/* Where an option of the table is stored: a member of struct opts. */
#define O(m)	offsetof(struct opts, m)

static const struct optab opts[] = {
	{ "bounds", 0, "field=lo:hi", "plausible range of voltage, current, "
	    "temp or soc", NULL, OPT_BOUNDS },
	{ "columns", 'c', "spec", "field=header[:unit],... for device, time "
	    "(iso|s|ms|us), date (a date column beside a time of day), "
	    "voltage (V|mV), current (A|mA), temp (C|F|K|dK|dC), soc "
	    "(pct|frac); other fields are found by name", NULL, 0 },
	{ "cells", 0, "n", "series cells per pack (voltage bounds 1.5..5.0 V "
	    "per cell)", "1", OPT_CELLS },
	{ "charge-negative", 0, NULL, "the log counts charging current as "
	    "negative", NULL, OPT_CHARGE_NEGATIVE },
	{ "charge-sign", 0, "sign", "auto, positive or negative: the sign of "
	    "charging current in the log", "auto: per file",
	    OPT_CHARGE_SIGN },
	{ "delimiter", 'd', "delim", "field delimiter: ',', ';', '\\t' or "
	    "'tab' (unset: the one of , ; tab | the header holds most)", NULL,
	    0 },
	{ "decimal-comma", 0, NULL, "numbers use ',' as the decimal mark "
	    "(unset: '.', or either mark when the delimiter is not ',')",
	    NULL, OPT_DECIMAL_COMMA },
	{ "device", 0, "name|@file", "device name for logs without a device "
	    "column; @file takes each file's base name without the "
	    "extensions .gz .bz2 .xz .zst .z, .csv .tsv .txt .log .dat and a "
	    "date .YYYY-MM-DD or .YYYYMMDD", NULL, OPT_DEVICE },
	{ "full-voltage", 0, "volts", "full-charge voltage for "
	    "--soc-from-charge", "4.15 V per cell", OPT_FULL_VOLTAGE,
	    OPTAB_NUM, O(full_v), 0.1, 1e4 },
	{ "growing", 0, NULL, "the files may still be written to: a last "
	    "line without a line end is held back and counted (unset: taken, "
	    "with a warning)", NULL, OPT_GROWING,
	    OPTAB_FLAG, O(c.growing), 0, 0 },
	{ "keep", 0, "col[,col...]", "raw columns (at most 8) carried after "
	    "soc_pct under their own names, values as read; with --step the "
	    "last raw row's in the interval (none by default)", NULL,
	    OPT_KEEP },
	{ "max-gap", 0, "duration", "never interpolate across a longer gap",
	    "15m", OPT_MAX_GAP,
	    OPTAB_DUR, O(c.max_gap), 0, 0 },
	{ "max-jump", 0, "duration", "reject as future a row more than this "
	    "past its device's newest time (a new device: the run's) unless "
	    "the device's next row confirms the gap", "7d; 0: off",
	    OPT_MAX_JUMP,
	    OPTAB_DUR, O(c.max_jump), -1, 0 },
	{ "max-reject", 0, "fraction", "fail (exit 1) when more than this "
	    "fraction of lines is rejected", "0.5", OPT_MAX_REJECT,
	    OPTAB_NUM, O(max_reject), 0, 1 },
	{ "max-time", 0, "time", "reject rows stamped after time (ISO 8601 "
	    "or epoch seconds) as future (unset: no fixed bound)", NULL,
	    OPT_MAX_TIME },
	{ "now", 0, NULL, "--max-time of the moment the run starts", NULL,
	    OPT_NOW },
	{ "output", 'o', "file", "write to file atomically instead of stdout",
	    NULL, 0,
	    OPTAB_STR, O(outpath), 0, 0 },
	{ "rejects", 0, "file", "write every rejected line there with its "
	    "reason", NULL, OPT_REJECTS,
	    OPTAB_STR, O(rejpath), 0, 0 },
	{ "reorder", 0, "duration", "put back rows late by up to this", "60s",
	    OPT_REORDER,
	    OPTAB_DUR, O(c.reorder), -1, 0 },
	{ "sentinel", 0, "list", "raw values meaning no reading, rejected as "
	    "out-of-range", "-32768,65535; or none", OPT_SENTINEL },
	{ "skip-junk", 0, NULL, "skip bytes after a gzip member that are not "
	    "one (counted on stderr; without it: exit 1)", NULL,
	    OPT_SKIP_JUNK },
	{ "soc-from-charge", 0, "ah", "derive SoC by coulomb counting for a "
	    "pack of ah", NULL, OPT_SOC_FROM_CHARGE,
	    OPTAB_NUM, O(c.soc_ah), 1e-6, 1e7 },
	{ "step", 0, "duration", "resample each device onto this grid", NULL,
	    OPT_STEP,
	    OPTAB_DUR, O(c.step), 0, 0 },
	{ "tz", 0, "+hh:mm", "offset of local times without a zone", "UTC",
	    OPT_TZ },
	OPTAB_END
};

static const struct optool tool = {
	"cw-clean", "[file ...]",
	"Clean raw battery gauge logs (plain or gzip) into the sample stream\n"
	"device,time,voltage_v,current_a,temp_c,soc_pct (then the --keep\n"
	"columns).\n",
	OPTAB_DURATIONS,
	opts,
	"print counts to stderr"
};

static void bounds_arg(struct clean_conf *, const char *, int *);
static char delim_arg(const char *);
static void sentinel_arg(struct clean_conf *, const char *);
static void report(const struct clean_stats *);

static char
delim_arg(const char *s)
{
	if (strcmp(s, "\\t") == 0 || strcmp(s, "tab") == 0 ||
	    strcmp(s, "\t") == 0)
		return '\t';
	if (strlen(s) != 1 || s[0] == '"' || s[0] == '\n' || s[0] == '\r')
		cw_usage_error("--delimiter: '%s' is not a single delimiter "
		    "character", s);
	return s[0];
}

/* --sentinel v,v,... or none. */
static void
sentinel_arg(struct clean_conf *c, const char *s)
{
	char buf[256], *p, *q;

	c->nsentinel = 0;
	if (strcmp(s, "none") == 0)
		return;
	if (strlen(s) >= sizeof(buf))
		cw_usage_error("--sentinel: value too long");
	strcpy(buf, s);
	for (p = buf; p != NULL; p = q) {
		q = strchr(p, ',');
		if (q != NULL)
			*q++ = '\0';
		if (c->nsentinel == (int)(sizeof(c->sentinel) /
		    sizeof(c->sentinel[0])))
			cw_usage_error("--sentinel: at most 8 values");
		c->sentinel[c->nsentinel++] = opt_num_arg("--sentinel", p,
		    -1e300, 1e300);
	}
}

/* --bounds field=lo:hi; SET marks the fields given. */
static void
bounds_arg(struct clean_conf *c, const char *s, int *set)
{
	char buf[128], *eq, *colon;
	int f;
	double lo, hi;

	if (strlen(s) >= sizeof(buf))
		cw_usage_error("--bounds: value too long");
	strcpy(buf, s);
	eq = strchr(buf, '=');
	colon = eq != NULL ? strchr(eq + 1, ':') : NULL;
	if (eq == NULL || colon == NULL)
		cw_usage_error("--bounds: expected field=lo:hi, got '%s'", s);
	*eq = *colon = '\0';
	for (f = CM_VOLTAGE; f <= CM_SOC; f++)
		if (strcmp(buf, colmap_field_name[f]) == 0)
			break;
	if (f > CM_SOC)
		cw_usage_error("--bounds: unknown field '%s' (voltage, current, "
		    "temp, soc)", buf);
	if (f == CM_TEMP) {
		lo = opt_temp_arg("--bounds", eq + 1);
		hi = opt_temp_arg("--bounds", colon + 1);
	} else {
		lo = opt_num_arg("--bounds", eq + 1, -1e12, 1e12);
		hi = opt_num_arg("--bounds", colon + 1, -1e12, 1e12);
	}
	if (lo > hi)
		cw_usage_error("--bounds: %s low bound above high bound", buf);
	c->lo[f] = lo;
	c->hi[f] = hi;
	set[f] = 1;
}

static void
report(const struct clean_stats *st)
{
	char buf[512];
	size_t n = 0;
	int k;

	for (k = 0; k < CR_NREASON; k++)
		if (st->reason[k] > 0)
			n += (size_t)snprintf(buf + n, sizeof(buf) - n, "%s%s %lu",
			    n ? ", " : "", clean_reason_name[k], st->reason[k]);
	buf[n] = '\0';
	cw_warn("%lu data line%s: %lu accepted, %lu rejected%s%s%s", st->lines,
	    st->lines == 1 ? "" : "s",
	    st->accepted, st->rejected, n ? " (" : "", buf, n ? ")" : "");
	cw_warn("%lu row%s written for %lu device%s; %lu repeated header "
	    "line%s skipped", st->written, st->written == 1 ? "" : "s",
	    st->devices, st->devices == 1 ? "" : "s", st->header_repeats,
	    st->header_repeats == 1 ? "" : "s");
	if (st->unended > 0 || st->held > 0)
		cw_warn("last lines without a line end: %lu taken, %lu held "
		    "back (--growing)", st->unended, st->held);
}

/*
 * The options into O, checked; the index of the first operand.  Exits 2
 * on a usage error.
 */
static int
parse(struct opts *o, int argc, char *argv[])
{
	struct clean_conf *c = &o->c;
	const char *err;
	int ch;

	memset(o, 0, sizeof(*o));
	clean_conf_default(c);
	o->max_reject = 0.5;
	o->cells = 1;
	while ((ch = optab_getopt(&tool, o, argc, argv)) != -1) {
		switch (ch) {
		case 'c':
			if (colmap_parse_spec(optarg, &c->spec, &err) < 0)
				cw_usage_error("--columns: %s: '%s'", err,
				    optarg);
			break;
		case 'd':
			c->delim = delim_arg(optarg);
			break;
		case OPT_BOUNDS:
			bounds_arg(c, optarg, o->set);
			break;
		case OPT_CELLS:
			o->cells = (double)opt_long_arg("--cells", optarg, 1,
			    1000);
			break;
		case OPT_CHARGE_NEGATIVE:
			c->charge_sign = CLEAN_SIGN_NEGATIVE;
			break;
		case OPT_CHARGE_SIGN:
			if (strcmp(optarg, "auto") == 0)
				c->charge_sign = CLEAN_SIGN_AUTO;
			else if (strcmp(optarg, "positive") == 0)
				c->charge_sign = CLEAN_SIGN_POSITIVE;
			else if (strcmp(optarg, "negative") == 0)
				c->charge_sign = CLEAN_SIGN_NEGATIVE;
			else
				cw_usage_error("--charge-sign: '%s' is not "
				    "auto, positive or negative", optarg);
			break;
		case OPT_DECIMAL_COMMA:
			c->dec = ',';
			break;
		case OPT_DEVICE:
			if (strcmp(optarg, "@file") == 0)
				c->device_from_file = 1;
			else if (optarg[0] == '\0')
				cw_usage_error("--device: empty name");
			else
				c->device = optarg;
			break;
		case OPT_KEEP:
			if (clean_keep_parse(c, optarg, &err) < 0)
				cw_usage_error("--keep: %s: '%s'", err, optarg);
			break;
		case OPT_MAX_TIME:
			if (ts_parse(optarg, strlen(optarg), TS_AUTO, 0,
			    &c->max_time) < 0)
				cw_usage_error("--max-time: '%s' is not an ISO "
				    "8601 time or epoch seconds", optarg);
			break;
		case OPT_NOW:
			c->max_time = (cw_time)time(NULL) * CW_US_PER_S;
			break;
		case OPT_SENTINEL:
			sentinel_arg(c, optarg);
			break;
		case OPT_SKIP_JUNK:
			gzsrc_skip_junk = 1;
			break;
		case OPT_TZ:
			if (ts_parse_offset(optarg, &c->tz_s) < 0)
				cw_usage_error("--tz: '%s' is not an offset "
				    "like +01:00 or -0530", optarg);
			break;
		}
	}
	if (!o->set[CM_VOLTAGE]) {
		c->lo[CM_VOLTAGE] *= o->cells;
		c->hi[CM_VOLTAGE] *= o->cells;
	}
	c->full_v = o->full_v > 0 ? o->full_v : 4.15 * o->cells;
	if (c->device != NULL && c->spec.header[CM_DEVICE] != NULL)
		cw_usage_error("--device and -c device= exclude each other");
	if (c->dec == ',' && (c->delim == ',' || c->delim == '\0'))
		cw_usage_error("--decimal-comma needs another delimiter (-d ';')");
	return optind;
}

/*
 * More than --max-reject of the lines with data rejected: a run that
 * fails (with a hint when most were out of range).
 */
static int
too_many_rejects(const struct clean_stats *st, double max_reject)
{
	/* Empty lines are rejected and counted, but hold no data to lose. */
	unsigned long nrej = st->rejected - st->reason[CR_EMPTY];
	unsigned long nlines = st->lines - st->reason[CR_EMPTY];

	if (nlines == 0 || !((double)nrej > max_reject * (double)nlines))
		return 0;
	cw_warn("%lu of %lu data lines rejected, more than --max-reject "
	    "%g%s", nrej, nlines, max_reject, st->reason[CR_RANGE] > nrej / 2 ?
	    " (mostly out of range: are the units and --cells right?)" : "");
	return 1;
}

int
main(int argc, char *argv[])
{
	struct opts o;
	struct clean_stats st;
	struct csvout out, rej;
	struct outf *of, *rf = NULL;
	int k, rc, rrc;

	k = parse(&o, argc, argv);
	argc -= k;
	argv += k;
	of = outf_open(o.outpath);
	csvout_init(&out, outf_fp(of));
	if (o.rejpath != NULL) {
		rf = outf_open(o.rejpath);
		csvout_init(&rej, outf_fp(rf));
	}
	rc = clean_run(&o.c, argv, argc, &out, rf ? &rej : NULL, &st);
	if (cw_verbose)
		report(&st);
	if (rc == 0 && too_many_rejects(&st, o.max_reject))
		rc = CW_EXIT_DATA;
	/*
	 * A failed run leaves an earlier -o FILE as it was; the rejects
	 * explain the failure, so they are kept all the same.
	 */
	rrc = rf != NULL ? cw_finish(&rej, rf, o.rejpath, CW_EXIT_OK) : 0;
	rc = cw_finish(&out, of, o.outpath, rc != 0 ? rc : rrc);
	csvout_free(&out);
	if (rf != NULL)
		csvout_free(&rej);
	return rc;
}
