/*
 * glue.c: what the tools' main() functions share (glue.h).
 */
#include <stdlib.h>
#include <string.h>

#include "csvout.h"
#include "cw.h"
#include "devtab.h"
#include "finish.h"
#include "glue.h"
#include "outf.h"
#include "sampin.h"

void
glue_open(struct glue *g, size_t devsize, const char *path, struct csvout *w,
    const char *header)
{
	memset(g, 0, sizeof(*g));
	g->devs = devsize > 0 ? devtab_new(devsize) : NULL;
	g->path = path;
	g->of = outf_open(path);
	g->w = w;
	csvout_init(w, outf_fp(g->of));
	if (header != NULL)
		csvout_header(w, header);
}

void
glue_reader(struct glue *g, struct devtab *devs)
{
	memset(g, 0, sizeof(*g));
	g->devs = devs;
}

void
glue_sampin(struct glue *g, unsigned need, unsigned need_any,
    int (*row)(void *, void *, const struct cw_sample *), void *ctx)
{
	struct sampin_conf *sc = &g->sc;

	memset(sc, 0, sizeof(*sc));
	sc->need = SAMP_BIT(SAMP_DEVICE) | SAMP_BIT(SAMP_TIME) | need;
	sc->need_any = need_any;
	sc->row = row;
	sc->ctx = ctx;
	sc->devs = g->devs;
}

int
glue_read(struct glue *g, char **files, int n)
{
	return sampin_run(&g->sc, files, n, &g->st);
}

int
glue_run(struct glue *g, char **files, int n, void (*end)(void *, void *),
    void *ctx)
{
	int rc = glue_read(g, files, n);

	if (rc == 0 && end != NULL)
		glue_each(g, end, ctx);
	return rc;
}

int
glue_states(char **files, int n, int stdin_whole,
    int (*read)(void *, const char *, int), void *ctx)
{
	int k, rc;

	if (n == 0)
		return read(ctx, "-", stdin_whole);
	for (k = 0; k < n; k++)
		if ((rc = read(ctx, files[k], strcmp(files[k], "-") != 0 ||
		    stdin_whole)) != 0)
			return rc;
	return 0;
}

void
glue_each(const struct glue *g, void (*fn)(void *, void *), void *ctx)
{
	void **v;
	size_t i, n;

	v = glue_sorted(g, &n);
	for (i = 0; i < n; i++)
		fn(ctx, v[i]);
	free(v);
}

void **
glue_sorted(const struct glue *g, size_t *n)
{
	*n = devtab_count(g->devs);
	return devtab_sorted(g->devs);
}

int
glue_close(struct glue *g, int rc)
{
	rc = cw_finish(g->w, g->of, g->path, rc);
	csvout_free(g->w);
	if (g->devs != NULL)
		devtab_free(g->devs);
	g->devs = NULL;
	return rc;
}

int
glue_finish(struct glue *g, int rc, void (*report)(const struct devtab *,
    const struct sampin_stats *))
{
	if (cw_verbose)
		report(g->devs, &g->st);
	return glue_close(g, rc);
}

void
glue_event(struct csvout *w, const struct devent *e, const char *kind,
    const char *where, cw_time start, cw_time end, double lo, double hi,
    double ah, double soc0, double soc1)
{
	csvout_strn(w, e->name, e->namelen);
	csvout_str(w, kind);
	csvout_str(w, where);
	glue_span(w, start, end);
	csvout_num(w, lo);
	csvout_num(w, hi);
	csvout_num(w, ah);
	csvout_num(w, soc0);
	csvout_num(w, soc1);
}

void
glue_span(struct csvout *w, cw_time start, cw_time end)
{
	csvout_time(w, start);
	csvout_time(w, end);
	csvout_num(w, (double)(end - start) / CW_US_PER_S);
}

void
glue_first_last(struct csvout *w, int have, cw_time first, cw_time last)
{
	if (have) {
		csvout_time(w, first);
		csvout_time(w, last);
	} else {
		csvout_empty(w);
		csvout_empty(w);
	}
}

void
glue_num(struct csvout *w, int have, double x)
{
	if (have)
		csvout_num(w, x);
	else
		csvout_empty(w);
}

void
glue_date(struct csvout *w, int have, cw_time t)
{
	if (have)
		csvout_date(w, t);
	else
		csvout_empty(w);
}
