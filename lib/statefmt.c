/* statefmt.c: the common text form of saved device states (statefmt.h). */
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <string.h>

#include "cw.h"
#include "num.h"
#include "statefmt.h"

#define SFMT_FNV_BASIS	0xcbf29ce484222325ull
#define SFMT_FNV_PRIME	0x100000001b3ull

void
sfmt_add(struct sfmt_buf *b, const char *s, size_t n)
{
	if (b->n + n + 1 > b->cap) {
		while (b->n + n + 1 > b->cap)
			b->cap = b->cap ? 2 * b->cap : 4096;
		b->s = cw_realloc(b->s, b->cap);
	}
	memcpy(b->s + b->n, s, n);
	b->n += n;
	b->s[b->n] = '\0';
}

void
sfmt_str(struct sfmt_buf *b, const char *s)
{
	sfmt_add(b, s, strlen(s));
}

void
sfmt_i64(struct sfmt_buf *b, long long x)
{
	char t[32];

	sfmt_add(b, t, (size_t)snprintf(t, sizeof(t), "%lld", x));
}

void
sfmt_ul(struct sfmt_buf *b, unsigned long x)
{
	char t[32];

	sfmt_add(b, t, (size_t)snprintf(t, sizeof(t), "%lu", x));
}

/* X with %.17g, which reads back to the same double; NaN as nothing. */
void
sfmt_dbl(struct sfmt_buf *b, double x, int nan_ok)
{
	char t[40];

	if (isnan(x) && nan_ok)
		return;
	sfmt_add(b, t, (size_t)snprintf(t, sizeof(t), "%.17g", x));
}

void
sfmt_field(struct sfmt_buf *b, int kind, const void *p)
{
	switch (kind) {
	case SFMT_DBL:
	case SFMT_DBLN:
		sfmt_dbl(b, *(const double *)p, kind == SFMT_DBLN);
		break;
	case SFMT_TIME:
		sfmt_i64(b, (long long)*(const cw_time *)p);
		break;
	case SFMT_UL:
		sfmt_ul(b, *(const unsigned long *)p);
		break;
	case SFMT_INT:
		sfmt_i64(b, *(const int *)p);
		break;
	case SFMT_SIZE:
		sfmt_ul(b, (unsigned long)*(const size_t *)p);
		break;
	}
}

/* A device name, quoted as RFC 4180 asks when it has to be. */
void
sfmt_name(struct sfmt_buf *b, const char *s, size_t n)
{
	size_t i;

	if (n > 0 && strcspn(s, ",\"\r\n") >= n && s[0] != ' ' &&
	    s[0] != '\t' && s[n - 1] != ' ' && s[n - 1] != '\t') {
		sfmt_add(b, s, n);
		return;
	}
	sfmt_add(b, "\"", 1);
	for (i = 0; i < n; i++) {
		if (s[i] == '"')
			sfmt_add(b, "\"", 1);
		sfmt_add(b, s + i, 1);
	}
	sfmt_add(b, "\"", 1);
}

uint64_t
sfmt_fnv(const char *s, size_t n)
{
	uint64_t h = SFMT_FNV_BASIS;
	size_t i;

	for (i = 0; i < n; i++) {
		h ^= (unsigned char)s[i];
		h *= SFMT_FNV_PRIME;
	}
	return h;
}

/* Append ",check\n" to the row in B and write it. */
int
sfmt_end_row(FILE *fp, struct sfmt_buf *b)
{
	char t[24];

	snprintf(t, sizeof(t), ",%016llx\n", (unsigned long long)sfmt_fnv(b->s,
	    b->n));
	sfmt_str(b, t);
	return fwrite(b->s, 1, b->n, fp) == b->n ? 0 : -1;
}

/* Strict integers: an optional '-', then digits, nothing else. */
int
sfmt_get_i64(const char *s, size_t n, long long *out)
{
	unsigned long long x = 0, lim = (unsigned long long)INT64_MAX;
	size_t i = 0;
	int neg = 0;

	if (n > 0 && s[0] == '-') {
		neg = 1;
		i = 1;
		lim++;
	}
	if (i == n)
		return -1;
	for (; i < n; i++) {
		if (s[i] < '0' || s[i] > '9')
			return -1;
		if (x > (lim - (unsigned)(s[i] - '0')) / 10)
			return -1;
		x = x * 10 + (unsigned)(s[i] - '0');
	}
	*out = neg ? (long long)(0 - x) : (long long)x;
	return 0;
}

int
sfmt_get_ul(const char *s, size_t n, unsigned long *out)
{
	long long x;

	if (n == 0 || s[0] == '-' || sfmt_get_i64(s, n, &x) < 0 ||
	    (unsigned long long)x > (unsigned long long)(unsigned long)-1)
		return -1;
	*out = (unsigned long)x;
	return 0;
}

/* Parse S[0..N) as a field of KIND into P; 0 or -1. */
int
sfmt_get_field(int kind, const char *s, size_t n, int lo, int hi, void *p)
{
	long long x;
	unsigned long u;
	double d;

	switch (kind) {
	case SFMT_DBL:
	case SFMT_DBLN:
		if (n == 0 && kind == SFMT_DBLN) {
			*(double *)p = CW_MISSING;
			return 0;
		}
		/* No blanks: num_parse() would skip them. */
		if (memchr(s, ' ', n) != NULL || memchr(s, '\t', n) != NULL ||
		    num_parse(s, n, '.', &d) != NUM_OK || !isfinite(d))
			return -1;
		*(double *)p = d;
		return 0;
	case SFMT_TIME:
		if (sfmt_get_i64(s, n, &x) < 0)
			return -1;
		*(cw_time *)p = x;
		return 0;
	case SFMT_UL:
		if (sfmt_get_ul(s, n, &u) < 0)
			return -1;
		*(unsigned long *)p = u;
		return 0;
	case SFMT_INT:
		if (sfmt_get_i64(s, n, &x) < 0 || x < lo || x > hi)
			return -1;
		*(int *)p = (int)x;
		return 0;
	case SFMT_SIZE:
		if (sfmt_get_ul(s, n, &u) < 0)
			return -1;
		*(size_t *)p = u;
		return 0;
	}
	return -1;
}

/* Whether two values of KIND are the same (NaN equal to NaN). */
int
sfmt_same(int kind, const void *a, const void *b)
{
	double x, y;

	switch (kind) {
	case SFMT_DBL:
	case SFMT_DBLN:
		x = *(const double *)a;
		y = *(const double *)b;
		return x == y || (isnan(x) && isnan(y));
	case SFMT_TIME:
		return *(const cw_time *)a == *(const cw_time *)b;
	}
	return 0;
}

int
sfmt_write_end(FILE *fp, struct sfmt_buf *b, const char *tag,
    unsigned long rows)
{
	b->n = 0;
	sfmt_str(b, ",,,");
	sfmt_str(b, tag);
	sfmt_str(b, ",end,");
	sfmt_ul(b, rows);
	return sfmt_end_row(fp, b);
}

int
sfmt_check_ends(const char *name, unsigned long ends,
    unsigned long announced, unsigned long rows)
{
	if (ends == 0) {
		cw_warn("%s: no end row: the state is cut short", name);
		return CW_EXIT_DATA;
	}
	if (announced != rows) {
		cw_warn("%s: %lu state rows, but the end rows announce %lu: "
		    "the state is cut short or rows were lost", name, rows,
		    announced);
		return CW_EXIT_DATA;
	}
	return 0;
}

int
sfmt_split(const char *s, size_t n, char sep, const char **p, size_t *l,
    int max)
{
	const char *e = s + n, *q;
	int k = 0;

	if (n == 0)
		return 0;
	for (;;) {
		if (k == max)
			return -1;
		q = memchr(s, sep, (size_t)(e - s));
		if (q == NULL)
			q = e;
		p[k] = s;
		l[k++] = (size_t)(q - s);
		if (q == e)
			return k;
		s = q + 1;
	}
}

/* A setting's value, for messages. */
void
sfmt_show(int kind, const void *p, char *t, size_t n)
{
	double x;

	if (kind == SFMT_TIME) {
		snprintf(t, n, "%gs", (double)*(const cw_time *)p /
		    CW_US_PER_S);
		return;
	}
	x = *(const double *)p;
	if (isnan(x))
		snprintf(t, n, "none");
	else
		snprintf(t, n, "%.15g", x);
}

int
sfmt_row_ok(const struct csvin_rec *rec)
{
	char hex[17];
	size_t at;

	if (rec->nf < 2)
		return 0;
	for (at = rec->rawlen; at > 0 && rec->raw[at - 1] != ','; at--)
		;
	if (at == 0)
		return 0;
	snprintf(hex, sizeof(hex), "%016llx",
	    (unsigned long long)sfmt_fnv(rec->raw, at - 1));
	return rec->len[rec->nf - 1] == 16 &&
	    memcmp(rec->f[rec->nf - 1], hex, 16) == 0;
}
