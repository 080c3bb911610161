/*
 * gzsrc.h: one input source, plain or gzip (recognised by its magic bytes),
 * concatenated gzip members read through, a large zlib buffer.
 */
#ifndef GZSRC_H
#define GZSRC_H

#include <stddef.h>
#include <sys/types.h>
#include <zlib.h>

#define GZSRC_BUFSZ (256 * 1024)

struct gzsrc {
	gzFile gz;
	const char *name;	/* "-" shows as "stdin" in messages */
	int is_stdin;
};

/* Open PATH ("-" or NULL: standard input).  0, or -1 with a message. */
int	gzsrc_open(struct gzsrc *s, const char *path);
/*
 * Read up to N bytes.  Returns the count, 0 at a clean end, -1 on a read
 * error or a truncated or corrupt gzip stream (message printed, naming
 * the file).  Bytes returned before the error are good.
 */
ssize_t	gzsrc_read(struct gzsrc *s, void *buf, size_t n);
void	gzsrc_close(struct gzsrc *s);

#endif
