/*
 * csvout.c: the CSV writer.  Rows are assembled in a private buffer and
 * handed to stdio in large blocks.  Numbers from 1e-6 to 1e15 are
 * formatted here, not by printf: scaled to an integer of at most 10
 * significant digits, then written with the decimal point put back and
 * trailing zeros dropped; the rare others go through snprintf("%.10g").
 */
#include <errno.h>
#include <math.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "csvout.h"
#include "ts.h"

#define CSVOUT_BUFSZ (256 * 1024)	/* handed to stdio at once */
#define CSVOUT_FIRST 4096		/* the buffer's first size */
#define CSVOUT_SIG 10		/* significant digits written at most */

static const double p10[] = {
	1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12,
	1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20
};

static void reserve(struct csvout *, size_t);
static void sep(struct csvout *);
static size_t utoa(unsigned long long, char *);

void
csvout_init(struct csvout *w, FILE *fp)
{
	memset(w, 0, sizeof(*w));
	w->fp = fp;
	/* Small at first: a short output never pays for the full block. */
	w->cap = CSVOUT_FIRST;
	w->buf = cw_malloc(w->cap);
}

void
csvout_free(struct csvout *w)
{
	free(w->buf);
	w->buf = NULL;
}

/* The first write error: kept with its errno for the message. */
static void
failed(struct csvout *w)
{
	w->err = 1;
	w->errnum = errno;
}

int
csvout_flush(struct csvout *w)
{
	if (w->n > 0 && !w->err && fwrite(w->buf, 1, w->n, w->fp) != w->n)
		failed(w);
	w->n = 0;
	if (!w->err && fflush(w->fp) != 0)
		failed(w);
	return w->err ? -1 : 0;
}

/*
 * Room for N more bytes: the buffer doubles up to CSVOUT_BUFSZ, then what
 * is built is handed to stdio.
 */
static void
reserve(struct csvout *w, size_t n)
{
	if (w->n + n <= w->cap)
		return;
	if (w->cap < CSVOUT_BUFSZ) {
		size_t cap = w->cap;

		while (cap < CSVOUT_BUFSZ && cap < w->n + n)
			cap *= 2;
		if (w->n + n <= cap) {
			w->cap = cap;
			w->buf = cw_realloc(w->buf, w->cap);
			return;
		}
	}
	if (w->n > 0 && !w->err && fwrite(w->buf, 1, w->n, w->fp) != w->n)
		failed(w);
	w->n = 0;
	if (n > w->cap) {
		w->cap = n > CSVOUT_BUFSZ ? n : CSVOUT_BUFSZ;
		w->buf = cw_realloc(w->buf, w->cap);
	}
}

static void
sep(struct csvout *w)
{
	if (w->nfield++ > 0) {
		reserve(w, 1);
		w->buf[w->n++] = ',';
	}
}

void
csvout_strn(struct csvout *w, const char *s, size_t n)
{
	/* The bytes that make a field quoted: one look-up a byte. */
	static const unsigned char quoted[256] = {
		[','] = 1, ['"'] = 1, ['\n'] = 1, ['\r'] = 1
	};
	size_t i;
	unsigned q = 0;

	sep(w);
	for (i = 0; i < n; i++)
		q |= quoted[(unsigned char)s[i]];
	if (!q) {
		reserve(w, n);
		memcpy(w->buf + w->n, s, n);
		w->n += n;
		return;
	}
	reserve(w, 2 * n + 2);
	w->buf[w->n++] = '"';
	for (i = 0; i < n; i++) {
		if (s[i] == '"')
			w->buf[w->n++] = '"';
		w->buf[w->n++] = s[i];
	}
	w->buf[w->n++] = '"';
}

void
csvout_str(struct csvout *w, const char *s)
{
	csvout_strn(w, s, strlen(s));
}

void
csvout_header(struct csvout *w, const char *names)
{
	size_t n = strlen(names);

	reserve(w, n + 1);
	memcpy(w->buf + w->n, names, n);
	w->n += n;
	w->buf[w->n++] = '\n';
	w->nfield = 0;
}

void
csvout_empty(struct csvout *w)
{
	sep(w);
}

void
csvout_endrow(struct csvout *w)
{
	reserve(w, 1);
	w->buf[w->n++] = '\n';
	w->nfield = 0;
}

static size_t
utoa(unsigned long long v, char *buf)
{
	char t[24];
	size_t n = 0, i;

	do {
		t[n++] = (char)('0' + v % 10);
		v /= 10;
	} while (v > 0);
	for (i = 0; i < n; i++)
		buf[i] = t[n - 1 - i];
	return n;
}

/* X rounded to DEC decimals (0..20), trailing zeros dropped. */
static size_t
fmt_dec(double x, int dec, char *buf)
{
	char *p = buf;
	unsigned long long m, ip, fp;
	double a = fabs(x);
	char fr[24];
	size_t n;
	int i;

	m = (unsigned long long)llround(a * p10[dec]);
	while (dec > 0 && m % 10 == 0) {
		m /= 10;
		dec--;
	}
	if (m == 0) {
		*p++ = '0';
		return (size_t)(p - buf);
	}
	if (x < 0)
		*p++ = '-';
	ip = m / (unsigned long long)p10[dec];
	fp = m % (unsigned long long)p10[dec];
	p += utoa(ip, p);
	if (dec > 0) {
		*p++ = '.';
		for (i = dec - 1; i >= 0; i--) {
			fr[i] = (char)('0' + fp % 10);
			fp /= 10;
		}
		memcpy(p, fr, (size_t)dec);
		p += dec;
	}
	n = (size_t)(p - buf);
	return n;
}

size_t
csvout_fmtnum(double x, char *buf)
{
	double a = fabs(x);
	int e, dec;

	if (!isfinite(x))
		return 0;
	if (x == 0) {
		buf[0] = '0';
		return 1;
	}
	if (a >= 1e15 || a < 1e-6) {
		int n = snprintf(buf, 32, "%.*g", CSVOUT_SIG, x);

		return n > 0 ? (size_t)n : 0;
	}
	/* e: the decimal exponent of the leading digit. */
	for (e = 0; e < 15 && a >= p10[e + 1]; e++)
		;
	if (a < 1)
		for (e = -1; e > -6 && a * p10[-e] < 1; e--)
			;
	dec = CSVOUT_SIG - 1 - e;
	if (dec < 0) {
		/* More integer digits than CSVOUT_SIG: round to CSVOUT_SIG
		 * digits, the rest are zeros. */
		size_t n = fmt_dec(x / p10[-dec], 0, buf);

		memset(buf + n, '0', (size_t)-dec);
		return n + (size_t)-dec;
	}
	if (dec > 20)
		dec = 20;
	return fmt_dec(x, dec, buf);
}

void
csvout_num(struct csvout *w, double x)
{
	sep(w);
	reserve(w, 32);
	w->n += csvout_fmtnum(x, w->buf + w->n);
}

void
csvout_fixed(struct csvout *w, double x, int digits)
{
	sep(w);
	if (!isfinite(x))
		return;
	if (digits < 0)
		digits = 0;
	if (digits > 12)
		digits = 12;
	if (fabs(x) * p10[digits] >= 9e18) {
		/* Too large for fmt_dec(): printf (%.12f of DBL_MAX takes 322
		 * bytes), then drop the trailing zeros. */
		char t[400];
		int n = snprintf(t, sizeof(t), "%.*f", digits, x);

		if (digits > 0) {
			while (t[n - 1] == '0')
				n--;
			if (t[n - 1] == '.')
				n--;
		}
		reserve(w, (size_t)n);
		memcpy(w->buf + w->n, t, (size_t)n);
		w->n += (size_t)n;
	} else {
		reserve(w, 40);
		w->n += fmt_dec(x, digits, w->buf + w->n);
	}
}

void
csvout_int(struct csvout *w, long long x)
{
	sep(w);
	reserve(w, 24);
	if (x < 0) {
		w->buf[w->n++] = '-';
		w->n += utoa(0ULL - (unsigned long long)x, w->buf + w->n);
	} else
		w->n += utoa((unsigned long long)x, w->buf + w->n);
}

void
csvout_time(struct csvout *w, cw_time t)
{
	sep(w);
	reserve(w, TS_FMTMAX);
	w->n += ts_format(t, w->buf + w->n);
}

void
csvout_date(struct csvout *w, cw_time t)
{
	const cw_time day = 86400 * CW_US_PER_S;
	long days = (long)(t / day), y;
	unsigned m, d;

	/* Whole days before T: rounded down, so -1 us is 1969-12-31. */
	if (t % day < 0)
		days--;
	ts_civil_from_days(days, &y, &m, &d);
	sep(w);
	if (y < 0 || y > 9999)
		return;
	reserve(w, 10);
	w->n += ts_format_date(y, m, d, w->buf + w->n);
}
