/*
 * fuzz_csvin.c: the CSV reader (lib/csvin.c) and header resolution
 * (lib/colmap.c) on arbitrary files, plain or gzip, read from memory
 * (csvin_mem()).
 *
 * The first byte picks the delimiter and which fields are required; the
 * rest is the file.  Oracles: every field is NUL-terminated at its length
 * and lies inside the reader's arena; line numbers never decrease; the
 * statistics add up (every record is a header, a repeated header, a row,
 * a bad record or a blank line); a record without a quote splits into
 * exactly the fields libcsv itself gives for it (csvin.c cuts those
 * records without libcsv and promises the same result); a resolved
 * column map names distinct columns inside the header, and every
 * required field.
 */
#include <csv.h>

#include "colmap.h"
#include "csvin.h"
#include "fuzz.h"

struct ctx {
	char delim;
	unsigned required;
	unsigned long last_line;
	unsigned long calls;
	/* libcsv's fields of the record being compared. */
	const struct csvin_rec *cmp;
	size_t k;
	int differ;
};

static int noterm(unsigned char c)
{
	(void)c;
	return 0;
}

static void
ref_field(void *s, size_t n, void *data)
{
	struct ctx *c = data;
	const struct csvin_rec *r = c->cmp;

	if (c->k >= r->nf || r->len[c->k] != n ||
	    (n > 0 && memcmp(r->f[c->k], s, n) != 0))
		c->differ = 1;
	c->k++;
}

static void
ref_row(int ch, void *data)
{
	(void)ch;
	(void)data;
}

static int
blanks(const struct csvin_rec *r)
{
	size_t i;

	for (i = 0; i < r->rawlen; i++)
		if (r->raw[i] != ' ' && r->raw[i] != '\t')
			return 0;
	return 1;
}

/* Compare a quote-free record with libcsv's reading of its raw text. */
static void
compare(struct ctx *c, const struct csvin_rec *r)
{
	struct csv_parser p;

	if (memchr(r->raw, '"', r->rawlen) != NULL)
		return;
	FZ_CHECK(csv_init(&p, CSV_STRICT) == 0);
	csv_set_delim(&p, (unsigned char)c->delim);
	csv_set_term_func(&p, noterm);
	c->cmp = r;
	c->k = 0;
	c->differ = 0;
	FZ_CHECK(csv_parse(&p, r->raw, r->rawlen, ref_field, ref_row, c) ==
	    r->rawlen);
	FZ_CHECK(csv_fini(&p, ref_field, ref_row, c) == 0);
	csv_free(&p);
	/* A record of blanks only: libcsv gives no row at all, csvin one
	 * empty field, as RFC 4180 reads it.  Both say "nothing here". */
	if (c->k == 0 && r->nf == 1 && r->len[0] == 0 && blanks(r))
		return;
	if (c->differ || c->k != r->nf) {
		fprintf(stderr, "line %lu: csvin gave %zu fields, libcsv %zu\n",
		    r->line, r->nf, c->k);
		abort();
	}
}

static void
check_rec(struct ctx *c, const struct csvin_rec *r)
{
	size_t i;

	FZ_CHECK(r->line >= c->last_line && r->line > 0);
	c->last_line = r->line;
	FZ_CHECK(r->src != NULL);
	FZ_CHECK(r->rawlen == 0 || r->raw != NULL);
	for (i = 0; i < r->nf; i++) {
		FZ_CHECK(r->f[i][r->len[i]] == '\0');
		FZ_CHECK(r->len[i] <= r->rawlen);
	}
	c->calls++;
}

static int
on_header(void *ctx, const struct csvin_rec *r)
{
	struct ctx *c = ctx;
	struct colmap_spec spec;
	struct colmap m;
	int f, g;

	check_rec(c, r);
	FZ_CHECK(r->nf >= 1);
	compare(c, r);
	memset(&spec, 0, sizeof(spec));
	if (colmap_resolve(&spec, r, c->required, &m) < 0)
		return 0;
	for (f = 0; f < CM_NFIELD; f++) {
		FZ_CHECK(m.col[f] >= -1 && m.col[f] < (int)r->nf);
		if (c->required & (1u << f))
			FZ_CHECK(m.col[f] >= 0);
		if (f >= CM_TIME && f <= CM_SOC)
			FZ_CHECK(m.unit[f] != CMU_NONE);
		FZ_CHECK(colmap_unit_name(m.unit[f]) != NULL);
		for (g = f + 1; g < CM_NFIELD; g++)
			FZ_CHECK(m.col[f] < 0 || m.col[f] != m.col[g]);
	}
	return 0;
}

static int
on_row(void *ctx, const struct csvin_rec *r)
{
	struct ctx *c = ctx;

	check_rec(c, r);
	FZ_CHECK(r->nf >= 1);
	compare(c, r);
	return 0;
}

static int
on_bad(void *ctx, const struct csvin_rec *r, const char *why)
{
	struct ctx *c = ctx;

	FZ_CHECK(why != NULL && why[0] != '\0');
	FZ_CHECK(r->nf == 0);
	FZ_CHECK(r->line >= c->last_line);
	c->last_line = r->line;
	c->calls++;
	return 0;
}

static int
on_blank(void *ctx, const struct csvin_rec *r)
{
	struct ctx *c = ctx;

	FZ_CHECK(r->rawlen == 0);
	c->calls++;
	return 0;
}

int
LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
	static const char delims[] = { ',', ';', '\t', '|' };
	static const struct csvin_ops ops = { on_header, on_row, on_bad,
	    on_blank };
	struct fz f = { data, size };
	const struct csvin_stats *st;
	struct csvin *r;
	struct ctx c;
	unsigned b;
	int rc;

	b = fz_byte(&f);
	memset(&c, 0, sizeof(c));
	c.delim = delims[b & 3];
	c.required = (b >> 2) & 0x3f;
	r = csvin_new(c.delim, &ops, &c);
	rc = csvin_mem(r, "fuzz.csv", f.p, f.n);
	FZ_CHECK(rc == 0 || rc == CW_EXIT_DATA);
	st = csvin_stats(r);
	FZ_CHECK(st->records == st->headers + st->header_repeats + st->rows +
	    st->bad + st->blank);
	FZ_CHECK(st->headers <= 1);
	FZ_CHECK(c.calls == st->headers + st->rows + st->bad + st->blank);
	csvin_free(r);
	return 0;
}
