/*
 * csvout.h: the buffered CSV writer.  RFC 4180 quoting, '\n' line ends,
 * C-locale numbers with 10 significant digits at most and no trailing
 * zeros (at least 6 are kept, as cellwear(7) asks), NaN and infinities as an
 * empty field.
 */
#ifndef CSVOUT_H
#define CSVOUT_H

#include <stdio.h>
#include <stddef.h>
#include "cw.h"

struct csvout {
	FILE *fp;
	char *buf;
	size_t n, cap;
	int nfield;	/* fields written in the current row */
	int err;	/* a write failed */
	int errnum;	/* errno of the first failure */
};

void	csvout_init(struct csvout *w, FILE *fp);
void	csvout_str(struct csvout *w, const char *s);
void	csvout_strn(struct csvout *w, const char *s, size_t n);
void	csvout_num(struct csvout *w, double x);
/* X with at most DIGITS decimals (trailing zeros dropped). */
void	csvout_fixed(struct csvout *w, double x, int digits);
void	csvout_int(struct csvout *w, long long x);
void	csvout_time(struct csvout *w, cw_time t);
/*
 * The calendar date (UTC, proleptic Gregorian) of T as YYYY-MM-DD; an
 * empty field when the year is outside 0000..9999.
 */
void	csvout_date(struct csvout *w, cw_time t);
void	csvout_empty(struct csvout *w);
/* Write a whole header: NAMES separated by commas, e.g. "device,time". */
void	csvout_header(struct csvout *w, const char *names);
void	csvout_endrow(struct csvout *w);
/* Flush to the FILE; 0, or -1 after a write error (errno kept). */
int	csvout_flush(struct csvout *w);
void	csvout_free(struct csvout *w);

/* Format X as csvout_num() does; returns the length (BUF >= 32 bytes). */
size_t	csvout_fmtnum(double x, char *buf);

#endif
