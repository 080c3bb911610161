/*
 * cw.h: what every cellwear tool shares: exit codes, messages, memory.
 *
 * Messages follow cellwear(7): "PROG: FILE:LINE: message" or "PROG: message",
 * on stderr.  cw_die() runs the exit handlers, so an atomic output file
 * that was not committed is removed (see outf.h).
 */
#ifndef CW_H
#define CW_H

#include <stddef.h>
#include <stdint.h>

/* The one set of exit codes; cellwear(7), EXIT STATUS. */
enum cw_exit {
	CW_EXIT_OK = 0,		/* success */
	CW_EXIT_DATA = 1,	/* data or I/O error */
	CW_EXIT_USAGE = 2	/* usage error */
};

/* Microseconds since 1970-01-01T00:00:00Z; the time type of every tool. */
typedef int64_t cw_time;
#define CW_US_PER_S 1000000LL

extern const char *cw_prog;	/* set by cw_setprog() */
extern int cw_verbose;		/* -v given */
/* Non-zero: cw_warn and cw_warn_at say nothing (a read-ahead whose
 * findings the main pass reports). */
extern int cw_quiet;

void	cw_setprog(const char *name);
void	cw_warn(const char *fmt, ...)
	    __attribute__((format(printf, 1, 2)));
void	cw_warn_at(const char *file, unsigned long line, const char *fmt, ...)
	    __attribute__((format(printf, 3, 4)));
_Noreturn void cw_die(int code, const char *fmt, ...)
	    __attribute__((format(printf, 2, 3)));
/* A usage error: the message, a hint to --help, exit 2. */
_Noreturn void cw_usage_error(const char *fmt, ...)
	    __attribute__((format(printf, 1, 2)));
/* Print "PROG VERSION" to stdout and exit 0. */
_Noreturn void cw_print_version(void);

void	*cw_malloc(size_t n);
void	*cw_calloc(size_t n, size_t size);
void	*cw_realloc(void *p, size_t n);
char	*cw_strdup(const char *s);

/* A missing value is NaN inside the tools and an empty field outside. */
/*
 * The struct TYPE whose member MEMBER is at P: an engine's callback gets
 * its own state, which a tool's device state embeds.
 */
#define CW_CONTAINER(p, type, member) \
	((type *)(void *)((char *)(p) - offsetof(type, member)))

#define CW_MISSING (__builtin_nan(""))
#define cw_isnum(x) ((x) == (x))

#endif
