/*
 * wearjoin.h: how cw-wear joins saved device states (lib/wearstate.c)
 * with each other and with new rows.
 *
 * States of one device that come one after the other (a stream sorted or
 * grouped by device, such as a reducer's input, in which a device's states
 * may come in any time order) are gathered, then joined in time order,
 * by first row, then last row, then line, when another device comes or the
 * input ends.  Each must come after or before what its device holds
 * (wjoin_place()); one that overlaps it by a little at one end (a clock
 * that went back across the boundary of two files) is joined all the
 * same and counted; any other overlap (the same rows twice, or a state
 * that falls between two joined before it) is an error.
 *
 * Rows that go on from a loaded state (--state) and come at or before its
 * end are judged at the end of the input (wjoin_stale_check()): the same
 * rows again when its last row is among them; a clock gone back when they
 * are within --max-gap of the end and newer rows follow; otherwise a day
 * that came late, which is an error.
 */
#ifndef WEARJOIN_H
#define WEARJOIN_H

#include "cw.h"
#include "devtab.h"
#include "wear.h"

#define WJOIN_MAXWARN	10	/* messages of one kind, then only a count */

/* A device's state in the devtab: the devent first, as devtab.h asks. */
struct wjoin_dev {
	struct devent e;
	int started;
	int loaded;		/* from a --state file, up to UPTO */
	int past;		/* a row after UPTO came */
	int seen_end;		/* a row at UPTO came: the state's last */
	cw_time upto;
	cw_time stale_first, stale_last;	/* rows up to UPTO */
	unsigned long nstale;
	struct wear_dev w;
};

/* A state read back, with where it came from. */
struct wjoin_piece {
	struct wear_dev w;
	unsigned long line;
	char src[256];
};

struct wjoin {
	const struct wear_conf *conf;
	struct devtab *devs;	/* of struct wjoin_dev */
	unsigned long joins;	/* states joined after or before another */
	unsigned long straddles;	/* states overlapping by a little */
	unsigned long stale;	/* rows already in a loaded state */
	unsigned long stale_devs;
	/* States read for RUN_DEV, not joined yet. */
	struct wjoin_dev *run_dev;
	struct wjoin_piece *piece;
	size_t npiece, piececap;
};

/* Where a state from FIRST to LAST goes beside one from HFIRST to HLAST. */
enum wjoin_where {
	WJOIN_AFTER,		/* begins at or after its end */
	WJOIN_BEFORE,		/* ends at or before its beginning */
	WJOIN_ENDS,		/* begins before its end, ends after it */
	WJOIN_BEGINS,		/* begins before it, ends before its end */
	WJOIN_OVERLAP		/* within it, or around it: an error */
};

/* How the rows of a device at or before the end of its loaded state
 * stand (wjoin_stale_check()). */
enum wjoin_stale {
	WJOIN_FRESH,		/* no such rows */
	WJOIN_AGAIN,		/* its last row among them: already in it */
	WJOIN_BACK,		/* within --max-gap, newer rows after them */
	WJOIN_LATE		/* rows the state does not hold */
};

/* Set up J on a new devtab of struct wjoin_dev, for settings C. */
void	wjoin_init(struct wjoin *j, const struct wear_conf *c);
/* The gathered states' memory (not the devices' states) and the devtab. */
void	wjoin_free(struct wjoin *j);

enum wjoin_where wjoin_place(cw_time first, cw_time last, cw_time hfirst,
	    cw_time hlast);
/* The order states of one device are joined in, for qsort(). */
int	wjoin_piece_cmp(const void *a, const void *b);

/*
 * A state read back, as wstate_read() hands it (wstate_dev_fn, CTX a
 * struct wjoin): gathered for its device; the states gathered for the
 * device before are joined first when it is another.
 */
int	wjoin_state(void *ctx, const char *src, unsigned long line,
	    const char *name, size_t len, struct wear_dev *w);
/*
 * Join the gathered states into their device, in time order.  Returns
 * 0, or CW_EXIT_DATA after a message for an overlap (the states not
 * joined are freed).
 */
int	wjoin_flush(struct wjoin *j);

/* Every device read so far goes on from its state with new rows. */
void	wjoin_go_on(struct wjoin *j);
/*
 * A new row at time T of device D: 0 when it is for the model, 1 when it
 * comes at or before the end of D's loaded state (counted, judged by
 * wjoin_stale_check()).  Starts D's state on its first row.
 */
int	wjoin_row(struct wjoin *j, struct wjoin_dev *d, cw_time t);
/* How D's rows at or before its state's end stand, for MAX_GAP. */
enum wjoin_stale wjoin_stale_of(const struct wjoin_dev *d, cw_time max_gap);
/*
 * After the rows: tell how the devices' rows at or before the end of
 * their state STATE (a path, for messages) stood; exits 1, nothing
 * written, when some came late.
 */
void	wjoin_stale_check(struct wjoin *j, const char *state);

#endif
