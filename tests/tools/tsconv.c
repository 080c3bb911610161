/*
 * tsconv: a test driver for lib/ts.c, used by tests/ref/ts_python.sh.
 *
 *   tsconv parse KIND     lines "OFFSET_S<TAB>TEXT" -> microseconds or ERR
 *   tsconv format         lines "MICROSECONDS"      -> ts_format() text
 *
 * KIND is iso, s, ms, us or auto (TS_ISO, TS_EPOCH_S, ...).  One output
 * line per input line, so the caller can pair them.  Not a tool: stdio
 * and strtoll are fine here.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "cw.h"
#include "ts.h"

static int kind_of(const char *);

static int
kind_of(const char *s)
{
	static const char *const names[] = { "iso", "s", "ms", "us", "auto" };
	static const int kinds[] = { TS_ISO, TS_EPOCH_S, TS_EPOCH_MS,
	    TS_EPOCH_US, TS_AUTO };
	size_t i;

	for (i = 0; i < sizeof(names) / sizeof(names[0]); i++)
		if (strcmp(s, names[i]) == 0)
			return kinds[i];
	return -1;
}

int
main(int argc, char **argv)
{
	char line[512], out[TS_FMTMAX];
	int kind = 0;

	cw_setprog("tsconv");
	if (argc == 3 && strcmp(argv[1], "parse") == 0)
		kind = kind_of(argv[2]);
	else if (!(argc == 2 && strcmp(argv[1], "format") == 0))
		kind = -1;
	if (kind < 0) {
		fprintf(stderr, "usage: tsconv parse iso|s|ms|us|auto | "
		    "tsconv format\n");
		return CW_EXIT_USAGE;
	}
	while (fgets(line, sizeof(line), stdin) != NULL) {
		size_t n = strcspn(line, "\n");
		char *end, *tab;
		cw_time t;
		long off;

		line[n] = '\0';
		if (kind == 0) {
			t = strtoll(line, &end, 10);
			if (end == line || *end != '\0') {
				fprintf(stderr, "tsconv: bad line '%s'\n", line);
				return CW_EXIT_DATA;
			}
			ts_format(t, out);
			printf("%s\n", out);
			continue;
		}
		tab = strchr(line, '\t');
		if (tab == NULL) {
			fprintf(stderr, "tsconv: no tab in '%s'\n", line);
			return CW_EXIT_DATA;
		}
		*tab = '\0';
		off = strtol(line, NULL, 10);
		if (ts_parse(tab + 1, strlen(tab + 1), kind, off, &t) == 0)
			printf("%lld\n", (long long)t);
		else
			printf("ERR\n");
	}
	return fflush(stdout) == 0 ? CW_EXIT_OK : CW_EXIT_DATA;
}
