/*
 * fuzz_dcirstate.c: the cw-dcir state reader (lib/dcirstate.c) on
 * arbitrary state files, read from memory.
 *
 * The first byte: bit 0 strict reading, bits 1-2 the points the trend
 * keeps (the run's --max-points).  The rest is the state file.  Oracles,
 * from dcirstate.h:
 * - the reader returns 0 or CW_EXIT_DATA and hands over exactly the
 *   device rows it counts;
 * - what it accepts writes back (dstate_write_*) to a file that reads
 *   again, strictly, to as many devices, and writes back to the same
 *   bytes: a state keeps every bit through a read and a write.
 */
#include "dcirstate.h"
#include "fuzz.h"

struct ctx {
	FILE *out;
	const struct dstate_conf *sc;
	unsigned long devs;
};

static int
on_dev(void *cp, const char *src, unsigned long line, const char *name,
    size_t namelen, struct dstate_dev *d)
{
	struct ctx *c = cp;

	FZ_CHECK(src != NULL && line > 0 && name != NULL);
	FZ_CHECK(d->ser.n <= c->sc->max_points);
	c->devs++;
	FZ_CHECK(dstate_write_dev(c->out, name, namelen, d, c->sc) == 0);
	dstate_free(d);
	return 0;
}

/* Read TEXT[0..N) named by fz_file(); write what it holds to *BUF. */
static int
pass(void *ap, int round, const void *text, size_t n, int strict,
    char **buf, size_t *len, unsigned long *devs)
{
	const struct dstate_conf *sc = ap;
	struct dstate_read r;
	struct ctx c;
	int rc;

	(void)round;
	memset(&r, 0, sizeof(r));
	memset(&c, 0, sizeof(c));
	FZ_CHECK((c.out = open_memstream(buf, len)) != NULL);
	FZ_CHECK(dstate_write_header(c.out, sc) == 0);
	c.sc = sc;
	r.sc = sc;
	r.dev = on_dev;
	r.ctx = &c;
	rc = dstate_read(&r, fz_file(text, n), strict);
	FZ_CHECK(rc == 0 || rc == CW_EXIT_DATA);
	FZ_CHECK(r.rows == c.devs);
	FZ_CHECK(dstate_write_end(c.out, c.devs) == 0);
	FZ_CHECK(fclose(c.out) == 0);
	*devs = c.devs;
	return rc;
}

int
LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
	static const size_t maxpts[] = { 2048, 16, 17, 32 };
	struct fz f = { data, size };
	struct dcir_conf dc;
	struct dstate_conf sc;
	unsigned b0;

	b0 = fz_byte(&f);
	dcir_conf_default(&dc);
	sc.c = &dc;
	sc.max_points = maxpts[(b0 >> 1) & 3];
	fz_round_trip(pass, &sc, f.p, f.n, b0 & 1);
	return 0;
}
