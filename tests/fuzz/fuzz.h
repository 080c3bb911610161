/*
 * fuzz.h: what the libFuzzer harnesses of tests/fuzz/ share.
 *
 * Each harness is one fuzz_<name>.c with LLVMFuzzerTestOneInput().  The
 * input is split into a few leading configuration bytes (struct fz) and a
 * body.  Bodies that the library reads from a file are read from memory
 * through a path bound to them (fz_file()): no file is written or read.
 * An analysis engine gets its samples either through sampin_run() over
 * that file (the body is CSV: the path the tools take) or decoded from
 * the body's bytes (fz_sample()), which reaches values and time steps a
 * CSV body would seldom spell.
 *
 * FZ_CHECK() turns a broken invariant into abort(), which libFuzzer
 * reports as a crash with the input saved.
 */
#ifndef FUZZ_H
#define FUZZ_H

#include <fcntl.h>
#include <math.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>

#include "cw.h"
#include "gzsrc.h"

#define FZ_CHECK(cond) do {						\
	if (!(cond)) {							\
		fprintf(stderr, "%s:%d: invariant broken: %s\n",	\
		    __FILE__, __LINE__, #cond);				\
		abort();						\
	}								\
} while (0)

int	LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

/* A cursor over the input: configuration bytes first, then the body. */
struct fz {
	const uint8_t *p;
	size_t n;
};

/* The next byte, 0 once the input is used up. */
static inline unsigned
fz_byte(struct fz *f)
{
	unsigned b;

	if (f->n == 0)
		return 0;
	b = *f->p++;
	f->n--;
	return b;
}

static inline unsigned
fz_u16(struct fz *f)
{
	unsigned lo = fz_byte(f);

	return lo | fz_byte(f) << 8;
}

static char fz_path[64];
static int fz_fd = -1;

static inline void
fz_unlink(void)
{
	if (fz_fd >= 0)
		unlink(fz_path);
}

/*
 * Give BODY[0..N) a path; return it.  Nothing is written: the path, an
 * empty file made once per process (so that stat() sees a regular file),
 * is bound to the bytes in memory (gzsrc_bind_mem()), and every reader
 * that opens it reads them.  BODY must stay until the next call.
 */
static inline const char *
fz_file(const void *body, size_t n)
{
	if (fz_fd < 0) {
		const char *dir = getenv("TMPDIR");

		snprintf(fz_path, sizeof(fz_path), "%s/cwfuzz.XXXXXX",
		    dir != NULL && strlen(dir) < 40 ? dir : "/tmp");
		fz_fd = mkstemp(fz_path);
		if (fz_fd < 0) {
			perror("fuzz: mkstemp");
			abort();
		}
		atexit(fz_unlink);
	}
	gzsrc_bind_mem(fz_path, body, n);
	return fz_path;
}

/*
 * An interesting double from one byte, for decoded samples: NaN
 * (missing), zero, small and huge magnitudes, values around the tools'
 * thresholds, or a plain scaled value.  Never infinite: the sample
 * stream's numbers are finite or missing (num.h rejects overflow).
 */
static inline double
fz_value(struct fz *f, double scale)
{
	static const double special[] = {
		0, -0.0, 1e-300, -1e-300, 1e300, -1e300, 1.7976931348623157e308,
		-1.7976931348623157e308, 0.05, -0.05, 0.5, 95, 99.5, 100, 10, 45,
		60, -20, 4.2, 3.0
	};
	unsigned b = fz_byte(f);

	if (b == 0)
		return CW_MISSING;
	if (b < 1 + sizeof(special) / sizeof(special[0]))
		return special[b - 1];
	return ((double)(int)fz_u16(f) - 32768.0) * scale;
}

/* One decoded sample: a device number below NDEV and its fields. */
struct fz_sample {
	unsigned dev;
	cw_time dt;	/* time since the device's previous sample, >= 0 */
	double v, i, temp, soc, x;
};

/* Decode a sample; 0 when the input is used up. */
static inline int
fz_sample(struct fz *f, unsigned ndev, struct fz_sample *s)
{
	unsigned b;

	if (f->n < 4)
		return 0;
	b = fz_byte(f);
	s->dev = (b & 0x0f) % ndev;
	/* Mostly seconds, now and then huge jumps or equal times. */
	switch (b >> 6) {
	case 0:
		s->dt = 0;
		break;
	case 1:
		s->dt = (cw_time)fz_byte(f) * CW_US_PER_S;
		break;
	case 2:
		s->dt = (cw_time)fz_u16(f) * CW_US_PER_S;
		break;
	default:
		s->dt = (cw_time)fz_u16(f) * (cw_time)fz_u16(f) *
		    CW_US_PER_S + (cw_time)fz_byte(f);
		break;
	}
	s->v = fz_value(f, 1e-3);
	s->i = fz_value(f, 1e-2);
	s->temp = fz_value(f, 1e-2);
	s->soc = fz_value(f, 1e-2);
	s->x = s->soc;
	return 1;
}

/*
 * A state reader's round trip.  PASS reads TEXT[0..N) (STRICT or not),
 * writes back what it accepted to a malloc'ed *BUF of *LEN bytes and
 * counts its devices; ROUND is 0 for the input, then 1 and 2.  When the
 * input is accepted, what it wrote must read again strictly to as many
 * devices and write back to the same bytes.
 */
typedef int fz_pass_fn(void *arg, int round, const void *text, size_t n,
    int strict, char **buf, size_t *len, unsigned long *devs);

static inline void
fz_round_trip(fz_pass_fn *pass, void *arg, const void *text, size_t n,
    int strict)
{
	char *a = NULL, *b = NULL, *c = NULL;
	size_t alen = 0, blen = 0, clen = 0;
	unsigned long na, nb, nc;

	if (pass(arg, 0, text, n, strict, &a, &alen, &na) == 0) {
		FZ_CHECK(pass(arg, 1, a, alen, 1, &b, &blen, &nb) == 0);
		FZ_CHECK(nb == na);
		FZ_CHECK(pass(arg, 2, b, blen, 1, &c, &clen, &nc) == 0);
		if (clen != blen || memcmp(b, c, blen) != 0) {
			fprintf(stderr, "state changed by a read and a write:"
			    "\n%.*s\n--- became\n%.*s\n", (int)blen, b,
			    (int)clen, c);
			abort();
		}
	}
	free(a);
	free(b);
	free(c);
}

/* True when X is a number no larger than what the tools are built for. */
static inline int
fz_tame(double x)
{
	return x == x && fabs(x) < 1e6;
}

#endif
