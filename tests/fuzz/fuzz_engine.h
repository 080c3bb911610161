/*
 * fuzz_engine.h: the driver the analysis-engine harnesses share.
 *
 * The first byte's low bit picks how samples arrive: 0, decoded from the
 * input's bytes for up to four devices (fz_sample()); 1, the rest of the
 * input is a CSV sample stream read by sampin_run(), as the tools read
 * it.  The other bits of that byte and the next three are the harness's
 * own configuration (struct fz_engine.cfg).  Per-device states (each
 * begins with struct devent) live in a devtab as in the tools when the
 * samples come from CSV; decoded, in four slots kept for the process (a
 * devtab's first block, 256 states zeroed per input, would cost more
 * than the engine's work).  At the end every device is finished in name
 * order.
 */
#ifndef FUZZ_ENGINE_H
#define FUZZ_ENGINE_H

#include "devtab.h"
#include "fuzz.h"
#include "sampin.h"

struct fz_engine {
	unsigned cfg[4];	/* configuration bytes */
	size_t statesz;		/* the harness's state, a devent first */
	/* A new device's state (zeroed but for its devent) is set up. */
	void	(*init)(void *ctx, void *dev);
	void	(*push)(void *ctx, void *dev, const struct cw_sample *s);
	void	(*finish)(void *ctx, void *dev);
	void	*ctx;
};

static int
fz_engine_row(void *ctx, void *dev, const struct cw_sample *s)
{
	struct fz_engine *e = ctx;
	struct devent *d = dev;

	if (d->nrows == 1)
		e->init(e->ctx, dev);
	e->push(e->ctx, dev, s);
	return 0;
}

/* Run the engine E over the input; returns what the harness returns. */
static int
fz_engine_run(struct fz_engine *e, const uint8_t *data, size_t size)
{
	static const char *const names[] = { "D0", "D1", "D2", "D3" };
	static unsigned char *slots;
	static size_t slotsz;
	struct fz f = { data, size };
	struct devtab *devs;
	unsigned b = fz_byte(&f);
	void **sorted;
	size_t i, n;
	int k;

	e->cfg[0] = b >> 1;
	for (k = 1; k < 4; k++)
		e->cfg[k] = fz_byte(&f);
	if (b & 1) {
		struct sampin_conf sc;
		char *files[1];
		int rc;

		devs = devtab_new(e->statesz);
		struct sampin_stats ss;

		memset(&sc, 0, sizeof(sc));
		sc.extra = "x";
		sc.need = SAMP_BIT(SAMP_DEVICE) | SAMP_BIT(SAMP_TIME);
		sc.row = fz_engine_row;
		sc.ctx = e;
		sc.devs = devs;
		files[0] = (char *)fz_file(f.p, f.n);
		rc = sampin_run(&sc, files, 1, &ss);
		FZ_CHECK(rc == 0 || rc == CW_EXIT_DATA);
		FZ_CHECK(ss.used + ss.skipped <= ss.rows);
		sorted = devtab_sorted(devs);
		n = devtab_count(devs);
		for (i = 0; i < n; i++)
			e->finish(e->ctx, sorted[i]);
		free(sorted);
		devtab_free(devs);
	} else {
		cw_time clock[4] = { 0, 0, 0, 0 };
		struct fz_sample z;
		struct cw_sample s;
		unsigned long line = 1;
		unsigned seen = 0;

		if (slotsz < e->statesz) {
			free(slots);
			slotsz = e->statesz;
			FZ_CHECK((slots = malloc(4 * slotsz)) != NULL);
		}
		while (fz_sample(&f, 4, &z)) {
			struct devent *d = (struct devent *)(slots + z.dev *
			    e->statesz);

			if (!(seen & 1u << z.dev)) {
				seen |= 1u << z.dev;
				memset(d, 0, e->statesz);
				d->name = names[z.dev];
				d->namelen = 2;
				e->init(e->ctx, d);
			}
			/* Times from 2026 on, never decreasing per device. */
			if (clock[z.dev] == 0)
				clock[z.dev] = INT64_C(1772323200) *
				    CW_US_PER_S;
			/* ts_parse() reads times up to INT64_MAX / 2. */
			if (z.dt > INT64_MAX / 2 - clock[z.dev])
				z.dt = 0;
			clock[z.dev] += z.dt;
			s.t = clock[z.dev];
			s.v = z.v;
			s.i = z.i;
			s.temp = z.temp;
			s.soc = z.soc;
			s.x = z.x;
			s.src = "fuzz";
			s.line = line++;
			d->last_t = s.t;
			d->nrows++;
			e->push(e->ctx, d, &s);
		}
		for (k = 0; k < 4; k++)
			if (seen & 1u << k)
				e->finish(e->ctx, slots + k * e->statesz);
	}
	return 0;
}

#endif
