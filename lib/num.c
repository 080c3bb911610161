/*
 * num.c: strict decimal parsing.  The common case (at most 19 significant
 * digits, a small exponent) is converted exactly with Clinger's fast path;
 * anything else goes to strtod() on a validated copy, which never sees
 * "nan", "inf" or hex because the scanner has rejected them already.
 */
#include <errno.h>
#include <math.h>
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "num.h"

static const double pow10tab[] = {
	1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11,
	1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22
};

static int slow_path(const char *, size_t, char, double *);

int
num_parse(const char *s, size_t n, char dec, double *out)
{
	const char *p = s, *e = s + n;
	uint64_t mant = 0;
	int neg = 0, sig = 0, dexp = 0, any = 0, exact = 1;
	long ex = 0;

	while (p < e && (*p == ' ' || *p == '\t'))
		p++;
	while (e > p && (e[-1] == ' ' || e[-1] == '\t'))
		e--;
	if (p == e)
		return NUM_EMPTY;
	if (*p == '+' || *p == '-')
		neg = *p++ == '-';
	/*
	 * The shape gauges write: at most 19 characters of digits and one
	 * decimal mark, no exponent.  All digits fit the mantissa, so it is
	 * what the loops below would find (leading zeros add nothing to it),
	 * the exponent is minus the count of fraction digits, and the same
	 * exact conversion applies; any other text takes the loops.
	 */
	if (e - p <= 19) {
		const char *q = p;
		uint64_t m = 0;
		int nfrac = 0, nint;

		for (; q < e && (unsigned)(*q - '0') < 10; q++)
			m = m * 10 + (uint64_t)(*q - '0');
		nint = (int)(q - p);
		if (q < e && (*q == dec || (dec == '\0' && (*q == '.' ||
		    *q == ',')))) {
			for (q++; q < e && (unsigned)(*q - '0') < 10; q++) {
				m = m * 10 + (uint64_t)(*q - '0');
				nfrac++;
			}
		}
		if (q == e && nint + nfrac > 0) {
			if (m == 0) {
				*out = neg ? -0.0 : 0.0;
				return NUM_OK;
			}
			if (m <= (UINT64_C(1) << 53)) {
				double d = (double)m;

				if (nfrac > 0)
					d /= pow10tab[nfrac];
				*out = neg ? -d : d;
				return NUM_OK;
			}
		}
	}
	for (; p < e && (unsigned)(*p - '0') < 10; p++) {
		any = 1;
		if (sig == 0 && *p == '0')
			continue;	/* leading zeros */
		if (sig < 19)
			mant = mant * 10 + (uint64_t)(*p - '0');
		else {
			dexp++;
			if (*p != '0')
				exact = 0;
		}
		sig++;
	}
	if (p < e && (*p == dec || (dec == '\0' && (*p == '.' ||
	    *p == ',')))) {
		p++;
		for (; p < e && (unsigned)(*p - '0') < 10; p++) {
			any = 1;
			if (sig == 0 && *p == '0') {
				dexp--;
				continue;
			}
			if (sig < 19) {
				mant = mant * 10 + (uint64_t)(*p - '0');
				dexp--;
			} else if (*p != '0')
				exact = 0;
			sig++;
		}
	}
	if (!any)
		return NUM_BAD;
	if (p < e && (*p == 'e' || *p == 'E')) {
		int eneg = 0, edig = 0;

		p++;
		if (p < e && (*p == '+' || *p == '-'))
			eneg = *p++ == '-';
		for (; p < e && (unsigned)(*p - '0') < 10; p++, edig++)
			if (ex < 100000)
				ex = ex * 10 + (*p - '0');
		if (edig == 0)
			return NUM_BAD;
		if (eneg)
			ex = -ex;
	}
	if (p != e)
		return NUM_BAD;
	ex += dexp;
	if (mant == 0) {
		*out = neg ? -0.0 : 0.0;
		return NUM_OK;
	}
	if (exact && mant <= (UINT64_C(1) << 53) && ex >= -22 && ex <= 22) {
		double d = (double)mant;

		d = ex < 0 ? d / pow10tab[-ex] : d * pow10tab[ex];
		*out = neg ? -d : d;
		return NUM_OK;
	}
	return slow_path(s, n, dec, out);
}

/* The validated text, copied with '.' as decimal mark, through strtod. */
static int
slow_path(const char *s, size_t n, char dec, double *out)
{
	char buf[128], *end, *q;
	size_t i;
	double d;

	if (n >= sizeof(buf)) {
		/* Very long digit strings: keep the sign, digits and exponent
		 * but let strtod see them whole. */
		q = malloc(n + 1);
		if (q == NULL)
			return NUM_BAD;
	} else
		q = buf;
	for (i = 0; i < n; i++)
		q[i] = s[i] == dec || (dec == '\0' && s[i] == ',') ? '.' : s[i];
	q[n] = '\0';
	errno = 0;
	d = strtod(q, &end);
	if (q != buf)
		free(q);
	if (errno == ERANGE && (d == HUGE_VAL || d == -HUGE_VAL))
		return NUM_RANGE;
	if (isinf(d) || isnan(d))
		return NUM_RANGE;
	*out = d;	/* underflow to a tiny value or 0 is fine */
	return NUM_OK;
}

int
num_parse_str(const char *s, double *out)
{
	return num_parse(s, strlen(s), '.', out);
}

const char *
num_strerror(int status)
{
	switch (status) {
	case NUM_OK:
		return "ok";
	case NUM_EMPTY:
		return "empty number";
	case NUM_RANGE:
		return "number out of range";
	default:
		return "not a number";
	}
}
