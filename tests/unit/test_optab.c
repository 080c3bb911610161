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
	optab_init(&op, &tool, NULL);
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
		optab_init(&op, &tool, NULL);
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

/* Options that store themselves: the value checked and put in place. */
struct conf {
	double x, pos, open;
	int n, flag;
	long big;
	unsigned long count;
	size_t size;
	cw_time gap;
	const char *name;
};

static const struct optab stored_opts[] = {
	{ "x", 0, "X", "a number", "1", OPTAB_LONG, OPTAB_NUM,
	    offsetof(struct conf, x), 0, 10 },
	{ "n", 'n', "N", "a count", "2", 0, OPTAB_INT,
	    offsetof(struct conf, n), 1, 5 },
	{ "flag", 0, NULL, "a flag", NULL, OPTAB_LONG + 1, OPTAB_FLAG,
	    offsetof(struct conf, flag), 0, 0 },
	{ "gap", 0, "DUR", "a duration", "15m", OPTAB_LONG + 2, OPTAB_DUR,
	    offsetof(struct conf, gap), 0, 0 },
	{ "name", 0, "S", "a name", NULL, OPTAB_LONG + 3, OPTAB_STR,
	    offsetof(struct conf, name), 0, 0 },
	{ "pos", 0, "X", "above 0", NULL, OPTAB_LONG + 4, OPTAB_POS,
	    offsetof(struct conf, pos), 0, 100 },
	{ "open", 0, "P", "strictly between", NULL, OPTAB_LONG + 5,
	    OPTAB_OPEN, offsetof(struct conf, open), 0.5, 1 },
	{ "big", 0, "N", "a long", NULL, OPTAB_LONG + 6, OPTAB_LONGINT,
	    offsetof(struct conf, big), 1, 5000000000.0 },
	{ "count", 0, "N", "an unsigned long", NULL, OPTAB_LONG + 7,
	    OPTAB_ULONG, offsetof(struct conf, count), 2, 1e9 },
	{ "size", 0, "N", "a size", NULL, OPTAB_LONG + 8, OPTAB_SIZE,
	    offsetof(struct conf, size), 16, 1 << 24 },
	{ "other", 'o', NULL, "handled by the caller", NULL, 0 },
	OPTAB_END
};

static const struct optool stored_tool = {
	"cw-test", NULL, NULL, NULL, stored_opts
};

static void
test_stored(void **state)
{
	char *argv[] = { "cw-test", "--x", "2.5", "-n3", "--flag", "--gap",
	    "2h", "--name=EB-1", "-o", "--pos", "0.25", "--open", "0.95",
	    "--big", "4000000000", "--count", "12", "--size", "2048", NULL };
	struct optparse op;
	struct conf c;

	(void)state;
	memset(&c, 0, sizeof(c));
	optind = 1;
	optab_init(&op, &stored_tool, &c);
	/* Only the caller's own option comes back. */
	assert_int_equal(optab_next(&op, 19, argv), 'o');
	assert_int_equal(optab_next(&op, 19, argv), -1);
	optab_free(&op);
	assert_float_equal(c.x, 2.5, 0);
	assert_int_equal(c.n, 3);
	assert_int_equal(c.flag, 1);
	assert_true(c.gap == 2 * 3600 * CW_US_PER_S);
	assert_string_equal(c.name, "EB-1");
	assert_float_equal(c.pos, 0.25, 0);
	assert_float_equal(c.open, 0.95, 0);
	assert_true(c.big == 4000000000L);
	assert_int_equal(c.count, 12);
	assert_int_equal(c.size, 2048);
}

/* OPTAB_TELL: the value is stored, and its id comes back to the caller. */
static const struct optab tell_opts[] = {
	{ "x", 0, "X", "a number", "1", OPTAB_LONG, OPTAB_NUM | OPTAB_TELL,
	    offsetof(struct conf, x), 0, 10 },
	{ "gap", 0, "DUR", "a duration", "15m", OPTAB_LONG + 2,
	    OPTAB_DUR | OPTAB_TELL, offsetof(struct conf, gap), 0, 0 },
	{ "n", 'n', "N", "a count", "2", 0, OPTAB_INT,
	    offsetof(struct conf, n), 1, 5 },
	OPTAB_END
};

static const struct optool tell_tool = {
	"cw-test", NULL, NULL, NULL, tell_opts
};

static void
test_tell(void **state)
{
	char *argv[] = { "cw-test", "-n", "2", "--x", "7.5", "--gap", "90s",
	    NULL };
	struct optparse op;
	struct conf c;

	(void)state;
	memset(&c, 0, sizeof(c));
	optind = 1;
	optab_init(&op, &tell_tool, &c);
	/* -n is stored quietly; --x is stored before its id comes back. */
	assert_int_equal(optab_next(&op, 7, argv), OPTAB_LONG);
	assert_int_equal(c.n, 2);
	assert_float_equal(c.x, 7.5, 0);
	assert_int_equal(optab_next(&op, 7, argv), OPTAB_LONG + 2);
	assert_true(c.gap == 90 * CW_US_PER_S);
	assert_int_equal(optab_next(&op, 7, argv), -1);
	optab_free(&op);
}

/*
 * optab_getopt(): the same loop without a struct optparse; its tables
 * are made again for a second parse once the first has ended (-1).
 */
static void
test_getopt(void **state)
{
	char *one[] = { "cw-test", "--x", "3", "-o", "FILE", NULL };
	char *two[] = { "cw-test", "-n", "4", NULL };
	struct conf c;

	(void)state;
	memset(&c, 0, sizeof(c));
	optind = 1;
	assert_int_equal(optab_getopt(&stored_tool, &c, 5, one), 'o');
	assert_int_equal(optab_getopt(&stored_tool, &c, 5, one), -1);
	assert_int_equal(optind, 4);
	assert_float_equal(c.x, 3, 0);
	optind = 1;
	assert_int_equal(optab_parse(&stored_tool, &c, 3, two), 3);
	assert_int_equal(c.n, 4);
}

/* A stored value out of its range is a usage error, exit 2. */
static void
test_stored_bad(void **state)
{
	char *big[] = { "cw-test", "--x", "11", NULL };
	char *zero[] = { "cw-test", "-n", "0", NULL };
	char *dur[] = { "cw-test", "--gap", "soon", NULL };
	char *pos[] = { "cw-test", "--pos", "0", NULL };
	char *open0[] = { "cw-test", "--open", "0.5", NULL };
	char *open1[] = { "cw-test", "--open", "1", NULL };
	char *count[] = { "cw-test", "--count", "1", NULL };
	char *size[] = { "cw-test", "--size", "2.5", NULL };
	char **cases[] = { big, zero, dur, pos, open0, open1, count, size };
	struct optparse op;
	struct conf c;
	size_t i;
	pid_t pid;
	int st;

	(void)state;
	for (i = 0; i < sizeof(cases) / sizeof(cases[0]); i++) {
		fflush(NULL);
		pid = fork();
		assert_true(pid >= 0);
		if (pid == 0) {
			if (freopen("/dev/null", "w", stderr) == NULL)
				_exit(99);
			optind = 1;
			optab_init(&op, &stored_tool, &c);
			while (optab_next(&op, 3, cases[i]) != -1)
				;
			_exit(0);
		}
		assert_int_equal(waitpid(pid, &st, 0), pid);
		assert_true(WIFEXITED(st));
		assert_int_equal(WEXITSTATUS(st), CW_EXIT_USAGE);
	}
}

/*
 * -v sets cw_verbose itself, with a struct to store into or without,
 * and is in the help, when the tool gives its text; without it, -v is
 * an unknown option like any other (exit 2, test_exits' way).
 */
static void
test_verbose(void **state)
{
	static const struct optab vopts[] = {
		{ "quiet", 'q', NULL, "the caller's own", NULL, 0 },
		{ NULL, 0, NULL, NULL, NULL, 0 }
	};
	static const struct optool vtool = { "cw-test", NULL, NULL, NULL,
	    vopts, "report counts" };
	char *argv[] = { "cw-test", "-q", "-v", "file", NULL };
	struct optparse op;
	char buf[2048];
	FILE *fp;
	size_t n;
	int base, pass;

	(void)state;
	for (pass = 0; pass < 2; pass++) {
		cw_verbose = 0;
		optind = 1;
		optab_init(&op, &vtool, pass ? &base : NULL);
		assert_int_equal(optab_next(&op, 4, argv), 'q');
		assert_int_equal(cw_verbose, 0);
		/* -v is not handed back: the next is the end. */
		assert_int_equal(optab_next(&op, 4, argv), -1);
		assert_int_equal(cw_verbose, 1);
		assert_int_equal(optind, 3);
		optab_free(&op);
	}
	cw_verbose = 0;
	fp = tmpfile();
	assert_non_null(fp);
	optab_help(fp, &vtool);
	rewind(fp);
	n = fread(buf, 1, sizeof(buf) - 1, fp);
	buf[n] = '\0';
	fclose(fp);
	assert_non_null(strstr(buf, "usage: cw-test [-hqv]"));
	assert_non_null(strstr(buf, "  -v, --verbose"));
	assert_non_null(strstr(buf, "report counts\n"));
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_help),
		cmocka_unit_test(test_parse),
		cmocka_unit_test(test_exits),
		cmocka_unit_test(test_stored),
		cmocka_unit_test(test_stored_bad),
		cmocka_unit_test(test_tell),
		cmocka_unit_test(test_getopt),
		cmocka_unit_test(test_verbose),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
