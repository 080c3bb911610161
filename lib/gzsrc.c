/*
 * gzsrc.c: input, plain or gzip, through zlib's inflate().
 *
 * decode() is the one reader: raw bytes come from raw_fill() (the file
 * descriptor; with fd -1 only what in[] already holds), and the mode says
 * what they are: undecided, plain (passed through), inside a gzip member,
 * between members, at the end, or failed.  A stream that ends inside a
 * member is truncated; data inflate() refuses (a wrong CRC-32 or ISIZE
 * among them) are corrupt; bytes after a member that are not another one
 * are junk (RFC 1952 2.2 knows only members; `gzip -t` calls them trailing
 * garbage).  Each is an error, after the last good byte.  decode() never
 * prints: its message waits in err[] for gzsrc_read(), on the caller's
 * thread, so that messages keep their order.
 *
 * A gzip regular file is decoded on a second thread (reader()) into a
 * ring of buffers the caller's gzsrc_read() copies from; everything the
 * reader touches of the struct is the reader's until it says it is done,
 * under the ring's lock.
 */
#include <errno.h>
#include <fcntl.h>
#include <pthread.h>
#include <signal.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <stdint.h>
#include <string.h>
#include <sys/stat.h>
#include <unistd.h>

#include "cw.h"
#include "gzsrc.h"
#include "pipe.h"

enum {
	GZSRC_M_START,		/* nothing seen yet */
	GZSRC_M_PLAIN,
	GZSRC_M_MEMBER,		/* inside a gzip member */
	GZSRC_M_BETWEEN,	/* a member ended */
	GZSRC_M_END,
	GZSRC_M_ERR		/* err[] says why */
};

struct gzsrc_ring {
	pthread_t th;
	pthread_mutex_t mu;
	pthread_cond_t cv;	/* any change of head, tail, done, stop */
	unsigned char *buf[GZSRC_NRING];
	size_t len[GZSRC_NRING];
	unsigned long head, tail;	/* the caller takes buf[head % N], the
					 * reader fills buf[tail % N] */
	size_t pos;		/* the caller's place in buf[head % N] */
	int done;		/* the reader has stopped, with status */
	int status;		/* 0 clean end, -1 error (err[]) */
	int stop;		/* the caller asks the reader to stop */
};

int gzsrc_skip_junk;

static int raw_fill(struct gzsrc *);
static ssize_t decode(struct gzsrc *, unsigned char *, size_t);
static int junk(struct gzsrc *);
static int fail(struct gzsrc *, const char *, ...)
    __attribute__((format(printf, 2, 3)));
static void *reader(void *);
static void ring_start(struct gzsrc *);
static void ring_free(struct gzsrc_ring *);
static ssize_t ring_read(struct gzsrc *, void *, size_t);
static ssize_t finish(struct gzsrc *, int);

static int
fail(struct gzsrc *s, const char *fmt, ...)
{
	va_list ap;

	va_start(ap, fmt);
	vsnprintf(s->err, sizeof(s->err), fmt, ap);
	va_end(ap);
	s->mode = GZSRC_M_ERR;
	return -1;
}

/* More raw input: keep the unconsumed bytes, read after them. */
static int
raw_fill(struct gzsrc *s)
{
	ssize_t got;

	if (s->fd < 0 || !s->in_owned) {
		s->raw_eof = 1;
		return 0;
	}
	if (s->inpos > 0) {
		memmove(s->in, s->in + s->inpos, s->inlen - s->inpos);
		s->inlen -= s->inpos;
		s->inoff += (off_t)s->inpos;
		s->inpos = 0;
	}
	do
		got = read(s->fd, s->in + s->inlen, s->incap - s->inlen);
	while (got < 0 && errno == EINTR);
	if (got < 0)
		return fail(s, "read error: %s", strerror(errno));
	if (got == 0)
		s->raw_eof = 1;
	s->inlen += (size_t)got;
	return 0;
}

/*
 * Bytes at in[inpos] after a member are not a member: find where the next
 * member starts (its magic and method, 1f 8b 08) or the end, then fail
 * with where and how many, or skip and count them (gzsrc_skip_junk).
 */
static int
junk(struct gzsrc *s)
{
	unsigned long long at = (unsigned long long)s->inoff + s->inpos, n = 0;
	int found = 0;

	while (!found) {
		while (s->inlen - s->inpos >= 3) {
			const unsigned char *p = s->in + s->inpos, *q;

			if (p[0] == 0x1f && p[1] == 0x8b && p[2] == 8) {
				found = 1;
				break;
			}
			q = memchr(p + 1, 0x1f, s->inlen - s->inpos - 1);
			if (q == NULL)
				q = s->in + s->inlen - 2;
			n += (size_t)(q - p);
			s->inpos += (size_t)(q - p);
		}
		if (found)
			break;
		if (s->raw_eof) {
			n += s->inlen - s->inpos;
			s->inpos = s->inlen;
			break;
		}
		if (raw_fill(s) < 0)
			return -1;
	}
	if (!gzsrc_skip_junk)
		return fail(s, "%llu bytes at offset %llu after a gzip member "
		    "are not gzip data (%s)", n, at, found ?
		    "another member follows them" : "up to the end");
	if (s->junk_runs++ == 0)
		s->junk_first = at;
	s->junk_bytes += n;
	if (!found) {
		s->mode = GZSRC_M_END;
		return 0;
	}
	inflateReset(&s->z);
	s->mode = GZSRC_M_MEMBER;
	return 0;
}

/* Up to N bytes of content into BUF: the count, 0 at the end, -1. */
static ssize_t
decode(struct gzsrc *s, unsigned char *buf, size_t n)
{
	for (;;) {
		size_t avail = s->inlen - s->inpos, used, out;
		ssize_t got;
		int rc;

		switch (s->mode) {
		case GZSRC_M_START:
			if (avail < 2 && !s->raw_eof) {
				if (raw_fill(s) < 0)
					return -1;
				continue;
			}
			if (avail < 2 || s->in[s->inpos] != 0x1f ||
			    s->in[s->inpos + 1] != 0x8b) {
				s->mode = GZSRC_M_PLAIN;
				s->plain = 1;
				continue;
			}
			if (inflateInit2(&s->z, 15 + 16) != Z_OK)
				return fail(s, "cannot inflate: out of memory");
			s->zinit = 1;
			s->mode = GZSRC_M_MEMBER;
			continue;
		case GZSRC_M_PLAIN:
			if (avail > 0) {
				out = avail < n ? avail : n;
				memcpy(buf, s->in + s->inpos, out);
				s->inpos += out;
				return (ssize_t)out;
			}
			if (s->raw_eof || s->fd < 0 || !s->in_owned) {
				s->mode = GZSRC_M_END;
				return 0;
			}
			/* Nothing buffered: straight into the caller's. */
			do
				got = read(s->fd, buf, n);
			while (got < 0 && errno == EINTR);
			if (got < 0)
				return fail(s, "read error: %s",
				    strerror(errno));
			if (got == 0)
				s->mode = GZSRC_M_END;
			return got;
		case GZSRC_M_MEMBER:
			if (avail == 0 && !s->raw_eof) {
				if (raw_fill(s) < 0)
					return -1;
				continue;
			}
			s->z.next_in = s->in + s->inpos;
			s->z.avail_in = (uInt)avail;
			s->z.next_out = buf;
			s->z.avail_out = (uInt)(n < (1u << 30) ? n : 1u << 30);
			out = s->z.avail_out;
			rc = inflate(&s->z, Z_NO_FLUSH);
			used = avail - s->z.avail_in;
			out -= s->z.avail_out;
			s->inpos += used;
			if (rc == Z_STREAM_END)
				s->mode = GZSRC_M_BETWEEN;
			else if (rc == Z_OK || rc == Z_BUF_ERROR) {
				if (out == 0 && s->z.avail_in == 0 &&
				    s->raw_eof)
					return fail(s, "truncated gzip stream "
					    "(unexpected end of file)");
				if (out == 0 && used == 0 &&
				    s->z.avail_in > 0)
					return fail(s, "corrupt gzip stream: "
					    "no progress");
			} else if (rc == Z_MEM_ERROR)
				return fail(s, "cannot inflate: out of memory");
			else
				return fail(s, "corrupt gzip stream: %s",
				    s->z.msg != NULL ? s->z.msg : "bad data");
			if (out > 0)
				return (ssize_t)out;
			continue;
		case GZSRC_M_BETWEEN:
			if (avail < 2 && !s->raw_eof) {
				if (raw_fill(s) < 0)
					return -1;
				continue;
			}
			if (avail == 0) {
				s->mode = GZSRC_M_END;
				return 0;
			}
			if (avail >= 2 && s->in[s->inpos] == 0x1f &&
			    s->in[s->inpos + 1] == 0x8b) {
				inflateReset(&s->z);
				s->mode = GZSRC_M_MEMBER;
				continue;
			}
			if (junk(s) < 0)
				return -1;
			continue;
		case GZSRC_M_END:
			return 0;
		default:
			return -1;
		}
	}
}

int
gzsrc_plain(const struct gzsrc *s)
{
	return s->plain;
}

/* The binding of gzsrc_bind_mem(). */
static const char *mem_name;
static const void *mem_buf;
static size_t mem_len;

void
gzsrc_bind_mem(const char *name, const void *buf, size_t n)
{
	mem_name = name;
	mem_buf = buf;
	mem_len = n;
}

/*
 * A memory source: all its raw input in in[] (not ours to free), no
 * descriptor and no second thread; decode() reads it as a file's.
 */
int
gzsrc_open_mem(struct gzsrc *s, const char *name, const void *buf, size_t n)
{
	static unsigned char none[1];

	memset(s, 0, sizeof(*s));
	s->fd = -1;
	s->name = name;
	s->in = n > 0 ? (unsigned char *)(uintptr_t)buf : none;
	s->inlen = s->incap = n;
	s->in_owned = 0;
	s->is_mem = 1;
	s->raw_eof = 1;
	s->mode = GZSRC_M_START;
	return 0;
}

int
gzsrc_open(struct gzsrc *s, const char *path)
{
	struct stat sb;
	const char *env;
	int fd;

	if (mem_name != NULL && path != NULL && strcmp(path, mem_name) == 0)
		return gzsrc_open_mem(s, path, mem_buf, mem_len);
	memset(s, 0, sizeof(*s));
	s->fd = -1;
	if (path == NULL || strcmp(path, "-") == 0) {
		s->is_stdin = 1;
		s->name = "stdin";
		fd = dup(STDIN_FILENO);
		if (fd >= 0)
			(void)pipe_widen(fd);	/* when it is a pipe */
	} else {
		s->name = path;
		fd = open(path, O_RDONLY);
	}
	if (fd < 0) {
		cw_warn("%s: %s", s->name, strerror(errno));
		return -1;
	}
	s->fd = fd;
	s->incap = GZSRC_BUFSZ;
	s->in = cw_malloc(s->incap);
	s->in_owned = 1;
	s->mode = GZSRC_M_START;
	/*
	 * A second thread only where it pays: gzip (seen by its first
	 * bytes) in a regular file.  A pipe is as fast as its writer.
	 */
	env = getenv("CW_THREADS");
	if ((env != NULL && strcmp(env, "0") == 0) || fstat(fd, &sb) != 0 ||
	    !S_ISREG(sb.st_mode))
		return 0;
	if (raw_fill(s) < 0 || s->inlen < 2 || s->in[0] != 0x1f ||
	    s->in[1] != 0x8b)
		return 0;
	ring_start(s);
	return 0;
}

/* The second thread: decode into the ring until the end or an error. */
static void *
reader(void *arg)
{
	struct gzsrc *s = arg;
	struct gzsrc_ring *g = s->ring;
	size_t len;
	ssize_t got = 1;
	unsigned k;

	for (;;) {
		pthread_mutex_lock(&g->mu);
		while (g->tail - g->head == GZSRC_NRING && !g->stop)
			pthread_cond_wait(&g->cv, &g->mu);
		if (g->stop) {
			g->done = 1;
			pthread_cond_broadcast(&g->cv);
			pthread_mutex_unlock(&g->mu);
			return NULL;
		}
		k = (unsigned)(g->tail % GZSRC_NRING);
		pthread_mutex_unlock(&g->mu);
		len = 0;
		while (len < GZSRC_RINGSZ) {
			got = decode(s, g->buf[k] + len, GZSRC_RINGSZ - len);
			if (got <= 0)
				break;
			len += (size_t)got;
		}
		pthread_mutex_lock(&g->mu);
		g->len[k] = len;
		if (len > 0)
			g->tail++;
		if (got <= 0) {
			g->done = 1;
			g->status = got < 0 ? -1 : 0;
		}
		pthread_cond_broadcast(&g->cv);
		pthread_mutex_unlock(&g->mu);
		if (got <= 0)
			return NULL;
	}
}

static void
ring_start(struct gzsrc *s)
{
	struct gzsrc_ring *g = cw_calloc(1, sizeof(*g));
	sigset_t all, old;
	int k, rc;

	for (k = 0; k < GZSRC_NRING; k++)
		g->buf[k] = cw_malloc(GZSRC_RINGSZ);
	pthread_mutex_init(&g->mu, NULL);
	pthread_cond_init(&g->cv, NULL);
	s->ring = g;
	/* Signals stay with the caller's thread (outf's clean-up). */
	sigfillset(&all);
	pthread_sigmask(SIG_SETMASK, &all, &old);
	rc = pthread_create(&g->th, NULL, reader, s);
	pthread_sigmask(SIG_SETMASK, &old, NULL);
	if (rc != 0) {
		/* No thread: read on this one, as for a pipe. */
		ring_free(g);
		s->ring = NULL;
	}
}

static void
ring_free(struct gzsrc_ring *g)
{
	int k;

	pthread_mutex_destroy(&g->mu);
	pthread_cond_destroy(&g->cv);
	for (k = 0; k < GZSRC_NRING; k++)
		free(g->buf[k]);
	free(g);
}

static ssize_t
ring_read(struct gzsrc *s, void *buf, size_t n)
{
	struct gzsrc_ring *g = s->ring;
	size_t k, m;
	int status;

	pthread_mutex_lock(&g->mu);
	while (g->head == g->tail && !g->done)
		pthread_cond_wait(&g->cv, &g->mu);
	if (g->head == g->tail) {
		status = g->status;
		pthread_mutex_unlock(&g->mu);
		return finish(s, status);
	}
	pthread_mutex_unlock(&g->mu);
	k = g->head % GZSRC_NRING;
	m = g->len[k] - g->pos;
	if (m > n)
		m = n;
	memcpy(buf, g->buf[k] + g->pos, m);
	g->pos += m;
	if (g->pos == g->len[k]) {
		g->pos = 0;
		pthread_mutex_lock(&g->mu);
		g->head++;
		pthread_cond_broadcast(&g->cv);
		pthread_mutex_unlock(&g->mu);
	}
	return (ssize_t)m;
}

/* The end of the content: say what went wrong or what was skipped. */
static ssize_t
finish(struct gzsrc *s, int status)
{
	if (status < 0) {
		if (s->err[0] != '\0')
			cw_warn("%s: %s", s->name, s->err);
		s->err[0] = '\0';	/* said once */
		return -1;
	}
	if (s->junk_runs > 0) {
		cw_warn("%s: %llu bytes after gzip members skipped, not gzip "
		    "data (%lu stretch%s, the first at offset %llu)", s->name,
		    s->junk_bytes, s->junk_runs, s->junk_runs == 1 ? "" :
		    "es", s->junk_first);
		s->junk_runs = 0;
	}
	return 0;
}

ssize_t
gzsrc_read(struct gzsrc *s, void *buf, size_t n)
{
	ssize_t got;

	if (n == 0)
		return 0;
	if (s->ring != NULL)
		return ring_read(s, buf, n);
	got = decode(s, buf, n);
	return got > 0 ? got : finish(s, (int)got);
}

void
gzsrc_close(struct gzsrc *s)
{
	struct gzsrc_ring *g = s->ring;

	if (g != NULL) {
		pthread_mutex_lock(&g->mu);
		g->stop = 1;
		pthread_cond_broadcast(&g->cv);
		pthread_mutex_unlock(&g->mu);
		pthread_join(g->th, NULL);
		ring_free(g);
		s->ring = NULL;
	}
	if (s->zinit)
		inflateEnd(&s->z);
	s->zinit = 0;
	if (s->fd >= 0)
		close(s->fd);
	s->fd = -1;
	if (s->in_owned)
		free(s->in);
	s->in = NULL;
}
