/*
 * cw-synth: an invented e-bike fleet's raw gauge logs, with the truth.
 */
#include <errno.h>
#include <getopt.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <sys/stat.h>

#include "cw.h"
#include "opt.h"
#include "synth.h"
#include "ts.h"

enum { OPT_AGING = 256, OPT_MIX, OPT_TZ, OPT_VERSION };

static const struct option longopts[] = {
	{ "aging", required_argument, NULL, OPT_AGING },
	{ "days", required_argument, NULL, 'd' },
	{ "devices", required_argument, NULL, 'n' },
	{ "faults", required_argument, NULL, 'F' },
	{ "format", required_argument, NULL, 'f' },
	{ "help", no_argument, NULL, 'h' },
	{ "level", required_argument, NULL, 'z' },
	{ "mix", required_argument, NULL, OPT_MIX },
	{ "outdir", required_argument, NULL, 'o' },
	{ "period", required_argument, NULL, 'p' },
	{ "seed", required_argument, NULL, 's' },
	{ "start", required_argument, NULL, 'S' },
	{ "tz", required_argument, NULL, OPT_TZ },
	{ "verbose", no_argument, NULL, 'v' },
	{ "version", no_argument, NULL, OPT_VERSION },
	{ NULL, 0, NULL, 0 }
};

static void usage(FILE *, int);
static uint64_t seed_arg(const char *);
static long date_arg(const char *);
static long period_arg(const char *);
static unsigned format_arg(const char *);
static void outdir_prepare(const char *);

static void
usage(FILE *fp, int status)
{
	fprintf(fp,
"usage: cw-synth [-hv] [-d days] [-F faults] [-f format] [-n devices]\n"
"                [-o dir] [-p period] [-S date] [-s seed] [-z level]\n"
"                [--aging factor] [--mix deep,topup,idle,nocutoff]\n"
"                [--tz +hh:mm]\n"
"\n"
"Simulate an invented bike-share fleet of 10-cell 14 Ah e-bike packs and\n"
"write its raw gauge logs, one gzipped file per local day, with the truth\n"
"that was injected beside them.\n"
"\n"
"  -n, --devices n     packs (default 10)\n"
"  -d, --days n        days (default 7)\n"
"  -S, --start date    first local day, YYYY-MM-DD (default 2026-01-12)\n"
"      --tz +hh:mm     the fleet's local time offset (default +01:00)\n"
"  -p, --period dur    sampling period, whole seconds dividing a day\n"
"                      (default 10s)\n"
"  -s, --seed n        random seed (default 1)\n"
"  -f, --format f      a (epoch ms, mV, mA, 0.1 K), b (local time, V, A,\n"
"                      degrees F, ';' and decimal comma) or both (default a)\n"
"  -F, --faults list   none, default, or name=rate,... for dup, late, stale,\n"
"                      trunc, sentinel (per row), gap, jump (per device and\n"
"                      day), header (per file); 0 disables one\n"
"      --mix w,w,w,w   weights of the profiles deep-depot, topup-dock,\n"
"                      idle-dock, topup-nocutoff (default 3,3,3,1)\n"
"      --aging x       multiply every growth and fade rate (default 1)\n"
"  -o, --outdir dir    write the files there (default .; made if missing)\n"
"  -z, --level n       gzip level 0..9 (default 1)\n"
"  -v, --verbose       print what was written to stderr\n"
"  -h, --help          print this help; --version prints the version\n");
	exit(status);
}

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

	cw_setprog("cw-synth");
	synth_conf_default(&c);
	opterr = 0;
	while ((ch = getopt_long(argc, argv, ":F:S:d:f:hn:o:p:s:vz:", longopts,
	    NULL)) != -1) {
		switch (ch) {
		case 'F':
			if (synth_faults_parse(optarg, c.rate, &err) < 0)
				cw_usage_error("--faults: %s: '%s'", err,
				    optarg);
			break;
		case 'S':
			c.start_day = date_arg(optarg);
			break;
		case 'd':
			c.ndays = opt_long_arg("--days", optarg, 1, 3660);
			break;
		case 'f':
			c.formats = format_arg(optarg);
			break;
		case 'h':
			usage(stdout, CW_EXIT_OK);
			break;
		case 'n':
			c.ndev = opt_long_arg("--devices", optarg, 1, 1000000);
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
		case 'v':
			cw_verbose = 1;
			break;
		case 'z':
			c.level = (int)opt_long_arg("--level", optarg, 0, 9);
			break;
		case OPT_AGING:
			c.aging = opt_num_arg("--aging", optarg, 0, 1000);
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
		case OPT_VERSION:
			cw_print_version();
		default:
			opt_getopt_fail(ch, argv);
		}
	}
	if (optind < argc)
		cw_usage_error("unexpected argument '%s'", argv[optind]);
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
