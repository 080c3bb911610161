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

int
gzsrc_open(struct gzsrc *s, const char *path)
{
	int fd;

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
}
