/*
 * ts.h: timestamps without locale or libc time zone state.  Times are
 * cw_time, microseconds since the epoch, UTC.
 */
#ifndef TS_H
#define TS_H

#include <stddef.h>
#include "cw.h"

enum ts_kind {
	TS_ISO = 1,	/* ISO 8601 */
	TS_EPOCH_S,	/* epoch seconds, fraction allowed */
	TS_EPOCH_MS,	/* epoch milliseconds */
	TS_EPOCH_US,	/* epoch microseconds */
	TS_AUTO		/* ISO 8601 or epoch seconds, as the sample stream */
};

/* Longest text ts_format() writes, with its NUL. */
#define TS_FMTMAX 40

/*
 * Parse S[0..N).  ISO 8601 extended form: YYYY-MM-DD (or YYYY/MM/DD, as
 * some loggers write), then 'T' or ' ',
 * hh:mm[:ss[.frac]], then Z, +hh:mm, +hhmm, +hh, UTC or nothing.  Without a zone
 * the time is local at OFFSET_S seconds east of UTC.  Impossible dates
 * (month 13, Feb 30, hour 25) are rejected; a leap second (:60) is read as
 * the first instant of the next minute.  Returns 0 or -1.
 */
int	ts_parse(const char *s, size_t n, int kind, long offset_s, cw_time *out);
/* Write T as YYYY-MM-DDThh:mm:ss[.ffffff]Z (fraction only when not whole,
 * trailing zeros dropped).  Returns the length. */
size_t	ts_format(cw_time t, char *buf);
/* Write YYYY-MM-DD (10 bytes, no NUL) of a year 0..9999; returns 10. */
size_t	ts_format_date(long y, unsigned m, unsigned d, char *buf);
/* Days since 1970-01-01 of a proleptic Gregorian date, and back. */
long	ts_days_from_civil(long y, unsigned m, unsigned d);
void	ts_civil_from_days(long z, long *y, unsigned *m, unsigned *d);
/* Parse a zone offset "+HH:MM", "-HHMM", "+HH", "Z", "UTC" or "GMT" (" UTC"
 * too) into seconds; 0 or -1. */
int	ts_parse_offset(const char *s, long *offset_s);

#endif
