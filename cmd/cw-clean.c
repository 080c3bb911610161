/*
 * cw-clean: raw gauge logs in, the cellwear sample stream out.
 */
#include <getopt.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>

#include "clean.h"
#include "csvout.h"
#include "cw.h"
#include "gzsrc.h"
#include "opt.h"
#include "outf.h"
#include "ts.h"

enum {
	OPT_BOUNDS = 256, OPT_CELLS, OPT_CHARGE_NEGATIVE, OPT_CHARGE_SIGN,
	OPT_DECIMAL_COMMA,
	OPT_DEVICE, OPT_FULL_VOLTAGE, OPT_GROWING, OPT_KEEP, OPT_MAX_GAP,
	OPT_MAX_JUMP, OPT_MAX_REJECT, OPT_MAX_TIME, OPT_NOW, OPT_REJECTS,
	OPT_REORDER, OPT_SENTINEL, OPT_SKIP_JUNK, OPT_SOC_FROM_CHARGE,
	OPT_STEP, OPT_TZ,
	OPT_VERSION
};

static const struct option longopts[] = {
	{ "bounds", required_argument, NULL, OPT_BOUNDS },
	{ "cells", required_argument, NULL, OPT_CELLS },
	{ "charge-negative", no_argument, NULL, OPT_CHARGE_NEGATIVE },
	{ "charge-sign", required_argument, NULL, OPT_CHARGE_SIGN },
	{ "columns", required_argument, NULL, 'c' },
	{ "decimal-comma", no_argument, NULL, OPT_DECIMAL_COMMA },
	{ "delimiter", required_argument, NULL, 'd' },
	{ "device", required_argument, NULL, OPT_DEVICE },
	{ "full-voltage", required_argument, NULL, OPT_FULL_VOLTAGE },
	{ "growing", no_argument, NULL, OPT_GROWING },
	{ "help", no_argument, NULL, 'h' },
	{ "keep", required_argument, NULL, OPT_KEEP },
	{ "max-gap", required_argument, NULL, OPT_MAX_GAP },
	{ "max-jump", required_argument, NULL, OPT_MAX_JUMP },
	{ "max-reject", required_argument, NULL, OPT_MAX_REJECT },
	{ "max-time", required_argument, NULL, OPT_MAX_TIME },
	{ "now", no_argument, NULL, OPT_NOW },
	{ "output", required_argument, NULL, 'o' },
	{ "rejects", required_argument, NULL, OPT_REJECTS },
	{ "reorder", required_argument, NULL, OPT_REORDER },
	{ "sentinel", required_argument, NULL, OPT_SENTINEL },
	{ "skip-junk", no_argument, NULL, OPT_SKIP_JUNK },
	{ "soc-from-charge", required_argument, NULL, OPT_SOC_FROM_CHARGE },
	{ "step", required_argument, NULL, OPT_STEP },
	{ "tz", required_argument, NULL, OPT_TZ },
	{ "verbose", no_argument, NULL, 'v' },
	{ "version", no_argument, NULL, OPT_VERSION },
	{ NULL, 0, NULL, 0 }
};

static void usage(FILE *, int);
static void bounds_arg(struct clean_conf *, const char *, int *);
static char delim_arg(const char *);
static void sentinel_arg(struct clean_conf *, const char *);
static void report(const struct clean_stats *);

static void
usage(FILE *fp, int status)
{
	fprintf(fp,
"usage: cw-clean [-hv] [-c spec] [-d delim] [-o file] [--bounds field=lo:hi]\n"
"                [--cells n] [--charge-negative] [--charge-sign sign]\n"
"                [--decimal-comma]\n"
"                [--device name | @file] [--full-voltage volts] [--growing]\n"
"                [--keep col[,col...]]\n"
"                [--max-gap duration] [--max-jump duration]\n"
"                [--max-reject fraction] [--max-time time | --now]\n"
"                [--rejects file] [--reorder duration] [--sentinel list]\n"
"                [--skip-junk] [--soc-from-charge ah] [--step duration]\n"
"                [--tz +hh:mm]\n"
"                [file ...]\n"
"\n"
"Clean raw battery gauge logs (plain or gzip) into the sample stream\n"
"device,time,voltage_v,current_a,temp_c,soc_pct (then the --keep columns).\n"
"\n"
"  -c, --columns spec      field=header[:unit],... for device, time (iso|s|ms|us),\n"
"                          date (a date column beside a time of day),\n"
"                          voltage (V|mV), current (A|mA), temp (C|F|K|dK|dC),\n"
"                          soc (pct|frac); other fields are found by name\n"
"  -d, --delimiter c       field delimiter: ',', ';', '\\t' or 'tab' (default: the\n"
"                          one of , ; tab | the header holds most)\n"
"      --decimal-comma     numbers use ',' as the decimal mark (default: '.',\n"
"                          or either mark when the delimiter is not ',')\n"
"      --device name       device name for logs without a device column;\n"
"                          @file takes each file's base name without the\n"
"                          extensions .gz .bz2 .xz .zst .z, .csv .tsv .txt .log\n"
"                          .dat and a date .YYYY-MM-DD or .YYYYMMDD\n"
"      --charge-negative   the log counts charging current as negative\n"
"      --charge-sign sign  auto, positive or negative: the sign of charging\n"
"                          current in the log (default auto: per file)\n"
"      --keep col,...      raw columns (at most 8) carried after soc_pct under\n"
"                          their own names, values as read; with --step the\n"
"                          last raw row's in the interval (default none)\n"
"      --tz +hh:mm         offset of local times without a zone (default UTC)\n"
"      --cells n           series cells per pack (voltage bounds 1.5..5.0 V per cell)\n"
"      --bounds f=lo:hi    plausible range of voltage, current, temp or soc\n"
"      --reorder duration  put back rows late by up to this (default 60s)\n"
"      --sentinel list     raw values meaning no reading, rejected as\n"
"                          out-of-range (default -32768,65535; or none)\n"
"      --skip-junk         skip bytes after a gzip member that are not one\n"
"                          (counted on stderr; without it: exit 1)\n"
"      --step duration     resample each device onto this grid\n"
"      --max-gap duration  never interpolate across a longer gap (default 15m)\n"
"      --max-time time     reject rows stamped after time (ISO 8601 or epoch\n"
"                          seconds) as future (default: no fixed bound)\n"
"      --now               --max-time of the moment the run starts\n"
"      --max-jump duration reject as future a row more than this past its\n"
"                          device's newest time (a new device: the run's)\n"
"                          unless the device's next row confirms the gap\n"
"                          (default 7d; 0: off)\n"
"      --growing           the files may still be written to: a last line\n"
"                          without a line end is held back and counted\n"
"                          (default: taken, with a warning)\n"
"      --soc-from-charge ah  derive SoC by coulomb counting for a pack of ah\n"
"      --full-voltage v    full-charge voltage for --soc-from-charge\n"
"                          (default 4.15 V per cell)\n"
"      --rejects file      write every rejected line there with its reason\n"
"      --max-reject f      fail (exit 1) when more than this fraction of\n"
"                          lines is rejected (default 0.5)\n"
"  -o, --output file       write to file atomically instead of stdout\n"
"  -v, --verbose           print counts to stderr\n"
"  -h, --help              print this help; --version prints the version\n");
	exit(status);
}

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

int
main(int argc, char *argv[])
{
	struct clean_conf c;
	struct clean_stats st;
	struct csvout out, rej;
	struct outf *of, *rf = NULL;
	const char *outpath = NULL, *rejpath = NULL, *err;
	double max_reject = 0.5, cells = 1, full_v = 0;
	unsigned long nrej, nlines;
	int ch, rc, set[CM_NFIELD] = { 0 };

	cw_setprog("cw-clean");
	clean_conf_default(&c);
	opterr = 0;
	while ((ch = getopt_long(argc, argv, ":c:d:ho:v", longopts, NULL)) !=
	    -1) {
		switch (ch) {
		case 'c':
			if (colmap_parse_spec(optarg, &c.spec, &err) < 0)
				cw_usage_error("--columns: %s: '%s'", err,
				    optarg);
			break;
		case 'd':
			c.delim = delim_arg(optarg);
			break;
		case 'h':
			usage(stdout, CW_EXIT_OK);
			break;
		case 'o':
			outpath = optarg;
			break;
		case 'v':
			cw_verbose = 1;
			break;
		case OPT_BOUNDS:
			bounds_arg(&c, optarg, set);
			break;
		case OPT_CELLS:
			cells = (double)opt_long_arg("--cells", optarg, 1, 1000);
			break;
		case OPT_CHARGE_NEGATIVE:
			c.charge_sign = CLEAN_SIGN_NEGATIVE;
			break;
		case OPT_CHARGE_SIGN:
			if (strcmp(optarg, "auto") == 0)
				c.charge_sign = CLEAN_SIGN_AUTO;
			else if (strcmp(optarg, "positive") == 0)
				c.charge_sign = CLEAN_SIGN_POSITIVE;
			else if (strcmp(optarg, "negative") == 0)
				c.charge_sign = CLEAN_SIGN_NEGATIVE;
			else
				cw_usage_error("--charge-sign: '%s' is not "
				    "auto, positive or negative", optarg);
			break;
		case OPT_DECIMAL_COMMA:
			c.dec = ',';
			break;
		case OPT_DEVICE:
			if (strcmp(optarg, "@file") == 0)
				c.device_from_file = 1;
			else if (optarg[0] == '\0')
				cw_usage_error("--device: empty name");
			else
				c.device = optarg;
			break;
		case OPT_FULL_VOLTAGE:
			full_v = opt_num_arg("--full-voltage", optarg, 0.1, 1e4);
			break;
		case OPT_KEEP:
			if (clean_keep_parse(&c, optarg, &err) < 0)
				cw_usage_error("--keep: %s: '%s'", err, optarg);
			break;
		case OPT_GROWING:
			c.growing = 1;
			break;
		case OPT_MAX_GAP:
			c.max_gap = opt_dur_arg("--max-gap", optarg, 0);
			break;
		case OPT_MAX_JUMP:
			c.max_jump = opt_dur_arg("--max-jump", optarg, 1);
			break;
		case OPT_MAX_TIME:
			if (ts_parse(optarg, strlen(optarg), TS_AUTO, 0,
			    &c.max_time) < 0)
				cw_usage_error("--max-time: '%s' is not an ISO "
				    "8601 time or epoch seconds", optarg);
			break;
		case OPT_NOW:
			c.max_time = (cw_time)time(NULL) * CW_US_PER_S;
			break;
		case OPT_MAX_REJECT:
			max_reject = opt_num_arg("--max-reject", optarg, 0, 1);
			break;
		case OPT_REJECTS:
			rejpath = optarg;
			break;
		case OPT_REORDER:
			c.reorder = opt_dur_arg("--reorder", optarg, 1);
			break;
		case OPT_SENTINEL:
			sentinel_arg(&c, optarg);
			break;
		case OPT_SKIP_JUNK:
			gzsrc_skip_junk = 1;
			break;
		case OPT_SOC_FROM_CHARGE:
			c.soc_ah = opt_num_arg("--soc-from-charge", optarg,
			    1e-6, 1e7);
			break;
		case OPT_STEP:
			c.step = opt_dur_arg("--step", optarg, 0);
			break;
		case OPT_TZ:
			if (ts_parse_offset(optarg, &c.tz_s) < 0)
				cw_usage_error("--tz: '%s' is not an offset "
				    "like +01:00 or -0530", optarg);
			break;
		case OPT_VERSION:
			cw_print_version();
			break;
		default:
			opt_getopt_fail(ch, argv);
		}
	}
	argc -= optind;
	argv += optind;
	if (!set[CM_VOLTAGE]) {
		c.lo[CM_VOLTAGE] *= cells;
		c.hi[CM_VOLTAGE] *= cells;
	}
	c.full_v = full_v > 0 ? full_v : 4.15 * cells;
	if (c.device != NULL && c.spec.header[CM_DEVICE] != NULL)
		cw_usage_error("--device and -c device= exclude each other");
	if (c.dec == ',' && (c.delim == ',' || c.delim == '\0'))
		cw_usage_error("--decimal-comma needs another delimiter (-d ';')");

	of = outf_open(outpath);
	csvout_init(&out, outf_fp(of));
	if (rejpath != NULL) {
		rf = outf_open(rejpath);
		csvout_init(&rej, outf_fp(rf));
	}
	rc = clean_run(&c, argv, argc, &out, rf ? &rej : NULL, &st);
	if (cw_verbose)
		report(&st);
	/* Empty lines are rejected and counted, but hold no data to lose. */
	nrej = st.rejected - st.reason[CR_EMPTY];
	nlines = st.lines - st.reason[CR_EMPTY];
	if (rc == 0 && nlines > 0 &&
	    (double)nrej > max_reject * (double)nlines) {
		cw_warn("%lu of %lu data lines rejected, more than "
		    "--max-reject %g%s", nrej, nlines, max_reject,
		    st.reason[CR_RANGE] > nrej / 2 ? " (mostly out of "
		    "range: are the units and --cells right?)" : "");
		rc = CW_EXIT_DATA;
	}
	if (csvout_flush(&out) < 0) {
		cw_warn("write error: %s", outpath ? outpath : "standard output");
		rc = CW_EXIT_DATA;
	}
	if (rf != NULL && csvout_flush(&rej) < 0) {
		cw_warn("%s: write error", rejpath);
		rc = CW_EXIT_DATA;
	}
	csvout_free(&out);
	if (rf != NULL)
		csvout_free(&rej);
	/* A failed run leaves earlier output files as they were. */
	if (rc == 0) {
		if (outf_commit(of) < 0)
			rc = CW_EXIT_DATA;
		if (rf != NULL && outf_commit(rf) < 0)
			rc = CW_EXIT_DATA;
	} else if (rf != NULL) {
		/* The rejects explain the failure: keep them. */
		outf_commit(rf);
		if (outpath == NULL)
			outf_commit(of);
	}
	return rc;
}
