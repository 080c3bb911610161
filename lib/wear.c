/* wear.c: wear stress and modelled fade per device (see wear.h). */
#include <math.h>
#include <string.h>

#include "charge.h"
#include "wear.h"

/* What a rainflow cycle needs to reach its device; lives on the stack. */
struct cyc_ctx {
	struct wear_dev *d;
	const struct wear_conf *c;
};

static void on_cycle(void *, const struct rf_cycle *);
static double time_above(double, double, double, double);
static double maxd(double, double);

static double
maxd(double a, double b)
{
	return a > b ? a : b;
}

/*
 * Seconds of an interval of DT seconds during which a value going
 * linearly from A to B is at or above TH.
 */
static double
time_above(double a, double b, double th, double dt)
{
	if (a >= th && b >= th)
		return dt;
	if (a < th && b < th)
		return 0;
	if (a >= th)
		return dt * (a - th) / (a - b);
	return dt * (b - th) / (b - a);
}

void
wear_conf_default(struct wear_conf *c)
{
	memset(c, 0, sizeof(*c));
	c->model = model_table[0];
	c->cycle_scale = 1;
	c->cal_scale = 1;
	thermal_limits_default(&c->lim);
	c->min_current = TOPOFF_MIN_CURRENT;
	c->max_gap = CHARGE_MAX_GAP;
	c->hysteresis = 1;
	c->residue = RF_RESIDUE_HALF;
	topoff_conf_default(&c->topoff);
}

void
wear_set_cycle_life(struct wear_conf *c, double n)
{
	struct model_eval e;

	c->model->cycle(1.0, c->model->ref_soc, c->model->ref_temp_c, &e);
	c->cycle_scale = c->model->damage_at(WEAR_EOL_FADE) / (n * e.full);
}

void
wear_set_calendar_life(struct wear_conf *c, double days)
{
	struct model_eval e;

	c->model->calendar(c->model->ref_soc, c->model->ref_temp_c, &e);
	c->cal_scale = c->model->damage_at(WEAR_EOL_FADE) /
	    (days * 86400.0 * e.full);
}

void
wear_init(struct wear_dev *d, const struct wear_conf *c)
{
	memset(d, 0, sizeof(*d));
	rf_init(&d->rf, c->hysteresis);
	topoff_init(&d->top);
}

static void
on_cycle(void *ctx, const struct rf_cycle *cy)
{
	struct cyc_ctx *x = ctx;
	struct wear_acc *a = &x->d->acc;
	struct model_eval e;

	rf_sum_add(&a->rf, cy);
	if (!cw_isnum(cy->aux_mean)) {
		a->cycles_no_temp += cy->count;
		return;
	}
	x->c->model->cycle(cy->range / 100.0, cy->mean / 100.0, cy->aux_mean,
	    &e);
	a->cyc[WEAR_FULL] += cy->count * e.full;
	a->cyc[WEAR_SOC_CAPPED] += cy->count * e.soc_capped;
	a->cyc[WEAR_TEMP_CAPPED] += cy->count * e.temp_capped;
	a->cyc[WEAR_DEPTH_ONLY] += cy->count * e.depth_only;
}

void
wear_push(struct wear_dev *d, const struct wear_conf *c, cw_time t,
    double v, double i_a, double temp_c, double soc)
{
	struct wear_acc *a = &d->acc;
	struct cyc_ctx x;
	struct model_eval e;
	int ok_soc, ok_temp;
	double dt, ah;

	ok_soc = cw_isnum(soc) && soc >= 0 && soc <= 100;
	ok_temp = cw_isnum(temp_c) && temp_c > -273.15;
	if (!a->have) {
		a->have = 1;
		a->first = t;
	}
	a->last = t;
	a->rows++;

	/* Charge over the interval that ends at this row. */
	if (!cw_isnum(i_a))
		a->rows_no_current++;
	else if (i_a > c->min_current) {
		a->max_charge_a = maxd(a->max_charge_a, i_a);
		if (d->have_prev) {
			ah = charge_ah(i_a, d->prev_t, t, c->max_gap);
			if (ah > 0) {
				a->charge_ah += ah;
				a->charge_s += (double)(t - d->prev_t) /
				    CW_US_PER_S;
				thermal_ah_add(&a->zone_ah, &c->lim,
				    ok_temp ? temp_c : CW_MISSING, ah);
			}
		}
	}
	d->have_prev = 1;
	d->prev_t = t;

	/* Time at high SoC; a gap holds the state before it. */
	if (!ok_soc)
		a->rows_no_soc++;
	else {
		if (d->have_soc && t > d->soc_t) {
			dt = (double)(t - d->soc_t) / CW_US_PER_S;
			a->soc_s += dt;
			if (t - d->soc_t <= c->max_gap)
				a->soc_high_s += time_above(d->soc, soc,
				    WEAR_HIGH_SOC, dt);
			else if (d->soc >= WEAR_HIGH_SOC)
				a->soc_high_s += dt;
		}
		d->have_soc = 1;
		d->soc_t = t;
		d->soc = soc;
	}

	/* Time at high temperature, likewise. */
	if (!ok_temp)
		a->rows_no_temp++;
	else {
		if (d->have_temp && t > d->temp_t) {
			dt = (double)(t - d->temp_t) / CW_US_PER_S;
			a->temp_s += dt;
			if (t - d->temp_t <= c->max_gap)
				a->temp_high_s += time_above(d->temp, temp_c,
				    WEAR_HIGH_TEMP, dt);
			else if (d->temp >= WEAR_HIGH_TEMP)
				a->temp_high_s += dt;
		}
		d->have_temp = 1;
		d->temp_t = t;
		d->temp = temp_c;
	}

	/* Calendar aging, sample by sample (trapezoid rule). */
	if (ok_soc && ok_temp) {
		a->rows_model++;
		c->model->calendar(soc / 100.0, temp_c, &e);
		if (d->have_model && t > d->model_t) {
			dt = (double)(t - d->model_t) / CW_US_PER_S;
			a->model_s += dt;
			if (t - d->model_t <= c->max_gap) {
				a->cal[WEAR_FULL] += dt *
				    (d->rate.full + e.full) / 2;
				a->cal[WEAR_SOC_CAPPED] += dt *
				    (d->rate.soc_capped + e.soc_capped) / 2;
				a->cal[WEAR_TEMP_CAPPED] += dt *
				    (d->rate.temp_capped + e.temp_capped) / 2;
			} else {
				a->gaps++;
				a->gap_s += dt;
				a->cal[WEAR_FULL] += dt * d->rate.full;
				a->cal[WEAR_SOC_CAPPED] += dt *
				    d->rate.soc_capped;
				a->cal[WEAR_TEMP_CAPPED] += dt *
				    d->rate.temp_capped;
			}
		}
		d->have_model = 1;
		d->model_t = t;
		d->rate = e;
	}

	/* Cycles: rainflow over the SoC, the temperature carried along. */
	if (ok_soc) {
		x.d = d;
		x.c = c;
		rf_push(&d->rf, t, soc, ok_temp ? temp_c : CW_MISSING,
		    on_cycle, &x);
	}
	topoff_push(&d->top, &c->topoff, t, v, i_a,
	    ok_soc ? soc : CW_MISSING);
}

void
wear_finish(struct wear_dev *d, const struct wear_conf *c)
{
	struct cyc_ctx x;

	x.d = d;
	x.c = c;
	rf_finish(&d->rf, c->residue, on_cycle, &x);
	topoff_finish(&d->top, &c->topoff);
	d->acc.topoff_cycles = d->top.tot.cycles;
	d->acc.topoff_judged = d->top.tot.rows - d->top.tot.unjudged;
}

void
wear_free(struct wear_dev *d)
{
	rf_free(&d->rf);
}

void
wear_acc_merge(struct wear_acc *a, const struct wear_acc *b)
{
	int k;

	if (!b->have)
		return;
	if (!a->have) {
		*a = *b;
		return;
	}
	if (b->first < a->first)
		a->first = b->first;
	if (b->last > a->last)
		a->last = b->last;
	a->rows += b->rows;
	a->rows_no_current += b->rows_no_current;
	a->rows_no_soc += b->rows_no_soc;
	a->rows_no_temp += b->rows_no_temp;
	a->rows_model += b->rows_model;
	a->charge_ah += b->charge_ah;
	a->charge_s += b->charge_s;
	a->max_charge_a = maxd(a->max_charge_a, b->max_charge_a);
	for (k = 0; k < THERMAL_NZONE; k++)
		a->zone_ah.zone[k] += b->zone_ah.zone[k];
	a->zone_ah.no_temp += b->zone_ah.no_temp;
	a->soc_s += b->soc_s;
	a->soc_high_s += b->soc_high_s;
	a->temp_s += b->temp_s;
	a->temp_high_s += b->temp_high_s;
	a->model_s += b->model_s;
	a->gap_s += b->gap_s;
	a->gaps += b->gaps;
	a->rf.cycles += b->rf.cycles;
	a->rf.range_sum += b->rf.range_sum;
	a->rf.max_range = maxd(a->rf.max_range, b->rf.max_range);
	a->rf.full += b->rf.full;
	a->rf.half += b->rf.half;
	a->cycles_no_temp += b->cycles_no_temp;
	a->topoff_cycles += b->topoff_cycles;
	a->topoff_judged += b->topoff_judged;
	for (k = 0; k < WEAR_NFORM; k++) {
		a->cyc[k] += b->cyc[k];
		a->cal[k] += b->cal[k];
	}
}

void
wear_report(const struct wear_conf *c, const struct wear_acc *a,
    double capacity_ah, struct wear_result *r)
{
	const struct model *m = c->model;
	struct model_eval ref;
	double f = 0, f_soc, f_temp, f_depth, f_eol, rest, share;
	int known_soc, known_temp, known_model;

	r->days = r->charge_ah = r->efc = r->max_depth_pct = CW_MISSING;
	r->hours_soc_ge_95 = r->hours_temp_ge_45 = CW_MISSING;
	r->cold_charge_ah = r->hot_charge_ah = r->topoff_cycles = CW_MISSING;
	r->share_cycling = r->share_high_soc = r->share_heat = CW_MISSING;
	r->fade_pct = r->days_to_eol = r->damage = CW_MISSING;
	r->max_charge_c = r->mean_charge_c = r->fade_ah = CW_MISSING;
	r->dominant = "";
	if (!a->have)
		return;

	known_soc = a->rows_no_soc < a->rows;
	known_temp = a->rows_no_temp < a->rows;
	known_model = a->model_s > 0 || a->rf.cycles > a->cycles_no_temp;
	r->days = (double)(a->last - a->first) / CW_US_PER_S / 86400.0;
	if (a->rows_no_current < a->rows)
		r->charge_ah = a->charge_ah;
	if (known_soc) {
		r->efc = a->rf.range_sum / 100.0;
		r->max_depth_pct = a->rf.max_range;
		r->hours_soc_ge_95 = a->soc_high_s / 3600.0;
	}
	if (known_temp) {
		r->hours_temp_ge_45 = a->temp_high_s / 3600.0;
		if (cw_isnum(r->charge_ah)) {
			r->cold_charge_ah = a->zone_ah.zone[THERMAL_BELOW_MIN] +
			    a->zone_ah.zone[THERMAL_COOL];
			r->hot_charge_ah = a->zone_ah.zone[THERMAL_WARM] +
			    a->zone_ah.zone[THERMAL_ABOVE_MAX];
		}
	}
	if (a->topoff_judged > 0)
		r->topoff_cycles = (double)a->topoff_cycles;

	if (known_model) {
		f = c->cycle_scale * a->cyc[WEAR_FULL] +
		    c->cal_scale * a->cal[WEAR_FULL];
		f_soc = c->cycle_scale * a->cyc[WEAR_SOC_CAPPED] +
		    c->cal_scale * a->cal[WEAR_SOC_CAPPED];
		f_temp = c->cycle_scale * a->cyc[WEAR_TEMP_CAPPED] +
		    c->cal_scale * a->cal[WEAR_TEMP_CAPPED];
		f_depth = c->cycle_scale * a->cyc[WEAR_DEPTH_ONLY];
		r->damage = f;
		r->fade_pct = 100.0 * m->fade(f);
		if (f > 0) {
			r->share_cycling = f_depth / f;
			r->share_high_soc = (f - f_soc) / f;
			r->share_heat = (f - f_temp) / f;
		}
		/* The span's mean damage rate, held until WEAR_EOL_FADE. */
		f_eol = m->damage_at(WEAR_EOL_FADE);
		if (f >= f_eol)
			r->days_to_eol = 0;
		else if (f > 0 && a->model_s > 0)
			r->days_to_eol = (f_eol - f) / (f / a->model_s) /
			    86400.0;
		if (capacity_ah > 0)
			r->fade_ah = capacity_ah * m->fade(f);
	}
	if (capacity_ah > 0 && cw_isnum(r->charge_ah) && a->charge_s > 0) {
		r->max_charge_c = a->max_charge_a / capacity_ah;
		r->mean_charge_c = a->charge_ah / (a->charge_s / 3600.0) /
		    capacity_ah;
	}

	/* The model has no plating term, so cold charge comes first. */
	if (cw_isnum(r->cold_charge_ah) && a->charge_ah > 0 &&
	    r->cold_charge_ah >= WEAR_COLD_SHARE * a->charge_ah) {
		r->dominant = "cold-charge";
		return;
	}
	if (!known_model || !cw_isnum(r->share_cycling))
		return;
	/* No faster than rest at the reference SoC and temperature. */
	m->calendar(m->ref_soc, m->ref_temp_c, &ref);
	rest = c->cal_scale * ref.full * a->model_s;
	if (f <= rest * (1 + 1e-9)) {
		r->dominant = "none";
		return;
	}
	r->dominant = "cycling";
	share = r->share_cycling;
	if (r->share_high_soc > share) {
		r->dominant = "high-soc";
		share = r->share_high_soc;
	}
	if (r->share_heat > share)
		r->dominant = "heat";
}
