/*
 * ts.c: ISO 8601 and epoch timestamps.  Calendar arithmetic uses the
 * days-from-civil algorithms of H. Hinnant ("chrono-Compatible Low-Level
 * Date Algorithms"), valid for the proleptic Gregorian calendar.
 */
#include <stdio.h>
#include <string.h>

#include "num.h"
#include "ts.h"

static int digits(const char *, int, long *);
static int days_in_month(long, unsigned);

long
ts_days_from_civil(long y, unsigned m, unsigned d)
{
	long era, yoe, doy, doe;

	y -= m <= 2;
	era = (y >= 0 ? y : y - 399) / 400;
	yoe = y - era * 400;
	doy = (153 * (m + (m > 2 ? -3 : 9)) + 2) / 5 + d - 1;
	doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
	return era * 146097 + doe - 719468;
}

void
ts_civil_from_days(long z, long *y, unsigned *m, unsigned *d)
{
	long era, doe, yoe, doy, mp;

	z += 719468;
	era = (z >= 0 ? z : z - 146096) / 146097;
	doe = z - era * 146097;
	yoe = (doe - doe / 1460 + doe / 36524 - doe / 146096) / 365;
	doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
	mp = (5 * doy + 2) / 153;
	*d = (unsigned)(doy - (153 * mp + 2) / 5 + 1);
	*m = (unsigned)(mp < 10 ? mp + 3 : mp - 9);
	*y = yoe + era * 400 + (*m <= 2);
}

static int
days_in_month(long y, unsigned m)
{
	static const int dm[] = { 31, 28, 31, 30, 31, 30, 31, 31, 30, 31,
	    30, 31 };
	int leap = (y % 4 == 0 && y % 100 != 0) || y % 400 == 0;

	return m == 2 ? 28 + leap : dm[m - 1];
}

/* N decimal digits at S into *V; 0 or -1. */
static int
digits(const char *s, int n, long *v)
{
	long x = 0;
	int i;

	for (i = 0; i < n; i++) {
		if ((unsigned)(s[i] - '0') > 9)
			return -1;
		x = x * 10 + (s[i] - '0');
	}
	*v = x;
	return 0;
}

int
ts_parse_offset(const char *s, long *off)
{
	size_t n = strlen(s);
	long h, m = 0;
	int sign;

	if (n == 4 && s[0] == ' ') {	/* "... UTC" */
		s++;
		n--;
	}
	if ((n == 1 && (s[0] == 'Z' || s[0] == 'z')) || (n == 3 &&
	    (strcmp(s, "UTC") == 0 || strcmp(s, "GMT") == 0))) {
		*off = 0;
		return 0;
	}
	if (n < 3 || (s[0] != '+' && s[0] != '-'))
		return -1;
	sign = s[0] == '-' ? -1 : 1;
	if (digits(s + 1, 2, &h) < 0)
		return -1;
	if (n == 6 && s[3] == ':') {
		if (digits(s + 4, 2, &m) < 0)
			return -1;
	} else if (n == 5) {
		if (digits(s + 3, 2, &m) < 0)
			return -1;
	} else if (n != 3)
		return -1;
	if (h > 18 || m > 59)
		return -1;
	*off = sign * (h * 3600 + m * 60);
	return 0;
}

static int
parse_iso(const char *s, size_t n, long offset_s, cw_time *out)
{
	const char *p = s, *e = s + n;
	long y, mo, d, h, mi, sec = 0, us = 0, off = offset_s;
	int64_t t;

	/* YYYY-MM-DD, or YYYY/MM/DD as some loggers write it. */
	if (n < 16 || digits(p, 4, &y) < 0 || (p[4] != '-' && p[4] != '/') ||
	    digits(p + 5, 2, &mo) < 0 || p[7] != p[4] ||
	    digits(p + 8, 2, &d) < 0 || (p[10] != 'T' && p[10] != 't' &&
	    p[10] != ' ') || digits(p + 11, 2, &h) < 0 || p[13] != ':' ||
	    digits(p + 14, 2, &mi) < 0)
		return -1;
	p += 16;
	if (p < e && *p == ':') {
		if (e - p < 3 || digits(p + 1, 2, &sec) < 0)
			return -1;
		p += 3;
		if (p < e && (*p == '.' || *p == ',')) {
			long scale = 100000;

			p++;
			if (p == e || (unsigned)(*p - '0') > 9)
				return -1;
			for (; p < e && (unsigned)(*p - '0') <= 9; p++) {
				us += (*p - '0') * scale;
				scale /= 10;
			}
		}
	}
	if (p < e) {
		char z[8];
		size_t zl = (size_t)(e - p);

		if (zl >= sizeof(z))
			return -1;
		memcpy(z, p, zl);
		z[zl] = '\0';
		if (ts_parse_offset(z, &off) < 0)
			return -1;
	}
	if (mo < 1 || mo > 12 || d < 1 || d > days_in_month(y, (unsigned)mo) ||
	    h > 23 || mi > 59 || sec > 60)
		return -1;
	t = (int64_t)ts_days_from_civil(y, (unsigned)mo, (unsigned)d) * 86400 +
	    h * 3600 + mi * 60 + sec - off;
	*out = t * CW_US_PER_S + us;
	return 0;
}

int
ts_parse(const char *s, size_t n, int kind, long offset_s, cw_time *out)
{
	double x, scale;
	int64_t mul, lim;

	while (n > 0 && (*s == ' ' || *s == '\t'))
		s++, n--;
	while (n > 0 && (s[n - 1] == ' ' || s[n - 1] == '\t'))
		n--;
	if (n == 0)
		return -1;
	if (kind == TS_ISO || (kind == TS_AUTO && n >= 10 && (s[4] == '-' ||
	    s[4] == '/')))
		return parse_iso(s, n, offset_s, out);
	switch (kind) {
	case TS_EPOCH_MS:
		scale = 1e3;
		mul = 1000;
		lim = INT64_MAX / 1000 / 2;
		break;
	case TS_EPOCH_US:
		scale = 1.0;
		mul = 1;
		lim = INT64_MAX / 1 / 2;
		break;
	default:
		scale = 1e6;
		mul = 1000000;
		lim = INT64_MAX / 1000000 / 2;
		break;
	}
	/* Whole numbers are converted exactly; fractions through double. */
	{
		const char *p = s;
		int neg = 0;
		int64_t v = 0;
		size_t i;

		if (*p == '-' || *p == '+')
			neg = *p++ == '-';
		i = (size_t)(p - s);
		/* Up to 18 digits cannot overflow: no check for each. */
		if (n - i <= 18)
			for (; i < n && (unsigned)(s[i] - '0') <= 9; i++)
				v = v * 10 + (s[i] - '0');
		for (; i < n; i++) {
			if ((unsigned)(s[i] - '0') > 9)
				break;
			if (v > (INT64_MAX - 9) / 10)
				return -1;
			v = v * 10 + (s[i] - '0');
		}
		if (i == n && i > (size_t)(p - s)) {
			if (v > lim)
				return -1;
			*out = (neg ? -v : v) * mul;
			return 0;
		}
	}
	if (num_parse(s, n, '.', &x) != NUM_OK)
		return -1;
	x *= scale;
	if (x > 9.2e18 / 2 || x < -9.2e18 / 2)
		return -1;
	*out = (cw_time)(x < 0 ? x - 0.5 : x + 0.5);
	return 0;
}

size_t
ts_format_date(long y, unsigned m, unsigned d, char *p)
{
	p[0] = (char)('0' + y / 1000);
	p[1] = (char)('0' + y / 100 % 10);
	p[2] = (char)('0' + y / 10 % 10);
	p[3] = (char)('0' + y % 10);
	p[4] = '-';
	p[5] = (char)('0' + m / 10);
	p[6] = (char)('0' + m % 10);
	p[7] = '-';
	p[8] = (char)('0' + d / 10);
	p[9] = (char)('0' + d % 10);
	return 10;
}

size_t
ts_format(cw_time t, char *buf)
{
	int64_t sec = t / CW_US_PER_S, us = t % CW_US_PER_S, days, rem;
	long y;
	unsigned m, d, hh, mm, ss;
	char *p = buf;
	int i;

	if (us < 0) {
		us += CW_US_PER_S;
		sec--;
	}
	days = sec / 86400;
	rem = sec % 86400;
	if (rem < 0) {
		rem += 86400;
		days--;
	}
	ts_civil_from_days((long)days, &y, &m, &d);
	hh = (unsigned)(rem / 3600);
	mm = (unsigned)(rem / 60 % 60);
	ss = (unsigned)(rem % 60);
	if (y < 0 || y > 9999) {
		/* Outside ISO 8601's four-digit years: plain epoch seconds. */
		return (size_t)snprintf(buf, TS_FMTMAX, "%lld", (long long)sec);
	}
	ts_format_date(y, m, d, p);
	p[10] = 'T';
	p[11] = (char)('0' + hh / 10);
	p[12] = (char)('0' + hh % 10);
	p[13] = ':';
	p[14] = (char)('0' + mm / 10);
	p[15] = (char)('0' + mm % 10);
	p[16] = ':';
	p[17] = (char)('0' + ss / 10);
	p[18] = (char)('0' + ss % 10);
	p += 19;
	if (us != 0) {
		char f[6];
		int n = 6;

		for (i = 5; i >= 0; i--) {
			f[i] = (char)('0' + us % 10);
			us /= 10;
		}
		while (n > 0 && f[n - 1] == '0')
			n--;
		*p++ = '.';
		memcpy(p, f, (size_t)n);
		p += n;
	}
	*p++ = 'Z';
	*p = '\0';
	return (size_t)(p - buf);
}
