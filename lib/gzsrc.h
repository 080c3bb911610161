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
	/* A memory source (gzsrc_open_mem()): gz is NULL. */
	const unsigned char *mem;
	size_t memlen, mempos;
	int memstate;		/* GZSRC_MEM_* of gzsrc.c */
	int meminit;		/* zs is set up */
	z_stream zs;
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

/*
 * Memory sources, for the fuzz harnesses and tests.  gzsrc_open_mem()
 * reads BUF[0..N) as gzsrc_open() reads a file holding those bytes (gzip
 * members, plain text, the same errors), naming it NAME in messages;
 * never fails.  gzsrc_bind_mem() makes every later gzsrc_open() of the
 * path NAME (compared as a string) read BUF[0..N) instead of the file, so
 * the readers that take a path run from memory; a NULL NAME ends the
 * binding.  Only one binding is held, by name pointer: NAME and BUF must
 * outlive it.  Not for the tools: nothing under cmd/ binds.
 */
int	gzsrc_open_mem(struct gzsrc *s, const char *name, const void *buf,
	    size_t n);
void	gzsrc_bind_mem(const char *name, const void *buf, size_t n);

#endif
