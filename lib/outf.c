/*
 * outf.c: atomic output files.  The temporary lives beside the target (the
 * file at the end of any symbolic links) so that rename(2) is atomic and
 * the links stay; exit handlers and signal handlers remove it if the run
 * does not reach outf_commit().
 */
/* S_ISVTX and realpath(3) are XSI. */
#undef _POSIX_C_SOURCE
#define _XOPEN_SOURCE 700
#include <errno.h>
#include <fcntl.h>
#include <limits.h>
#include <signal.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <sys/stat.h>

#include "cw.h"
#include "outf.h"
#include "pipe.h"

#define OUTF_MAX 8
#define OUTF_HOPS 40		/* symbolic links followed, as Linux's ELOOP */
#define OUTF_SUFFIX ".tmpXXXXXX"

struct outf {
	FILE *fp;
	char *path;		/* NULL: standard output; else the target */
	char *tmp;
	volatile sig_atomic_t live; /* temporary exists, not yet renamed */
	int direct;		/* not a regular file: written in place */
};

static struct outf slots[OUTF_MAX];
static volatile sig_atomic_t nslots;
static int hooked;

/* Signals whose default action ends the process, so they are caught. */
static const int fatal_sigs[] = {
	SIGINT, SIGTERM, SIGHUP, SIGPIPE, SIGQUIT, SIGALRM, SIGUSR1, SIGUSR2,
	SIGXCPU, SIGVTALRM, SIGPROF
};

static void cleanup(void);
static void on_signal(int);
static void hook(void);
static char *dir_of(const char *);
static int shared_dir(const char *, const struct stat *, struct stat *);
static char *resolve(const char *);
static struct outf *slot(void);
static struct outf *open_any(const char *, int);
static void sync_dir(const char *);

static void
cleanup(void)
{
	int i;

	for (i = 0; i < nslots; i++)
		if (slots[i].live) {
			unlink(slots[i].tmp);
			slots[i].live = 0;
		}
}

static void
on_signal(int sig)
{
	int i;

	/* Only async-signal-safe calls here. */
	for (i = 0; i < nslots; i++)
		if (slots[i].live)
			unlink(slots[i].tmp);
	signal(sig, SIG_DFL);
	raise(sig);
}

static void
hook(void)
{
	struct sigaction sa, old;
	size_t i;

	if (hooked)
		return;
	memset(&sa, 0, sizeof(sa));
	sa.sa_handler = on_signal;
	sigfillset(&sa.sa_mask);
	for (i = 0; i < sizeof(fatal_sigs) / sizeof(fatal_sigs[0]); i++) {
		/*
		 * A hang-up or broken pipe ignored by the caller (nohup)
		 * stays ignored.  SIGINT and SIGQUIT, which a shell ignores
		 * in its background jobs, are caught all the same, so that
		 * kill -INT still ends the run cleanly.
		 */
		if ((fatal_sigs[i] == SIGHUP || fatal_sigs[i] == SIGPIPE) &&
		    sigaction(fatal_sigs[i], NULL, &old) == 0 &&
		    old.sa_handler == SIG_IGN)
			continue;
		sigaction(fatal_sigs[i], &sa, NULL);
	}
	/* Past a file size limit, write(2) then fails with EFBIG. */
	signal(SIGXFSZ, SIG_IGN);
	atexit(cleanup);
	hooked = 1;
}

/* The folder PATH is in ("." for a bare name), allocated. */
static char *
dir_of(const char *path)
{
	const char *slash = strrchr(path, '/');
	char *d;

	if (slash == NULL)
		return cw_strdup(".");
	if (slash == path)
		return cw_strdup("/");
	d = cw_malloc((size_t)(slash - path) + 1);
	memcpy(d, path, (size_t)(slash - path));
	d[slash - path] = '\0';
	return d;
}

/*
 * Whether ST, an entry of folder DIR, is another user's in a shared
 * folder (sticky and writable by all, as /tmp), where the kernel's
 * protected_symlinks and protected_fifos rules do not follow it either.
 */
static int
shared_dir(const char *dir, const struct stat *st, struct stat *dst)
{
	if (stat(dir, dst) != 0)
		return 0;
	return (dst->st_mode & S_ISVTX) && (dst->st_mode & S_IWOTH) &&
	    st->st_uid != geteuid() && st->st_uid != dst->st_uid;
}

/* PATH after the symbolic links at its end, allocated (it may not exist). */
static char *
resolve(const char *path)
{
	struct stat st, dst;
	char *p, *q, *dir;
	size_t cap = PATH_MAX;
	ssize_t n;
	int hops;

	p = cw_strdup(path);
	for (hops = 0;; hops++) {
		if (lstat(p, &st) != 0 || !S_ISLNK(st.st_mode))
			return p;
		if (hops == OUTF_HOPS)
			cw_die(CW_EXIT_DATA, "%s: %s", path, strerror(ELOOP));
		dir = dir_of(p);
		if (shared_dir(dir, &st, &dst))
			cw_die(CW_EXIT_DATA, "%s: a symbolic link of another "
			    "user in a shared folder (sticky, writable by "
			    "all): not followed", p);
		q = cw_malloc(cap);
		if ((n = readlink(p, q, cap - 1)) < 0)
			cw_die(CW_EXIT_DATA, "%s: %s", p, strerror(errno));
		q[n] = '\0';
		if (q[0] != '/' && strchr(p, '/') != NULL) {
			char *r = cw_malloc(strlen(dir) + (size_t)n + 2);

			sprintf(r, "%s/%s", dir, q);
			free(q);
			q = r;
		}
		free(dir);
		free(p);
		p = q;
	}
}

static struct outf *
slot(void)
{
	struct outf *o;
	int i;

	/* A slot whose file was committed can serve again. */
	for (o = NULL, i = 0; i < nslots; i++)
		if (slots[i].path != NULL && slots[i].fp == NULL &&
		    !slots[i].live) {
			o = &slots[i];
			free(o->path);
			free(o->tmp);
			memset(o, 0, sizeof(*o));
			return o;
		}
	if (nslots == OUTF_MAX)
		cw_die(CW_EXIT_DATA, "too many output files");
	o = &slots[nslots];
	memset(o, 0, sizeof(*o));
	nslots++;
	return o;
}

void
outf_check_state(const char *path)
{
	struct stat st;
	char *p = resolve(path);

	if (stat(p, &st) == 0 && !S_ISREG(st.st_mode))
		cw_die(CW_EXIT_DATA, "%s: not a regular file (%s); a state "
		    "must be a plain file", path, S_ISFIFO(st.st_mode) ?
		    "a FIFO" : S_ISDIR(st.st_mode) ? "a folder" :
		    S_ISCHR(st.st_mode) || S_ISBLK(st.st_mode) ? "a device" :
		    "a socket or other special file");
	free(p);
}

struct outf *
outf_open(const char *path)
{
	return open_any(path, 0);
}

struct outf *
outf_open_state(const char *path)
{
	return open_any(path, 1);
}

static struct outf *
open_any(const char *path, int state)
{
	static char obuf[256 * 1024];
	struct outf *o;
	struct stat st, dst;
	char *target, *dir;
	const char *base;
	sigset_t all, omask;
	long name_max;
	size_t keep, len;
	int fd, have;

	if (path == NULL || strcmp(path, "-") == 0) {
		o = slot();
		o->fp = stdout;
		setvbuf(stdout, obuf, _IOFBF, sizeof(obuf));
		(void)pipe_widen(STDOUT_FILENO);	/* when it is a pipe */
		return o;
	}
	hook();
	if (state)
		outf_check_state(path);
	target = resolve(path);
	dir = dir_of(target);
	have = stat(target, &st) == 0;
	if (have && S_ISDIR(st.st_mode))
		cw_die(CW_EXIT_DATA, "%s: is a folder", path);
	if (have && !S_ISREG(st.st_mode)) {
		/*
		 * A device or a FIFO is written in place: renaming over it
		 * would replace it with a plain file.  One's own FIFO waits
		 * for its reader (a pipeline started in any order); another
		 * user's in a shared folder is refused.
		 */
		if (S_ISFIFO(st.st_mode) && shared_dir(dir, &st, &dst))
			cw_die(CW_EXIT_DATA, "%s: a FIFO of another user in a "
			    "shared folder: not written to", path);
		if (!S_ISFIFO(st.st_mode) && !S_ISCHR(st.st_mode))
			cw_die(CW_EXIT_DATA, "%s: neither a plain file, a "
			    "FIFO nor a character device", path);
		fd = open(target, O_WRONLY | O_NOCTTY);
		if (fd < 0)
			cw_die(CW_EXIT_DATA, "%s: %s", path, strerror(errno));
		o = slot();
		o->fp = fdopen(fd, "w");
		if (o->fp == NULL)
			cw_die(CW_EXIT_DATA, "%s: %s", path, strerror(errno));
		o->path = target;
		o->direct = 1;
		free(dir);
		return o;
	}
	/*
	 * ".BASE.tmpXXXXXX" beside the target; BASE is cut so that the name
	 * stays within the file system's limit (NAME_MAX).
	 */
	base = strrchr(target, '/');
	base = base != NULL ? base + 1 : target;
	if ((name_max = pathconf(dir, _PC_NAME_MAX)) <= 0)
		name_max = NAME_MAX;
	keep = strlen(base);
	if (keep + 1 + strlen(OUTF_SUFFIX) > (size_t)name_max)
		keep = (size_t)name_max - 1 - strlen(OUTF_SUFFIX);
	len = (size_t)(base - target) + keep + 1 + strlen(OUTF_SUFFIX) + 1;
	o = slot();
	o->tmp = cw_malloc(len);
	snprintf(o->tmp, len, "%.*s.%.*s%s", (int)(base - target), target,
	    (int)keep, base, OUTF_SUFFIX);
	/*
	 * No signal between making the temporary and marking it live: the
	 * handler removes only the temporaries of live slots.
	 */
	sigfillset(&all);
	sigprocmask(SIG_BLOCK, &all, &omask);
	fd = mkstemp(o->tmp);
	if (fd < 0)
		cw_die(CW_EXIT_DATA, "%s: cannot create a temporary file: %s",
		    path, strerror(errno));
	o->live = 1;
	if (have) {
		/* The new file keeps the old one's mode (and group). */
		fchmod(fd, st.st_mode & 07777);
		if (fchown(fd, (uid_t)-1, st.st_gid) != 0)
			errno = 0;
	} else {
		mode_t um = umask(0);

		umask(um);
		fchmod(fd, 0666 & ~um);
	}
	o->path = target;
	free(dir);
	sigprocmask(SIG_SETMASK, &omask, NULL);
	o->fp = fdopen(fd, "w");
	if (o->fp == NULL)
		cw_die(CW_EXIT_DATA, "%s: %s", path, strerror(errno));
	return o;
}

int
outf_same(const char *a, const char *b)
{
	struct stat sa, sb;
	char *ra, *rb, *da, *db, *pa, *pb;
	const char *ba, *bb;
	int same;

	ra = resolve(a);
	rb = resolve(b);
	if (stat(ra, &sa) == 0 && stat(rb, &sb) == 0) {
		same = sa.st_dev == sb.st_dev && sa.st_ino == sb.st_ino;
		free(ra);
		free(rb);
		return same;
	}
	/* One does not exist yet: compare canonical folders and names. */
	da = dir_of(ra);
	db = dir_of(rb);
	ba = strrchr(ra, '/') ? strrchr(ra, '/') + 1 : ra;
	bb = strrchr(rb, '/') ? strrchr(rb, '/') + 1 : rb;
	pa = realpath(da, NULL);
	pb = realpath(db, NULL);
	same = strcmp(ba, bb) == 0 && (pa != NULL && pb != NULL ?
	    strcmp(pa, pb) == 0 : strcmp(da, db) == 0);
	free(pa);
	free(pb);
	free(da);
	free(db);
	free(ra);
	free(rb);
	return same;
}

FILE *
outf_fp(struct outf *o)
{
	return o->fp;
}

/* After a rename, the folder's entry is made durable too. */
static void
sync_dir(const char *path)
{
	char *dir = dir_of(path);
	int fd = open(dir, O_RDONLY | O_DIRECTORY);

	if (fd >= 0) {
		fsync(fd);
		close(fd);
	}
	free(dir);
}

int
outf_commit(struct outf *o)
{
	int bad;

	if (o->path == NULL) {
		if (fflush(stdout) != 0 || ferror(stdout)) {
			cw_warn("write error on standard output: %s",
			    strerror(errno));
			return -1;
		}
		return 0;
	}
	bad = fflush(o->fp) != 0 || ferror(o->fp);
	if (o->direct) {
		bad |= fclose(o->fp) != 0;
		o->fp = NULL;
		if (bad) {
			cw_warn("%s: write error: %s", o->path,
			    strerror(errno));
			return -1;
		}
		return 0;
	}
	bad |= fsync(fileno(o->fp)) != 0 && errno != EINVAL;
	bad |= fclose(o->fp) != 0;
	o->fp = NULL;
	if (bad) {
		cw_warn("%s: write error: %s", o->path, strerror(errno));
		outf_abort(o);
		return -1;
	}
	if (rename(o->tmp, o->path) != 0) {
		cw_warn("%s: cannot rename the temporary into place: %s",
		    o->path, strerror(errno));
		outf_abort(o);
		return -1;
	}
	o->live = 0;
	sync_dir(o->path);
	return 0;
}

void
outf_abort(struct outf *o)
{
	if (o->live) {
		unlink(o->tmp);
		o->live = 0;
	}
}
