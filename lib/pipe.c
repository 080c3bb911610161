/*
 * pipe.c: a wider pipe between two tools.
 *
 * A Linux pipe holds 64 KiB.  In `cw-clean | cw-wear` on two cores, three
 * busy threads (cw-clean's inflating and parsing threads, cw-wear) share
 * two cores: each time the pipe is full the parsing thread stops until
 * cw-wear has been scheduled and emptied it, and while it waits its core
 * goes to the others.  A pipe of 1 MiB lets either side run on for longer
 * before it has to wait (BENCHMARKS.md has the measured effect).  Either
 * end may ask; only a pipe that is smaller is widened, and a refusal
 * (another system, a user over the kernel's pipe-user-pages-soft limit)
 * leaves the pipe as it was: the data are the same, only the waits
 * change.
 */
#define _GNU_SOURCE		/* F_GETPIPE_SZ, F_SETPIPE_SZ */
#include <fcntl.h>
#include <sys/stat.h>

#include "pipe.h"

/* Widen FD if it is a pipe smaller than PIPE_WIDE: its size after, or -1
 * where FD is not a pipe or its size cannot be read. */
int
pipe_widen(int fd)
{
	struct stat sb;
	int now = -1;

	if (fstat(fd, &sb) != 0 || !S_ISFIFO(sb.st_mode))
		return -1;
#if defined(F_GETPIPE_SZ) && defined(F_SETPIPE_SZ)
	now = fcntl(fd, F_GETPIPE_SZ);
	if (now >= 0 && now < PIPE_WIDE && fcntl(fd, F_SETPIPE_SZ,
	    PIPE_WIDE) >= 0)
		now = fcntl(fd, F_GETPIPE_SZ);
#endif
	return now;
}
