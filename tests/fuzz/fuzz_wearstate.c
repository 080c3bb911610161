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

/* Read TEXT[0..N) named by fz_file(); write what it holds to *BUF. */
static int
pass(const void *text, size_t n, struct wear_conf *conf, unsigned fixed,
    int strict, char **buf, size_t *len, unsigned long *devs)
{
	struct wstate_read r;
	struct ctx c;
	int rc;

	memset(&r, 0, sizeof(r));
	memset(&c, 0, sizeof(c));
	FZ_CHECK((c.out = open_memstream(buf, len)) != NULL);
	FZ_CHECK(wstate_write_header(c.out) == 0);
	c.conf = conf;
	r.conf = conf;
	r.fixed = fixed;
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
	struct wear_conf conf, conf2;
	char *a = NULL, *b = NULL, *c = NULL;
	size_t alen = 0, blen = 0, clen = 0;
	unsigned long na, nb, nc;
	unsigned b0, fixed;
	int strict;

	b0 = fz_byte(&f);
	fixed = fz_byte(&f);
	strict = b0 & 1;
	wear_conf_default(&conf);
	if (pass(f.p, f.n, &conf, fixed, strict, &a, &alen, &na) == 0) {
		/* Read back with the settings the first pass adopted. */
		conf2 = conf;
		FZ_CHECK(pass(a, alen, &conf2, fixed, 1, &b, &blen, &nb) == 0);
		FZ_CHECK(nb == na);
		FZ_CHECK(pass(b, blen, &conf2, fixed, 1, &c, &clen, &nc) == 0);
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
	return 0;
}
