/*
 * test_csvout.c: the CSV writer (lib/csvout.c).
 *
 * References:
 * - RFC 4180, section 2 (6, 7): a field holding a comma, a quote or a line
 *   break is enclosed in quotes and a quote inside is doubled.
 * - Numbers: the contract in lib/csvout.h and cellwear(7) ("Numbers keep at
 *   least 6 significant digits"; at most 10, no trailing zeros, NaN as an
 *   empty field).  The value written is checked against glibc strtod()
 *   (correctly rounded, ISO C11 7.22.1.3) reading it back, and against
 *   printf's "%.9e" (correctly rounded to 10 significant digits by glibc)
 *   for the digits themselves.  Expected texts of single values are the
 *   shortest decimal that reads back to the same double, as Python's
 *   repr() prints it (Python 3 "Floating Point Arithmetic", tutorial 15),
 *   with C's two-digit exponent.
 * - Dates (csvout_date): POSIX.1-2017 XBD 4.16 "Seconds Since the Epoch",
 *   whose formula gives the epoch seconds of a UTC date from its year and
 *   day of the year, with the Gregorian leap year rule and month lengths
 *   (ISO 8601-1:2019, 4.2.3); the ends of the four-digit years from
 *   Debian's /usr/bin/python3: datetime(1, 1, 1, tzinfo=timezone.utc)
 *   .timestamp() is -62135596800 and datetime(9999, 12, 31, 23, 59, 59,
 *   999999, tzinfo=timezone.utc).timestamp() is 253402300800 (rounded).
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

#include "csvout.h"

static uint64_t rng_state = 0x853c49e6748fea9bu;

static uint64_t rnd(void);
static const char *fmt(double);
static int sigdigits(const char *);
static void check_faithful(double);
static int leap(long);
static long long posix_epoch(long, long);
static const char *date_of(cw_time);

static uint64_t
rnd(void)
{
	rng_state ^= rng_state >> 12;
	rng_state ^= rng_state << 25;
	rng_state ^= rng_state >> 27;
	return rng_state * 2685821657736338717u;
}

/* csvout_fmtnum() as a string (static buffer). */
static const char *
fmt(double x)
{
	static char buf[64];
	size_t n;

	memset(buf, 'X', sizeof(buf));
	n = csvout_fmtnum(x, buf);
	assert_true(n < 32);
	buf[n] = '\0';
	return buf;
}

/* Significant digits: from the first non-zero digit to the last non-zero
 * digit of the mantissa. */
static int
sigdigits(const char *s)
{
	const char *p, *first = NULL, *last = NULL;
	int n = 0;

	for (p = s; *p != '\0' && *p != 'e' && *p != 'E'; p++)
		if (*p >= '1' && *p <= '9') {
			if (first == NULL)
				first = p;
			last = p;
		}
	if (first == NULL)
		return 0;
	for (p = first; p <= last; p++)
		n += *p >= '0' && *p <= '9';
	return n;
}

/*
 * X written: reads back (strtod) to within half a unit of the 10th
 * significant digit; has at most 10 significant digits; no trailing zero
 * after a decimal point, no point at the end, no "-0", C-locale syntax.
 */
static void
check_faithful(double x)
{
	const char *s = fmt(x);
	char ref[64], *end;
	double y, unit;
	int e;

	y = strtod(s, &end);
	if (*s == '\0' || *end != '\0') {
		print_error("%.17g -> '%s' does not read back\n", x, s);
		fail();
	}
	/* e: the decimal exponent of X's leading digit, from printf. */
	snprintf(ref, sizeof(ref), "%.9e", x);
	e = atoi(strchr(ref, 'e') + 1);
	unit = pow(10.0, e - 9);
	if (!(fabs(y - x) <= 0.5 * unit * (1 + 1e-9) + fabs(x) * 1e-16)) {
		print_error("%.17g -> '%s': off by %g (unit %g)\n", x, s,
		    fabs(y - x), unit);
		fail();
	}
	if (sigdigits(s) > 10) {
		print_error("%.17g -> '%s': more than 10 digits\n", x, s);
		fail();
	}
	if (strchr(s, '.') != NULL && strchr(s, 'e') == NULL) {
		size_t n = strlen(s);

		if (s[n - 1] == '0' || s[n - 1] == '.') {
			print_error("%.17g -> '%s': trailing zero\n", x, s);
			fail();
		}
	}
	if (strncmp(s, "-0", 2) == 0 && y == 0) {
		print_error("%.17g -> '%s': negative zero\n", x, s);
		fail();
	}
	assert_null(strchr(s, ','));
	assert_null(strchr(s, ' '));
}

static void
test_values(void **st)
{
	(void)st;
	assert_string_equal(fmt(0.1), "0.1");
	assert_string_equal(fmt(39.812), "39.812");
	assert_string_equal(fmt(-2.35), "-2.35");
	assert_string_equal(fmt(83.5), "83.5");
	assert_string_equal(fmt(1e-7), "1e-07");
	assert_string_equal(fmt(-1e-7), "-1e-07");
	assert_string_equal(fmt(1.5e-7), "1.5e-07");
	assert_string_equal(fmt(1e20), "1e+20");
	assert_string_equal(fmt(1e15), "1e+15");
	assert_string_equal(fmt(-0.0), "0");
	assert_string_equal(fmt(0.0), "0");
	assert_string_equal(fmt(100), "100");
	assert_string_equal(fmt(-7), "-7");
	assert_string_equal(fmt(0.000001), "0.000001");
	assert_string_equal(fmt(0.00012345), "0.00012345");
	/* 0.1 + 0.2 is 0.30000000000000004 (Python repr): 10 digits drop
	 * the noise. */
	assert_string_equal(fmt(0.1 + 0.2), "0.3");
	assert_string_equal(fmt(1.0 / 3), "0.3333333333");
	assert_string_equal(fmt(2.0 / 3), "0.6666666667");
	assert_string_equal(fmt(-2.0 / 3 * 1e-3), "-0.0006666666667");
	assert_string_equal(fmt(123456789.123), "123456789.1");
	assert_string_equal(fmt(9.99999999996), "10");
	assert_string_equal(fmt(1772323260), "1772323260");
	assert_string_equal(fmt(4.2e-5), "0.000042");
	assert_string_equal(fmt(NAN), "");
	assert_string_equal(fmt(INFINITY), "");
	assert_string_equal(fmt(-INFINITY), "");
}

/* Values with 10 integer digits or more, where a plain integer form would
 * show more than 10 significant digits. */
static void
test_large(void **st)
{
	(void)st;
	check_faithful(12345678901.5);
	check_faithful(98765432109876.0);
	check_faithful(999999999999999.0);
	check_faithful(99999999999.7);
	check_faithful(1e10);
	check_faithful(-31415926535.89);
	assert_true(strtod(fmt(12345678901.5), NULL) == 12345678900.0);
}

/* Random doubles over 30 decades, both signs. */
static void
test_random_faithful(void **st)
{
	int k;

	(void)st;
	for (k = 0; k < 300000; k++) {
		double m = (double)(rnd() >> 11) / 9007199254740992.0;
		int e = (int)(rnd() % 34) - 14;
		double x = (1 + 9 * m) * pow(10.0, e);

		check_faithful(k & 1 ? -x : x);
	}
	for (k = 0; k < 100000; k++) {
		uint64_t b = rnd();
		double x;

		memcpy(&x, &b, sizeof(x));
		if (isfinite(x))
			check_faithful(x);
	}
}

/*
 * Shortest form: a double that is the nearest to a decimal of K <= 10
 * significant digits is written with at most K digits, and reads back to
 * exactly the same double (strtod).  Values as gauges log them: 39.812,
 * -2.35, 0.001234 ...
 */
static void
test_shortest(void **st)
{
	int k;

	(void)st;
	for (k = 0; k < 300000; k++) {
		int nd = 1 + (int)(rnd() % 10), e = (int)(rnd() % 26) - 10, i;
		char txt[64], *p = txt;
		const char *s;
		double x;

		if (rnd() & 1)
			*p++ = '-';
		*p++ = (char)('1' + rnd() % 9);
		*p++ = '.';
		for (i = 1; i < nd; i++)
			*p++ = (char)('0' + rnd() % 10);
		sprintf(p, "e%d", e);
		x = strtod(txt, NULL);
		s = fmt(x);
		if (strtod(s, NULL) != x || sigdigits(s) > nd) {
			print_error("%s (%.17g) -> '%s'\n", txt, x, s);
			fail();
		}
	}
}

/* csvout_fixed: at most DIGITS decimals, trailing zeros dropped. */
static void
test_fixed(void **st)
{
	char *out = NULL, want[400];
	size_t outlen = 0, n;
	struct csvout w;
	FILE *fp;

	(void)st;
	fp = open_memstream(&out, &outlen);
	assert_non_null(fp);
	csvout_init(&w, fp);
	csvout_fixed(&w, 1.5, 3);
	csvout_fixed(&w, 2.0, 3);
	csvout_fixed(&w, 3.14159, 2);
	csvout_fixed(&w, -0.0004, 3);
	csvout_fixed(&w, -2.71828, 4);
	csvout_fixed(&w, 0.125, 6);
	csvout_fixed(&w, NAN, 2);
	csvout_fixed(&w, 41.0, 0);
	csvout_fixed(&w, 1e7, 12);
	csvout_fixed(&w, 123456789.25, 12);
	csvout_fixed(&w, -5e18, 2);
	csvout_endrow(&w);
	csvout_fixed(&w, 1e300, 2);
	csvout_endrow(&w);
	assert_int_equal(csvout_flush(&w), 0);
	fclose(fp);
	n = (size_t)snprintf(want, sizeof(want), "1.5,2,3.14,0,-2.7183,0.125,,"
	    "41,10000000,123456789.25,-5000000000000000000\n%.0f\n", 1e300);
	assert_int_equal(outlen, n);
	assert_string_equal(out, want);
	csvout_free(&w);
	free(out);
}

/* RFC 4180 quoting, empty fields, integers, times, headers. */
static void
test_quoting(void **st)
{
	char *out = NULL;
	size_t outlen = 0;
	struct csvout w;
	FILE *fp;

	(void)st;
	fp = open_memstream(&out, &outlen);
	assert_non_null(fp);
	csvout_init(&w, fp);
	csvout_header(&w, "a,b,c,d,e,f,g");
	csvout_str(&w, "plain");
	csvout_str(&w, "a,b");
	csvout_str(&w, "say \"hi\"");
	csvout_str(&w, "two\nlines");
	csvout_str(&w, "cr\rx");
	csvout_str(&w, "");
	csvout_strn(&w, "\"", 1);
	csvout_endrow(&w);
	csvout_empty(&w);
	csvout_empty(&w);
	csvout_endrow(&w);
	csvout_int(&w, INT64_MIN);
	csvout_int(&w, INT64_MAX);
	csvout_int(&w, 0);
	csvout_int(&w, -42);
	csvout_time(&w, 1772323260LL * CW_US_PER_S + 500000);
	csvout_strn(&w, "EB-0042xyz", 7);
	csvout_num(&w, 39.812);
	csvout_endrow(&w);
	assert_int_equal(csvout_flush(&w), 0);
	fclose(fp);
	assert_string_equal(out,
	    "a,b,c,d,e,f,g\n"
	    "plain,\"a,b\",\"say \"\"hi\"\"\",\"two\nlines\",\"cr\rx\",,"
	    "\"\"\"\"\n"
	    ",\n"
	    "-9223372036854775808,9223372036854775807,0,-42,"
	    "2026-03-01T00:01:00.5Z,EB-0042,39.812\n");
	csvout_free(&w);
	free(out);
}

/* The Gregorian leap year rule (ISO 8601-1:2019, 4.2.3). */
static int
leap(long y)
{
	return (y % 4 == 0 && y % 100 != 0) || y % 400 == 0;
}

/*
 * Epoch seconds of 00:00:00Z on day YDAY (0-based) of year Y >= 1970,
 * by the formula of POSIX.1-2017 XBD 4.16 with tm_year = Y - 1900.
 */
static long long
posix_epoch(long y, long yday)
{
	long long ty = y - 1900;

	return yday * 86400LL + (ty - 70) * 31536000LL +
	    ((ty - 69) / 4) * 86400LL - ((ty - 1) / 100) * 86400LL +
	    ((ty + 299) / 400) * 86400LL;
}

/* What csvout_date() writes for T, as a string (static buffer). */
static const char *
date_of(cw_time t)
{
	static char buf[64];
	char *out = NULL;
	size_t outlen = 0;
	struct csvout w;
	FILE *fp;

	fp = open_memstream(&out, &outlen);
	assert_non_null(fp);
	csvout_init(&w, fp);
	csvout_str(&w, "x");
	csvout_date(&w, t);
	csvout_str(&w, "y");
	csvout_endrow(&w);
	assert_int_equal(csvout_flush(&w), 0);
	fclose(fp);
	assert_true(outlen >= 5 && outlen < sizeof(buf));
	assert_true(strncmp(out, "x,", 2) == 0 &&
	    strcmp(out + outlen - 3, ",y\n") == 0);
	memcpy(buf, out + 2, outlen - 5);
	buf[outlen - 5] = '\0';
	csvout_free(&w);
	free(out);
	return buf;
}

/*
 * Calendar dates: each day's first and last microsecond and one in
 * between, for random days of 1970..9999 against the POSIX formula; days
 * round down before the epoch; an empty field outside 0000..9999.
 */
/*
 * RFC 4180's rule, written out byte by byte here, against csvout_strn():
 * random fields of 0 to 40 bytes drawn mostly from the four bytes that
 * force quotes, NUL and bytes above 0x7f, at each offset from an aligned
 * buffer.
 */
static void
test_quoting_random(void **st)
{
	static const char pool[] = { ',', '"', '\n', '\r', '\0', 'a', ' ',
	    (char)0x80, (char)0xff, (char)0x2b, (char)0x2d, (char)0x0b };
	char field[48], want[128], *out = NULL;
	size_t outlen = 0, n, k, m;
	struct csvout w;
	FILE *fp;
	int round, quote;

	(void)st;
	for (round = 0; round < 20000; round++) {
		size_t off = (size_t)round % 8;

		n = (size_t)(rnd() % 41);
		for (k = 0; k < n; k++)
			field[off + k] = rnd() % 4 == 0 ? pool[rnd() % 4] :
			    pool[rnd() % sizeof(pool)];
		quote = 0;
		for (k = 0; k < n; k++)
			if (strchr(",\"\n\r", field[off + k]) != NULL &&
			    field[off + k] != '\0')
				quote = 1;
		m = 0;
		if (quote)
			want[m++] = '"';
		for (k = 0; k < n; k++) {
			if (field[off + k] == '"')
				want[m++] = '"';
			want[m++] = field[off + k];
		}
		if (quote)
			want[m++] = '"';
		want[m++] = '\n';
		fp = open_memstream(&out, &outlen);
		assert_non_null(fp);
		csvout_init(&w, fp);
		csvout_strn(&w, field + off, n);
		csvout_endrow(&w);
		assert_int_equal(csvout_flush(&w), 0);
		csvout_free(&w);
		fclose(fp);
		assert_int_equal(outlen, m);
		assert_memory_equal(out, want, m);
		free(out);
		out = NULL;
	}
}

static void
test_date(void **st)
{
	static const int mdays[12] = {
		31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31
	};
	const cw_time day = 86400 * CW_US_PER_S;
	char want[32];
	long y, yday, k;
	int m, d, i;
	cw_time t0;

	(void)st;
	assert_string_equal(date_of(0), "1970-01-01");
	assert_string_equal(date_of(-1), "1969-12-31");
	assert_string_equal(date_of(-day), "1969-12-31");
	assert_string_equal(date_of(-day - 1), "1969-12-30");
	assert_string_equal(date_of(day - 1), "1970-01-01");
	/* 2000 is a leap year (divisible by 400), 1900 and 2100 are not. */
	assert_string_equal(date_of(posix_epoch(2000, 59) * CW_US_PER_S),
	    "2000-02-29");
	assert_string_equal(date_of(posix_epoch(2100, 59) * CW_US_PER_S),
	    "2100-03-01");
	assert_string_equal(date_of(-62135596800LL * CW_US_PER_S),
	    "0001-01-01");
	/* Year 0000 is a leap year of the proleptic calendar: 366 days. */
	assert_string_equal(date_of((-62135596800LL - 366 * 86400LL) *
	    CW_US_PER_S), "0000-01-01");
	assert_string_equal(date_of((-62135596800LL - 366 * 86400LL) *
	    CW_US_PER_S - 1), "");
	assert_string_equal(date_of(253402300800LL * CW_US_PER_S - 1),
	    "9999-12-31");
	assert_string_equal(date_of(253402300800LL * CW_US_PER_S), "");
	assert_string_equal(date_of(INT64_MAX), "");
	assert_string_equal(date_of(INT64_MIN), "");
	for (k = 0; k < 20000; k++) {
		y = 1970 + (long)(rnd() % (9999 - 1970 + 1));
		yday = (long)(rnd() % (leap(y) ? 366 : 365));
		for (m = 0, d = (int)yday; ; m++) {
			int len = mdays[m] + (m == 1 && leap(y));

			if (d < len)
				break;
			d -= len;
		}
		snprintf(want, sizeof(want), "%04ld-%02d-%02d", y, m + 1,
		    d + 1);
		t0 = posix_epoch(y, yday) * CW_US_PER_S;
		for (i = 0; i < 3; i++) {
			cw_time t = t0 + (i == 0 ? 0 : i == 1 ?
			    (cw_time)(rnd() % (uint64_t)day) : day - 1);

			if (strcmp(date_of(t), want) != 0) {
				print_error("t %lld: got %s, want %s\n",
				    (long long)t, date_of(t), want);
				fail();
			}
		}
	}
}

/* Far more than the 256 KiB buffer, and one field larger than it: every
 * byte arrives, in order. */
static void
test_large_output(void **st)
{
	char *out = NULL, *want, *big;
	size_t outlen = 0, wn = 0, bn = 700000, i;
	struct csvout w;
	FILE *fp;
	int k;

	(void)st;
	want = malloc(16u << 20);
	big = malloc(bn + 1);
	assert_non_null(want);
	assert_non_null(big);
	for (i = 0; i < bn; i++)
		big[i] = i % 1000 == 999 ? '"' : (char)('a' + i % 26);
	big[bn] = '\0';
	fp = open_memstream(&out, &outlen);
	assert_non_null(fp);
	csvout_init(&w, fp);
	for (k = 0; k < 300000; k++) {
		csvout_str(&w, "EB-1");
		csvout_int(&w, k);
		csvout_num(&w, k / 8.0);
		csvout_endrow(&w);
		wn += (size_t)sprintf(want + wn, "EB-1,%d,%.10g\n", k, k / 8.0);
		if (k == 150000) {
			csvout_str(&w, big);
			csvout_endrow(&w);
			want[wn++] = '"';
			for (i = 0; i < bn; i++) {
				if (big[i] == '"')
					want[wn++] = '"';
				want[wn++] = big[i];
			}
			want[wn++] = '"';
			want[wn++] = '\n';
		}
	}
	assert_int_equal(csvout_flush(&w), 0);
	fclose(fp);
	assert_int_equal(outlen, wn);
	assert_memory_equal(out, want, wn);
	csvout_free(&w);
	free(out);
	free(want);
	free(big);
}

/* A write error (the disk full device) is reported by csvout_flush(). */
static void
test_write_error(void **st)
{
	struct csvout w;
	FILE *fp = fopen("/dev/full", "w");
	int k;

	(void)st;
	if (fp == NULL)
		skip();
	csvout_init(&w, fp);
	for (k = 0; k < 100000; k++) {
		csvout_num(&w, k);
		csvout_endrow(&w);
	}
	assert_int_equal(csvout_flush(&w), -1);
	assert_true(w.err);
	fclose(fp);
	csvout_free(&w);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_values),
		cmocka_unit_test(test_large),
		cmocka_unit_test(test_random_faithful),
		cmocka_unit_test(test_shortest),
		cmocka_unit_test(test_fixed),
		cmocka_unit_test(test_quoting),
		cmocka_unit_test(test_quoting_random),
		cmocka_unit_test(test_date),
		cmocka_unit_test(test_large_output),
		cmocka_unit_test(test_write_error),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
