/*
 * cw-synth: an invented e-bike fleet's raw gauge logs, with the truth.
 */
#include <errno.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

#include "cw.h"
#include "opt.h"
#include "optab.h"
#include "synth.h"
#include "ts.h"

enum {
	OPT_AGING = OPTAB_LONG, OPT_CHARGE_SIGN, OPT_DOCKS, OPT_INCIDENTS,
	OPT_MIX, OPT_TZ
};

/* Where an option of the table is stored: a member of synth_conf. */
#define C(m)	offsetof(struct synth_conf, m)

static const struct optab opts[] = {
	{ "aging", 0, "factor", "multiply every growth and fade rate", "1",
	    OPT_AGING,
	    OPTAB_NUM, C(aging), 0, 1000 },
	{ "charge-sign", 0, "sign", "how the raw logs count charging "
	    "current: positive or negative in every format (default: each "
	    "format's own, a negative, b positive)", NULL, OPT_CHARGE_SIGN },
	{ "days", 'd', "days", "days", "7", 0,
	    OPTAB_LONGINT, C(ndays), 1, 3660 },
	{ "devices", 'n', "devices", "packs", "10", 0,
	    OPTAB_LONGINT, C(ndev), 1, 1000000 },
	{ "docks", 0, NULL, "a dock column in the raw logs (depot, dock-01 .. "
	    "dock-07, empty when away), and packs hop between docks (dock-07 "
	    "has no cut-off; without it each pack stays at its own dock, no "
	    "column)", NULL, OPT_DOCKS,
	    OPTAB_FLAG, C(docks), 0, 0 },
	{ "faults", 'F', "faults", "none, the default rates, or "
	    "name=rate,... for dup, "
	    "late, stale, trunc, sentinel (per row), gap, jump (per device "
	    "and day), header (per file); 0 disables one", NULL, 0 },
	{ "format", 'f', "format", "a (epoch ms, mV, mA, 0.1 K), b (local "
	    "time, V, A, degrees F, ';' and decimal comma) or both", "a", 0 },
	{ "incidents", 0, "n", "give n packs each of the four incidents: a "
	    "fast charger without JEITA rules in the cold, one in a hot "
	    "cabinet, a pack stored flat, a charger set to 4.30 V per cell",
	    "0", OPT_INCIDENTS,
	    OPTAB_LONGINT, C(incidents), 0, 250000 },
	{ "level", 'z', "level", "gzip level 0..9", "1", 0,
	    OPTAB_INT, C(level), 0, 9 },
	{ "mix", 0, "deep,topup,idle,nocutoff", "weights of the profiles "
	    "deep-depot, topup-dock, idle-dock, topup-nocutoff", "3,3,3,1",
	    OPT_MIX },
	{ "outdir", 'o', "dir", "write the files there (default the current "
	    "folder), made if missing", NULL, 0 },
	{ "period", 'p', "period", "sampling period, whole seconds dividing "
	    "a day", "10 s", 0 },
	{ "seed", 's', "seed", "random seed", "1", 0 },
	{ "start", 'S', "date", "first local day, YYYY-MM-DD", "2026-01-12",
	    0 },
	{ "tz", 0, "+hh:mm", "the fleet's local time offset", "+01:00",
	    OPT_TZ },
	OPTAB_END
};

static const struct optool tool = {
	"cw-synth", NULL,
	"Simulate an invented bike-share fleet of 10-cell 14 Ah e-bike packs\n"
	"and write its raw gauge logs, one gzipped file per local day, with\n"
	"the truth that was injected beside them.\n",
	NULL,
	opts,
	"print what was written to stderr"
};

static uint64_t seed_arg(const char *);
static long date_arg(const char *);
static long period_arg(const char *);
static unsigned format_arg(const char *);
static void outdir_prepare(const char *);

/* A seed: a decimal number from 0 to 2^64 - 1. */
static uint64_t
seed_arg(const char *s)
{
	unsigned long long x;
	char *end;

	errno = 0;
	if (*s < '0' || *s > '9')
		cw_usage_error("--seed: '%s' is not a whole number", s);
	x = strtoull(s, &end, 10);
	if (errno != 0 || *end != '\0')
		cw_usage_error("--seed: '%s' is not a whole number from 0 to "
		    "18446744073709551615", s);
	return (uint64_t)x;
}

/* A date YYYY-MM-DD: days since 1970-01-01. */
static long
date_arg(const char *s)
{
	char buf[32];
	cw_time t;

	if (strlen(s) != 10 || s[4] != '-' || s[7] != '-')
		cw_usage_error("--start: '%s' is not a date YYYY-MM-DD", s);
	memcpy(buf, s, 10);
	memcpy(buf + 10, "T00:00:00Z", 11);
	if (ts_parse(buf, 20, TS_ISO, 0, &t) < 0 || t < 0)
		cw_usage_error("--start: '%s' is not a date from 1970 on", s);
	return (long)(t / (86400 * CW_US_PER_S));
}

/* A sampling period: whole seconds that divide a day. */
static long
period_arg(const char *s)
{
	cw_time us = opt_dur_arg("--period", s, 0);
	long p = (long)(us / CW_US_PER_S);

	if (us % CW_US_PER_S != 0 || p < 1 || p > 3600 || 86400 % p != 0)
		cw_usage_error("--period: '%s' must be whole seconds from 1 to "
		    "3600 that divide a day (1, 2, 5, 10, 15, 30, 60, ...)", s);
	return p;
}

static unsigned
format_arg(const char *s)
{
	if (strcmp(s, "a") == 0 || strcmp(s, "A") == 0)
		return SYNTH_FMT_A;
	if (strcmp(s, "b") == 0 || strcmp(s, "B") == 0)
		return SYNTH_FMT_B;
	if (strcmp(s, "both") == 0)
		return SYNTH_FMT_A | SYNTH_FMT_B;
	cw_usage_error("--format: '%s' is not a, b or both", s);
}

/* The output folder exists when this returns; one level is made. */
static void
outdir_prepare(const char *dir)
{
	struct stat st;

	if (stat(dir, &st) == 0) {
		if (!S_ISDIR(st.st_mode))
			cw_die(CW_EXIT_DATA, "%s: not a folder", dir);
		return;
	}
	if (mkdir(dir, 0777) != 0)
		cw_die(CW_EXIT_DATA, "%s: cannot make the folder: %s", dir,
		    strerror(errno));
}

int
main(int argc, char *argv[])
{
	struct synth_conf c;
	struct synth_stats st;
	const char *err;
	double sum;
	long tz;
	int ch, k;

	synth_conf_default(&c);
	while ((ch = optab_getopt(&tool, &c, argc, argv)) != -1) {
		switch (ch) {
		case 'F':
			if (synth_faults_parse(optarg, c.rate, &err) < 0)
				cw_usage_error("--faults: %s: '%s'", err,
				    optarg);
			break;
		case 'S':
			c.start_day = date_arg(optarg);
			break;
		case 'f':
			c.formats = format_arg(optarg);
			break;
		case 'o':
			c.outdir = optarg;
			break;
		case 'p':
			c.period_s = period_arg(optarg);
			break;
		case 's':
			c.seed = seed_arg(optarg);
			break;
		case OPT_CHARGE_SIGN:
			if (strcmp(optarg, "positive") == 0)
				c.charge_sign = 1;
			else if (strcmp(optarg, "negative") == 0)
				c.charge_sign = -1;
			else
				cw_usage_error("--charge-sign: '%s' is not "
				    "positive or negative", optarg);
			break;
		case OPT_MIX:
			opt_list_arg("--mix", optarg, c.mix, SYNTH_NPROFILE, 0,
			    0);
			sum = 0;
			for (k = 0; k < SYNTH_NPROFILE; k++) {
				if (c.mix[k] < 0)
					cw_usage_error("--mix: weights must not "
					    "be negative");
				sum += c.mix[k];
			}
			if (sum <= 0)
				cw_usage_error("--mix: at least one weight "
				    "must be positive");
			break;
		case OPT_TZ:
			if (ts_parse_offset(optarg, &tz) < 0 || tz <= -86400 ||
			    tz >= 86400)
				cw_usage_error("--tz: '%s' is not an offset "
				    "+hh:mm", optarg);
			c.tz_s = tz;
			break;
		}
	}
	if (optind < argc)
		cw_usage_error("unexpected argument '%s'", argv[optind]);
	if (4 * c.incidents > c.ndev)
		cw_usage_error("--incidents %ld needs at least %ld devices",
		    c.incidents, 4 * c.incidents);
	outdir_prepare(c.outdir);
	if (cw_verbose && c.rate[SYNTH_F_LATE] > 0 && c.period_s > 60)
		cw_warn("late rows need a period of 60 s or less; none are "
		    "injected");
	synth_write(&c, &st);
	if (cw_verbose)
		cw_warn("%ld devices, %ld days: %lu rows sampled, %lu files, "
		    "%lu lines per format, %llu bytes before compression",
		    c.ndev, c.ndays, st.rows, st.files, st.lines, st.bytes);
	return CW_EXIT_OK;
}
