/*
 * synth.c: the invented fleet's physics, daily plans and truth (synth.h).
 *
 * Every constant below is invented for the scenario unless a comment says
 * otherwise; cw-synth(1) lists them with their sources.
 */
#include <math.h>
#include <stdlib.h>
#include <string.h>

#include "synth.h"
#include "ts.h"

#define PI 3.14159265358979323846

/* Sub-step of the integration: at most this many seconds. */
#define SUBSTEP_MAX 10.0

/* Thermal exchange (W/K) and outside heat (W at full sun) by location. */
#define UA_DEPOT 2.0
#define UA_DOCK 1.6
#define UA_PARK 1.6
#define UA_RIDE 4.5
#define SUN_DOCK_W 35.0
#define SUN_PARK_W 10.0
#define SUN_RIDE_W 8.0

/* The truth's event rules: cw-thermal(1)'s defaults. */
#define EV_MIN_A 0.05
#define EV_MIN_DUR (60 * CW_US_PER_S)
#define EV_MERGE (120 * CW_US_PER_S)
/* The protocol's: cw-thermal(1)'s defaults, margins included. */
#define EV_COOL_A (0.5 * SYNTH_CAP_AH * 1.05)
#define EV_WARM_V (4.10 + 0.02)
/* cw-volt's minimum duration. */
#define VEV_MIN_DUR (30 * CW_US_PER_S)

const char *const synth_profile_name[SYNTH_NPROFILE] = {
	"deep-depot", "topup-dock", "idle-dock", "topup-nocutoff"
};

const char *const synth_zone_name[5] = {
	"below-min", "cool", "normal", "warm", "above-max"
};

/* How the depot and the docks charge (see synth_charger_current()). */
static const struct synth_charger ch_depot = {
	"depot", 14.0, SYNTH_VMAX, 0.7, 0.0, 1, 10.0, 0.0
};
static const struct synth_charger ch_dock = {
	"dock", 2.8, SYNTH_VMAX, 0.7, 41.4, 1, 10.0, 30.0
};
static const struct synth_charger ch_nocutoff = {
	"dock-nocutoff", 5.0, SYNTH_VMAX, 0.7, 41.4, 0, -273.15, 0.0
};
/* The chargers of the incidents (synth.h, enum synth_incident). */
static const struct synth_charger ch_coldfast = {
	"dock-fast-nojeita", 10.0, SYNTH_VMAX, 0.7, 41.4, 0, -273.15, 0.0
};
static const struct synth_charger ch_cabinet = {
	"dock-cabinet-nojeita", 2.8, SYNTH_VMAX, 0.7, 41.4, 0, -273.15, 0.0
};
static const struct synth_charger ch_depot430 = {
	"depot-4v30", 14.0, SYNTH_CELLS * 4.30, 0.7, 0.0, 1, 10.0, 0.0
};
#define CABINET_C 50.0		/* the failed cabinet's air, C */
#define FLAT_SOC (-0.06)	/* the stored pack's SoC at the start */
#define FLAT_DRAIN 0.02		/* its standby drain, A */

const char *const synth_incident_name[SYNTH_NINCIDENT] = {
	"", "cold-fast-charger", "hot-cabinet", "stored-flat", "overcharge"
};

/* How much sun reaches a docked pack, by site (0: the indoor depot). */
static const double site_sun[8] = {
	0.0, 0.9, 0.5, 1.0, 0.3, 0.7, 0.6, 1.0
};
#define SITE_NOCUTOFF 7
/* First random stream of the capacity fade and gauge drift draws: far
 * above the physics and fault streams of any fleet (2 i + 1, 2 i + 2). */
#define SYNTH_CAP_STREAM (1ULL << 62)

struct synth_fleet {
	struct synth_conf c;
	struct synth_hooks h;
	struct synth_dev *devs;		/* by index */
	struct synth_dev **order;	/* by phase, then index */
	long ndev, rpd, nsub;
	double hsub;
	long day;
	long day_utc_s;			/* UTC second of local midnight */
	double season_c, daylen_h, sun_peak;
	double *wx, *clear;		/* per day, ndays + 1 of each */
	long env_slot;
	double amb, sun;
	int started;
};

static uint64_t rotl(uint64_t, int);
static void add_seg(struct synth_dev *, long, int, double);
static void plan_day(struct synth_dev *);
static void slot_env(struct synth_fleet *, long);
static void dev_env(const struct synth_fleet *, const struct synth_dev *,
	    struct synth_env *);
static void enter(struct synth_fleet *, struct synth_dev *, int, cw_time);
static void mc_end(struct synth_fleet *, struct synth_dev *, cw_time, int);
static void ev_close(struct synth_fleet *, struct synth_dev *);
static void vev_close(struct synth_fleet *, struct synth_dev *);
static void vev_track(struct synth_fleet *, struct synth_dev *, cw_time,
	    cw_time, double, double);
static void incident_set(struct synth_dev *, int);
static int zone_of(double);
static void dock_hop(struct synth_fleet *, struct synth_dev *);
static int cmp_phase(const void *, const void *);
static void swing(struct synth_truth *, double, int);

/* Random numbers. */

uint64_t
synth_splitmix64(uint64_t *state)
{
	uint64_t z = (*state += 0x9e3779b97f4a7c15ULL);

	z = (z ^ (z >> 30)) * 0xbf58476d1ce4e5b9ULL;
	z = (z ^ (z >> 27)) * 0x94d049bb133111ebULL;
	return z ^ (z >> 31);
}

void
synth_rng_seed(struct synth_rng *r, uint64_t seed, uint64_t stream)
{
	uint64_t x = stream * 0xd1b54a32d192ed03ULL + 0x632be59bd9b4e019ULL;
	int i;

	x = synth_splitmix64(&x) ^ seed;
	for (i = 0; i < 4; i++)
		r->s[i] = synth_splitmix64(&x);
	r->has_spare = 0;
	r->spare = 0;
}

static uint64_t
rotl(uint64_t x, int k)
{
	return (x << k) | (x >> (64 - k));
}

uint64_t
synth_rng_next(struct synth_rng *r)
{
	uint64_t *s = r->s;
	uint64_t res = rotl(s[1] * 5, 7) * 9;
	uint64_t t = s[1] << 17;

	s[2] ^= s[0];
	s[3] ^= s[1];
	s[1] ^= s[2];
	s[0] ^= s[3];
	s[2] ^= t;
	s[3] = rotl(s[3], 45);
	return res;
}

double
synth_rng_unif(struct synth_rng *r)
{
	return (double)(synth_rng_next(r) >> 11) * 0x1.0p-53;
}

double
synth_rng_range(struct synth_rng *r, double lo, double hi)
{
	return lo + (hi - lo) * synth_rng_unif(r);
}

double
synth_rng_gauss(struct synth_rng *r)
{
	double u1, u2, m;

	if (r->has_spare) {
		r->has_spare = 0;
		return r->spare;
	}
	u1 = 1.0 - synth_rng_unif(r);	/* (0, 1]: the log is finite */
	u2 = synth_rng_unif(r);
	m = sqrt(-2.0 * log(u1));
	r->spare = m * sin(2.0 * PI * u2);
	r->has_spare = 1;
	return m * cos(2.0 * PI * u2);
}

/* The cell and the pack. */

/*
 * An invented NMC-like curve, not fitted to any cell: 3.00 V empty,
 * 4.20 V full, a gently rising middle near 3.7 V, a knee below 15 % and a
 * steeper last few percent.  It rises everywhere, so SoC follows from it.
 */
double
synth_ocv_cell(double soc)
{
	double s = soc < -0.05 ? -0.05 : soc > 1.05 ? 1.05 : soc;
	double s2 = s * s, s4 = s2 * s2;
	double u = 3.25 + 0.85 * s - 0.25 * exp(-15.0 * s) + 0.10 * s4 * s4;

	/*
	 * Over-discharged (only a pack whose drain bypasses the cut-off
	 * gets there): the voltage falls on along the slope at -5 %, to
	 * 2.06 V at -12 %, and stays there.
	 */
	if (soc < -0.05)
		u += synth_docv_cell(-0.05) * ((soc < -0.12 ? -0.12 : soc) +
		    0.05);
	return u;
}

double
synth_docv_cell(double soc)
{
	double s = soc < -0.05 ? -0.05 : soc > 1.05 ? 1.05 : soc;
	double s2 = s * s, s4 = s2 * s2;

	return 0.85 + 3.75 * exp(-15.0 * s) + 0.80 * s4 * s2 * s;
}

double
synth_arrhenius(double ea, double t_c)
{
	return exp(-(ea / SYNTH_RGAS) * (1.0 / (t_c + SYNTH_T0_K) -
	    1.0 / (SYNTH_TREF_C + SYNTH_T0_K)));
}

void
synth_pack_init(struct synth_pack *p, double cap_ah, double r0_ref,
    double r1_ref, double tau1_s, double temp_c)
{
	memset(p, 0, sizeof(*p));
	p->soc = 1.0;
	p->cap_ah = cap_ah;
	p->cap0_ah = cap_ah;
	p->r0_ref = r0_ref;
	p->r1_ref = r1_ref;
	p->tau1_s = tau1_s;
	p->temp_c = temp_c;
	p->heat_cap = 3200.0;
	p->v = SYNTH_CELLS * synth_ocv_cell(1.0);
}

double
synth_pack_r0(const struct synth_pack *p)
{
	return p->r0_ref * (1.0 + p->growth) /
	    synth_arrhenius(SYNTH_EA_R, p->temp_c);
}

double
synth_pack_r1(const struct synth_pack *p)
{
	return p->r1_ref * (1.0 + p->growth) /
	    synth_arrhenius(SYNTH_EA_R, p->temp_c);
}

double
synth_pack_rstep25(const struct synth_pack *p, double dt)
{
	return (p->r0_ref + p->r1_ref * (1.0 - exp(-dt / p->tau1_s))) *
	    (1.0 + p->growth);
}

double
synth_pack_current_for(const struct synth_pack *p, double v, double dt)
{
	double f = (1.0 + p->growth) / synth_arrhenius(SYNTH_EA_R, p->temp_c);
	double r0 = p->r0_ref * f, r1 = p->r1_ref * f;
	double e = exp(-dt / p->tau1_s);
	double ocv = SYNTH_CELLS * synth_ocv_cell(p->soc);
	double slope = SYNTH_CELLS * synth_docv_cell(p->soc) /
	    (3600.0 * p->cap_ah);

	return (v - ocv - p->v_rc * e) / (r0 + r1 * (1.0 - e) + slope * dt);
}

/*
 * One step with constant current: the RC pair and the temperature follow
 * their exact exponential responses, the SoC the charge, the resistance
 * growth its rates at the temperature at the start of the step.  The
 * resistances are those at the start of the step too, which is what
 * synth_pack_current_for() assumes.
 */
double
synth_pack_step(struct synth_pack *p, double i_a, double dt,
    const struct synth_env *env)
{
	double fr = synth_arrhenius(SYNTH_EA_R, p->temp_c);
	double r0 = p->r0_ref * (1.0 + p->growth) / fr;
	double r1 = p->r1_ref * (1.0 + p->growth) / fr;
	double e = exp(-dt / p->tau1_s);
	double vrc = p->v_rc * e + r1 * i_a * (1.0 - e);
	double heat = i_a * i_a * r0 + vrc * vrc / r1;
	double tinf = env->amb_c + (heat + env->gain_w) / env->ua;
	double et = exp(-dt * env->ua / p->heat_cap);
	double fa = synth_arrhenius(SYNTH_EA_AGE, p->temp_c);
	double s = p->soc, dq = fabs(i_a) * dt / 3600.0;

	p->growth += fa * (p->k_cal * (0.3 + 0.7 * s * s) * dt +
	    p->k_cyc * dq / (2.0 * p->cap_ah));
	if (i_a > 0 && p->temp_c < 10.0)
		p->growth += p->k_cold * dq / p->cap_ah *
		    (10.0 - p->temp_c) / 10.0;
	/* The capacity fades by the same stresses, and its SoC is a
	 * fraction of what is left. */
	p->fade += fa * (p->kf_cal * (0.3 + 0.7 * s * s) * dt +
	    p->kf_cyc * dq / (2.0 * p->cap0_ah));
	if (i_a > 0 && p->temp_c < 10.0)
		p->fade += p->kf_cold * dq / p->cap0_ah *
		    (10.0 - p->temp_c) / 10.0;
	if (p->fade > 0.9)
		p->fade = 0.9;
	p->cap_ah = p->cap0_ah * (1.0 - p->fade);
	p->soc += i_a * dt / (3600.0 * p->cap_ah);
	p->v_rc = vrc;
	p->temp_c = tinf + (p->temp_c - tinf) * et;
	p->heat_w = heat;
	p->v = SYNTH_CELLS * synth_ocv_cell(p->soc) + vrc + r0 * i_a;
	return p->v;
}

/*
 * The charger's rules: it waits while the pack is colder than its hold
 * temperature; with the JEITA rules it also waits outside 0..60 C, halves
 * the current below 10 C and lowers the voltage to 4.10 V per cell above
 * 45 C; a terminated charger starts again when the resting pack falls
 * below the re-start voltage (lowered as the charge voltage is); it gives
 * the constant
 * current until the voltage limit binds, then the current that holds the
 * voltage; it terminates when that current falls below I_TERM.  The bike's
 * electronics draw I_PAR throughout, from the charger while it charges.
 */
double
synth_charger_current(const struct synth_charger *c,
    const struct synth_pack *p, int *state, double i_par, double dt,
    int *event)
{
	double icc = c->i_cc, vcv = c->v_cv, icv, i;
	int paused = p->temp_c < c->hold_c;

	*event = 0;
	if (*state == SYNTH_CH_OFF)
		return -i_par;
	if (c->jeita) {
		if (p->temp_c < 0.0 || p->temp_c > 60.0)
			paused = 1;
		else if (p->temp_c < 10.0)
			icc *= 0.5;
		else if (p->temp_c > 45.0)
			vcv = SYNTH_CELLS * 4.10;
	}
	if (*state == SYNTH_CH_DONE) {
		/* The re-start gap below the charge voltage in force. */
		if (c->v_restart <= 0 ||
		    p->v >= c->v_restart - (c->v_cv - vcv))
			return -i_par;
		*state = SYNTH_CH_CHARGING;
		*event = 2;
	}
	if (paused)
		return -i_par;
	icv = synth_pack_current_for(p, vcv, dt);
	i = icc - i_par;
	if (icv < i) {
		i = icv;
		if (i + i_par < c->i_term) {
			*state = SYNTH_CH_DONE;
			*event = vcv >= c->v_cv ? 1 : 3;
			return -i_par;
		}
	}
	return i < -i_par ? -i_par : i;
}

/* Plans. */

static void
add_seg(struct synth_dev *d, long at, int loc, double mean_a)
{
	if (d->nseg == SYNTH_MAXSEG)
		return;
	d->seg[d->nseg].at = at;
	d->seg[d->nseg].loc = loc;
	d->seg[d->nseg].mean_a = mean_a;
	d->nseg++;
}

#define H(x) ((long)((x) * 3600.0))
#define MIN(x) ((long)((x) * 60.0))

/*
 * A device's day, local time.  The first segment, at midnight, is where
 * the previous day ended, so days join.
 */
static void
plan_day(struct synth_dev *d)
{
	struct synth_rng *r = &d->rng;
	long t, t2, dur, pick;
	int n;

	d->nseg = 0;
	d->cur = 0;
	if (d->incident == SYNTH_I_STORED_FLAT) {
		add_seg(d, 0, SYNTH_PARKED, 0);	/* in storage */
		return;
	}
	switch (d->profile) {
	case SYNTH_DEEP:
		add_seg(d, 0, SYNTH_AT_DEPOT, 0);
		pick = H(synth_rng_range(r, 6.0, 7.0));
		add_seg(d, pick, SYNTH_PARKED, 0);
		t = (long)synth_rng_range(r, (double)(pick + MIN(10) > H(7.0) ?
		    pick + MIN(10) : H(7.0)), (double)H(8.75));
		dur = MIN(synth_rng_range(r, 40, 95));
		add_seg(d, t, SYNTH_RIDING, synth_rng_range(r, 5.0, 8.5));
		add_seg(d, t + dur, SYNTH_PARKED, 0);
		if (synth_rng_unif(r) < 0.75) {
			t = H(synth_rng_range(r, 16.5, 18.0));
			dur = MIN(synth_rng_range(r, 15, 50));
			add_seg(d, t, SYNTH_RIDING, synth_rng_range(r, 4.0,
			    8.0));
			add_seg(d, t + dur, SYNTH_PARKED, 0);
		}
		add_seg(d, H(synth_rng_range(r, 19.0, 21.0)), SYNTH_AT_DEPOT,
		    0);
		break;
	case SYNTH_TOPUP:
	case SYNTH_NOCUTOFF:
		add_seg(d, 0, SYNTH_AT_DOCK, 0);
		t = H(synth_rng_range(r, 6.5, d->profile == SYNTH_TOPUP ? 8.0 :
		    8.5));
		while (t < H(21.0) && d->nseg + 2 <= SYNTH_MAXSEG) {
			dur = MIN(synth_rng_range(r, 5, 25));
			add_seg(d, t, SYNTH_RIDING, synth_rng_range(r, 3.0,
			    7.0));
			add_seg(d, t + dur, SYNTH_AT_DOCK, 0);
			t += dur + (d->profile == SYNTH_TOPUP ?
			    MIN(synth_rng_range(r, 20, 110)) :
			    MIN(synth_rng_range(r, 40, 180)));
		}
		break;
	default:	/* SYNTH_IDLE */
		add_seg(d, 0, SYNTH_AT_DOCK, 0);
		t = synth_rng_unif(r) < 0.3 ? 0 : 1;
		n = t == 0 ? 0 : synth_rng_unif(r) < 0.64 ? 1 : 2;
		t = H(synth_rng_range(r, 8.0, 14.0));
		t2 = t + H(synth_rng_range(r, 1.0, 6.0));
		if (n >= 1) {
			dur = MIN(synth_rng_range(r, 10, 30));
			add_seg(d, t, SYNTH_RIDING, synth_rng_range(r, 3.0,
			    6.0));
			add_seg(d, t + dur, SYNTH_AT_DOCK, 0);
		}
		if (n == 2) {
			dur = MIN(synth_rng_range(r, 10, 30));
			add_seg(d, t2, SYNTH_RIDING, synth_rng_range(r, 3.0,
			    6.0));
			add_seg(d, t2 + dur, SYNTH_AT_DOCK, 0);
		}
		break;
	}
}

/* The weather. */

/*
 * Ambient temperature and sunshine at slot SLOT of the current day: a
 * seasonal mean from -1 C in mid January to 28 C in mid July, a daily
 * swing of 8 K peaking at 15:00, a random offset per day (smoothed over
 * the day), and sun from sunrise to sunset, weaker in winter, scaled by
 * the day's clear-sky fraction.
 */
static void
slot_env(struct synth_fleet *f, long slot)
{
	double h = (double)(slot * f->c.period_s) / 3600.0, x, rise;
	long d = f->day;

	x = h / 24.0;
	f->amb = f->season_c + f->wx[d] + (f->wx[d + 1] - f->wx[d]) * x +
	    8.0 * cos(2.0 * PI * (h - 15.0) / 24.0);
	rise = 12.0 - f->daylen_h / 2.0;
	x = sin(PI * (h - rise) / f->daylen_h);
	f->sun = h > rise && h < rise + f->daylen_h && x > 0 ?
	    x * f->sun_peak * (f->clear[d] + (f->clear[d + 1] -
	    f->clear[d]) * h / 24.0) : 0.0;
	f->env_slot = slot;
}

static void
dev_env(const struct synth_fleet *f, const struct synth_dev *d,
    struct synth_env *e)
{
	switch (d->loc) {
	case SYNTH_AT_DEPOT:
		/* Heated in winter, it follows part of the summer heat. */
		e->amb_c = 18.0 + (f->amb > 18.0 ? 0.6 * (f->amb - 18.0) : 0);
		e->ua = UA_DEPOT;
		e->gain_w = 0;
		break;
	case SYNTH_AT_DOCK:
		e->amb_c = f->amb;
		e->ua = UA_DOCK;
		e->gain_w = SUN_DOCK_W * f->sun * site_sun[d->site];
		if (d->heat_on)
			e->gain_w += d->dock->heater_w;
		if (d->incident == SYNTH_I_HOT_CABINET) {
			e->amb_c = CABINET_C;
			e->gain_w = 0;
		}
		break;
	case SYNTH_PARKED:
		e->amb_c = f->amb;
		e->ua = UA_PARK;
		e->gain_w = SUN_PARK_W * f->sun;
		break;
	default:
		e->amb_c = f->amb;
		e->ua = UA_RIDE;
		e->gain_w = SUN_RIDE_W * f->sun;
		break;
	}
}

/* The fleet. */

void
synth_conf_default(struct synth_conf *c)
{
	int k;

	memset(c, 0, sizeof(*c));
	c->ndev = 10;
	c->ndays = 7;
	c->start_day = ts_days_from_civil(2026, 1, 12);
	c->tz_s = 3600;
	c->period_s = 10;
	c->seed = 1;
	c->mix[SYNTH_DEEP] = 3;
	c->mix[SYNTH_TOPUP] = 3;
	c->mix[SYNTH_IDLE] = 3;
	c->mix[SYNTH_NOCUTOFF] = 1;
	c->aging = 1.0;
	for (k = 0; k < SYNTH_NFAULT; k++)
		c->rate[k] = synth_fault_default[k];
	c->formats = SYNTH_FMT_A;
	c->level = 1;
	c->outdir = ".";
}

static int
cmp_phase(const void *a, const void *b)
{
	const struct synth_dev *x = *(const struct synth_dev *const *)a;
	const struct synth_dev *y = *(const struct synth_dev *const *)b;

	if (x->phase_s != y->phase_s)
		return x->phase_s < y->phase_s ? -1 : 1;
	return x->idx < y->idx ? -1 : x->idx > y->idx;
}

struct synth_fleet *
synth_fleet_new(const struct synth_conf *c, const struct synth_hooks *h)
{
	struct synth_fleet *f = cw_calloc(1, sizeof(*f));
	struct synth_rng wr, cr;
	double cur[SYNTH_NPROFILE] = { 0 }, total = 0;
	long i, k, w, ndock = 0;
	int p, best;

	f->c = *c;
	if (h != NULL)
		f->h = *h;
	f->ndev = c->ndev;
	f->rpd = 86400 / c->period_s;
	f->nsub = (long)ceil((double)c->period_s / SUBSTEP_MAX);
	f->hsub = (double)c->period_s / (double)f->nsub;
	f->devs = cw_calloc((size_t)f->ndev, sizeof(*f->devs));
	f->order = cw_calloc((size_t)f->ndev, sizeof(*f->order));
	f->wx = cw_calloc((size_t)c->ndays + 1, sizeof(*f->wx));
	f->clear = cw_calloc((size_t)c->ndays + 1, sizeof(*f->clear));
	f->env_slot = -1;
	synth_rng_seed(&wr, c->seed, 0);
	for (i = 0; i <= c->ndays; i++) {
		f->wx[i] = 2.5 * synth_rng_gauss(&wr);
		f->clear[i] = synth_rng_range(&wr, 0.3, 1.0);
	}
	for (p = 0; p < SYNTH_NPROFILE; p++)
		total += c->mix[p];
	w = 4;
	for (k = c->ndev; k > 9999; k /= 10)
		w++;
	for (i = 0; i < f->ndev; i++) {
		struct synth_dev *d = &f->devs[i];
		struct synth_rng *r = &d->rng;
		double cap, r0, r1, tau, a = c->aging;
		char *q;

		/* Smooth weighted round robin: the mix, evenly spread. */
		best = -1;
		for (p = 0; p < SYNTH_NPROFILE; p++) {
			cur[p] += c->mix[p];
			if (c->mix[p] > 0 && (best < 0 || cur[p] > cur[best]))
				best = p;
		}
		if (best < 0)	/* no positive weight: all of the first */
			best = SYNTH_DEEP;
		else
			cur[best] -= total;
		d->idx = i;
		d->profile = best;
		memcpy(d->name, "EB-", 3);
		q = d->name + 3 + w;
		*q = '\0';
		for (k = i + 1; q > d->name + 3; k /= 10)
			*--q = (char)('0' + k % 10);
		d->namelen = 3 + (size_t)w;
		synth_rng_seed(r, c->seed, 2 * (uint64_t)i + 1);
		synth_rng_seed(&d->frng, c->seed, 2 * (uint64_t)i + 2);
		/* One draw per statement: argument order is unspecified. */
		cap = SYNTH_CAP_AH * synth_rng_range(r, 0.96, 1.03);
		r0 = synth_rng_range(r, 0.090, 0.125);
		r1 = r0 * synth_rng_range(r, 0.30, 0.45);
		tau = synth_rng_range(r, 25, 45);
		synth_pack_init(&d->pack, cap, r0, r1, tau, 15.0);
		d->pack.soc = synth_rng_range(r, 0.985, 0.995);
		d->pack.heat_cap *= synth_rng_range(r, 0.9, 1.1);
		d->pack.k_cal = a * 0.03 / (30 * 86400.0) *
		    synth_rng_range(r, 0.8, 1.2);
		d->pack.k_cyc = a * 0.001 * synth_rng_range(r, 0.8, 1.2);
		d->pack.k_cold = a * 0.005 * synth_rng_range(r, 0.8, 1.2);
		d->i_park = synth_rng_range(r, 0.01, 0.03);
		d->i_dock = synth_rng_range(r, 0.08, 0.25);
		d->gauge_int = synth_rng_unif(r) < 0.4;
		d->g_gain = synth_rng_range(r, -0.015, 0.015);
		d->g_off = 0.003 * synth_rng_gauss(r);
		d->phase_s = (long)(synth_rng_unif(r) * (double)c->period_s);
		/* Capacity fade and the gauge's drift draw from a stream of
		 * their own, so the draws above keep their values. */
		synth_rng_seed(&cr, c->seed, SYNTH_CAP_STREAM + (uint64_t)i);
		d->pack.kf_cal = a * 0.025 / (30 * 86400.0) *
		    synth_rng_range(&cr, 0.8, 1.2);
		d->pack.kf_cyc = a * 0.002 * synth_rng_range(&cr, 0.8, 1.2);
		d->pack.kf_cold = a * 0.005 * synth_rng_range(&cr, 0.8, 1.2);
		d->g_drift = synth_rng_range(&cr, -0.8, 0.8) / 86400.0;
		if (d->profile == SYNTH_DEEP)
			d->site = 0;
		else if (d->profile == SYNTH_NOCUTOFF)
			d->site = SITE_NOCUTOFF;
		else
			d->site = 1 + (int)(ndock++ % 6);
		d->dock = d->profile == SYNTH_NOCUTOFF ? &ch_nocutoff :
		    &ch_dock;
		d->depot = &ch_depot;
		d->r_start25 = synth_pack_rstep25(&d->pack,
		    (double)c->period_s);
		f->order[i] = d;
	}
	/* The incidents, in the last devices, one kind after the other. */
	for (k = 0; k < 4 * c->incidents && k < f->ndev; k++)
		incident_set(&f->devs[f->ndev - 1 - k],
		    SYNTH_I_COLD_FAST + (int)(k % 4));
	qsort(f->order, (size_t)f->ndev, sizeof(*f->order), cmp_phase);
	return f;
}

/* Give D incident KIND: its charger, profile and drain. */
static void
incident_set(struct synth_dev *d, int kind)
{
	d->incident = kind;
	switch (kind) {
	case SYNTH_I_COLD_FAST:
	case SYNTH_I_HOT_CABINET:
		if (d->profile != SYNTH_TOPUP) {
			d->profile = SYNTH_TOPUP;
			d->site = 1 + (int)(d->idx % 6);
		}
		d->dock = kind == SYNTH_I_COLD_FAST ? &ch_coldfast :
		    &ch_cabinet;
		break;
	case SYNTH_I_STORED_FLAT:
		d->pack.soc = FLAT_SOC;
		d->i_park = FLAT_DRAIN;
		break;
	case SYNTH_I_OVERCHARGE:
		d->profile = SYNTH_DEEP;
		d->site = 0;
		d->depot = &ch_depot430;
		break;
	}
}

void
synth_fleet_free(struct synth_fleet *f)
{
	if (f == NULL)
		return;
	free(f->devs);
	free(f->order);
	free(f->wx);
	free(f->clear);
	free(f);
}

long
synth_fleet_ndev(const struct synth_fleet *f)
{
	return f->ndev;
}

struct synth_dev *
synth_fleet_dev(struct synth_fleet *f, long i)
{
	return f->order[i];
}

long
synth_fleet_rows_per_day(const struct synth_fleet *f)
{
	return f->rpd;
}

const char *
synth_dev_charger(const struct synth_dev *d)
{
	if (d->incident == SYNTH_I_STORED_FLAT)
		return "none";		/* in storage, never charged */
	return d->profile == SYNTH_DEEP ? d->depot->name : d->dock->name;
}

void
synth_dev_site(const struct synth_dev *d, char buf[16])
{
	synth_site_name(d->site, buf);
}

const char *
synth_dev_home(const struct synth_dev *d, char buf[16])
{
	if (d->home == 0) {
		synth_dev_site(d, buf);
		return synth_dev_charger(d);
	}
	synth_site_name(d->home, buf);
	return d->home == SITE_NOCUTOFF ? ch_nocutoff.name : ch_dock.name;
}

void
synth_site_name(int site, char buf[16])
{
	if (site < 0) {
		buf[0] = '\0';
		return;
	}
	if (site == 0) {
		memcpy(buf, "depot", 6);
		return;
	}
	memcpy(buf, "dock-0", 6);
	buf[6] = (char)('0' + site);
	buf[7] = '\0';
}

/*
 * --docks: a pack put in a dock goes to its home dock half of the time,
 * else to any of the seven (the one without a cut-off included), drawn
 * from a hash of the seed, the pack and its plug-in count rather than
 * from its random streams, so that the physics' draws keep their order.
 */
static void
dock_hop(struct synth_fleet *f, struct synth_dev *d)
{
	uint64_t x = f->c.seed ^ (0x9e3779b97f4a7c15ULL * (uint64_t)(d->idx +
	    1)) ^ (0xc2b2ae3d27d4eb4fULL * (uint64_t)d->tr.plugins);
	uint64_t h = synth_splitmix64(&x);

	if (d->home == 0)
		d->home = d->site;
	d->site = (h & 1) ? d->home : 1 + (int)((h >> 1) % SITE_NOCUTOFF);
	d->dock = d->site == SITE_NOCUTOFF ? &ch_nocutoff : &ch_dock;
}

void
synth_fleet_day(struct synth_fleet *f, long day)
{
	long y, i, z = f->c.start_day + day, doy;
	unsigned m, dd;
	double sx;

	f->day = day;
	f->day_utc_s = z * 86400 - f->c.tz_s;
	ts_civil_from_days(z, &y, &m, &dd);
	doy = z - ts_days_from_civil(y, 1, 1) + 1;
	sx = cos(2.0 * PI * ((double)doy - 15.0) / 365.25);
	f->season_c = 13.5 - 14.5 * sx;
	f->daylen_h = 12.0 - 3.5 * sx;
	f->sun_peak = 0.55 - 0.45 * sx;
	f->env_slot = -1;
	for (i = 0; i < f->ndev; i++)
		plan_day(&f->devs[i]);
	if (f->started)
		return;
	/* The first day: every pack starts full, resting where it is. */
	f->started = 1;
	slot_env(f, 0);
	for (i = 0; i < f->ndev; i++) {
		struct synth_dev *d = &f->devs[i];
		struct synth_env e;

		d->loc = d->seg[0].loc;
		d->ch_state = SYNTH_CH_DONE;
		dev_env(f, d, &e);
		d->pack.temp_c = e.amb_c + e.gain_w / e.ua;
		d->pack.v = SYNTH_CELLS * synth_ocv_cell(d->pack.soc);
		d->g_deficit = (1.0 - d->pack.soc) * d->pack.cap_ah;
		d->tr.soc_start = 100.0 * d->pack.soc;
		d->tr.peak_soc = d->tr.soc_start;
	}
}

/* A micro-cycle ends at T; COMPLETED: by termination. */
static void
mc_end(struct synth_fleet *f, struct synth_dev *d, cw_time t, int completed)
{
	d->mc.end = t;
	d->mc.completed = completed;
	d->mc.depth = 100.0 * (d->mc_peak - d->mc_low);
	if (f->h.topoff != NULL)
		f->h.topoff(f->h.ctx, d, &d->mc);
	d->mc_on = 0;
}

/* D moves to LOC at (about) time T. */
static void
enter(struct synth_fleet *f, struct synth_dev *d, int loc, cw_time t)
{
	int was_ch = d->loc == SYNTH_AT_DEPOT || d->loc == SYNTH_AT_DOCK;
	int is_ch = loc == SYNTH_AT_DEPOT || loc == SYNTH_AT_DOCK;

	if (loc == d->loc)
		return;
	if (d->loc == SYNTH_RIDING) {
		d->rd.end = t;
		d->rd.to_charger = is_ch;
		if (f->h.ride != NULL)
			f->h.ride(f->h.ctx, d, &d->rd);
	}
	if (was_ch) {
		if (d->mc_on)
			mc_end(f, d, t, 0);
		d->held = 0;
		d->ch_state = SYNTH_CH_OFF;
	}
	d->loc = loc;
	if (is_ch) {
		d->ch_state = SYNTH_CH_CHARGING;
		d->held = 0;
		d->tr.plugins++;
		if (loc == SYNTH_AT_DOCK && f->c.docks)
			dock_hop(f, d);
	}
	if (loc == SYNTH_RIDING) {
		d->rd.start = t;
		d->rd.soc_start = d->rd.soc_min = 100.0 * d->pack.soc;
		d->rd.from_charger = was_ch;
		d->tr.rides++;
		d->ride_mean = d->seg[d->cur].mean_a;
		d->ride_left = 0;
		d->ride_cut = 0;
	}
}

static int
zone_of(double t)
{
	if (t < 0.0)
		return 0;
	if (t < 10.0)
		return 1;
	if (t <= 45.0)
		return 2;
	if (t <= 60.0)
		return 3;
	return 4;
}

static void
ev_close(struct synth_fleet *f, struct synth_dev *d)
{
	struct synth_cevent *e = &d->ev;

	d->ev_on = 0;
	if (e->end - e->start < EV_MIN_DUR)
		return;
	if (e->zone == 0 || e->zone == 4)
		e->protocol = 3;
	else if (e->zone == 1)
		e->protocol = e->i_max > EV_COOL_A ? 1 : 0;
	else
		e->protocol = e->v_max > EV_WARM_V ? 2 : 0;
	d->tr.cevents++;
	if (f->h.cevent != NULL)
		f->h.cevent(f->h.ctx, d, &d->ev);
}

void
synth_fleet_sample(struct synth_fleet *f, struct synth_dev *d, long slot,
    struct synth_sample *s)
{
	/* Severity of a zone: the prohibited ones first. */
	static const int rank[5] = { 3, 1, 0, 2, 4 };
	struct synth_pack *p = &d->pack;
	struct synth_env env;
	const struct synth_charger *ch;
	double per = (double)f->c.period_s, h = f->hsub, q = 0, i, lim, gs;
	double soc0 = 100.0 * p->soc, tloc, hr, t_c, soc_pct, iavg;
	cw_time t = (cw_time)(f->day_utc_s + slot * f->c.period_s +
	    d->phase_s) * CW_US_PER_S, t0;
	long j;
	int ev, z;

	if (f->env_slot != slot)
		slot_env(f, slot);
	tloc = (double)(slot * f->c.period_s + d->phase_s) - per;
	for (j = 0; j < f->nsub; j++, tloc += h) {
		while (d->cur + 1 < d->nseg && (double)d->seg[d->cur + 1].at <=
		    tloc) {
			d->cur++;
			enter(f, d, d->seg[d->cur].loc, t);
		}
		/* The heating pad's thermostat. */
		if (d->loc != SYNTH_AT_DOCK || d->dock->heater_w <= 0 ||
		    d->ch_state != SYNTH_CH_CHARGING)
			d->heat_on = 0;
		else if (p->temp_c < 11.0)
			d->heat_on = 1;
		else if (p->temp_c > 13.0)
			d->heat_on = 0;
		dev_env(f, d, &env);
		ev = 0;
		switch (d->loc) {
		case SYNTH_RIDING:
			if (d->ride_left <= 0) {
				if (synth_rng_unif(&d->rng) < 0.12) {
					d->ride_level = 0;
					d->ride_left = synth_rng_range(&d->rng,
					    10, 40);
				} else {
					d->ride_level = d->ride_mean *
					    synth_rng_range(&d->rng, 0.4, 1.6);
					d->ride_left = synth_rng_range(&d->rng,
					    15, 90);
				}
			}
			d->ride_left -= h;
			i = d->ride_cut ? 0.0 : -d->ride_level;
			break;
		case SYNTH_PARKED:
			i = -d->i_park;
			break;
		default:
			ch = d->loc == SYNTH_AT_DEPOT ? d->depot : d->dock;
			i = synth_charger_current(ch, p, &d->ch_state,
			    d->loc == SYNTH_AT_DEPOT ? d->i_park : d->i_dock,
			    h, &ev);
			break;
		}
		/* The cut-off: no discharge below the minimum voltage (but
		 * for a stored pack whose drain bypasses it). */
		if (i < 0 && d->incident != SYNTH_I_STORED_FLAT) {
			lim = synth_pack_current_for(p, SYNTH_VMIN, h);
			if (i < lim) {
				i = lim < 0 ? lim : 0.0;
				if (d->loc == SYNTH_RIDING && lim > -0.5)
					d->ride_cut = 1;
			}
		}
		synth_pack_step(p, i, h, &env);
		q += i * h;
		if (i > 0)
			d->tr.charge_ah += i * h / 3600.0;
		else
			d->tr.discharge_ah -= i * h / 3600.0;
		/* The gauge counts with its own errors. */
		d->g_deficit -= (i * (1.0 + d->g_gain) + d->g_off) * h /
		    3600.0;
		if (d->g_deficit < 0)
			d->g_deficit = 0;
		d->g_bias += d->g_drift * h;
		if (d->loc == SYNTH_RIDING && 100.0 * p->soc < d->rd.soc_min)
			d->rd.soc_min = 100.0 * p->soc;
		if (d->mc_on) {
			if (p->soc < d->mc_low)
				d->mc_low = p->soc;
			if (i > 0)
				d->mc.ah += i * h / 3600.0;
		}
		if (ev == 1 || ev == 3) {
			if (ev == 1) {
				d->g_deficit = 0;
				d->g_bias = 0;
			}
			if (d->mc_on)
				mc_end(f, d, t, 1);
			d->held = 1;
			d->term_t = t;
			d->term_soc = p->soc;
		} else if (ev == 2 && d->held) {
			d->mc_on = 1;
			d->tr.topoffs++;
			d->mc.start = d->term_t;
			d->mc.restart = t;
			d->mc.ah = 0;
			d->mc_peak = d->term_soc;
			d->mc_low = p->soc;
		}
	}

	/* What the gauge reports. */
	iavg = q / per;
	t_c = p->temp_c;
	soc_pct = 100.0 * p->soc;
	s->t = t;
	s->mv = (long)floor(p->v * 1000.0 + 4.0 * synth_rng_gauss(&d->rng) +
	    0.5);
	s->ma = (long)floor(iavg * 1000.0 + 8.0 * synth_rng_gauss(&d->rng) +
	    0.5);
	s->dk = (long)floor((t_c + SYNTH_T0_K) * 10.0 +
	    synth_rng_gauss(&d->rng) + 0.5);
	/* Its count over the pack's true capacity now (a gauge that has
	 * learnt it), plus its drift since the last full-charge reset. */
	gs = 100.0 * (1.0 - d->g_deficit / p->cap_ah) + d->g_bias;
	gs = gs < 0 ? 0 : gs > 100 ? 100 : gs;
	s->soc10 = d->gauge_int ? 10 * (long)floor(gs + 0.5) :
	    (long)floor(gs * 10.0 + 0.5);
	s->site = d->loc == SYNTH_AT_DOCK || d->loc == SYNTH_AT_DEPOT ?
	    d->site : -1;

	/* The truth, in the rows' convention (charge.h). */
	t0 = d->have_prev ? d->prev_t : t - (cw_time)f->c.period_s *
	    CW_US_PER_S;
	if (!d->have_prev) {
		d->tr.first = t;
		d->tr.cap_first = p->cap_ah;
	}
	d->have_prev = 1;
	d->prev_t = t;
	d->tr.last = t;
	d->tr.rows++;
	d->tr.soc_end = soc_pct;
	hr = per / 3600.0;
	if (soc_pct >= 95.0)
		d->tr.hours_soc95 += hr;
	if (t_c >= 45.0)
		d->tr.hours_t45 += hr;
	if (iavg > EV_MIN_A && t_c < 10.0)
		d->tr.cold_ah += iavg * hr;
	if (iavg > EV_MIN_A && t_c > 45.0)
		d->tr.hot_ah += iavg * hr;
	if (soc_pct > d->tr.peak_soc)
		d->tr.peak_soc = soc_pct;
	if (d->tr.peak_soc - soc_pct > d->tr.max_depth)
		d->tr.max_depth = d->tr.peak_soc - soc_pct;
	swing(&d->tr, soc_pct, 0);
	if (d->ev_on && t0 - d->ev.end > EV_MERGE)
		ev_close(f, d);
	z = zone_of(t_c);
	if (iavg > EV_MIN_A && z != 2) {
		if (!d->ev_on) {
			d->ev_on = 1;
			d->ev.zone = z;
			d->ev.start = t0;
			d->ev.tmin = d->ev.tmax = t_c;
			d->ev.ah = 0;
			d->ev.soc0 = soc0;
			d->ev.i_max = iavg;
			d->ev.v_max = p->v / SYNTH_CELLS;
		}
		if (iavg > d->ev.i_max)
			d->ev.i_max = iavg;
		if (p->v / SYNTH_CELLS > d->ev.v_max)
			d->ev.v_max = p->v / SYNTH_CELLS;
		if (rank[z] > rank[d->ev.zone])
			d->ev.zone = z;
		if (t_c < d->ev.tmin)
			d->ev.tmin = t_c;
		if (t_c > d->ev.tmax)
			d->ev.tmax = t_c;
		d->ev.end = t;
		d->ev.ah += iavg * hr;
		d->ev.soc1 = soc_pct;
	}
	vev_track(f, d, t0, t, iavg, hr);
}

/* The end of a voltage event: emitted when it lasted 30 s. */
static void
vev_close(struct synth_fleet *f, struct synth_dev *d)
{
	d->vev_on = 0;
	if (d->vev.end - d->vev.start < VEV_MIN_DUR)
		return;
	if (f->h.vevent != NULL)
		f->h.vevent(f->h.ctx, d, &d->vev);
}

/*
 * The cell voltage truth of the sample at T (interval from T0) with mean
 * current IAVG over HR hours: cw-volt's rules without hysteresis.
 */
static void
vev_track(struct synth_fleet *f, struct synth_dev *d, cw_time t0, cw_time t,
    double iavg, double hr)
{
	double vc = d->pack.v / SYNTH_CELLS;
	int lim = vc > SYNTH_VOLT_MAX ? 0 : vc < SYNTH_VOLT_MIN ? 1 : -1;
	int kind = iavg > EV_MIN_A ? 0 : iavg < -EV_MIN_A ? 1 : 2;

	if (d->vev_on && (lim != d->vev.limit || kind != d->vev.kind))
		vev_close(f, d);
	if (lim < 0)
		return;
	if (!d->vev_on) {
		d->vev_on = 1;
		d->vev.limit = lim;
		d->vev.kind = kind;
		d->vev.start = t0;
		d->vev.vmin = d->vev.vmax = vc;
		d->vev.ah = 0;
	}
	if (vc < d->vev.vmin)
		d->vev.vmin = vc;
	if (vc > d->vev.vmax)
		d->vev.vmax = vc;
	d->vev.end = t;
	d->vev.ah += iavg * hr;
}

/*
 * Follow the true SoC S (percent) through its turning points: a run ends
 * when S comes back one point from its extreme, and counts in swings20
 * when it spans 20 points.  LAST: the end of the log closes the run.
 */
static void
swing(struct synth_truth *tr, double s, int last)
{
	if (tr->rows == 1) {
		tr->sw_from = tr->sw_ext = tr->soc_start;
		tr->sw_dir = 0;
	}
	if (!last && (tr->sw_dir == 0 ? fabs(s - tr->sw_from) < 1.0 :
	    (s - tr->sw_ext) * tr->sw_dir > 0)) {
		if (tr->sw_dir != 0)
			tr->sw_ext = s;
		return;
	}
	if (!last && tr->sw_dir == 0) {
		tr->sw_dir = s > tr->sw_from ? 1 : -1;
		tr->sw_ext = s;
		return;
	}
	if (!last && (tr->sw_ext - s) * tr->sw_dir < 1.0)
		return;
	if (fabs(tr->sw_ext - tr->sw_from) >= 20.0)
		tr->swings20++;
	tr->sw_from = tr->sw_ext;
	tr->sw_ext = s;
	tr->sw_dir = -tr->sw_dir;
}

void
synth_fleet_finish(struct synth_fleet *f)
{
	long i;

	for (i = 0; i < f->ndev; i++) {
		struct synth_dev *d = &f->devs[i];

		if (d->ev_on)
			ev_close(f, d);
		if (d->vev_on)
			vev_close(f, d);
		if (d->mc_on)
			mc_end(f, d, d->tr.last, 0);
		if (d->tr.rows > 0)
			swing(&d->tr, d->tr.soc_end, 1);
		if (d->loc == SYNTH_RIDING && f->h.ride != NULL) {
			d->rd.end = d->tr.last;
			d->rd.to_charger = 0;
			f->h.ride(f->h.ctx, d, &d->rd);
		}
	}
}
