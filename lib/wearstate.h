/*
 * wearstate.h: the text form of cw-wear device states (cw-wear --state,
 * --state-out, --merge), so that a state can be kept between runs, moved
 * between machines and joined with others (wear_join).
 *
 * A state is CSV, one row per device, keyed by device:
 *
 *	device,first,last,cw-wear-state-2,model,hysteresis,...,check
 *
 * The header row names every column; its fourth column is the name and
 * version of the format, "cw-wear-state-2", which every data row repeats
 * in its fourth column, so that rows keep their version through sort,
 * cat and a shuffle.  Then come the settings the state was made with, the
 * device's totals, its first and last rows, the rainflow state with its
 * residue (one field, points "t:x:aux" separated by ';'), the top-off
 * detector and its prefix (one field, runs of rows "t:t_last:n:v:i:soc").
 * Floating values are written with %.17g, so they read back to the same
 * bits; times as integer microseconds since the epoch (but first and
 * last, ISO 8601); NaN as an empty field.  The last field, check, is the
 * FNV-1a 64-bit hash of the row's text before it, in 16 hexadecimal
 * digits: a row cut short or altered does not match it.
 *
 * Version 2 adds top_used and top_lvl_since (the top-off detector's use
 * dips, topoff.h) and the prior (the damage before the log: prior,
 * prior_soh_pct, prior_age_s, prior_efc) after pre_judged; version 1 is
 * refused with a message, as its damage is not split by cause.
 *
 * A file of states ends with an end row, ",,,cw-wear-state-2,end,N,check",
 * N being the rows of device states before it; files joined with cat hold
 * several, and their N add up (sorted, they come first).  A file without
 * an end row, or whose rows do not add up to the end rows' N, was cut
 * short.
 *
 * Version 2 splits the damage by cause (model.h) and carries the prior
 * (struct wear_prior).  A version 1 state holds capped forms of the
 * damage from which the split cannot be recovered, so it is refused with
 * a message that says how to make it again.
 */
#ifndef WEARSTATE_H
#define WEARSTATE_H

#include <stdio.h>

#include "wear.h"

#define WSTATE_TAG	"cw-wear-state-2"

/* The settings a state is made with, by the option that sets them. */
enum {
	WSTATE_SET_MODEL = 1 << 0,
	WSTATE_SET_HYSTERESIS = 1 << 1,
	WSTATE_SET_MIN_CURRENT = 1 << 2,
	WSTATE_SET_MAX_GAP = 1 << 3,
	WSTATE_SET_LIMITS = 1 << 4,
	WSTATE_SET_FULL = 1 << 5,
	WSTATE_SET_FULL_VOLTAGE = 1 << 6,
	WSTATE_SET_MIN_DEPTH = 1 << 7
};

/* Write the header row, a device's row, the end row.  0, or -1 on a
 * write error (also left in ferror(FP)). */
int	wstate_write_header(FILE *fp);
int	wstate_write_dev(FILE *fp, const char *name, size_t namelen,
	    const struct wear_dev *d, const struct wear_conf *c);
int	wstate_write_end(FILE *fp, unsigned long rows);

/*
 * Receives each device state read: its name, where its row is, and the
 * state (set up as by wear_init() and filled in), whose memory the
 * callee takes over.  Returns 0, or an exit code to stop reading.
 */
typedef int wstate_dev_fn(void *ctx, const char *src, unsigned long line,
    const char *name, size_t namelen, struct wear_dev *d);

struct wstate_read {
	/*
	 * The run's settings.  The first state row read sets those not in
	 * FIXED (WSTATE_SET_*: given on the command line) and marks them
	 * adopted; every row must then agree with them.
	 */
	struct wear_conf *conf;
	unsigned fixed;
	int adopted;
	wstate_dev_fn *dev;
	void *ctx;
	/* Counts, over every file read. */
	unsigned long rows;	/* device rows */
	unsigned long headers;	/* header rows skipped */
	unsigned long ends;	/* end rows */
};

/*
 * Read the states in PATH ("-": standard input).  STRICT: PATH is one
 * file, or files joined with cat (sorted or not), that must hold end rows
 * and the rows they announce; otherwise (a stream, perhaps split by
 * device) end rows are only checked for their form.  Header and end rows
 * may come anywhere.  Returns 0, or CW_EXIT_DATA after a message
 * "FILE:LINE: what is wrong" (another version, a cut or corrupt row, a
 * setting that does not agree), or what R->dev returned.
 */
int	wstate_read(struct wstate_read *r, const char *path, int strict);

#endif
