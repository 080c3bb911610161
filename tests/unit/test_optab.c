/*
 * test_optab.c: one table of options gives getopt's tables, the
 * synopsis and the help (lib/optab.h).  The expected texts are written
 * out by hand from the rules in optab.c: flags with a letter gathered in
 * one bracket, the others sorted by letter or name, -h and --version
 * added, defaults as "(default X)", lines wrapped before column 79.
 */
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <sys/wait.h>
#include <cmocka.h>

#include "cw.h"
#include "optab.h"

enum { OPT_ALPHA = OPTAB_LONG, OPT_ZETA, OPT_QUIET };

static const struct optab opts[] = {
	{ "zeta", 0, "Z", "the last letter", "26", OPT_ZETA },
	{ "alpha", 0, "DUR", "the first letter, with a text long enough to "
	    "need a second line of help", "15m", OPT_ALPHA },
	{ "output", 'o', "FILE", "write to FILE", NULL, 0 },
	{ "summary", 's', NULL, "one row per device", NULL, 0 },
	{ "quiet", 0, NULL, "say nothing", NULL, OPT_QUIET },
	{ "big", 'S', NULL, "the upper case flag", NULL, 0 },
	{ NULL, 0, NULL, NULL, NULL, 0 }
};

static const struct optool tool = {
	"cw-test", "[FILE ...]", "What it does.\n", "The end.\n", opts
};

static char *
help_text(void)
{
	char *buf = NULL;
	size_t n = 0;
	FILE *fp = open_memstream(&buf, &n);

	assert_non_null(fp);
	optab_help(fp, &tool);
	assert_int_equal(fclose(fp), 0);
	return buf;
}

static void
test_help(void **state)
{
	char *h = help_text();

	(void)state;
	assert_string_equal(h,
	    "usage: cw-test [-hsS] [--alpha DUR] [-o FILE] [--quiet] "
	    "[--version] [--zeta Z]\n"
	    "               [FILE ...]\n"
	    "\n"
	    "What it does.\n"
	    "\n"
	    "      --alpha DUR         the first letter, with a text long "
	    "enough to need a\n"
	    "                          second line of help (default 15m)\n"
	    "  -h, --help              print this help and exit 0\n"
	    "  -o, --output FILE       write to FILE\n"
	    "      --quiet             say nothing\n"
	    "  -s, --summary           one row per device\n"
	    "  -S, --big               the upper case flag\n"
	    "      --version           print the version and exit 0\n"
	    "      --zeta Z            the last letter (default 26)\n"
	    "\n"
	    "The end.\n");
	free(h);
}

/* Each option comes back as its letter or id, with its value. */
static void
test_parse(void **state)
{
	char *argv[] = { "cw-test", "--alpha", "2h", "-s", "-oout.csv",
	    "--zeta=3", "--quiet", "-S", "in.csv", NULL };
	int argc = 9;
	struct optparse op;

	(void)state;
	optind = 1;
	optab_init(&op, &tool);
	assert_int_equal(optab_next(&op, argc, argv), OPT_ALPHA);
	assert_string_equal(optarg, "2h");
	assert_int_equal(optab_next(&op, argc, argv), 's');
	assert_int_equal(optab_next(&op, argc, argv), 'o');
	assert_string_equal(optarg, "out.csv");
	assert_int_equal(optab_next(&op, argc, argv), OPT_ZETA);
	assert_string_equal(optarg, "3");
	assert_int_equal(optab_next(&op, argc, argv), OPT_QUIET);
	assert_int_equal(optab_next(&op, argc, argv), 'S');
	assert_int_equal(optab_next(&op, argc, argv), -1);
	assert_int_equal(optind, 8);
	optab_free(&op);
}

/* The exit status of a child that parses ARGV to the end. */
static int
child_status(char **argv, int argc)
{
	struct optparse op;
	pid_t pid;
	int st;

	fflush(NULL);
	pid = fork();
	assert_true(pid >= 0);
	if (pid == 0) {
		/* Its messages and help are not the test's output. */
		if (freopen("/dev/null", "w", stdout) == NULL ||
		    freopen("/dev/null", "w", stderr) == NULL)
			_exit(99);
		optind = 1;
		optab_init(&op, &tool);
		while (optab_next(&op, argc, argv) != -1)
			;
		_exit(0);
	}
	assert_int_equal(waitpid(pid, &st, 0), pid);
	assert_true(WIFEXITED(st));
	return WEXITSTATUS(st);
}

/* -h, --help and --version exit 0; a bad option or a missing value 2. */
static void
test_exits(void **state)
{
	char *help[] = { "cw-test", "-h", NULL };
	char *lhelp[] = { "cw-test", "--help", NULL };
	char *ver[] = { "cw-test", "--version", NULL };
	char *unknown[] = { "cw-test", "--bogus", NULL };
	char *letter[] = { "cw-test", "-x", NULL };
	char *noval[] = { "cw-test", "--zeta", NULL };
	char *noval2[] = { "cw-test", "-o", NULL };
	char *flagval[] = { "cw-test", "--quiet=1", NULL };

	(void)state;
	cw_setprog("cw-test");
	assert_int_equal(child_status(help, 2), 0);
	assert_int_equal(child_status(lhelp, 2), 0);
	assert_int_equal(child_status(ver, 2), 0);
	assert_int_equal(child_status(unknown, 2), CW_EXIT_USAGE);
	assert_int_equal(child_status(letter, 2), CW_EXIT_USAGE);
	assert_int_equal(child_status(noval, 2), CW_EXIT_USAGE);
	assert_int_equal(child_status(noval2, 2), CW_EXIT_USAGE);
	assert_int_equal(child_status(flagval, 2), CW_EXIT_USAGE);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_help),
		cmocka_unit_test(test_parse),
		cmocka_unit_test(test_exits),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
