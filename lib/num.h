/*
 * num.h: strict, fast decimal number parsing.  Accepted: [+-]digits[.digits]
 * [(e|E)[+-]digits], also ".5" and "5.".  Rejected: empty, nan, inf, hex,
 * trailing garbage, overflow.  Never depends on the locale.
 */
#ifndef NUM_H
#define NUM_H

#include <stddef.h>

enum num_status {
	NUM_OK = 0,
	NUM_EMPTY,	/* nothing but blanks */
	NUM_BAD,	/* not a decimal number */
	NUM_RANGE	/* overflows a double */
};

/* Parse S[0..N) with DEC as the decimal mark ('.' or ','; '\0': either). */
int	num_parse(const char *s, size_t n, char dec, double *out);
/* Parse a NUL-terminated string with '.' as decimal mark. */
int	num_parse_str(const char *s, double *out);
const char *num_strerror(int status);

#endif
