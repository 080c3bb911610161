/*
 * statefmt.h: what the text forms of saved device states (cw-wear and
 * cw-dcir --state, --state-out, --merge) have in common: a growable row
 * buffer, fields written so that they read back to the same bits (%.17g
 * for doubles, integer microseconds for times, NaN as an empty field),
 * strict parsers of them, and the check that ends every row: the FNV-1a
 * 64-bit hash of the row's text before it, in 16 hexadecimal digits.
 */
#ifndef STATEFMT_H
#define STATEFMT_H

#include <stddef.h>
#include <stdint.h>
#include <stdio.h>

#include "csvin.h"

/* Kinds of fields. */
enum {
	SFMT_DBL,		/* double, finite */
	SFMT_DBLN,		/* double, empty for NaN */
	SFMT_TIME,		/* cw_time, integer microseconds */
	SFMT_UL,		/* unsigned long */
	SFMT_INT,		/* int in lo..hi */
	SFMT_SIZE		/* size_t */
};

/*
 * What a field read back must hold besides its kind, as the engine that
 * made it guarantees: nothing more; a sum or an extreme of charge, depth
 * or damage, never below 0; seconds of the rows' span; a count of rows,
 * or of what rows make (turning points, cycles), at most the rows; a time
 * of a row, 0 while unset.  The reader of the state checks them against
 * the rows it holds.
 */
enum { SFMT_R_ANY, SFMT_R_NONNEG, SFMT_R_SPAN_S, SFMT_R_ROWS, SFMT_R_TIME };

/*
 * One field of an engine's saved state: its column name, its kind
 * (SFMT_*), where it is in the engine's struct, the range of an SFMT_INT
 * field and its rule (SFMT_R_*).  SINCE is the revision of the engine's
 * state that brought the field (1 for the first): a state file places
 * the fields of each revision where that revision of the file format put
 * them, so the engine's fields need not be side by side in a row.
 */
struct sfmt_spec {
	const char *name;
	int kind;
	size_t off;
	int lo, hi;
	int rule;
	int since;
};

/* A growable text buffer for one row; zeroed is empty. */
struct sfmt_buf {
	char *s;
	size_t n, cap;
};

void	sfmt_add(struct sfmt_buf *b, const char *s, size_t n);
void	sfmt_str(struct sfmt_buf *b, const char *s);
void	sfmt_i64(struct sfmt_buf *b, long long x);
void	sfmt_ul(struct sfmt_buf *b, unsigned long x);
/* X with %.17g; NaN as nothing when NAN_OK. */
void	sfmt_dbl(struct sfmt_buf *b, double x, int nan_ok);
/* The field of KIND at P. */
void	sfmt_field(struct sfmt_buf *b, int kind, const void *p);
/* A device name, quoted as RFC 4180 asks when it has to be. */
void	sfmt_name(struct sfmt_buf *b, const char *s, size_t n);
uint64_t sfmt_fnv(const char *s, size_t n);
/* Append ",check\n" to the row in B and write it: 0, or -1. */
int	sfmt_end_row(FILE *fp, struct sfmt_buf *b);
/* An end row, ",,,TAG,end,ROWS,check\n", made in B and written: 0, or -1. */
int	sfmt_write_end(FILE *fp, struct sfmt_buf *b, const char *tag,
	    unsigned long rows);
/*
 * The end of a strict read of the state NAME: whether its end rows (ENDS
 * of them, announcing ANNOUNCED rows) account for the ROWS read; 0, or
 * CW_EXIT_DATA with a message that the state is cut short.
 */
int	sfmt_check_ends(const char *name, unsigned long ends,
	    unsigned long announced, unsigned long rows);
/*
 * Split S[0..N) at SEP into at most MAX pieces (P, L); the count, or -1
 * when there are more.  An empty S has none.
 */
int	sfmt_split(const char *s, size_t n, char sep, const char **p,
	    size_t *l, int max);
/*
 * Whether the last field of REC is the check of the text before it (the
 * raw record up to its last comma); 1 or 0.
 */
int	sfmt_row_ok(const struct csvin_rec *rec);

/* Strict integers: an optional '-', then digits, nothing else; 0 or -1. */
int	sfmt_get_i64(const char *s, size_t n, long long *out);
int	sfmt_get_ul(const char *s, size_t n, unsigned long *out);
/* Parse S[0..N) as a field of KIND (an int within LO..HI) into P. */
int	sfmt_get_field(int kind, const char *s, size_t n, int lo, int hi,
	    void *p);
/* Whether two doubles or times of KIND are the same (NaN equal NaN). */
int	sfmt_same(int kind, const void *a, const void *b);
/* A double or time setting of KIND, for messages ("none" for NaN). */
void	sfmt_show(int kind, const void *p, char *t, size_t n);

#endif
