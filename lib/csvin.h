/*
 * csvin.h: the CSV reader.  Records are split on line ends outside quotes,
 * then parsed by libcsv (RFC 4180), so every record keeps its line number
 * and its raw text for messages and reject files.  CRLF and a UTF-8 BOM are
 * handled; the first record of each file is its header; a later record
 * equal to the header (concatenated logs) is skipped and counted.
 */
#ifndef CSVIN_H
#define CSVIN_H

#include <stddef.h>
#include "gzsrc.h"

struct csvin_rec {
	const char *src;	/* file name for messages */
	unsigned long line;	/* physical line where the record starts */
	const char *raw;	/* the record as read, without its line end */
	size_t rawlen;
	size_t nf;		/* number of fields */
	char **f;		/* fields, NUL-terminated */
	size_t *len;		/* their lengths */
};

/*
 * What the reader reports.  Each returns 0 to go on, or an exit code to
 * stop reading (the caller's error, already reported).
 * header: the first record of a file.
 * row: every later data record.
 * bad: a record that could not be parsed (unbalanced quote, stray quote,
 *      too long), with a reason; the raw text is valid, the fields are not.
 * blank: an empty line.
 */
struct csvin_ops {
	int	(*header)(void *ctx, const struct csvin_rec *r);
	int	(*row)(void *ctx, const struct csvin_rec *r);
	int	(*bad)(void *ctx, const struct csvin_rec *r, const char *why);
	int	(*blank)(void *ctx, const struct csvin_rec *r);
};

struct csvin_stats {
	unsigned long records;		/* every record, header included */
	unsigned long headers;		/* first headers */
	unsigned long header_repeats;	/* skipped repeated headers */
	unsigned long rows;		/* passed to row() */
	unsigned long bad;		/* passed to bad() */
	unsigned long blank;		/* passed to blank() */
	unsigned long unended;		/* last lines without a line end,
					 * taken (with a warning) */
	unsigned long held;		/* the same, held back (growing) */
};

struct csvin;

/* DELIM: ',', ';', '\t' or another byte; '\0': taken from each file's
 * header, whichever of ',', ';', tab and '|' it holds most. */
struct csvin *csvin_new(char delim, const struct csvin_ops *ops, void *ctx);
/*
 * Read one file (or "-") through.  Returns 0, CW_EXIT_DATA on an input
 * error (reported), or the first non-zero value a callback returned.
 */
int	csvin_file(struct csvin *r, const char *path);
/* As csvin_file(), from BUF[0..N) (gzip or plain) named NAME in
 * messages (gzsrc_open_mem()). */
int	csvin_mem(struct csvin *r, const char *name, const void *buf,
	    size_t n);
/* Read every file of FILES[0..N), or standard input when N is 0. */
int	csvin_files(struct csvin *r, char **files, int n);
/*
 * ON: the files may still be written to, so the last line of a plain file
 * without a line end is a line not finished yet: held back (not passed to
 * any callback) and counted, instead of taken with a warning.
 */
void	csvin_set_growing(struct csvin *r, int on);
const struct csvin_stats *csvin_stats(const struct csvin *r);
/* The delimiter in use (of the current file, when chosen by header). */
char	csvin_delim(const struct csvin *r);
void	csvin_free(struct csvin *r);

/* A blank callback that passes blank lines over: 0. */
int	csvin_skip_blank(void *ctx, const struct csvin_rec *r);
/*
 * Read all of a small side file, PATH (a fleet file, a trend, a table),
 * through OPS with CTX, the delimiter found from its header; die with
 * "PATH: EMPTY" when it has no header, and with "PATH: cannot read
 * WHAT" (the exit code csvin_file() returned) when reading failed.
 */
void	csvin_load(const char *path, const struct csvin_ops *ops, void *ctx,
	    const char *empty, const char *what);

/* Index of the header field named NAME (exact), or -1. */
int	csvin_find(const struct csvin_rec *hdr, const char *name);

#endif
