/*
 * test_num.c: strict number parsing (lib/num.c).
 *
 * Reference: glibc strtod(), which rounds correctly as ISO C11 7.22.1.3
 * and IEEE 754 require; every accepted value must be bit for bit the
 * double strtod() gives for the same text.  What must be rejected comes
 * from the contract in lib/num.h (a decimal number and nothing else).
 */
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "num.h"

static uint64_t rng_state = 0x9e3779b97f4a7c15u;

static uint64_t rnd(void);
static unsigned rnd_below(unsigned);
static void same_as_strtod(const char *);
static void rejected(const char *, int);

/* A fixed-seed xorshift64*, so that a failure can be reproduced. */
static uint64_t
rnd(void)
{
	rng_state ^= rng_state >> 12;
	rng_state ^= rng_state << 25;
	rng_state ^= rng_state >> 27;
	return rng_state * 2685821657736338717u;
}

static unsigned
rnd_below(unsigned n)
{
	return (unsigned)(rnd() % n);
}

/* S must parse, and to exactly strtod()'s double (same bits, same sign). */
static void
same_as_strtod(const char *s)
{
	double got = -12345.0, want;
	int rc;

	want = strtod(s, NULL);
	rc = num_parse_str(s, &got);
	if (rc != NUM_OK || memcmp(&got, &want, sizeof(got)) != 0) {
		print_error("'%s': rc %d, got %.17g, strtod %.17g\n", s, rc,
		    got, want);
		fail();
	}
}

/* S must give status WANT and leave the output untouched. */
static void
rejected(const char *s, int want)
{
	double x = 42.0;
	int rc = num_parse_str(s, &x);

	if (rc != want || x != 42.0) {
		print_error("'%s': rc %d (want %d), value %.17g\n", s, rc,
		    want, x);
		fail();
	}
}

static void
test_plain_values(void **st)
{
	static const char *ok[] = {
		"0", "-0", "+0", "1", "-1", "+7", "39.812", "-2.35", "11.4",
		"83.5", ".5", "5.", "-.5", "0.1", "0.2", "0.3", "1e-7",
		"1E+20", "2.5e3", "1e22", "1e23", "9007199254740993",
		"123456789012345678", "0.000001", "3.14159265358979323846",
		"000123.4500", "1e-400", "4.9e-324", "2.2250738585072014e-308",
		"1.7976931348623157e308", "1e0000000000000000000000005",
	};
	size_t i;

	(void)st;
	for (i = 0; i < sizeof(ok) / sizeof(ok[0]); i++)
		same_as_strtod(ok[i]);
}

/* lib/num.h: "Rejected: empty, nan, inf, hex, trailing garbage,
 * overflow." */
static void
test_rejected(void **st)
{
	static const char *bad[] = {
		"nan", "NaN", "-nan", "inf", "-inf", "Infinity", "INF",
		"0x10", "0X1p3", "1p3", "12abc", "1.2.3", "1,5", "--1", "+-1",
		"-", "+", ".", "e5", "5e", "5e+", "5e-", "1 2", "1_000",
		"12V", "0.5%", "\"1\"", "1e5.5", "١٢",
	};
	size_t i;

	(void)st;
	for (i = 0; i < sizeof(bad) / sizeof(bad[0]); i++)
		rejected(bad[i], NUM_BAD);
	rejected("", NUM_EMPTY);
	rejected("   ", NUM_EMPTY);
	rejected("\t", NUM_EMPTY);
	rejected("1e400", NUM_RANGE);
	rejected("-1e400", NUM_RANGE);
	rejected("1.8e308", NUM_RANGE);
	rejected("1e99999999999999999999", NUM_RANGE);
	assert_int_not_equal(num_parse("5\0", 2, '.', &(double){0}), NUM_OK);
}

/* Blanks around the number are allowed (lib/num.h: NUM_EMPTY is "nothing
 * but blanks"); the text outside [0, N) is never looked at. */
static void
test_bounds_and_blanks(void **st)
{
	double x = 0;

	(void)st;
	assert_int_equal(num_parse_str(" 2.5\t", &x), NUM_OK);
	assert_true(x == 2.5);
	assert_int_equal(num_parse("12345", 3, '.', &x), NUM_OK);
	assert_true(x == 123.0);
	assert_int_equal(num_parse("1.5e3xyz", 5, '.', &x), NUM_OK);
	assert_true(x == 1.5e3);
	assert_int_equal(num_parse("1.5e3xyz", 4, '.', &x), NUM_BAD);
	assert_true(signbit(-0.0) != 0);
	assert_int_equal(num_parse_str("-0", &x), NUM_OK);
	assert_true(x == 0.0 && signbit(x));
	assert_int_equal(num_parse_str("-0.000", &x), NUM_OK);
	assert_true(x == 0.0 && signbit(x));
}

/* The decimal comma of European gauge exports: with DEC ',' the comma is
 * the mark and '.' is garbage; values equal strtod() of the text with the
 * comma replaced by a point. */
static void
test_decimal_comma(void **st)
{
	static const char *txt[] = {
		"3,5", "-2,35", ",5", "5,", "1,5e3", "39,812",
		"1,2345678901234567890123", "0,1",
	};
	size_t i;
	double x, want;

	(void)st;
	for (i = 0; i < sizeof(txt) / sizeof(txt[0]); i++) {
		char buf[64], *p;

		strcpy(buf, txt[i]);
		p = strchr(buf, ',');
		*p = '.';
		want = strtod(buf, NULL);
		x = -1;
		assert_int_equal(num_parse(txt[i], strlen(txt[i]), ',', &x),
		    NUM_OK);
		if (x != want) {
			print_error("'%s': got %.17g want %.17g\n", txt[i], x,
			    want);
			fail();
		}
	}
	assert_int_equal(num_parse("3.5", 3, ',', &x), NUM_BAD);
	assert_int_equal(num_parse("3,5,1", 5, ',', &x), NUM_BAD);
}

/*
 * Many random decimal strings of the shapes gauges write, plus long and
 * extreme ones that leave the fast path: each must equal strtod() exactly.
 */
static void
test_random_vs_strtod(void **st)
{
	char s[128];
	int k;

	(void)st;
	for (k = 0; k < 400000; k++) {
		char *p = s;
		unsigned ndig = 1 + rnd_below(k % 4 == 0 ? 30 : 17);
		unsigned point = rnd_below(ndig + 1), i;

		if (rnd_below(2))
			*p++ = '-';
		for (i = 0; i < ndig; i++) {
			if (i == point)
				*p++ = '.';
			/* Runs of zeros and nines probe rounding edges. */
			switch (rnd_below(8)) {
			case 0:
				*p++ = '0';
				break;
			case 1:
				*p++ = '9';
				break;
			default:
				*p++ = (char)('0' + rnd_below(10));
				break;
			}
		}
		if (point == ndig && rnd_below(2))
			*p++ = '.';
		if (rnd_below(3) == 0)
			p += sprintf(p, "e%d", (int)rnd_below(80) - 40);
		*p = '\0';
		same_as_strtod(s);
	}
}

/* Values printed by printf %.17g (round-trip form) of random doubles,
 * and near-halfway strings between two neighbouring doubles. */
static void
test_roundtrip_doubles(void **st)
{
	char s[64];
	int k;

	(void)st;
	for (k = 0; k < 200000; k++) {
		uint64_t bits = rnd();
		double d;

		memcpy(&d, &bits, sizeof(d));
		if (!isfinite(d))
			continue;
		snprintf(s, sizeof(s), "%.17g", d);
		same_as_strtod(s);
		/* Halfway between d and its neighbour, to 25 digits. */
		snprintf(s, sizeof(s), "%.25g", d + (nextafter(d, INFINITY) -
		    d) / 2);
		if (strchr(s, 'n') == NULL)
			same_as_strtod(s);
	}
}

/* Digit strings longer than any buffer in the parser. */
static void
test_long_strings(void **st)
{
	char s[700];
	int k;

	(void)st;
	for (k = 0; k < 200; k++) {
		size_t n = 100 + rnd_below(500), i;

		for (i = 0; i < n; i++)
			s[i] = (char)('0' + rnd_below(10));
		s[n / 3] = '.';
		s[n] = '\0';
		same_as_strtod(s);
	}
	memset(s, '0', 600);
	s[0] = '0';
	s[1] = '.';
	s[599] = '7';
	s[600] = '\0';
	same_as_strtod(s);	/* 7e-598: underflows to 0, which is allowed */
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_plain_values),
		cmocka_unit_test(test_rejected),
		cmocka_unit_test(test_bounds_and_blanks),
		cmocka_unit_test(test_decimal_comma),
		cmocka_unit_test(test_random_vs_strtod),
		cmocka_unit_test(test_roundtrip_doubles),
		cmocka_unit_test(test_long_strings),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
