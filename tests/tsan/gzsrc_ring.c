/*
 * gzsrc_ring: drive the threaded gzip reader of lib/gzsrc.c for
 * ThreadSanitizer (make tsan, run by tests/run).
 *
 *   gzsrc_ring GZ PLAIN      read GZ through in uneven pieces and compare
 *                            with PLAIN byte for byte; exit 0 when equal
 *   gzsrc_ring -s GZ K       read K bytes of GZ, then close (the reader
 *                            thread stopped in the middle)
 *   gzsrc_ring -e GZ         read GZ to its end; exit 0 when the read
 *                            ends in an error (a cut or bad file)
 * Prints what it found; the sanitizer reports races on stderr and makes
 * the exit status non-zero.
 */
#include <stdio.h>
#include <stdlib.h>
#include <string.h>

#include "gzsrc.h"

static int
whole(const char *gz, const char *plain)
{
	static char buf[3 * 1024 * 1024 + 17], want[sizeof(buf)];
	struct gzsrc s;
	FILE *fp = fopen(plain, "rb");
	size_t total = 0, k = 0, n, m;
	ssize_t got;

	if (fp == NULL || gzsrc_open(&s, gz) < 0)
		return 2;
	if (s.ring == NULL) {
		fprintf(stderr, "gzsrc_ring: %s: not read on a second thread\n",
		    gz);
		return 1;
	}
	for (;;) {
		/* Pieces from 1 byte to 3 MiB, across the ring's buffers. */
		n = (size_t)1 << (k++ % 22);
		if (n > sizeof(buf))
			n = sizeof(buf);
		if ((got = gzsrc_read(&s, buf, n)) <= 0)
			break;
		m = fread(want, 1, (size_t)got, fp);
		if (m != (size_t)got || memcmp(buf, want, m) != 0) {
			fprintf(stderr, "gzsrc_ring: bytes differ after %zu\n",
			    total);
			return 1;
		}
		total += (size_t)got;
	}
	gzsrc_close(&s);
	if (got < 0 || fgetc(fp) != EOF) {
		fprintf(stderr, "gzsrc_ring: %zu bytes, then %s\n", total,
		    got < 0 ? "an error" : "too few");
		return 1;
	}
	fclose(fp);
	printf("%zu bytes equal\n", total);
	return 0;
}

static int
part(const char *gz, size_t want)
{
	static char buf[65536];
	struct gzsrc s;
	size_t total = 0;
	ssize_t got;

	if (gzsrc_open(&s, gz) < 0)
		return 2;
	while (total < want && (got = gzsrc_read(&s, buf, sizeof(buf))) > 0)
		total += (size_t)got;
	gzsrc_close(&s);
	printf("closed after %zu bytes\n", total);
	return 0;
}

static int
bad(const char *gz)
{
	static char buf[65536];
	struct gzsrc s;
	ssize_t got;

	if (gzsrc_open(&s, gz) < 0)
		return 2;
	while ((got = gzsrc_read(&s, buf, sizeof(buf))) > 0)
		;
	gzsrc_close(&s);
	printf("ended with %s\n", got < 0 ? "an error" : "no error");
	return got < 0 ? 0 : 1;
}

int
main(int argc, char *argv[])
{
	if (argc == 3 && strcmp(argv[1], "-e") == 0)
		return bad(argv[2]);
	if (argc == 4 && strcmp(argv[1], "-s") == 0)
		return part(argv[2], (size_t)strtoul(argv[3], NULL, 10));
	if (argc == 3)
		return whole(argv[1], argv[2]);
	fprintf(stderr, "usage: gzsrc_ring GZ PLAIN | -s GZ K | -e GZ\n");
	return 2;
}
