/*
 * test_opt.c: option values (lib/opt.c).
 *
 * References for the units:
 * - kelvin: t/degC = T/K - 273.15 (SI Brochure, 9th ed. 2019, 2.3.1);
 * - degree Fahrenheit: t/degC = (t/degF - 32) / 1.8 (NIST SP 811, 2008,
 *   B.8 and B.9);
 * - minute, hour, day: 60 s, 3600 s, 86400 s (SI Brochure, table 8).
 * The forms accepted are cellwear(7)'s: "10, 10C, 50F, 283.15K" and "90, 90s,
 * 15m, 2h, 1d".  The *_arg() forms exit 2 through cw_usage_error() on a
 * bad value: they run in a child process here, and the exit status and
 * the message are checked.
 */
#include <math.h>
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
#include "opt.h"

/* What the child should call. */
struct call {
	int what;	/* 'n' num, 'p' positive, 'o' open interval, 'l'
			   long, 't' temp, 'D' temperature difference, 'd'
			   dur, 'L' list */
	const char *s;
	double lo, hi;
	int n, temp, nondec, zero_ok;
};

static int in_child(const struct call *, char *, size_t);
static void usage_error(const struct call *, const char *);
static void near(double, double);

static void
near(double got, double want)
{
	if (!(fabs(got - want) <= 1e-12 * (1 + fabs(want)))) {
		print_error("got %.17g, want %.17g\n", got, want);
		fail();
	}
}

/*
 * Run C in a child with stderr into a pipe; returns its exit status (or
 * 128 + signal) and its stderr in ERR.  A call that returns exits 0.
 */
static int
in_child(const struct call *c, char *err, size_t errsz)
{
	int fd[2], status;
	size_t n = 0;
	ssize_t got;
	pid_t pid;

	assert_int_equal(pipe(fd), 0);
	fflush(NULL);
	pid = fork();
	assert_true(pid >= 0);
	if (pid == 0) {
		double out[8];

		close(fd[0]);
		dup2(fd[1], 2);
		switch (c->what) {
		case 'n':
			opt_num_arg("--x", c->s, c->lo, c->hi);
			break;
		case 'p':
			opt_pos_arg("--x", c->s, c->hi);
			break;
		case 'o':
			opt_open_arg("--x", c->s, c->lo, c->hi);
			break;
		case 'l':
			opt_long_arg("--x", c->s, (long)c->lo, (long)c->hi);
			break;
		case 't':
			opt_temp_arg("--x", c->s);
			break;
		case 'D':
			opt_tempdiff_arg("--x", c->s);
			break;
		case 'd':
			opt_dur_arg("--x", c->s, c->zero_ok);
			break;
		case 'L':
			opt_list_arg("--x", c->s, out, c->n, c->temp,
			    c->nondec);
			break;
		}
		_exit(0);
	}
	close(fd[1]);
	while (n + 1 < errsz && (got = read(fd[0], err + n, errsz - 1 - n)) >
	    0)
		n += (size_t)got;
	err[n] = '\0';
	close(fd[0]);
	assert_int_equal(waitpid(pid, &status, 0), pid);
	if (WIFSIGNALED(status))
		return 128 + WTERMSIG(status);
	return WEXITSTATUS(status);
}

/* C must exit 2 with "test_opt: --x: " + WANT and the --help hint. */
static void
usage_error(const struct call *c, const char *want)
{
	char err[1024], line[600];
	int rc = in_child(c, err, sizeof(err));

	snprintf(line, sizeof(line), "test_opt: --x: %s\n"
	    "Try 'test_opt --help' for more information.\n", want);
	if (rc != CW_EXIT_USAGE || strcmp(err, line) != 0) {
		print_error("'%s': exit %d, stderr:\n%s--- want:\n%s", c->s, rc,
		    err, line);
		fail();
	}
}

static int
setup(void **st)
{
	(void)st;
	cw_setprog("test_opt");
	return 0;
}

static void
test_temp(void **st)
{
	double c = 0;

	(void)st;
	assert_int_equal(opt_temp("10", &c), 0);
	near(c, 10);
	assert_int_equal(opt_temp("10C", &c), 0);
	near(c, 10);
	assert_int_equal(opt_temp("10c", &c), 0);
	near(c, 10);
	assert_int_equal(opt_temp("-20", &c), 0);
	near(c, -20);
	/* NIST SP 811 B.9: (50 - 32) / 1.8 = 10; -40 F is -40 C; 212 F is
	 * 100 C. */
	assert_int_equal(opt_temp("50F", &c), 0);
	near(c, 10);
	assert_int_equal(opt_temp("-40F", &c), 0);
	near(c, -40);
	assert_int_equal(opt_temp("212f", &c), 0);
	near(c, 100);
	assert_int_equal(opt_temp("113F", &c), 0);
	near(c, 45);
	/* SI Brochure 2.3.1: 283.15 K is 10 C; 0 K is -273.15 C. */
	assert_int_equal(opt_temp("283.15K", &c), 0);
	near(c, 10);
	assert_int_equal(opt_temp("0K", &c), 0);
	near(c, -273.15);
	assert_int_equal(opt_temp("318.15k", &c), 0);
	near(c, 45);
	/* Below absolute zero, malformed, or no number at all. */
	c = 99;
	assert_int_equal(opt_temp("-1K", &c), -1);
	assert_int_equal(opt_temp("-274", &c), -1);
	assert_int_equal(opt_temp("-460F", &c), -1);
	assert_int_equal(opt_temp("", &c), -1);
	assert_int_equal(opt_temp("C", &c), -1);
	assert_int_equal(opt_temp("K", &c), -1);
	assert_int_equal(opt_temp("10X", &c), -1);
	assert_int_equal(opt_temp("10CC", &c), -1);
	assert_int_equal(opt_temp("10 F x", &c), -1);
	assert_int_equal(opt_temp("nan", &c), -1);
	assert_int_equal(opt_temp("infC", &c), -1);
	assert_int_equal(opt_temp("0x10", &c), -1);
	assert_int_equal(opt_temp("1e999", &c), -1);
	assert_true(c == 99);
}

/*
 * Temperature differences: a kelvin is a degree Celsius (SI Brochure
 * 2.3.1: the degree Celsius is equal in magnitude to the kelvin), a
 * degree Fahrenheit is 1/1.8 of one (NIST SP 811 B.9).  No offset: a
 * difference of 1F is 0.556 C, not the -17.2 C of the temperature 1F.
 */
static void
test_tempdiff(void **st)
{
	double c = 0;

	(void)st;
	assert_int_equal(opt_tempdiff("0.5", &c), 0);
	assert_true(c == 0.5);
	assert_int_equal(opt_tempdiff("0.5C", &c), 0);
	assert_true(c == 0.5);
	assert_int_equal(opt_tempdiff("1K", &c), 0);
	assert_true(c == 1);
	assert_int_equal(opt_tempdiff("1k", &c), 0);
	assert_true(c == 1);
	assert_int_equal(opt_tempdiff("0", &c), 0);
	assert_true(c == 0);
	assert_int_equal(opt_tempdiff("0.9F", &c), 0);
	assert_true(c == 0.5);
	/* 2.7 / 1.8 = 1.5 and 5.4 / 1.8 = 3 exactly after the 1e-9
	 * rounding, which binary arithmetic alone misses by one unit in the
	 * last place. */
	assert_true(2.7 * (5.0 / 9.0) != 1.5);
	assert_int_equal(opt_tempdiff("2.7F", &c), 0);
	assert_true(c == 1.5);
	assert_true(5.4 * (5.0 / 9.0) != 3);
	assert_int_equal(opt_tempdiff("5.4F", &c), 0);
	assert_true(c == 3);
	/* 1 / 1.8 = 0.5555..., to the nearest 1e-9. */
	assert_int_equal(opt_tempdiff("1f", &c), 0);
	assert_true(fabs(c - 1 / 1.8) <= 0.5e-9);
	assert_int_equal(opt_tempdiff("90F", &c), 0);
	assert_true(c == 50);
	assert_int_equal(opt_tempdiff("50", &c), 0);
	assert_true(c == 50);
	/* Negative, over 50 C, malformed. */
	c = 99;
	assert_int_equal(opt_tempdiff("-1", &c), -1);
	assert_int_equal(opt_tempdiff("50.1", &c), -1);
	assert_int_equal(opt_tempdiff("91F", &c), -1);
	assert_int_equal(opt_tempdiff("", &c), -1);
	assert_int_equal(opt_tempdiff("F", &c), -1);
	assert_int_equal(opt_tempdiff("1Q", &c), -1);
	assert_int_equal(opt_tempdiff("1KK", &c), -1);
	assert_int_equal(opt_tempdiff("nan", &c), -1);
	assert_int_equal(opt_tempdiff("infK", &c), -1);
	assert_true(c == 99);
}

static void
test_dur(void **st)
{
	cw_time us = 0;

	(void)st;
	assert_int_equal(opt_dur("90", &us), 0);
	assert_int_equal(us, 90 * CW_US_PER_S);
	assert_int_equal(opt_dur("90s", &us), 0);
	assert_int_equal(us, 90 * CW_US_PER_S);
	assert_int_equal(opt_dur("15m", &us), 0);
	assert_int_equal(us, 900 * CW_US_PER_S);
	assert_int_equal(opt_dur("2h", &us), 0);
	assert_int_equal(us, 7200 * CW_US_PER_S);
	assert_int_equal(opt_dur("1d", &us), 0);
	assert_int_equal(us, 86400 * CW_US_PER_S);
	assert_int_equal(opt_dur("1.5h", &us), 0);
	assert_int_equal(us, 5400 * CW_US_PER_S);
	assert_int_equal(opt_dur("0.25s", &us), 0);
	assert_int_equal(us, 250000);
	assert_int_equal(opt_dur("0.000001", &us), 0);
	assert_int_equal(us, 1);
	assert_int_equal(opt_dur("0", &us), 0);
	assert_int_equal(us, 0);
	/* 365 days; and ten thousand days, still exact. */
	assert_int_equal(opt_dur("365d", &us), 0);
	assert_int_equal(us, 31536000LL * CW_US_PER_S);
	assert_int_equal(opt_dur("10000d", &us), 0);
	assert_int_equal(us, 864000000LL * CW_US_PER_S);
	us = 77;
	assert_int_equal(opt_dur("-1", &us), -1);
	assert_int_equal(opt_dur("-5m", &us), -1);
	assert_int_equal(opt_dur("", &us), -1);
	assert_int_equal(opt_dur("s", &us), -1);
	assert_int_equal(opt_dur("m", &us), -1);
	assert_int_equal(opt_dur("1w", &us), -1);
	assert_int_equal(opt_dur("15M", &us), -1);
	assert_int_equal(opt_dur("1h30m", &us), -1);
	assert_int_equal(opt_dur("5 min", &us), -1);
	assert_int_equal(opt_dur("nan", &us), -1);
	assert_int_equal(opt_dur("infs", &us), -1);
	assert_int_equal(opt_dur("1e30", &us), -1);
	assert_true(us == 77);
}

/* The exiting forms, on good values, return them. */
static void
test_args_ok(void **st)
{
	double v[4];
	char err[512];
	struct call c = { 0 };

	(void)st;
	near(opt_num_arg("--x", "0.5", 0, 1), 0.5);
	near(opt_num_arg("--x", "1", 0, 1), 1);
	near(opt_pos_arg("--x", "1e-9", 1), 1e-9);
	near(opt_pos_arg("--x", "1", 1), 1);
	near(opt_open_arg("--x", "0.95", 0.5, 1), 0.95);
	assert_int_equal(opt_long_arg("--x", "42", 1, 100), 42);
	assert_int_equal(opt_long_arg("--x", "-3", -5, 5), -3);
	near(opt_temp_arg("--x", "50F"), 10);
	assert_true(opt_tempdiff_arg("--x", "0.9F") == 0.5);
	assert_int_equal(opt_dur_arg("--x", "2h", 0), 7200 * CW_US_PER_S);
	assert_int_equal(opt_dur_arg("--x", "0", 1), 0);
	opt_list_arg("--x", "0,10,45,60", v, 4, 1, 1);
	near(v[0], 0);
	near(v[1], 10);
	near(v[2], 45);
	near(v[3], 60);
	/* The same limits in Fahrenheit and kelvin (NIST SP 811 B.9, SI
	 * Brochure 2.3.1). */
	opt_list_arg("--x", "32F,50F,318.15K,140F", v, 4, 1, 1);
	near(v[0], 0);
	near(v[1], 10);
	near(v[2], 45);
	near(v[3], 60);
	opt_list_arg("--x", "20,80", v, 2, 0, 1);
	near(v[0], 20);
	near(v[1], 80);
	opt_list_arg("--x", "5,-5", v, 2, 0, 0);
	near(v[1], -5);
	/* And in a child too, so that in_child() is seen to report 0. */
	c.what = 'L';
	c.s = "1,2,3";
	c.n = 3;
	assert_int_equal(in_child(&c, err, sizeof(err)), 0);
	assert_string_equal(err, "");
}

/* cellwear(7): "a bad number is a usage error, never silently 0". */
static void
test_args_bad(void **st)
{
	struct call c = { 0 };

	(void)st;
	c.what = 'n';
	c.lo = 0;
	c.hi = 1;
	c.s = "abc";
	usage_error(&c, "'abc' is not a number");
	c.s = "";
	usage_error(&c, "'' is not a number");
	c.s = "nan";
	usage_error(&c, "'nan' is not a number");
	c.s = "0.5x";
	usage_error(&c, "'0.5x' is not a number");
	c.s = "1.5";
	usage_error(&c, "1.5 is outside 0..1");
	c.s = "-0.1";
	usage_error(&c, "-0.1 is outside 0..1");

	/* Above 0: 0 itself passes the range, not the bound; -1 neither. */
	c.what = 'p';
	c.hi = 100;
	c.s = "0";
	usage_error(&c, "0 is not above 0");
	c.s = "-0";
	usage_error(&c, "-0 is not above 0");
	c.s = "-1";
	usage_error(&c, "-1 is outside 0..100");
	c.s = "101";
	usage_error(&c, "101 is outside 0..100");

	/* Strictly between: either end is out, as is what lies beyond. */
	c.what = 'o';
	c.lo = 0.5;
	c.hi = 1;
	c.s = "0.5";
	usage_error(&c, "0.5 is not between 0.5 and 1 (exclusive)");
	c.s = "1";
	usage_error(&c, "1 is not between 0.5 and 1 (exclusive)");
	c.s = "2";
	usage_error(&c, "2 is outside 0.5..1");

	c.what = 'l';
	c.lo = 1;
	c.hi = 100;
	c.s = "2.5";
	usage_error(&c, "'2.5' is not a whole number");
	c.s = "101";
	usage_error(&c, "101 is outside 1..100");
	c.s = "0";
	usage_error(&c, "0 is outside 1..100");
	c.s = "x";
	usage_error(&c, "'x' is not a whole number");
	/* Far outside a long: still a usage error, not a wrapped value. */
	c.s = "1e30";
	usage_error(&c, "'1e30' is not a whole number");
	c.s = "-1e30";
	usage_error(&c, "'-1e30' is not a whole number");

	c.what = 't';
	c.s = "10X";
	usage_error(&c, "'10X' is not a temperature (e.g. 10, 10C, 50F, "
	    "283.15K)");
	c.s = "-5K";
	usage_error(&c, "'-5K' is not a temperature (e.g. 10, 10C, 50F, "
	    "283.15K)");

	c.what = 'D';
	c.s = "-1";
	usage_error(&c, "'-1' is not a temperature difference within 0..50 C "
	    "(e.g. 0.5, 0.5C, 1F)");
	c.s = "1Q";
	usage_error(&c, "'1Q' is not a temperature difference within 0..50 C "
	    "(e.g. 0.5, 0.5C, 1F)");

	c.what = 'd';
	c.s = "1w";
	usage_error(&c, "'1w' is not a duration (e.g. 90, 90s, 15m, 2h, 1d)");
	c.s = "0";
	c.zero_ok = 0;
	usage_error(&c, "the duration must be above 0");
	/* 0.1 us rounds to 0 us, so it is as 0. */
	c.s = "0.0000001";
	usage_error(&c, "the duration must be above 0");

	c.what = 'L';
	c.n = 4;
	c.temp = 1;
	c.nondec = 1;
	c.s = "0,10,45";
	usage_error(&c, "expected 4 comma-separated values, got '0,10,45'");
	c.s = "0,10,45,60,70";
	usage_error(&c, "expected 4 comma-separated values, got "
	    "'0,10,45,60,70'");
	c.s = "0,10,45,60,";
	usage_error(&c, "expected 4 comma-separated values, got "
	    "'0,10,45,60,'");
	c.s = "10,0,45,60";
	usage_error(&c, "values must not decrease");
	c.s = "0,10,hot,60";
	usage_error(&c, "'hot' is not a temperature");
	c.s = "0,,45,60";
	usage_error(&c, "'' is not a temperature");
	c.temp = 0;
	c.s = "0,1e,45,60";
	usage_error(&c, "'1e' is not a number");
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_temp),
		cmocka_unit_test(test_tempdiff),
		cmocka_unit_test(test_dur),
		cmocka_unit_test(test_args_ok),
		cmocka_unit_test(test_args_bad),
	};

	return cmocka_run_group_tests(tests, setup, NULL);
}
