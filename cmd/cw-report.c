/*
 * cw-report: the morning report for cron.  It reads the per-device CSVs
 * the analysis tools wrote and the fleet file, and prints the packs that
 * need attention, most urgent first, and why; exit status 3 when there is
 * any.  The engine is lib/report.c; this file holds the options.
 */
#include <errno.h>
#include <getopt.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cw.h"
#include "fleet.h"
#include "opt.h"
#include "outf.h"
#include "report.h"
#include "ts.h"

/* Something needs attention: cron mails on it. */
#define EXIT_ATTENTION 3

enum {
	OPT_BY = 256, OPT_CSV, OPT_FLEET, OPT_GROWTH, OPT_HORIZON, OPT_LIFE,
	OPT_LIMITS, OPT_SINCE, OPT_SOH, OPT_TOPOFF, OPT_TZ, OPT_VERSION
};

static void	usage(FILE *fp);

static void
usage(FILE *fp)
{
	fprintf(fp,
	    "usage: cw-report [-hv] [--by site|model] [--csv] [--fleet FILE] "
	    "[--growth PCT]\n"
	    "                 [--horizon DAYS] [--life DAYS] "
	    "[--limits T1,T2,T3,T4] [-n N]\n"
	    "                 [-o FILE] [--since FILE] [--soh PCT] "
	    "[--topoff N] [--tz +HH:MM]\n"
	    "                 [--version] [FILE ...]\n");
	fputs(
"\n"
"The packs that need attention, most urgent first, and why, from the\n"
"outputs of cw-wear, cw-thermal --summary, cw-topoff --summary, cw-dcir\n"
"--trend, cw-capacity --trend and cw-volt --summary (each recognised by its\n"
"header).  Exit status 3 when any pack needs attention, 0 when none does.\n"
"\n"
"      --by site|model     roll the reasons up per site or model of the\n"
"                          fleet file (without it: per pack)\n"
"      --csv               write CSV: rank,device,site,reason,detail,new,tier\n"
"      --fleet FILE        the fleet file: site, model, capacity_ah\n"
"      --growth PCT        resistance growth since the trend's start that\n"
"                          needs attention (default 100, i.e. doubled)\n"
"  -h, --help              print this help and exit 0\n"
"      --horizon DAYS      a sure trend that reaches --soh or --growth\n"
"                          within DAYS needs attention (default 90)\n"
"      --life DAYS         modelled days to end of life below DAYS need\n"
"                          attention (default 365)\n"
"      --limits T1,T2,T3,T4  the zones cw-thermal was run with, for the\n"
"                          text (default 0,10,45,60 C)\n"
"  -n, --top N             list the N most urgent packs (or groups) only\n"
"                          (default 0: all)\n"
"  -o, --output FILE       write to FILE atomically, not standard output\n"
"      --since FILE        an earlier --csv report: mark what is new\n"
"      --soh PCT           measured state of health below PCT needs\n"
"                          attention (default 80)\n"
"      --topoff N          show top-off micro-cycles a day of N or more\n"
"                          beside a listed pack (default 10)\n"
"      --tz +HH:MM         dates at this offset from UTC (default UTC)\n"
"  -v, --verbose           say what each input file was taken for\n"
"      --version           print the version and exit 0\n"
"\n"
"The thresholds are common practice, no source; the cell maker's data\n"
"sheet rules.  The report advises; it is not a safety system.\n", fp);
}

int
main(int argc, char *argv[])
{
	static const struct option longopts[] = {
		{ "by", required_argument, NULL, OPT_BY },
		{ "csv", no_argument, NULL, OPT_CSV },
		{ "fleet", required_argument, NULL, OPT_FLEET },
		{ "growth", required_argument, NULL, OPT_GROWTH },
		{ "help", no_argument, NULL, 'h' },
		{ "horizon", required_argument, NULL, OPT_HORIZON },
		{ "life", required_argument, NULL, OPT_LIFE },
		{ "limits", required_argument, NULL, OPT_LIMITS },
		{ "output", required_argument, NULL, 'o' },
		{ "since", required_argument, NULL, OPT_SINCE },
		{ "soh", required_argument, NULL, OPT_SOH },
		{ "top", required_argument, NULL, 'n' },
		{ "topoff", required_argument, NULL, OPT_TOPOFF },
		{ "tz", required_argument, NULL, OPT_TZ },
		{ "verbose", no_argument, NULL, 'v' },
		{ "version", no_argument, NULL, OPT_VERSION },
		{ NULL, 0, NULL, 0 }
	};
	static char stdin_name[] = "-";
	static char *stdin_only[] = { stdin_name };
	struct report_conf conf;
	struct report *rep;
	struct fleet *fleet = NULL;
	struct outf *of;
	const char *outpath = NULL, *fleetpath = NULL, *since = NULL;
	size_t npacks;
	int ch, i, rc = CW_EXIT_OK;

	cw_setprog("cw-report");
	report_conf_default(&conf);
	opterr = 0;
	while ((ch = getopt_long(argc, argv, ":hn:o:v", longopts, NULL)) !=
	    -1) {
		switch (ch) {
		case 'h':
			usage(stdout);
			return fflush(stdout) == 0 ? CW_EXIT_OK : CW_EXIT_DATA;
		case 'n':
			conf.top = opt_long_arg("--top", optarg, 0, 1000000000);
			break;
		case 'o':
			outpath = optarg;
			break;
		case 'v':
			cw_verbose = 1;
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
		case OPT_CSV:
			conf.csv = 1;
			break;
		case OPT_FLEET:
			fleetpath = optarg;
			break;
		case OPT_GROWTH:
			conf.growth_max = opt_num_arg("--growth", optarg,
			    0.001, 1e6);
			break;
		case OPT_HORIZON:
			conf.horizon_d = opt_num_arg("--horizon", optarg, 0,
			    36500);
			break;
		case OPT_LIFE:
			conf.life_d = opt_num_arg("--life", optarg, 0, 36500);
			break;
		case OPT_LIMITS:
			opt_list_arg("--limits", optarg, conf.lim, 4, 1, 1);
			break;
		case OPT_SINCE:
			since = optarg;
			break;
		case OPT_SOH:
			conf.soh_min = opt_num_arg("--soh", optarg, 0.001,
			    150);
			break;
		case OPT_TOPOFF:
			conf.topoff_day = opt_num_arg("--topoff", optarg, 0,
			    1e6);
			break;
		case OPT_TZ:
			if (ts_parse_offset(optarg, &conf.tz_s) != 0)
				cw_usage_error("--tz: \"%s\" is not an offset "
				    "such as +01:00, -0500 or UTC", optarg);
			break;
		case OPT_VERSION:
			cw_print_version();
		default:
			opt_getopt_fail(ch, argv);
		}
	}
	argc -= optind;
	argv += optind;
	if (argc == 0) {
		argv = stdin_only;
		argc = 1;
	}

	if (fleetpath != NULL)
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
			cw_warn("%s: write error: %s", outpath != NULL ?
			    outpath : "standard output", strerror(errno));
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
