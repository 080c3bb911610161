/*
 * gzsrc.h: one input source, plain or gzip (recognised by its magic bytes),
 * concatenated gzip members read through, large buffers.
 *
 * Bytes after a complete gzip member that do not start another member (a
 * logger's zero-filled tail, a partial upload) are an error, reported
 * with their offset in the file and their length, after every byte of the
 * members before them; with gzsrc_skip_junk set they are skipped up to
 * the next member (or the end) and counted in one warning at the end.
 *
 * A gzip regular file is inflated on a second thread into a ring of
 * GZSRC_NRING buffers of GZSRC_RINGSZ bytes, so that inflating and the
 * caller's parsing run on two cores; plain input, pipes and terminals are
 * read on the caller's thread.  The bytes delivered are the same either
 * way.  CW_THREADS=0 in the environment keeps every read on one thread.
 */
#ifndef GZSRC_H
#define GZSRC_H

#include <stddef.h>
#include <sys/types.h>
#include <zlib.h>

#define GZSRC_BUFSZ (256 * 1024)	/* compressed input read at once */
#define GZSRC_RINGSZ (1024 * 1024)	/* one buffer of the ring */
#define GZSRC_NRING 4

struct gzsrc_ring;

struct gzsrc {
	const char *name;	/* "-" shows as "stdin" in messages */
	int is_stdin;
	int is_mem;		/* gzsrc_open_mem(): all input in in[] */
	int plain;		/* read as plain text, not gzip */
	int fd;			/* -1: no more raw input than in[] holds */
	/* Raw input: bytes [inpos, inlen) of in[] are not consumed yet;
	 * in[0] is byte inoff of the file. */
	unsigned char *in;
	size_t inpos, inlen, incap;
	int in_owned;		/* in[] is ours to free */
	int raw_eof;
	off_t inoff;
	int mode;		/* GZSRC_M_, see gzsrc.c */
	int zinit;		/* z holds an inflate state */
	z_stream z;
	/* Bytes skipped after members (gzsrc_skip_junk). */
	unsigned long long junk_bytes, junk_first;
	unsigned long junk_runs;
	char err[320];		/* the error of the stream, once it failed */
	struct gzsrc_ring *ring;	/* inflating on a second thread, or NULL */
};

/* Non-zero: bytes after a gzip member that are not one are skipped. */
extern int gzsrc_skip_junk;

/* Open PATH ("-" or NULL: standard input).  0, or -1 with a message. */
int	gzsrc_open(struct gzsrc *s, const char *path);
/*
 * Read up to N bytes.  Returns the count, 0 at a clean end, -1 on a read
 * error or a truncated or corrupt gzip stream or bytes after a member that
 * are not one (message printed, naming the file).  Bytes returned before
 * the error are good.
 */
ssize_t	gzsrc_read(struct gzsrc *s, void *buf, size_t n);
void	gzsrc_close(struct gzsrc *s);

/* Whether S has been read as plain text (no gzip member seen). */
int	gzsrc_plain(const struct gzsrc *s);

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
