/*
 * fuzz_wearstate.c: the cw-wear state reader (lib/wearstate.c) on
 * arbitrary state files, read from memory.
 *
 * The first byte: bit 0 strict reading (one file with its end rows), the
 * next byte the settings given on the command line (WSTATE_SET_*).  The
 * rest is the state file.  Oracles, from wearstate.h:
 * - the reader returns 0 or CW_EXIT_DATA, and hands over exactly the
 *   device rows it counts;
 * - what it accepts writes back (wstate_write_*) to a file that reads
 *   again, strictly, with the same settings adopted, to as many devices,
 *   and writes back to the same bytes: a state keeps every bit through
 *   a read and a write.
 */
#include "fuzz.h"
#include "wearstate.h"

struct ctx {
	FILE *out;
	const struct wear_conf *conf;
	unsigned long devs;
};

static int
on_dev(void *cp, const char *src, unsigned long line, const char *name,
    size_t namelen, struct wear_dev *d)
{
	struct ctx *c = cp;

	FZ_CHECK(src != NULL && line > 0 && name != NULL);
	c->devs++;
	if (c->out != NULL)
		FZ_CHECK(wstate_write_dev(c->out, name, namelen, d,
		    c->conf) == 0);
	wear_free(d);
	return 0;
}

/* The settings of the passes: the input's, then those it adopted. */
struct arg {
	struct wear_conf conf, adopted;
	unsigned fixed;
};

/* Read TEXT[0..N) named by fz_file(); write what it holds to *BUF. */
static int
pass(void *ap, int round, const void *text, size_t n, int strict,
    char **buf, size_t *len, unsigned long *devs)
{
	struct arg *a = ap;
	struct wear_conf *conf = round == 0 ? &a->conf : &a->adopted;
	struct wstate_read r;
	struct ctx c;
	int rc;

	if (round == 1)
		a->adopted = a->conf;
	memset(&r, 0, sizeof(r));
	memset(&c, 0, sizeof(c));
	FZ_CHECK((c.out = open_memstream(buf, len)) != NULL);
	FZ_CHECK(wstate_write_header(c.out) == 0);
	c.conf = conf;
	r.conf = conf;
	r.fixed = a->fixed;
	r.dev = on_dev;
	r.ctx = &c;
	rc = wstate_read(&r, fz_file(text, n), strict);
	FZ_CHECK(rc == 0 || rc == CW_EXIT_DATA);
	FZ_CHECK(r.rows == c.devs);
	FZ_CHECK(wstate_write_end(c.out, c.devs) == 0);
	FZ_CHECK(fclose(c.out) == 0);
	*devs = c.devs;
	return rc;
}

int
LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
	struct fz f = { data, size };
	struct arg a;
	unsigned b0;

	b0 = fz_byte(&f);
	a.fixed = fz_byte(&f);
	wear_conf_default(&a.conf);
	fz_round_trip(pass, &a, f.p, f.n, b0 & 1);
	return 0;
}
