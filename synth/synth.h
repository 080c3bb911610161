/*
 * synth.h: the invented fleet behind cw-synth.
 *
 * A city bike-share operator's e-bike packs (10 cells in series, 14 Ah) are
 * simulated sample by sample: an open-circuit-voltage curve, an ohmic
 * resistance and one RC pair that depend on temperature (Arrhenius) and
 * grow with age, a lumped thermal model with self-heating and exchange
 * with the surroundings, chargers with constant current, constant voltage,
 * termination and re-start, riders, docks, a depot, the weather, and a
 * gauge that counts coulombs with its own errors.  Everything is invented;
 * the man page says where each constant comes from.
 *
 * The simulator is deterministic for a seed: every random draw comes from
 * xoshiro256** streams seeded through splitmix64, one stream per device
 * for the physics, one per device for the faults, one for the weather, so
 * the physics does not change with the fault rates or the output format.
 *
 * This header has two layers: the pieces (random numbers, the cell and
 * the pack, the charger), which the unit tests drive directly, and the
 * fleet (synth_fleet_*), which synthout.c runs to write the logs.
 */
#ifndef SYNTH_H
#define SYNTH_H

#include <stddef.h>
#include <stdint.h>

#include "cw.h"

/* Random numbers: xoshiro256** (Blackman and Vigna), seeded by splitmix64. */
struct synth_rng {
	uint64_t s[4];
	double spare;		/* the second normal deviate of a pair */
	int has_spare;
};

uint64_t synth_splitmix64(uint64_t *state);
/* Seed stream STREAM of SEED; different streams are independent. */
void	synth_rng_seed(struct synth_rng *r, uint64_t seed, uint64_t stream);
uint64_t synth_rng_next(struct synth_rng *r);
/* Uniform on [0, 1), 53 bits. */
double	synth_rng_unif(struct synth_rng *r);
/* Uniform on [LO, HI). */
double	synth_rng_range(struct synth_rng *r, double lo, double hi);
/* Standard normal (Box-Muller, both deviates used). */
double	synth_rng_gauss(struct synth_rng *r);

/* The invented pack. */
#define SYNTH_CELLS	10		/* in series */
#define SYNTH_CAP_AH	14.0		/* rated capacity */
#define SYNTH_VMAX_CELL	4.20		/* charge voltage per cell */
#define SYNTH_VMIN_CELL	3.00		/* discharge cut-off per cell */
#define SYNTH_VMAX	(SYNTH_CELLS * SYNTH_VMAX_CELL)
#define SYNTH_VMIN	(SYNTH_CELLS * SYNTH_VMIN_CELL)
#define SYNTH_RGAS	8.314462618	/* J/(mol K), CODATA 2018 */
#define SYNTH_T0_K	273.15		/* 0 C in kelvin */
#define SYNTH_TREF_C	25.0		/* reference temperature */
#define SYNTH_EA_R	30000.0		/* J/mol, resistance against T */
#define SYNTH_EA_AGE	50000.0		/* J/mol, resistance growth rate */

/* Open-circuit voltage of one cell at state of charge SOC (0..1), V. */
double	synth_ocv_cell(double soc);
/* Its derivative dU/dSoC, V per unit SoC. */
double	synth_docv_cell(double soc);
/*
 * The Arrhenius factor exp(-(EA/Rg) (1/T - 1/Tref)) at T_C degrees Celsius:
 * how much faster a process with activation energy EA (J/mol) runs at T
 * than at 25 C.  A resistance falls by the same factor.
 */
double	synth_arrhenius(double ea, double t_c);

/* The surroundings of a pack over one step. */
struct synth_env {
	double amb_c;		/* ambient temperature, C */
	double ua;		/* heat exchange with it, W/K */
	double gain_w;		/* heat from outside (sun), W */
};

/*
 * A pack's physical state.  Current is positive while charging.  The
 * terminal voltage is U(soc) * cells + v_rc + r0 * i, with r0 and r1 the
 * reference values times (1 + growth) divided by the Arrhenius factor at
 * the pack temperature; the RC pair's time constant does not change.
 */
struct synth_pack {
	double soc;		/* true state of charge, 0..1 */
	double cap_ah;		/* true capacity, Ah */
	double r0_ref;		/* ohmic resistance at 25 C when new, ohm */
	double r1_ref;		/* RC pair resistance at 25 C when new, ohm */
	double tau1_s;		/* RC pair time constant, s */
	double growth;		/* resistance growth so far (0.1: +10 %) */
	double v_rc;		/* voltage over the RC pair, V */
	double temp_c;		/* lumped pack temperature, C */
	double heat_cap;	/* heat capacity, J/K */
	double k_cal;		/* growth per second at 25 C, full charge */
	double k_cyc;		/* growth per equivalent full cycle at 25 C */
	double k_cold;		/* growth per capacity charged at 0 C */
	/* Capacity fade, by the same stresses at rates of its own. */
	double cap0_ah;		/* true capacity when new, Ah */
	double fade;		/* fraction of cap0_ah lost so far */
	double kf_cal;		/* fade per second at 25 C, full charge */
	double kf_cyc;		/* fade per equivalent full cycle at 25 C */
	double kf_cold;		/* fade per capacity charged at 0 C */
	/* What the last step did, for the caller's bookkeeping. */
	double v;		/* terminal voltage at its end, V */
	double heat_w;		/* heat generated in it, W */
};

/* Set P to a new pack with the given parameters, full and at TEMP_C. */
void	synth_pack_init(struct synth_pack *p, double cap_ah, double r0_ref,
	    double r1_ref, double tau1_s, double temp_c);
/* Ohmic and RC resistance now (at the pack temperature, with growth). */
double	synth_pack_r0(const struct synth_pack *p);
double	synth_pack_r1(const struct synth_pack *p);
/*
 * The resistance a current step shows after DT seconds at 25 C:
 * r0 + r1 (1 - exp(-DT / tau1)), with the growth so far.
 */
double	synth_pack_rstep25(const struct synth_pack *p, double dt);
/*
 * The current that brings the terminal voltage to V at the end of a step
 * of DT seconds (to first order in the SoC change): the constant-voltage
 * current of a charger, or the largest discharge a cut-off allows.
 */
double	synth_pack_current_for(const struct synth_pack *p, double v,
	    double dt);
/* Advance P by DT seconds at current I_A in ENV; returns the voltage. */
double	synth_pack_step(struct synth_pack *p, double i_a, double dt,
	    const struct synth_env *env);

/*
 * A charger: constant current I_CC up to V_CV, then constant voltage
 * until the current falls to I_TERM (termination); then, if V_RESTART is
 * set (> 0), it starts again once the resting pack falls below it (a
 * top-off).  JEITA: temperature rules in the scheme of the JEITA
 * guideline (values from memory, see cw-synth(1)): no charge below 0 C or
 * above 60 C, half current from 0 to 10 C, 4.10 V per cell from 45 to
 * 60 C.  A charger without them charges at any temperature.  HOLD_C: a
 * better charger waits until the pack is this warm before it charges;
 * HEATER_W, a heating pad (a thermostat holds 11..13 C) warms it there.
 */
struct synth_charger {
	const char *name;
	double i_cc, v_cv, i_term, v_restart;
	int jeita;
	double hold_c;		/* no charge below this, C */
	double heater_w;	/* pad that keeps a waiting pack at 11..13 C */
};

enum synth_chstate { SYNTH_CH_OFF, SYNTH_CH_CHARGING, SYNTH_CH_DONE };

/*
 * One step of DT seconds of pack P on charger C, with state *STATE, while
 * a load of I_PAR amperes (the bike's electronics) draws from the pack.
 * Returns the pack current (positive: charging).  *EVENT is set to 1 when
 * the charger terminated in this step, 2 when it started again, else 0.
 */
double	synth_charger_current(const struct synth_charger *c,
	    const struct synth_pack *p, int *state, double i_par, double dt,
	    int *event);

/* The fleet. */
enum synth_profile {
	SYNTH_DEEP,		/* long rides, depot fast charger overnight */
	SYNTH_TOPUP,		/* short hops, docked on a charger between */
	SYNTH_IDLE,		/* mostly held full in a dock */
	SYNTH_NOCUTOFF,		/* short hops at the dock with no cut-off */
	SYNTH_NPROFILE
};
extern const char *const synth_profile_name[SYNTH_NPROFILE];

enum synth_loc { SYNTH_AT_DEPOT, SYNTH_AT_DOCK, SYNTH_PARKED, SYNTH_RIDING };

enum synth_fault {
	SYNTH_F_DUP,		/* a row written twice */
	SYNTH_F_LATE,		/* a row written up to 60 s late */
	SYNTH_F_STALE,		/* a row written over 60 s to 10 min late */
	SYNTH_F_TRUNC,		/* a line cut before its last field */
	SYNTH_F_SENTINEL,	/* a field holding a gauge's no-value code */
	SYNTH_F_GAP,		/* the device not logging for a while */
	SYNTH_F_JUMP,		/* the device clock set back for a while */
	SYNTH_F_HEADER,		/* a header line repeated inside a file */
	SYNTH_NFAULT
};
extern const char *const synth_fault_name[SYNTH_NFAULT];
/* Default rates: per row for the first five, per device-day for gap and
 * jump, per file for header. */
extern const double synth_fault_default[SYNTH_NFAULT];
/*
 * Parse a --faults list: "none", "default", or name=rate items, separated
 * by commas, applied in order to RATE.  0, or -1 with *ERR set.
 */
int	synth_faults_parse(const char *s, double rate[SYNTH_NFAULT],
	    const char **err);

enum synth_format { SYNTH_FMT_A = 1, SYNTH_FMT_B = 2 };

struct synth_conf {
	long ndev;		/* devices */
	long ndays;		/* days */
	long start_day;		/* first local date, days since 1970-01-01 */
	long tz_s;		/* local time offset east of UTC, s */
	long period_s;		/* sampling period, s; divides 86400 */
	uint64_t seed;
	double mix[SYNTH_NPROFILE];	/* weights of the profiles */
	double aging;		/* multiplies every growth and fade rate */
	double rate[SYNTH_NFAULT];
	unsigned formats;	/* SYNTH_FMT_* bits */
	int charge_sign;	/* raw logs' charging current: 0 each
				   format's own, 1 positive, -1 negative */
	int docks;		/* a dock column; packs hop between docks */
	int level;		/* gzip level */
	const char *outdir;
	long incidents;		/* packs given each enum synth_incident */
};

/*
 * Misuse of a pack or a charger, injected into the last 4 * incidents
 * devices (cw-synth --incidents), one kind after the other:
 * COLD_FAST: a fast dock charger (10 A) without the JEITA rules, so it
 * does not reduce the current in the cold; HOT_CABINET: a dock charger
 * without them in a cabinet whose fan failed (50 C), so it charges to
 * 4.20 V per cell in the warm zone; STORED_FLAT: a pack stored run flat
 * (SoC -6 %, 2.59 V a cell) whose standby drain (20 mA) bypasses the
 * cut-off; OVERCHARGE: a depot charger set to 4.30 V per cell.
 */
enum synth_incident {
	SYNTH_I_NONE, SYNTH_I_COLD_FAST, SYNTH_I_HOT_CABINET,
	SYNTH_I_STORED_FLAT, SYNTH_I_OVERCHARGE, SYNTH_NINCIDENT
};
extern const char *const synth_incident_name[SYNTH_NINCIDENT];

/* Defaults: 10 devices, 7 days from 2026-01-12 at +01:00, 10 s, seed 1. */
void	synth_conf_default(struct synth_conf *c);

/* A measured sample, as the gauge reports it. */
struct synth_sample {
	cw_time t;		/* true time, us */
	long mv;		/* pack voltage, mV */
	long ma;		/* current, mA, positive charging */
	long dk;		/* temperature, 0.1 K */
	long soc10;		/* SoC, tenths of a percent */
	int site;		/* where it sits: 0 depot, N dock N, -1 neither */
};

/* One charging event outside the normal window, in true values. */
struct synth_cevent {
	int zone;		/* 0 below-min, 1 cool, 3 warm, 4 above-max */
	cw_time start, end;
	double tmin, tmax;	/* C */
	double ah;
	double soc0, soc1;	/* percent */
	double i_max;		/* A, highest current of its rows */
	double v_max;		/* V per cell, highest of its rows */
	int protocol;		/* 0 within, 1 over-current, 2 over-voltage,
				   3 no-charge-allowed (cw-thermal's words) */
};
extern const char *const synth_zone_name[5];

/*
 * One event of a cell voltage (true pack voltage over the cells) above
 * SYNTH_VOLT_MAX or below SYNTH_VOLT_MIN, by cw-volt's rules without
 * hysteresis: a run of rows beyond the limit of one kind (charge above
 * 0.05 A, use below -0.05 A, rest between), at least 30 s.
 */
#define SYNTH_VOLT_MAX 4.25
#define SYNTH_VOLT_MIN 2.50
struct synth_vevent {
	int limit;		/* 0 over, 1 under */
	int kind;		/* 0 charge, 1 use, 2 rest */
	cw_time start, end;
	double vmin, vmax;	/* V per cell */
	double ah;		/* net charge */
};

/* One top-off micro-cycle, in true values. */
struct synth_topoff {
	cw_time start;		/* termination before the drop */
	cw_time restart;	/* the charger started again */
	cw_time end;		/* termination after it, or interruption */
	double depth;		/* peak - lowest SoC, percent */
	double ah;		/* charge from the restart to the end */
	int completed;		/* the recharge reached termination */
};

/* One ride, in true values. */
struct synth_ride {
	cw_time start;		/* taken (about: the sample after) */
	cw_time end;		/* parked or put on a charger again */
	double soc_start;	/* percent, at the start */
	double soc_min;		/* lowest during the ride, percent */
	int from_charger;	/* taken from a dock or the depot */
	int to_charger;		/* put on a charger at its end */
};

/* The truth kept per device. */
struct synth_truth {
	cw_time first, last;		/* first and last sample */
	double soc_start, soc_end;	/* percent */
	double charge_ah, discharge_ah;
	double max_depth;		/* largest fall from an earlier peak */
	double peak_soc;
	double hours_soc95, hours_t45;
	double cold_ah, hot_ah;		/* charge below 10 C, above 45 C */
	double cap_first;		/* true capacity at the first sample */
	/* Swings of true SoC: runs between turning points (1 point of
	 * hysteresis), counted when they span 20 points or more. */
	int sw_dir;
	double sw_from, sw_ext;
	unsigned long swings20;
	unsigned long rides, plugins, cevents, topoffs;
	unsigned long rows;		/* samples taken */
	unsigned long written;		/* data lines written (one format) */
	unsigned long fault[SYNTH_NFAULT];	/* injected, by kind */
	unsigned long gap_rows, jump_rows;
};

#define SYNTH_MAXSEG 40

struct synth_seg {
	long at;		/* seconds since local midnight */
	int loc;		/* enum synth_loc */
	double mean_a;		/* riding: mean discharge current */
};

struct synth_dev {
	long idx;
	char name[16];
	size_t namelen;
	int profile;
	int site;		/* 0: depot, else dock site number */
	int home;		/* --docks: its own dock (0: not yet hopped) */
	int gauge_int;		/* the gauge reports whole percent */
	long phase_s;		/* sample times are phase_s past the grid */
	struct synth_rng rng;	/* physics */
	struct synth_rng frng;	/* faults */
	struct synth_pack pack;
	const struct synth_charger *dock;	/* its dock's charger */
	const struct synth_charger *depot;	/* its depot's charger */
	int incident;		/* enum synth_incident */
	double i_park, i_dock;	/* electronics load parked and docked, A */
	double r_start25;	/* rstep25 at the start */
	/* Today's plan. */
	struct synth_seg seg[SYNTH_MAXSEG];
	int nseg, cur;
	int loc;
	int ch_state;
	int heat_on;		/* the dock's heating pad is on */
	double ride_mean, ride_level, ride_left;
	int ride_cut;
	/* The gauge. */
	double g_deficit;	/* Ah below full, as the gauge counts */
	double g_gain, g_off;	/* its current error: gain, offset A */
	double g_drift;		/* its SoC drift, points per second */
	double g_bias;		/* drift since the last full-charge reset */
	/* Truth bookkeeping. */
	struct synth_truth tr;
	int have_prev;
	cw_time prev_t;
	int ev_on;
	struct synth_cevent ev;
	int vev_on;
	struct synth_vevent vev;
	int mc_on;		/* a micro-cycle is in progress */
	int held;		/* the charger terminated, no ride since */
	struct synth_topoff mc;
	double mc_peak, mc_low;
	struct synth_ride rd;	/* the ride in progress */
	cw_time term_t;
	double term_soc;
	/* Fault state (synthout.c). */
	long gap_left, jump_left, jump_s, clean_run;
	int pend_on;
	long pend_slot;
	double pend_delay;
	int pend_kind;
	struct synth_sample pend;
};

struct synth_fleet;

/* Hooks for the truth the simulation finds as it goes. */
struct synth_hooks {
	void	(*cevent)(void *ctx, const struct synth_dev *d,
		    const struct synth_cevent *e);
	void	(*topoff)(void *ctx, const struct synth_dev *d,
		    const struct synth_topoff *m);
	void	(*vevent)(void *ctx, const struct synth_dev *d,
		    const struct synth_vevent *e);
	void	(*ride)(void *ctx, const struct synth_dev *d,
		    const struct synth_ride *m);
	void	*ctx;
};

struct synth_fleet *synth_fleet_new(const struct synth_conf *c,
	    const struct synth_hooks *h);
void	synth_fleet_free(struct synth_fleet *f);
long	synth_fleet_ndev(const struct synth_fleet *f);
/* Device I in phase order: the order of a slot's rows in a file. */
struct synth_dev *synth_fleet_dev(struct synth_fleet *f, long i);
long	synth_fleet_rows_per_day(const struct synth_fleet *f);
/* Start local day DAY (0-based): plans every device's day. */
void	synth_fleet_day(struct synth_fleet *f, long day);
/* Take slot SLOT of the current day for device D into *S. */
void	synth_fleet_sample(struct synth_fleet *f, struct synth_dev *d,
	    long slot, struct synth_sample *s);
/* Close the truth at the end of the run (open events are emitted). */
void	synth_fleet_finish(struct synth_fleet *f);
/* Names of the charger and site of D, for the truth. */
const char *synth_dev_charger(const struct synth_dev *d);
void	synth_dev_site(const struct synth_dev *d, char buf[16]);
/*
 * D's own site into BUF and the name of its charger: with --docks the
 * home dock it hops from, else the same as the two above.
 */
const char *synth_dev_home(const struct synth_dev *d, char buf[16]);
/* The name of site SITE (0: depot); "" for -1. */
void	synth_site_name(int site, char buf[16]);

/* Writing (synthout.c). */

/* Line formats: write the row into BUF (>= SYNTH_LINEMAX), no line end. */
#define SYNTH_LINEMAX 128
/* SENTINEL: -1 none, else 0 voltage, 1 current, 2 temp, 3 soc. */
size_t	synth_fmt_a(char *buf, const struct synth_dev *d,
	    const struct synth_sample *s, cw_time t_shown, int sentinel);
size_t	synth_fmt_b(char *buf, const struct synth_dev *d,
	    const struct synth_sample *s, cw_time t_shown, long tz_s,
	    int sentinel);
extern const char synth_header_a[], synth_header_b[];
/* X scaled by 10^DEC, written with DEC decimals and decimal mark MARK. */
size_t	synth_fmt_fixed(char *buf, long x, int dec, char mark);
size_t	synth_fmt_long(char *buf, long x);
/* Local ISO 8601 time of T at offset TZ_S: 2026-01-15T07:30:00+01:00. */
size_t	synth_fmt_local(char *buf, cw_time t, long tz_s);

/* What a run wrote. */
struct synth_stats {
	unsigned long files;
	unsigned long lines;	/* per format */
	unsigned long rows;	/* samples taken */
	unsigned long long bytes;	/* uncompressed, all formats */
};

/*
 * Run the whole simulation and write every file into C->outdir.  Exits
 * with a message (cw_die) on an I/O error; returns 0.
 */
int	synth_write(const struct synth_conf *c, struct synth_stats *st);

#endif
