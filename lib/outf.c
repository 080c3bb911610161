/*
 * outf.c: atomic output files.  The temporary lives beside the target so
 * that rename(2) is atomic; exit handlers and signal handlers remove it if
 * the run does not reach outf_commit().
 */
#include <errno.h>
#include <signal.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <sys/stat.h>

#include "cw.h"
#include "outf.h"

#define OUTF_MAX 8

struct outf {
	FILE *fp;
	char *path;		/* NULL: standard output */
	char tmp[4096];
	int live;		/* temporary exists, not yet renamed */
	int direct;		/* not a regular file: written in place */
};

static struct outf slots[OUTF_MAX];
static volatile sig_atomic_t nslots;
static int hooked;

static void cleanup(void);
static void on_signal(int);

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

struct outf *
outf_open(const char *path)
{
	static char obuf[256 * 1024];
	struct outf *o;
	const char *slash, *base;
	struct stat st;
	sigset_t omask;
	int fd, i;

	/* A slot whose file was committed can serve again. */
	for (o = NULL, i = 0; i < nslots; i++)
		if (slots[i].path != NULL && slots[i].fp == NULL &&
		    !slots[i].live) {
			o = &slots[i];
			free(o->path);
			o->path = NULL;
			break;
		}
	if (o == NULL) {
		if (nslots == OUTF_MAX)
			cw_die(CW_EXIT_DATA, "too many output files");
		o = &slots[nslots];
	}
	memset(o, 0, sizeof(*o));
	if (path == NULL || strcmp(path, "-") == 0) {
		o->fp = stdout;
		setvbuf(stdout, obuf, _IOFBF, sizeof(obuf));
		if (o == &slots[nslots])
			nslots++;
		return o;
	}
	if (!hooked) {
		struct sigaction sa;
		int sigs[] = { SIGINT, SIGTERM, SIGHUP, SIGPIPE };

		memset(&sa, 0, sizeof(sa));
		sa.sa_handler = on_signal;
		sigemptyset(&sa.sa_mask);
		for (i = 0; i < 4; i++)
			sigaction(sigs[i], &sa, NULL);
		atexit(cleanup);
		hooked = 1;
	}
	/*
	 * A path that exists and is not a regular file (/dev/stderr, a FIFO,
	 * a symbolic link) is written in place: renaming over it would
	 * replace the device or the link with a plain file.
	 */
	if (lstat(path, &st) == 0 && !S_ISREG(st.st_mode)) {
		o->fp = fopen(path, "w");
		if (o->fp == NULL)
			cw_die(CW_EXIT_DATA, "%s: %s", path, strerror(errno));
		o->path = cw_strdup(path);
		o->direct = 1;
		if (o == &slots[nslots])
			nslots++;
		return o;
	}
	slash = strrchr(path, '/');
	base = slash ? slash + 1 : path;
	if (snprintf(o->tmp, sizeof(o->tmp), "%.*s.%s.tmpXXXXXX",
	    (int)(base - path), path, base) >= (int)sizeof(o->tmp))
		cw_die(CW_EXIT_DATA, "%s: path too long", path);
	/*
	 * No signal between making the temporary and counting its slot: the
	 * handler removes only the temporaries of counted slots.
	 */
	{
		sigset_t all;

		sigfillset(&all);
		sigprocmask(SIG_BLOCK, &all, &omask);
	}
	fd = mkstemp(o->tmp);
	if (fd < 0)
		cw_die(CW_EXIT_DATA, "%s: cannot create a temporary file: %s",
		    path, strerror(errno));
	o->live = 1;
	{
		mode_t um = umask(0);

		umask(um);
		fchmod(fd, 0666 & ~um);
	}
	o->path = cw_strdup(path);
	if (o == &slots[nslots])
		nslots++;
	sigprocmask(SIG_SETMASK, &omask, NULL);
	o->fp = fdopen(fd, "w");
	if (o->fp == NULL)
		cw_die(CW_EXIT_DATA, "%s: %s", path, strerror(errno));
	return o;
}

FILE *
outf_fp(struct outf *o)
{
	return o->fp;
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
