/*
 * test_ts.c: timestamps (lib/ts.c).
 *
 * References:
 * - POSIX.1-2017, XBD 4.16 "Seconds Since the Epoch": the formula
 *     tm_sec + tm_min*60 + tm_hour*3600 + tm_yday*86400 +
 *     (tm_year-70)*31536000 + ((tm_year-69)/4)*86400 -
 *     ((tm_year-1)/100)*86400 + ((tm_year+299)/400)*86400
 *   (written from memory of the standard's text; it is checked below
 *   against values printed by GNU date, so a slip would show), used as an
 *   independent reference for every date from 1970 on.  It has no leap
 *   seconds, so 23:59:60 lands on the next day's 00:00:00.
 * - The Gregorian leap-year rule (ISO 8601-1:2019, 3.2.1 / the calendar
 *   itself): divisible by 4, except centuries not divisible by 400.
 * - Values from GNU date 9.1 (`date -u -d ... +%s`), run by hand when the
 *   test was written, for a few fixed instants.
 * tests/ref/ts_python.sh compares many random timestamps with Python's
 * datetime.
 */
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <string.h>
#include <cmocka.h>

#include "ts.h"

static uint64_t rng_state = 0x2545f4914f6cdd1du;

static uint64_t rnd(void);
static long posix_epoch(long, int, int, int, int, int);
static cw_time parse_ok(const char *, int, long);
static void parse_bad(const char *, int);
static void fmt_is(cw_time, const char *);

static uint64_t
rnd(void)
{
	rng_state ^= rng_state >> 12;
	rng_state ^= rng_state << 25;
	rng_state ^= rng_state >> 27;
	return rng_state * 2685821657736338717u;
}

/* POSIX XBD 4.16 from a calendar date (year >= 1970). */
static long
posix_epoch(long y, int mo, int d, int h, int mi, int s)
{
	static const int cum[] = { 0, 31, 59, 90, 120, 151, 181, 212, 243,
	    273, 304, 334 };
	long tm_year = y - 1900;
	int leap = (y % 4 == 0 && y % 100 != 0) || y % 400 == 0;
	long yday = cum[mo - 1] + d - 1 + (leap && mo > 2);

	return s + mi * 60L + h * 3600L + yday * 86400L +
	    (tm_year - 70) * 31536000L + ((tm_year - 69) / 4) * 86400L -
	    ((tm_year - 1) / 100) * 86400L + ((tm_year + 299) / 400) * 86400L;
}

static cw_time
parse_ok(const char *s, int kind, long off)
{
	cw_time t = 0;

	if (ts_parse(s, strlen(s), kind, off, &t) != 0) {
		print_error("'%s' rejected\n", s);
		fail();
	}
	return t;
}

static void
parse_bad(const char *s, int kind)
{
	cw_time t = 777;

	if (ts_parse(s, strlen(s), kind, 0, &t) == 0 || t != 777) {
		print_error("'%s' accepted as %lld\n", s, (long long)t);
		fail();
	}
}

static void
fmt_is(cw_time t, const char *want)
{
	char buf[TS_FMTMAX];
	size_t n = ts_format(t, buf);

	if (strcmp(buf, want) != 0 || n != strlen(want)) {
		print_error("%lld: got '%s' (%zu), want '%s'\n", (long long)t,
		    buf, n, want);
		fail();
	}
}

/* The reference formula itself, against GNU date 9.1:
 *   date -u -d 2026-03-01T00:01:00Z +%s   -> 1772323260
 *   date -u -d 2000-02-29T12:00:00Z +%s   -> 951825600
 *   date -u -d 2100-12-31T23:59:59Z +%s   -> 4133980799 */
static void
test_reference_formula(void **st)
{
	(void)st;
	assert_int_equal(posix_epoch(1970, 1, 1, 0, 0, 0), 0);
	assert_int_equal(posix_epoch(2026, 3, 1, 0, 1, 0), 1772323260L);
	assert_int_equal(posix_epoch(2000, 2, 29, 12, 0, 0), 951825600L);
	assert_int_equal(posix_epoch(2100, 12, 31, 23, 59, 59), 4133980799L);
}

static void
test_iso_zulu(void **st)
{
	(void)st;
	assert_int_equal(parse_ok("2026-03-01T00:01:00Z", TS_ISO, 0),
	    1772323260LL * CW_US_PER_S);
	assert_int_equal(parse_ok("1970-01-01T00:00:00Z", TS_ISO, 0), 0);
	assert_int_equal(parse_ok("1970-01-01T00:00:00z", TS_ISO, 0), 0);
	/* Space separator (ISO 8601 permits it by agreement; RFC 3339 5.6). */
	assert_int_equal(parse_ok("2026-03-01 00:01:00Z", TS_ISO, 0),
	    1772323260LL * CW_US_PER_S);
	/* Minutes only. */
	assert_int_equal(parse_ok("2026-03-01T00:01Z", TS_ISO, 0),
	    1772323260LL * CW_US_PER_S);
	/* The sample stream's TS_AUTO reads ISO too; blanks are trimmed. */
	assert_int_equal(parse_ok(" 2026-03-01T00:01:00Z ", TS_AUTO, 0),
	    1772323260LL * CW_US_PER_S);
}

/* Offsets east of UTC are subtracted: 01:01+01:00 is 00:01Z. */
static void
test_iso_offsets(void **st)
{
	cw_time z = 1772323260LL * CW_US_PER_S;

	(void)st;
	assert_int_equal(parse_ok("2026-03-01T01:01:00+01:00", TS_ISO, 0), z);
	assert_int_equal(parse_ok("2026-03-01T01:01:00+0100", TS_ISO, 0), z);
	assert_int_equal(parse_ok("2026-03-01T02:01:00+02", TS_ISO, 0), z);
	assert_int_equal(parse_ok("2026-02-28T18:31:00-0530", TS_ISO, 0), z);
	assert_int_equal(parse_ok("2026-02-28T18:31:00-05:30", TS_ISO, 0), z);
	assert_int_equal(parse_ok("2026-03-01T00:01:00+00:00", TS_ISO, 0), z);
	assert_int_equal(parse_ok("2026-03-01T00:01:00-00:00", TS_ISO, 0), z);
	/* No zone: local time at the caller's offset (here UTC+01:00). */
	assert_int_equal(parse_ok("2026-03-01T01:01:00", TS_ISO, 3600), z);
	assert_int_equal(parse_ok("2026-03-01T00:01:00", TS_ISO, 0), z);
	/* An explicit zone wins over the caller's offset. */
	assert_int_equal(parse_ok("2026-03-01T00:01:00Z", TS_ISO, 3600), z);
	/* Malformed zones. */
	parse_bad("2026-03-01T00:01:00+1", TS_ISO);
	parse_bad("2026-03-01T00:01:00+01:", TS_ISO);
	parse_bad("2026-03-01T00:01:00+01:0", TS_ISO);
	parse_bad("2026-03-01T00:01:00+01:60", TS_ISO);
	parse_bad("2026-03-01T00:01:00+0a:00", TS_ISO);
	parse_bad("2026-03-01T00:01:00ZZ", TS_ISO);
	parse_bad("2026-03-01T00:01:00 Z", TS_ISO);
	/* "UTC" and "GMT" for Z, as loggers write them (not ISO 8601). */
	assert_int_equal(parse_ok("2026-03-01T00:01:00UTC", TS_ISO, 3600),
	    posix_epoch(2026, 3, 1, 0, 1, 0) * CW_US_PER_S);
	assert_int_equal(parse_ok("2026-03-01 00:01:00 GMT", TS_ISO, 3600),
	    posix_epoch(2026, 3, 1, 0, 1, 0) * CW_US_PER_S);
	parse_bad("2026-03-01T00:01:00 CET", TS_ISO);
}

static void
test_parse_offset(void **st)
{
	long off = 1;

	(void)st;
	assert_int_equal(ts_parse_offset("Z", &off), 0);
	assert_int_equal(off, 0);
	assert_int_equal(ts_parse_offset("+05:30", &off), 0);
	assert_int_equal(off, 19800);
	assert_int_equal(ts_parse_offset("-0800", &off), 0);
	assert_int_equal(off, -28800);
	assert_int_equal(ts_parse_offset("+02", &off), 0);
	assert_int_equal(off, 7200);
	assert_int_equal(ts_parse_offset("+14:00", &off), 0);
	assert_int_equal(off, 50400);
	off = 99;
	assert_int_equal(ts_parse_offset("+5", &off), -1);
	assert_int_equal(ts_parse_offset("0530", &off), -1);
	assert_int_equal(ts_parse_offset("+05:3", &off), -1);
	assert_int_equal(ts_parse_offset("+05-30", &off), -1);
	assert_int_equal(ts_parse_offset("", &off), -1);
	assert_int_equal(off, 99);
}

/* Fractions: microseconds kept; ISO 8601 allows ',' as the mark too;
 * digits past the sixth are dropped, as Python's fromisoformat does. */
static void
test_iso_fraction(void **st)
{
	cw_time z = 1772323260LL * CW_US_PER_S;

	(void)st;
	assert_int_equal(parse_ok("2026-03-01T00:01:00.5Z", TS_ISO, 0),
	    z + 500000);
	assert_int_equal(parse_ok("2026-03-01T00:01:00,25Z", TS_ISO, 0),
	    z + 250000);
	assert_int_equal(parse_ok("2026-03-01T00:01:00.000001Z", TS_ISO, 0),
	    z + 1);
	assert_int_equal(parse_ok("2026-03-01T00:01:00.123456Z", TS_ISO, 0),
	    z + 123456);
	assert_int_equal(parse_ok("2026-03-01T00:01:00.1234569Z", TS_ISO, 0),
	    z + 123456);
	assert_int_equal(parse_ok("2026-03-01T01:01:00.75+01:00", TS_ISO, 0),
	    z + 750000);
	parse_bad("2026-03-01T00:01:00.Z", TS_ISO);
	parse_bad("2026-03-01T00:01:00.", TS_ISO);
	parse_bad("2026-03-01T00:01:00.5.5Z", TS_ISO);
	parse_bad("2026-03-01T00:01.5Z", TS_ISO);
}

/* Impossible dates and times are rejected, not rolled over. */
static void
test_iso_invalid(void **st)
{
	static const char *bad[] = {
		"2026-13-01T00:00:00Z", "2026-00-10T00:00:00Z",
		"2026-02-30T00:00:00Z", "2023-02-29T00:00:00Z",
		"1900-02-29T00:00:00Z", "2100-02-29T00:00:00Z",
		"2026-04-31T00:00:00Z", "2026-01-32T00:00:00Z",
		"2026-01-00T00:00:00Z", "2026-03-01T24:00:00Z",
		"2026-03-01T25:00:00Z", "2026-03-01T00:60:00Z",
		"2026-03-01T00:00:61Z", "2026-3-01T00:00:00Z",
		"2026-03-1T00:00:00Z", "2026-03-01T0:00:00Z",
		"2026-03-01T00:00:0Z", "2026/03-01T00:00:00Z",
		"2026-03/01T00:00:00Z", "2026/13/01T00:00:00Z",
		"2026-03-01X00:00:00Z", "2026-03-01", "2026-03-01T",
		"2026-03-01T00", "20260301T000000Z", "2026-03-01T00:00:00Zjunk",
		"abcd-ef-ghTij:kl:mnZ", "", "   ",
	};
	size_t i;

	(void)st;
	for (i = 0; i < sizeof(bad) / sizeof(bad[0]); i++)
		parse_bad(bad[i], TS_ISO);
	/* Slashes, as some loggers write dates (not ISO 8601, but read). */
	assert_int_equal(parse_ok("2026/03/01 00:00:00Z", TS_ISO, 0),
	    posix_epoch(2026, 3, 1, 0, 0, 0) * CW_US_PER_S);
	/* The leap days that do exist. */
	assert_int_equal(parse_ok("2024-02-29T00:00:00Z", TS_ISO, 0),
	    posix_epoch(2024, 2, 29, 0, 0, 0) * CW_US_PER_S);
	assert_int_equal(parse_ok("2000-02-29T00:00:00Z", TS_ISO, 0),
	    posix_epoch(2000, 2, 29, 0, 0, 0) * CW_US_PER_S);
}

/* ts.h: a leap second (:60) is the first instant of the next minute,
 * which is also what the POSIX formula gives for tm_sec = 60. */
static void
test_leap_second(void **st)
{
	(void)st;
	assert_int_equal(parse_ok("2016-12-31T23:59:60Z", TS_ISO, 0),
	    parse_ok("2017-01-01T00:00:00Z", TS_ISO, 0));
	assert_int_equal(parse_ok("2016-12-31T23:59:60Z", TS_ISO, 0),
	    posix_epoch(2016, 12, 31, 23, 59, 60) * CW_US_PER_S);
	assert_int_equal(parse_ok("2016-12-31T23:59:60.5Z", TS_ISO, 0),
	    parse_ok("2017-01-01T00:00:00.5Z", TS_ISO, 0));
}

/* Every day from 1970 to 2100 at a random time of day, against the POSIX
 * formula, and back through ts_format. */
static void
test_every_day(void **st)
{
	static const int dm[] = { 31, 28, 31, 30, 31, 30, 31, 31, 30, 31,
	    30, 31 };
	long y;
	int mo, d;

	(void)st;
	for (y = 1970; y <= 2100; y++)
		for (mo = 1; mo <= 12; mo++) {
			int leap = (y % 4 == 0 && y % 100 != 0) ||
			    y % 400 == 0;
			int nd = dm[mo - 1] + (mo == 2 && leap);

			for (d = 1; d <= nd + 1; d++) {
				char s[64], back[TS_FMTMAX];
				int h = (int)(rnd() % 24), mi = (int)(rnd() %
				    60), sec = (int)(rnd() % 60);
				cw_time t;

				snprintf(s, sizeof(s),
				    "%04ld-%02d-%02dT%02d:%02d:%02dZ", y, mo,
				    d, h, mi, sec);
				if (d > nd) {
					parse_bad(s, TS_ISO);
					continue;
				}
				t = parse_ok(s, TS_ISO, 0);
				if (t != posix_epoch(y, mo, d, h, mi, sec) *
				    CW_US_PER_S) {
					print_error("%s: %lld\n", s,
					    (long long)t);
					fail();
				}
				ts_format(t, back);
				assert_string_equal(back, s);
			}
		}
}

/* Epoch numbers: seconds (fraction allowed), milliseconds, microseconds;
 * TS_AUTO takes a plain number as seconds (cellwear(7): "Readers also accept
 * epoch seconds in this column"). */
static void
test_epoch(void **st)
{
	(void)st;
	assert_int_equal(parse_ok("1772323260", TS_EPOCH_S, 0),
	    1772323260LL * CW_US_PER_S);
	assert_int_equal(parse_ok("1772323260", TS_AUTO, 0),
	    1772323260LL * CW_US_PER_S);
	assert_int_equal(parse_ok("1772323260.25", TS_EPOCH_S, 0),
	    1772323260LL * CW_US_PER_S + 250000);
	assert_int_equal(parse_ok("1772323260.000001", TS_AUTO, 0),
	    1772323260LL * CW_US_PER_S + 1);
	assert_int_equal(parse_ok("1772323260123", TS_EPOCH_MS, 0),
	    1772323260123LL * 1000);
	assert_int_equal(parse_ok("1772323260123.5", TS_EPOCH_MS, 0),
	    1772323260123LL * 1000 + 500);
	assert_int_equal(parse_ok("1772323260123456", TS_EPOCH_US, 0),
	    1772323260123456LL);
	assert_int_equal(parse_ok("0", TS_EPOCH_S, 0), 0);
	assert_int_equal(parse_ok("-1", TS_EPOCH_S, 0), -CW_US_PER_S);
	assert_int_equal(parse_ok("+60", TS_EPOCH_S, 0), 60 * CW_US_PER_S);
	/* Large exact integers stay exact (no trip through double). */
	assert_int_equal(parse_ok("4133980799999999", TS_EPOCH_US, 0),
	    4133980799999999LL);
	parse_bad("12abc", TS_EPOCH_S);
	parse_bad("nan", TS_EPOCH_S);
	parse_bad("inf", TS_EPOCH_S);
	parse_bad("0x10", TS_EPOCH_S);
	parse_bad("-", TS_EPOCH_S);
	parse_bad("1e300", TS_EPOCH_S);
	parse_bad("99999999999999999999999", TS_EPOCH_US);
	parse_bad("9223372036854775807", TS_EPOCH_S);
	parse_bad("2026-03-01T00:01:00Z", TS_EPOCH_S);
}

static void
test_format(void **st)
{
	cw_time z = 1772323260LL * CW_US_PER_S;

	(void)st;
	fmt_is(0, "1970-01-01T00:00:00Z");
	fmt_is(z, "2026-03-01T00:01:00Z");
	/* Fraction only when not whole, trailing zeros dropped. */
	fmt_is(z + 500000, "2026-03-01T00:01:00.5Z");
	fmt_is(z + 120000, "2026-03-01T00:01:00.12Z");
	fmt_is(z + 1, "2026-03-01T00:01:00.000001Z");
	fmt_is(z + 999999, "2026-03-01T00:01:00.999999Z");
	fmt_is(z + 10, "2026-03-01T00:01:00.00001Z");
	/* Before the epoch (GNU date -u -d @-1: 1969-12-31 23:59:59). */
	fmt_is(-1, "1969-12-31T23:59:59.999999Z");
	fmt_is(-CW_US_PER_S, "1969-12-31T23:59:59Z");
	fmt_is(-CW_US_PER_S - 1, "1969-12-31T23:59:58.999999Z");
	/* GNU date -u -d @-62135596800: 0001-01-01 00:00:00. */
	fmt_is(-62135596800LL * CW_US_PER_S, "0001-01-01T00:00:00Z");
	/* GNU date -u -d @253402300799: 9999-12-31 23:59:59. */
	fmt_is(253402300799LL * CW_US_PER_S, "9999-12-31T23:59:59Z");
}

/* Random instants 1970..2100 with random microseconds: format, parse
 * back, same instant; the text has no trailing zero in its fraction. */
static void
test_format_roundtrip(void **st)
{
	int k;

	(void)st;
	for (k = 0; k < 200000; k++) {
		cw_time t = (cw_time)(rnd() % (4133980800ULL * CW_US_PER_S));
		char buf[TS_FMTMAX];
		size_t n;

		if (k % 3 == 0)
			t -= t % CW_US_PER_S;
		else if (k % 3 == 1)
			t -= t % 1000;
		n = ts_format(t, buf);
		assert_int_equal(n, strlen(buf));
		assert_true(buf[n - 1] == 'Z');
		if (n > 20) {
			assert_true(buf[19] == '.');
			assert_true(buf[n - 2] != '0');
		} else
			assert_true(t % CW_US_PER_S == 0);
		if (parse_ok(buf, TS_AUTO, 0) != t) {
			print_error("%lld -> %s\n", (long long)t, buf);
			fail();
		}
	}
}

/* days_from_civil and civil_from_days invert each other over +-1e6 days
 * and step one calendar day at a time. */
static void
test_civil(void **st)
{
	long z, y, py = 0;
	unsigned m, d, pm = 0, pd = 0;

	(void)st;
	assert_int_equal(ts_days_from_civil(1970, 1, 1), 0);
	/* GNU date -u -d 2000-03-01 +%s = 951868800 = 11017 days. */
	assert_int_equal(ts_days_from_civil(2000, 3, 1), 11017);
	/* Proleptic Gregorian 0000-03-01 is day -719468 (the algorithm's
	 * own anchor, same as Python's date(1,1,1).toordinal() - 719163
	 * - 306). */
	assert_int_equal(ts_days_from_civil(0, 3, 1), -719468);
	for (z = -1000000; z <= 1000000; z++) {
		ts_civil_from_days(z, &y, &m, &d);
		assert_int_equal(ts_days_from_civil(y, m, d), z);
		if (z > -1000000) {
			int next_day = y == py && m == pm && d == pd + 1;
			int next_month = y == py && m == pm + 1 && d == 1;
			int next_year = y == py + 1 && m == 1 && d == 1 &&
			    pm == 12 && pd == 31;

			assert_true(next_day || next_month || next_year);
		}
		py = y;
		pm = m;
		pd = d;
	}
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_reference_formula),
		cmocka_unit_test(test_iso_zulu),
		cmocka_unit_test(test_iso_offsets),
		cmocka_unit_test(test_parse_offset),
		cmocka_unit_test(test_iso_fraction),
		cmocka_unit_test(test_iso_invalid),
		cmocka_unit_test(test_leap_second),
		cmocka_unit_test(test_every_day),
		cmocka_unit_test(test_epoch),
		cmocka_unit_test(test_format),
		cmocka_unit_test(test_format_roundtrip),
		cmocka_unit_test(test_civil),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
