/*
 * dcirjoin.h: how cw-dcir joins saved device states (lib/dcirstate.c)
 * with each other, and goes on from them with new rows.
 *
 * Every state read is gathered (djoin_state()), and all of them are
 * joined when the input ends (djoin_flush()), so that files and streams
 * may come in any order: by device name, then by first row, then by line
 * in the input.  A device's first state is taken as it is; each next one
 * must begin after the last row of what its device holds (joined after
 * it) or end before its first row (joined before it).  One that shares a
 * time with it, or lies within or around it, is an error: the same rows
 * twice, or a state that falls between two joined before it.  Unlike
 * cw-wear's states (lib/wearjoin.h), no overlap is forgiven: a step's
 * detector needs the rows in one order.
 *
 * Rows that go on from a loaded state (--state) and come at or before its
 * last row are in it already: they are counted and passed over
 * (djoin_row()).
 */
#ifndef DCIRJOIN_H
#define DCIRJOIN_H

#include <stddef.h>

#include "cw.h"
#include "dcirstate.h"
#include "devtab.h"

/* A device's state in the devtab: the devent first, as devtab.h asks. */
struct djoin_dev {
	struct devent e;
	struct dstate_dev ds;	/* detector, steps, first rows */
	int loaded;		/* from a --state file, up to UPTO */
	cw_time upto;
};

/* A state read back, with its device and where it came from. */
struct djoin_piece {
	struct djoin_dev *dev;
	struct dstate_dev w;
	char src[256];
	unsigned long line;
};

struct djoin {
	const struct dstate_conf *sc;	/* the run's settings */
	struct devtab *devs;	/* of struct djoin_dev */
	unsigned long joined;	/* steps found across joins */
	unsigned long stale;	/* rows already in a loaded state */
	/* States read, not joined yet. */
	struct djoin_piece *piece;
	size_t npiece, piececap;
};

/* Where a state from FIRST to LAST goes beside one from HFIRST to HLAST. */
enum djoin_where {
	DJOIN_AFTER,		/* begins after its end */
	DJOIN_BEFORE,		/* ends before its beginning */
	DJOIN_OVERLAP		/* shares a time with it: an error */
};

/* Set up J on a new devtab of struct djoin_dev, for settings SC. */
void	djoin_init(struct djoin *j, const struct dstate_conf *sc);
/* The states gathered and not joined, the devices' states, the devtab. */
void	djoin_free(struct djoin *j);

enum djoin_where djoin_place(cw_time first, cw_time last, cw_time hfirst,
	    cw_time hlast);
/* The order states are joined in, for qsort(): device, first row, line. */
int	djoin_piece_cmp(const void *a, const void *b);

/*
 * A state read back, as dstate_read() hands it (dstate_dev_fn, CTX a
 * struct djoin): gathered for its device, its memory taken over.
 */
int	djoin_state(void *ctx, const char *src, unsigned long line,
	    const char *name, size_t len, struct dstate_dev *w);
/*
 * Join the gathered states into their devices, in the order above.
 * Returns 0, or CW_EXIT_DATA after a message "FILE:LINE: ..." for an
 * overlap (the states not joined are freed).
 */
int	djoin_flush(struct djoin *j);

/* Every device read so far goes on from its state with new rows. */
void	djoin_go_on(struct djoin *j);
/*
 * A new row at time T of device D: 0 when it is for the detector, 1 when
 * it comes at or before the last row of D's loaded state (counted in
 * J->stale, to be passed over).
 */
int	djoin_row(struct djoin *j, struct djoin_dev *d, cw_time t);

#endif
