/* lock.c: one run at a time on a state file (see lock.h). */
/* realpath(3) is XSI, beside the POSIX base the build asks for. */
#define _XOPEN_SOURCE 700
#include <dirent.h>
#include <errno.h>
#include <fcntl.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <time.h>
#include <unistd.h>
#include <sys/stat.h>

#include "cw.h"
#include "lock.h"

/* How often a waiting run tries again: 50 ms. */
#define LOCK_POLL_NS	50000000L

/* The lock file, open until the process ends (closing it drops the lock). */
static int lock_fd = -1;

static char	*resolved(const char *);
static int	 try_lock(int, long *);
static cw_time	 now_us(void);
static unsigned	 sweep(const char *);
static int	 is_tmp_of(const char *, const char *, size_t);

/* PATH with its symbolic links resolved, or PATH itself (not there yet). */
static char *
resolved(const char *path)
{
	char *r = realpath(path, NULL);

	return r != NULL ? r : cw_strdup(path);
}

/* 0: locked; 1: another process holds it (*HOLDER its pid); -1: error. */
static int
try_lock(int fd, long *holder)
{
	struct flock fl;

	memset(&fl, 0, sizeof(fl));
	fl.l_type = F_WRLCK;
	fl.l_whence = SEEK_SET;
	if (fcntl(fd, F_SETLK, &fl) == 0)
		return 0;
	if (errno != EACCES && errno != EAGAIN)
		return -1;
	memset(&fl, 0, sizeof(fl));
	fl.l_type = F_WRLCK;
	fl.l_whence = SEEK_SET;
	*holder = fcntl(fd, F_GETLK, &fl) == 0 && fl.l_type != F_UNLCK ?
	    (long)fl.l_pid : 0;
	return 1;
}

static cw_time
now_us(void)
{
	struct timespec ts;

	clock_gettime(CLOCK_MONOTONIC, &ts);
	return (cw_time)ts.tv_sec * CW_US_PER_S + ts.tv_nsec / 1000;
}

/* Whether NAME is ".BASE.tmpXXXXXX", a temporary outf made for BASE. */
static int
is_tmp_of(const char *name, const char *base, size_t blen)
{
	size_t k;

	if (strlen(name) != blen + 11 || name[0] != '.' ||
	    strncmp(name + 1, base, blen) != 0 ||
	    strncmp(name + 1 + blen, ".tmp", 4) != 0)
		return 0;
	for (k = blen + 5; name[k] != '\0'; k++)
		if (!((name[k] >= 'a' && name[k] <= 'z') ||
		    (name[k] >= 'A' && name[k] <= 'Z') ||
		    (name[k] >= '0' && name[k] <= '9')))
			return 0;
	return 1;
}

/* Remove the temporaries of PATH that killed runs left; how many. */
static unsigned
sweep(const char *path)
{
	const char *slash = strrchr(path, '/'), *base;
	char dir[4096], full[8192];
	struct dirent *e;
	struct stat sb;
	unsigned n = 0;
	DIR *dp;

	base = slash != NULL ? slash + 1 : path;
	if (slash == NULL)
		snprintf(dir, sizeof(dir), ".");
	else if (snprintf(dir, sizeof(dir), "%.*s", (int)(slash - path) + 1,
	    path) >= (int)sizeof(dir))
		return 0;
	if ((dp = opendir(dir)) == NULL)
		return 0;
	while ((e = readdir(dp)) != NULL) {
		if (!is_tmp_of(e->d_name, base, strlen(base)))
			continue;
		if (snprintf(full, sizeof(full), "%s/%s", dir, e->d_name) >=
		    (int)sizeof(full))
			continue;
		if (lstat(full, &sb) == 0 && S_ISREG(sb.st_mode) &&
		    unlink(full) == 0)
			n++;
	}
	closedir(dp);
	return n;
}

void
lock_state(const char *path, cw_time wait)
{
	char *real, *name;
	struct stat sb;
	cw_time t0;
	long holder = 0;
	size_t n;
	unsigned swept;
	int rc, told = 0;

	real = resolved(path);
	n = strlen(real) + sizeof(".lock");
	name = cw_malloc(n);
	snprintf(name, n, "%s.lock", real);
	/* Not through a link, and never blocked by a FIFO planted there. */
	lock_fd = open(name, O_RDWR | O_CREAT | O_NOFOLLOW | O_NONBLOCK |
	    O_CLOEXEC, 0666);
	if (lock_fd < 0)
		cw_die(CW_EXIT_DATA, "%s: cannot open the lock file %s: %s",
		    path, name, strerror(errno));
	if (fstat(lock_fd, &sb) != 0 || !S_ISREG(sb.st_mode))
		cw_die(CW_EXIT_DATA, "%s: the lock file %s is not a regular "
		    "file", path, name);
	t0 = now_us();
	while ((rc = try_lock(lock_fd, &holder)) != 0) {
		struct timespec ts = { 0, LOCK_POLL_NS };

		if (rc < 0)
			cw_die(CW_EXIT_DATA, "%s: cannot lock %s: %s", path,
			    name, strerror(errno));
		if (now_us() - t0 >= wait)
			cw_die(CW_EXIT_DATA, "%s: another run (process %ld) "
			    "holds its lock %s%s: the state was left as it "
			    "is; run again once that run has ended, or give "
			    "a longer --lock-wait", path, holder, name,
			    wait > 0 ? " and did not let go in time" : "");
		if (cw_verbose && !told++)
			cw_warn("%s: waiting for another run (process %ld) "
			    "to let go of %s", path, holder, name);
		nanosleep(&ts, NULL);
	}
	swept = sweep(real);
	if (strcmp(real, path) != 0)
		swept += sweep(path);
	if (swept > 0)
		cw_warn("%s: removed %u temporary file%s that a killed run "
		    "left beside it", path, swept, swept > 1 ? "s" : "");
	free(name);
	free(real);
}
