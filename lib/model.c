/* model.c: the table of degradation models (see model.h). */
#include <string.h>

#include "model.h"
#include "xu2018.h"

static void xu_cycle(double, double, double, struct model_eval *);
static void xu_calendar(double, double, struct model_eval *);
static void split(double, double, double, struct model_eval *);
static double xu_fade(double);
static double xu_damage_at(double);

static const struct model xu2018_model = {
	.name = "xu2018",
	.title = "Xu et al., IEEE Trans. Smart Grid 9(2), 2018 (LMO cells)",
	.cycle = xu_cycle,
	.calendar = xu_calendar,
	.fade = xu_fade,
	.damage_at = xu_damage_at,
	.ref_soc = 0.5,
	.ref_temp_c = 25.0,
};

const struct model *const model_table[] = {
	&xu2018_model,
	NULL
};

const struct model *
model_find(const char *name)
{
	const struct model *const *m;

	for (m = model_table; *m != NULL; m++)
		if (strcmp((*m)->name, name) == 0)
			return *m;
	return NULL;
}

/*
 * The Xu model's stresses multiply, so each term is A * s * tau with s and
 * tau 1 at the reference SoC (50 %) and temperature (25 C): the Shapley
 * split of model.h.
 */
static void
split(double a, double ss, double st, struct model_eval *out)
{
	double both = a * (ss - 1) * (st - 1) / 2;

	out->full = a * ss * st;
	out->ref = a;
	out->soc = a * (ss - 1) + both;
	out->temp = a * (st - 1) + both;
}

static void
xu_cycle(double d, double s, double temp_c, struct model_eval *out)
{
	const struct xu2018_params *p = &xu2018_published;

	split(xu2018_s_dod(p, d), xu2018_s_soc(p, s), xu2018_s_temp(p,
	    temp_c), out);
}

static void
xu_calendar(double s, double temp_c, struct model_eval *out)
{
	const struct xu2018_params *p = &xu2018_published;

	split(p->kt, xu2018_s_soc(p, s), xu2018_s_temp(p, temp_c), out);
}

static double
xu_fade(double f)
{
	return xu2018_fade(&xu2018_published, f);
}

static double
xu_damage_at(double l)
{
	return xu2018_damage_at(&xu2018_published, l);
}
