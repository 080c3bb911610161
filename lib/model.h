/*
 * model.h: the degradation models cw-wear can use, in a table by name, so
 * a second model is one more table entry and no change to the tools.
 *
 * A model turns stress into damage f (dimensionless) and damage into fade
 * (fraction of capacity lost).  Each stress evaluation returns the damage
 * and its split by cause, which cw-wear's shares add up (SPEC.md,
 * cw-wear).  For a term A * s * tau (A the depth or time stress, s the SoC
 * stress, tau the temperature stress, both 1 at the reference SoC and
 * temperature):
 *   full   the model as it stands, A * s * tau
 *   ref    A, the term at the reference conditions
 *   soc    A * (s - 1) + A * (s - 1) * (tau - 1) / 2
 *   temp   A * (tau - 1) + A * (s - 1) * (tau - 1) / 2
 * so ref + soc + temp = full: the excess over reference split by the
 * Shapley rule (the interaction shared equally between the two causes).
 * soc and temp are negative where the pack is emptier or cooler than
 * reference.  A model whose stresses do not factor this way decides what
 * the split means for it and says so in its own header.
 */
#ifndef MODEL_H
#define MODEL_H

struct model_eval {
	double full;
	double ref;
	double soc;
	double temp;
};

struct model {
	const char *name;	/* --model NAME */
	const char *title;	/* one line: the source */
	/* Damage of one cycle of depth D (0..1) at mean SoC S (0..1) and
	 * mean temperature TEMP_C. */
	void	(*cycle)(double d, double s, double temp_c,
		    struct model_eval *out);
	/* Calendar damage per second at SoC S and TEMP_C. */
	void	(*calendar)(double s, double temp_c, struct model_eval *out);
	/* Fade (0..1) after damage F, and the damage at fade L. */
	double	(*fade)(double f);
	double	(*damage_at)(double l);
	/* The reference condition of the ratings: --cycle-life counts full
	 * cycles and --calendar-life days of rest at this SoC and
	 * temperature. */
	double	ref_soc;	/* 0..1 */
	double	ref_temp_c;
};

/* The table, ending with a NULL; the first entry is the default. */
extern const struct model *const model_table[];

/* The model named NAME, or NULL. */
const struct model *model_find(const char *name);

#endif
