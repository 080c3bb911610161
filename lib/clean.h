/*
 * clean.h: the cleaning engine behind cw-clean.  Raw log rows are mapped
 * to fields, converted to canonical units and sign, checked, de-duplicated
 * and put back in time order per device within a bounded window, given a
 * coulomb-counted SoC if asked, then written as the sample stream at their
 * own times or resampled onto a grid.  Every data line is either accepted
 * or rejected with a reason.
 */
#ifndef CLEAN_H
#define CLEAN_H

#include <stdio.h>

#include "colmap.h"
#include "csvout.h"

enum clean_reason {
	CR_MALFORMED, CR_MISSING, CR_BADNUM, CR_BADTIME, CR_RANGE,
	CR_DUPLICATE, CR_ORDER, CR_FUTURE, CR_EMPTY, CR_NREASON
};

extern const char *const clean_reason_name[CR_NREASON];

/* --charge-sign: how the log counts charging current. */
enum {
	CLEAN_SIGN_AUTO,	/* decided per file from the data */
	CLEAN_SIGN_POSITIVE,	/* as the sample stream: positive */
	CLEAN_SIGN_NEGATIVE	/* turned */
};

/*
 * --charge-sign auto reads up to CLEAN_SIGN_ROWS data rows of each named
 * file ahead (a second open of the file; standard input is not read
 * ahead) and counts the rows whose current agrees or disagrees in sign
 * with the change of SoC since the device's previous row (of voltage,
 * where the file has no SoC).  A sign is decided when one count is at
 * least CLEAN_SIGN_MIN and CLEAN_SIGN_RATIO times the other.
 */
#define CLEAN_SIGN_ROWS		200000
#define CLEAN_SIGN_ENOUGH	2000	/* evidence rows: stop reading ahead */
#define CLEAN_SIGN_MIN		20
#define CLEAN_SIGN_RATIO	4
/* Fewer than CLEAN_SIGN_MIN, but at least this many against and none
 * or few with: not turned, but warned about (our choice, no source). */
#define CLEAN_SIGN_HINT		5

/*
 * Unit plausibility: the first CLEAN_UNIT_ROWS values of voltage, current
 * and temperature of each file, in the units assumed, are looked at as a
 * whole (medians and percentiles, not single rows), and a warning tells
 * when they only make sense in another unit (mA for A, F, K or 0.1 K for
 * C, mV for V) or as a pack of cells in series, with the option that
 * fixes it.  At least CLEAN_UNIT_MIN values are needed.
 */
#define CLEAN_UNIT_ROWS		2000
#define CLEAN_UNIT_MIN		100

/*
 * --keep: at most CLEAN_KEEP_MAX raw columns carried into the stream, each
 * value in a slot of CLEAN_KEEP_LEN bytes (a length byte, then at most
 * CLEAN_KEEP_LEN - 1 bytes of the value; a longer one is cut, with a
 * warning).
 */
#define CLEAN_KEEP_MAX	8
#define CLEAN_KEEP_LEN	64
/* --max-jump default: 7 days (common practice, no source). */
#define CLEAN_MAX_JUMP	((cw_time)7 * 86400 * CW_US_PER_S)

struct clean_conf {
	struct colmap_spec spec;
	const char *device;	/* --device NAME */
	int device_from_file;	/* --device @file */
	int charge_sign;	/* CLEAN_SIGN_, default auto */
	char delim;		/* '\0': from each file's header */
	char dec;		/* '\0': '.', or either mark when the
				 * delimiter is not ',' */
	long tz_s;		/* offset of zone-less local times */
	double lo[CM_NFIELD], hi[CM_NFIELD];	/* bounds, canonical units */
	cw_time reorder, step, max_gap;	/* step 0: no resampling */
	double sentinel[8];	/* raw values that mean "no reading" */
	int nsentinel;
	double soc_ah;		/* --soc-from-charge, 0 when off */
	double full_v;		/* full-charge voltage */
	const char *keep[CLEAN_KEEP_MAX];	/* --keep, as named */
	int nkeep;
	/*
	 * Impossible stamps (a gauge clock reset to 2100): a row after
	 * max_time (--max-time, INT64_MAX when not given) is rejected as
	 * "future"; so is a row more than max_jump (--max-jump, 0 off) past
	 * its device's newest accepted time (a device's first row: the
	 * newest of the run) unless the device's next row confirms the jump
	 * (a real gap).  Such a row is held, never accepted alone, so it
	 * cannot make the rows after it look out of order.
	 */
	cw_time max_time, max_jump;
	int growing;		/* --growing: hold a cut last line back */
};

struct clean_stats {
	unsigned long lines;	/* data lines read */
	unsigned long accepted;
	unsigned long rejected;
	unsigned long reason[CR_NREASON];
	unsigned long written;	/* sample rows written */
	unsigned long header_repeats;
	unsigned long devices;
	unsigned long keep_cut;	/* --keep values longer than a slot */
	unsigned long unended;	/* last lines without a line end, taken */
	unsigned long held;	/* the same, held back (--growing) */
};

void	clean_conf_default(struct clean_conf *c);
/*
 * Parse a --keep list COL[,COL...] into C (names point into a copy kept
 * for the run); 0, or -1 with *ERR set.
 */
int	clean_keep_parse(struct clean_conf *c, const char *list,
	    const char **err);
/*
 * Clean FILES[0..N) (stdin when N is 0) to OUT; rejected lines to REJ
 * (may be NULL).  Returns 0 or an exit code (input error, reported).
 */
int	clean_run(const struct clean_conf *c, char **files, int n,
	    struct csvout *out, struct csvout *rej, struct clean_stats *st);

#endif
