/*
 * fuzz_clean.c: the cw-clean pipeline (clean_run() of lib/clean.c) on
 * arbitrary raw logs.
 *
 * Two configuration bytes pick the delimiter, decimal mark, sign, device
 * source, reorder window, resampling step, gap limit, coulomb counting,
 * time zone and column spec; the rest is the raw log, written to a
 * temporary file.  Oracles, from cw-clean(1):
 * - data lines in = rows accepted + rows rejected, and each reason's
 *   count adds up to the rejected rows;
 * - the rejects file holds exactly one record per rejected row;
 * - the output is a valid sample stream: read back through sampin_run()
 *   (the analysis tools' reader), every row is used, none is skipped for
 *   a bad time or for time going back within a device, no value is
 *   unparsable, and there are as many rows as clean_run() says it wrote;
 * - without --step, no more rows are written than accepted.
 */
#include "clean.h"
#include "csvin.h"
#include "csvout.h"
#include "devtab.h"
#include "fuzz.h"
#include "sampin.h"

struct count {
	unsigned long rows, header;
};

static int
count_header(void *ctx, const struct csvin_rec *r)
{
	struct count *c = ctx;

	(void)r;
	c->header++;
	return 0;
}

static int
count_row(void *ctx, const struct csvin_rec *r)
{
	struct count *c = ctx;

	FZ_CHECK(r->nf == 4);
	c->rows++;
	return 0;
}

static int
count_bad(void *ctx, const struct csvin_rec *r, const char *why)
{
	(void)ctx;
	fprintf(stderr, "rejects line %lu unreadable: %s\n", r->line, why);
	abort();
}

static int
on_sample(void *ctx, void *dev, const struct cw_sample *s)
{
	(void)ctx;
	(void)dev;
	FZ_CHECK(cw_isnum(s->v) && cw_isnum(s->i));
	return 0;
}

/* The text of a memory stream, written to the harness's file. */
static const char *
spill(FILE *fp, char **buf, size_t *len)
{
	FZ_CHECK(fflush(fp) == 0);
	return fz_file(*buf, *len);
}

int
LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
	static const char delims[] = { ',', ';', '\t', ',' };
	static const cw_time reorders[] = { 0, 1, 60, 3600 };
	static const cw_time steps[] = { 0, 0, 1, 60 };
	static const struct csvin_ops cops = { count_header, count_row,
	    count_bad, NULL };
	struct fz f = { data, size };
	struct clean_conf c;
	struct clean_stats st;
	struct csvout out, rej;
	struct sampin_conf sc;
	struct sampin_stats ss;
	struct devtab *devs;
	struct csvin *in;
	struct count cnt;
	FILE *ofp, *rfp;
	char *obuf = NULL, *rbuf = NULL, *path;
	size_t olen = 0, rlen = 0;
	unsigned b0, b1;
	unsigned long sum;
	int rc, k;
	char *files[1];

	b0 = fz_byte(&f);
	b1 = fz_byte(&f);
	clean_conf_default(&c);
	c.delim = delims[b0 & 3];
	if (b0 & 4)
		c.dec = c.delim == ',' ? '.' : ',';
	c.charge_sign = (b0 >> 3) & 1 ? CLEAN_SIGN_NEGATIVE : CLEAN_SIGN_AUTO;
	switch ((b0 >> 4) & 3) {
	case 1:
		c.device = "FZ-1";
		break;
	case 2:
		c.device_from_file = 1;
		break;
	}
	c.reorder = reorders[b0 >> 6] * CW_US_PER_S;
	c.step = steps[b1 & 3] * CW_US_PER_S;
	c.max_gap = (b1 & 4 ? 60 : 900) * CW_US_PER_S;
	if (b1 & 8) {
		c.soc_ah = 14;
		c.full_v = 4.15;
	}
	if (b1 & 16)
		c.tz_s = -5 * 3600 - 1800;
	if (b1 & 32) {
		const char *err;

		FZ_CHECK(colmap_parse_spec("device=id,time=t:ms,voltage=mv:mV,"
		    "current=ma:mA,temp=dk:dK,soc=f:frac", &c.spec, &err) == 0);
	}
	if (b1 & 64) {
		c.lo[CM_VOLTAGE] = -1e300;
		c.hi[CM_VOLTAGE] = 1e300;
	}

	path = (char *)fz_file(f.p, f.n);
	files[0] = path;
	FZ_CHECK((ofp = open_memstream(&obuf, &olen)) != NULL);
	FZ_CHECK((rfp = open_memstream(&rbuf, &rlen)) != NULL);
	csvout_init(&out, ofp);
	csvout_init(&rej, rfp);
	rc = clean_run(&c, files, 1, &out, &rej, &st);
	FZ_CHECK(rc == 0 || rc == CW_EXIT_DATA);
	FZ_CHECK(csvout_flush(&out) == 0 && csvout_flush(&rej) == 0);
	csvout_free(&out);
	csvout_free(&rej);
	if (rc == 0) {
		FZ_CHECK(st.lines == st.accepted + st.rejected);
		for (sum = 0, k = 0; k < CR_NREASON; k++)
			sum += st.reason[k];
		FZ_CHECK(sum == st.rejected);
		if (c.step == 0)
			FZ_CHECK(st.written <= st.accepted);
	}

	/* The rejects: a header and one record per rejected row. */
	memset(&cnt, 0, sizeof(cnt));
	in = csvin_new(',', &cops, &cnt);
	FZ_CHECK(csvin_file(in, spill(rfp, &rbuf, &rlen)) == 0);
	csvin_free(in);
	FZ_CHECK(cnt.header == 1);
	if (rc == 0)
		FZ_CHECK(cnt.rows == st.rejected);

	/* The output, read back as the analysis tools read it. */
	memset(&sc, 0, sizeof(sc));
	sc.need = SAMP_BIT(SAMP_DEVICE) | SAMP_BIT(SAMP_TIME) |
	    SAMP_BIT(SAMP_VOLTAGE) | SAMP_BIT(SAMP_CURRENT) |
	    SAMP_BIT(SAMP_TEMP) | SAMP_BIT(SAMP_SOC);
	sc.row = on_sample;
	devs = devtab_new(sizeof(struct devent));
	sc.devs = devs;
	files[0] = (char *)spill(ofp, &obuf, &olen);
	FZ_CHECK(sampin_run(&sc, files, 1, &ss) == 0);
	if (ss.skipped != 0 || ss.rows != st.written) {
		fprintf(stderr, "cleaned output: %lu rows read, %lu skipped, "
		    "%lu written\n", ss.rows, ss.skipped, st.written);
		abort();
	}
	for (k = SAMP_VOLTAGE; k < SAMP_EXTRA; k++)
		FZ_CHECK(ss.invalid[k] == 0);
	devtab_free(devs);
	fclose(ofp);
	fclose(rfp);
	free(obuf);
	free(rbuf);
	return 0;
}
