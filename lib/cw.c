/* cw.c: messages, exit codes and checked allocation. */
#include <errno.h>
#include <stdarg.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cw.h"

const char *cw_prog = "cellwear";
int cw_verbose;
int cw_quiet;

static void vwarn_at(const char *, unsigned long, const char *, va_list);

void
cw_setprog(const char *name)
{
	cw_prog = name;
}

static void
vwarn_at(const char *file, unsigned long line, const char *fmt, va_list ap)
{
	/* One fputs-sized write per message keeps lines whole under pipes. */
	char buf[1024], *p;
	int n;

	if (file != NULL && line > 0)
		n = snprintf(buf, sizeof(buf), "%s: %s:%lu: ", cw_prog, file,
		    line);
	else if (file != NULL)
		n = snprintf(buf, sizeof(buf), "%s: %s: ", cw_prog, file);
	else
		n = snprintf(buf, sizeof(buf), "%s: ", cw_prog);
	if (n < 0 || (size_t)n >= sizeof(buf))
		n = 0;
	vsnprintf(buf + n, sizeof(buf) - (size_t)n, fmt, ap);
	/* Bytes quoted from a damaged input must not reach the terminal as
	 * control characters (line ends, escapes): show them as '?'. */
	for (p = buf; *p != '\0'; p++)
		if ((unsigned char)*p < 0x20 || *p == 0x7f)
			*p = '?';
	fflush(stdout);
	fprintf(stderr, "%s\n", buf);
}

void
cw_warn(const char *fmt, ...)
{
	va_list ap;

	if (cw_quiet)
		return;
	va_start(ap, fmt);
	vwarn_at(NULL, 0, fmt, ap);
	va_end(ap);
}

void
cw_warn_at(const char *file, unsigned long line, const char *fmt, ...)
{
	va_list ap;

	if (cw_quiet)
		return;
	va_start(ap, fmt);
	vwarn_at(file, line, fmt, ap);
	va_end(ap);
}

void
cw_die(int code, const char *fmt, ...)
{
	va_list ap;

	va_start(ap, fmt);
	vwarn_at(NULL, 0, fmt, ap);
	va_end(ap);
	exit(code);
}

void
cw_usage_error(const char *fmt, ...)
{
	va_list ap;

	va_start(ap, fmt);
	vwarn_at(NULL, 0, fmt, ap);
	va_end(ap);
	fprintf(stderr, "Try '%s --help' for more information.\n", cw_prog);
	exit(CW_EXIT_USAGE);
}

void
cw_print_version(void)
{
	printf("%s (cellwear) %s\n", cw_prog, CW_VERSION);
	exit(fflush(stdout) == 0 ? CW_EXIT_OK : CW_EXIT_DATA);
}

void *
cw_malloc(size_t n)
{
	void *p = malloc(n ? n : 1);

	if (p == NULL)
		cw_die(CW_EXIT_DATA, "out of memory (%zu bytes)", n);
	return p;
}

void *
cw_calloc(size_t n, size_t size)
{
	void *p = calloc(n ? n : 1, size ? size : 1);

	if (p == NULL)
		cw_die(CW_EXIT_DATA, "out of memory (%zu x %zu bytes)", n,
		    size);
	return p;
}

void *
cw_realloc(void *p, size_t n)
{
	void *q = realloc(p, n ? n : 1);

	if (q == NULL)
		cw_die(CW_EXIT_DATA, "out of memory (%zu bytes)", n);
	return q;
}

char *
cw_strdup(const char *s)
{
	size_t n = strlen(s) + 1;

	return memcpy(cw_malloc(n), s, n);
}
