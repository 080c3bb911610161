/*
 * model.h: the degradation models cw-wear can use, in a table by name, so
 * a second model is one more table entry and no change to the tools.
 *
 * A model turns stress into damage f (dimensionless) and damage into fade
 * (fraction of capacity lost).  Each stress evaluation returns the damage
 * four ways, because cw-wear's shares compare them (SPEC.md, cw-wear):
 *   full          the model as it stands
 *   soc_capped    with the SoC stress capped at its reference level
 *   temp_capped   with the temperature stress capped at its reference
 *   depth_only    the cycle damage of the depth alone (SoC and temperature
 *                 stresses set to the reference); 0 for calendar aging
 * A model whose stresses do not factor this way decides what "capped"
 * means for it and says so in its own header.
 */
#ifndef MODEL_H
#define MODEL_H

struct model_eval {
	double full;
	double soc_capped;
	double temp_capped;
	double depth_only;
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
