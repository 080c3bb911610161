/*
 * cw-report: the morning report for cron.  It reads the per-device CSVs
 * the analysis tools wrote and the fleet file, and prints the packs that
 * need attention, most urgent first, and why; exit status 3 when there is
 * any.  The engine is lib/report.c; this file holds the options.
 */
#include <errno.h>
#include <stddef.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cw.h"
#include "finish.h"
#include "fleet.h"
#include "opt.h"
#include "optab.h"
#include "outf.h"
#include "report.h"
#include "ts.h"

/* Something needs attention: cron mails on it. */
#define EXIT_ATTENTION 3

enum {
	OPT_BY = OPTAB_LONG, OPT_CSV, OPT_FLEET, OPT_GROWTH, OPT_HORIZON,
	OPT_LIFE, OPT_LIMITS, OPT_MIN_DAYS, OPT_SINCE, OPT_SOH, OPT_TOPOFF, OPT_TZ
};

/* Where an option of the table is stored: a member of report_conf. */
#define C(m)	offsetof(struct report_conf, m)

static const struct optab opts[] = {
	{ "by", 0, "site|model", "roll the reasons up per site or model of "
	    "the fleet file (without it: per pack)", NULL, OPT_BY },
	{ "csv", 0, NULL, "write CSV: rank,device,site,reason,detail,new,tier",
	    NULL, OPT_CSV,
	    OPTAB_FLAG, C(csv), 0, 0 },
	{ "fleet", 0, "FILE", "the fleet file: site, model, capacity_ah",
	    NULL, OPT_FLEET },
	{ "growth", 0, "PCT", "resistance growth since the trend's start that "
	    "needs attention", "100, i.e. doubled", OPT_GROWTH,
	    OPTAB_NUM, C(growth_max), 0.001, 1e6 },
	{ "horizon", 0, "DAYS", "a sure trend that reaches --soh or --growth "
	    "within DAYS needs attention", "90", OPT_HORIZON,
	    OPTAB_NUM, C(horizon_d), 0, 36500 },
	{ "life", 0, "DAYS", "modelled days to end of life below DAYS need "
	    "attention", "365", OPT_LIFE,
	    OPTAB_NUM, C(life_d), 0, 36500 },
	{ "min-days", 0, "DAYS", "a modelled life from fewer DAYS of log is "
	    "not a reason", "7", OPT_MIN_DAYS,
	    OPTAB_NUM, C(min_days), 0, 36500 },
	{ "limits", 0, "T1,T2,T3,T4", "the zones cw-thermal was run with, for "
	    "the text", "0,10,45,60 C", OPT_LIMITS },
	{ "top", 'n', "N", "list the N most urgent packs (or groups) only",
	    "0: all", 0,
	    OPTAB_LONGINT, C(top), 0, 1000000000 },
	{ "output", 'o', "FILE", "write to FILE atomically, not standard "
	    "output", NULL, 0 },
	{ "since", 0, "FILE", "an earlier --csv report: mark what is new",
	    NULL, OPT_SINCE },
	{ "soh", 0, "PCT", "measured state of health below PCT needs "
	    "attention", "80", OPT_SOH,
	    OPTAB_NUM, C(soh_min), 0.001, 150 },
	{ "topoff", 0, "N", "show top-off micro-cycles a day of N or more "
	    "beside a listed pack", "10", OPT_TOPOFF,
	    OPTAB_NUM, C(topoff_day), 0, 1e6 },
	{ "tz", 0, "+HH:MM", "dates at this offset from UTC", "UTC", OPT_TZ },
	OPTAB_END
};

static const struct optool tool = {
	"cw-report", "[FILE ...]",
	"The packs that need attention, most urgent first, and why, from\n"
	"the outputs of cw-wear, cw-thermal --summary, cw-topoff --summary,\n"
	"cw-dcir --trend, cw-capacity --trend and cw-volt --summary (each\n"
	"recognised by its header).  Exit status 3 when any pack needs\n"
	"attention, 0 when none does.\n",
	"The thresholds are common practice, no source; the cell maker's data\n"
	"sheet rules.  The report advises; it is not a safety system.\n",
	opts,
	"say what each input file was taken for"
};


int
main(int argc, char *argv[])
{
	static char stdin_name[] = "-";
	static char *stdin_only[] = { stdin_name };
	struct report_conf conf;
	struct report *rep;
	struct fleet *fleet = NULL;
	struct outf *of;
	const char *outpath = NULL, *fleetpath = NULL, *since = NULL;
	size_t npacks;
	int ch, i, rc = CW_EXIT_OK;

	report_conf_default(&conf);
	while ((ch = optab_getopt(&tool, &conf, argc, argv)) != -1) {
		switch (ch) {
		case 'o':
			outpath = optarg;
			break;
		case OPT_BY:
			if (strcmp(optarg, "site") == 0)
				conf.by = REPORT_BY_SITE;
			else if (strcmp(optarg, "model") == 0)
				conf.by = REPORT_BY_MODEL;
			else
				cw_usage_error("--by: \"%s\" is not site or "
				    "model", optarg);
			break;
		case OPT_FLEET:
			fleetpath = optarg;
			break;
		case OPT_LIMITS:
			opt_list_arg("--limits", optarg, conf.lim, 4, 1, 1);
			break;
		case OPT_SINCE:
			since = optarg;
			break;
		case OPT_TZ:
			if (ts_parse_offset(optarg, &conf.tz_s) != 0)
				cw_usage_error("--tz: \"%s\" is not an offset "
				    "such as +01:00, -0500 or UTC", optarg);
			break;
		}
	}
	argc -= optind;
	argv += optind;
	if (argc == 0) {
		argv = stdin_only;
		argc = 1;
	}

	fleet = fleet_load(fleetpath);
	rep = report_new(&conf, fleet);
	if (since != NULL)
		rc = report_since(rep, since);
	for (i = 0; i < argc && rc == 0; i++)
		rc = report_read(rep, argv[i]);
	if (rc == 0) {
		npacks = report_rank(rep);
		of = outf_open(outpath);
		if (report_write(rep, outf_fp(of)) != 0) {
			cw_write_error(outpath, errno);
			outf_abort(of);
			rc = CW_EXIT_DATA;
		} else if (outf_commit(of) != 0)
			rc = CW_EXIT_DATA;
		else if (npacks > 0)
			rc = EXIT_ATTENTION;
	}
	report_free(rep);
	fleet_free(fleet);
	return rc;
}
