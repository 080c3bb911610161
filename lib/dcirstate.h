/*
 * dcirstate.h: what cw-dcir keeps of a device between runs (--state,
 * --state-out, --merge), its text form, and the join of two states of
 * one device that follow each other in time, so that night by night, or
 * pieces of a history joined, give the same steps and the same trend as
 * one pass over the whole history.
 *
 * A state is CSV, one row per device, keyed by device, in the form of
 * cw-wear's states (statefmt.h):
 *
 *	device,first,last,cw-dcir-state-1,min_step,...,check
 *
 * The fourth column, on every row, names the format and its version.
 * Then the settings the steps were found and corrected with (they must
 * be the run's), the device's counts, and four lists: the detector's
 * last samples (hist, "t:v:i:temp:soc" separated by ';', oldest first),
 * the steps per SoC bin ("bin:n:first:last"), the trend's kept points
 * ("t:r_ref:bin") and the device's first samples (pre, as hist), up to
 * DCIR_HIST_MAX, which a join runs after the earlier state's detector to
 * find the steps whose steady samples lie on both sides.  Doubles are
 * written with %.17g, times as integer microseconds (first and last, of
 * the rows, in ISO 8601), NaN as an empty field.  The last field is the
 * FNV-1a 64-bit hash of the row before it.  A file of states ends with
 * ",,,cw-dcir-state-1,end,N,check", N the device rows before it.
 */
#ifndef DCIRSTATE_H
#define DCIRSTATE_H

#include <stdio.h>

#include "dcir.h"

#define DSTATE_TAG	"cw-dcir-state-1"

/* A device as a state holds it; zeroed is a device without rows. */
struct dstate_dev {
	unsigned long rows;	/* rows fed */
	cw_time first, last;	/* times of the first and the last */
	struct dcir_dev det;	/* the step detector */
	struct dcir_series ser;	/* the trend's steps */
	unsigned npre;		/* first rows kept in PRE */
	struct dcir_pt pre[DCIR_HIST_MAX];
};

/* The settings a state holds. */
struct dstate_conf {
	const struct dcir_conf *c;
	size_t max_points;
};

/* Feed a row to D: the detector, the first rows; 1 and *OUT on a step
 * (as dcir_feed()), else 0.  The step is not added to the series. */
int	dstate_feed(struct dstate_dev *d, const struct dcir_conf *c,
	    const struct dcir_pt *s, struct dcir_counts *cnt,
	    struct dcir_step *out);
/*
 * Join B, whose rows all come after A's, into A, as if B's rows had
 * followed A's in one pass; B is freed.  Returns the steps found across
 * the boundary (added to A's series).
 */
unsigned long dstate_join(struct dstate_dev *a, struct dstate_dev *b,
	    const struct dstate_conf *sc);
void	dstate_free(struct dstate_dev *d);

int	dstate_write_header(FILE *fp, const struct dstate_conf *sc);
int	dstate_write_dev(FILE *fp, const char *name, size_t namelen,
	    const struct dstate_dev *d, const struct dstate_conf *sc);
int	dstate_write_end(FILE *fp, unsigned long rows);

/* Receives each device read; takes over D's memory.  0, or an exit code
 * to stop. */
typedef int dstate_dev_fn(void *ctx, const char *src, unsigned long line,
    const char *name, size_t namelen, struct dstate_dev *d);

struct dstate_read {
	const struct dstate_conf *sc;	/* the run's settings */
	dstate_dev_fn *dev;
	void *ctx;
	unsigned long rows, headers, ends;	/* over every file read */
};

/*
 * Read the states in PATH ("-": standard input).  STRICT: PATH must hold
 * end rows that announce its rows (a file, or files joined with cat);
 * otherwise end rows are only checked for their form.  Returns 0, or
 * CW_EXIT_DATA after a message "FILE:LINE: what is wrong" (another
 * version, a cut or corrupt row, settings other than the run's), or what
 * R->dev returned.
 */
int	dstate_read(struct dstate_read *r, const char *path, int strict);

#endif
