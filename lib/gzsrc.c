/*
 * gzsrc.c: input through zlib's gz* layer, which reads gzip (by its magic
 * bytes, concatenated members included) and passes anything else through
 * unchanged.  A truncated stream shows up as Z_BUF_ERROR after the last
 * good byte; it is an error here, never a quiet end of file.
 */
#include <errno.h>
#include <fcntl.h>
#include <string.h>
#include <unistd.h>

#include "cw.h"
#include "gzsrc.h"

static ssize_t gzsrc_read_mem(struct gzsrc *, void *, size_t);

/* The binding of gzsrc_bind_mem(). */
static const char *mem_name;
static const void *mem_buf;
static size_t mem_len;

int
gzsrc_open(struct gzsrc *s, const char *path)
{
	int fd;

	if (mem_name != NULL && path != NULL && strcmp(path, mem_name) == 0)
		return gzsrc_open_mem(s, path, mem_buf, mem_len);
	memset(s, 0, sizeof(*s));
	if (path == NULL || strcmp(path, "-") == 0) {
		s->is_stdin = 1;
		s->name = "stdin";
		fd = dup(STDIN_FILENO);
	} else {
		s->name = path;
		fd = open(path, O_RDONLY);
	}
	if (fd < 0) {
		cw_warn("%s: %s", s->name, strerror(errno));
		return -1;
	}
	s->gz = gzdopen(fd, "rb");
	if (s->gz == NULL) {
		close(fd);
		cw_warn("%s: cannot open: out of memory", s->name);
		return -1;
	}
	gzbuffer(s->gz, GZSRC_BUFSZ);
	return 0;
}

ssize_t
gzsrc_read(struct gzsrc *s, void *buf, size_t n)
{
	int got, err;
	const char *msg;

	if (s->mem != NULL)
		return gzsrc_read_mem(s, buf, n);
	if (n > (1u << 30))
		n = 1u << 30;
	got = gzread(s->gz, buf, (unsigned)n);
	if (got > 0)
		return got;
	msg = gzerror(s->gz, &err);
	if (got == 0 && err == Z_OK && !gzdirect(s->gz)) {
		/*
		 * zlib reports a clean end when the input stops right after a
		 * member's deflate data, its trailer missing; a second read
		 * sees that the member is unfinished (Z_BUF_ERROR).
		 */
		gzclearerr(s->gz);
		got = gzread(s->gz, buf, (unsigned)n);
		if (got > 0)
			return got;
		msg = gzerror(s->gz, &err);
	}
	if (got == 0 && err == Z_OK)
		return 0;
	if (err == Z_ERRNO)
		cw_warn("%s: read error: %s", s->name, strerror(errno));
	else if (err == Z_BUF_ERROR)
		cw_warn("%s: truncated gzip stream (unexpected end of file)",
		    s->name);
	else {
		/* zlib names the stream "<fd:N>: ": the file is named here. */
		if (msg != NULL && strncmp(msg, "<fd:", 4) == 0 &&
		    strstr(msg, ": ") != NULL)
			msg = strstr(msg, ": ") + 2;
		cw_warn("%s: corrupt gzip stream: %s", s->name, msg);
	}
	return -1;
}

void
gzsrc_close(struct gzsrc *s)
{
	if (s->gz != NULL)
		gzclose_r(s->gz);
	s->gz = NULL;
	if (s->meminit)
		inflateEnd(&s->zs);
	s->meminit = 0;
	s->mem = NULL;
}

/*
 * The memory source.  It follows what zlib's gz* layer does with a file
 * (gzread.c, gz_look()): gzip when the next two bytes are the magic
 * bytes; plain bytes copied through when the source does not begin with
 * them; after a gzip member, another member if the magic bytes follow,
 * else the rest is trailing garbage, ignored.  A member cut short is a
 * truncated stream, a broken one a corrupt stream, as in gzsrc_read().
 */
enum { GZSRC_MEM_LOOK, GZSRC_MEM_GZIP, GZSRC_MEM_DIRECT, GZSRC_MEM_END };

void
gzsrc_bind_mem(const char *name, const void *buf, size_t n)
{
	mem_name = name;
	mem_buf = buf;
	mem_len = n;
}

int
gzsrc_open_mem(struct gzsrc *s, const char *name, const void *buf, size_t n)
{
	static const unsigned char none[1];

	memset(s, 0, sizeof(*s));
	s->name = name;
	s->mem = n > 0 ? buf : none;
	s->memlen = n;
	s->memstate = GZSRC_MEM_LOOK;
	return 0;
}

static ssize_t
gzsrc_read_mem(struct gzsrc *s, void *buf, size_t n)
{
	size_t left, got;
	int ret;

	if (n > (1u << 30))
		n = 1u << 30;
	for (;;) {
		left = s->memlen - s->mempos;
		switch (s->memstate) {
		case GZSRC_MEM_LOOK:
			if (left >= 2 && s->mem[s->mempos] == 0x1f &&
			    s->mem[s->mempos + 1] == 0x8b) {
				if (!s->meminit) {
					if (inflateInit2(&s->zs, 15 + 16) !=
					    Z_OK) {
						cw_warn("%s: cannot open: out "
						    "of memory", s->name);
						return -1;
					}
					s->meminit = 1;
				} else
					inflateReset(&s->zs);
				s->memstate = GZSRC_MEM_GZIP;
			} else if (s->meminit || left == 0)
				s->memstate = GZSRC_MEM_END;
			else
				s->memstate = GZSRC_MEM_DIRECT;
			break;
		case GZSRC_MEM_DIRECT:
			got = left < n ? left : n;
			memcpy(buf, s->mem + s->mempos, got);
			s->mempos += got;
			return (ssize_t)got;
		case GZSRC_MEM_GZIP:
			/* With the input used up, inflate() may still hold
			 * output (a match being copied out). */
			s->zs.next_in = (unsigned char *)s->mem + s->mempos;
			s->zs.avail_in = left > (1u << 30) ? 1u << 30 :
			    (unsigned)left;
			s->zs.next_out = buf;
			s->zs.avail_out = (unsigned)n;
			ret = inflate(&s->zs, Z_NO_FLUSH);
			s->mempos += (size_t)(s->zs.next_in - (s->mem +
			    s->mempos));
			got = n - s->zs.avail_out;
			if (ret == Z_STREAM_END)
				s->memstate = GZSRC_MEM_LOOK;
			else if (ret == Z_DATA_ERROR || ret == Z_NEED_DICT ||
			    ret == Z_STREAM_ERROR || ret == Z_MEM_ERROR) {
				cw_warn("%s: corrupt gzip stream: %s", s->name,
				    s->zs.msg != NULL ? s->zs.msg :
				    "compressed data error");
				return -1;
			}
			if (got > 0)
				return (ssize_t)got;
			if (s->memstate == GZSRC_MEM_GZIP && left == 0) {
				cw_warn("%s: truncated gzip stream (unexpected "
				    "end of file)", s->name);
				return -1;
			}
			break;
		default:
			return 0;
		}
	}
}
