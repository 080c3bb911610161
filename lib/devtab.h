/*
 * devtab.h: the per-device state table.  O(1) lookup by name (open
 * addressing, FNV-1a), states of a fixed size allocated in blocks and never
 * moved, so a pointer to a state stays valid.  Memory grows with devices.
 */
#ifndef DEVTAB_H
#define DEVTAB_H

#include <stddef.h>
#include "cw.h"

/* The header every state begins with; the tool's state follows it. */
struct devent {
	const char *name;
	size_t namelen;
	size_t index;		/* insertion order, from 0 */
	cw_time last_t;		/* last time seen, for order checks */
	unsigned long nrows;	/* rows seen */
	/* The device looked up after this one, the last time that was
	 * another device: devtab_get()'s first guess (a hint only). */
	struct devent *next;
};

struct devtab;

/*
 * Each state is aligned to a cache line less DEVTAB_INLINE bytes, which
 * hold its name when shorter than that (the name and the state's first
 * fields share a line).
 */
#define DEVTAB_INLINE	32
#define DEVTAB_LINE	64

#if defined(__GNUC__) || defined(__clang__)
#define DEVTAB_PREFETCH(p)	__builtin_prefetch(p)
#else
#define DEVTAB_PREFETCH(p)	((void)(p))
#endif

/*
 * Ask for the first LINES cache lines of the entry of STATE (its inline
 * name included) without waiting for them: a hint, no load.
 */
static inline void
devtab_prefetch(const void *state, int lines)
{
	const char *e = (const char *)state - DEVTAB_INLINE;

	while (lines-- > 0) {
		DEVTAB_PREFETCH(e);
		e += DEVTAB_LINE;
	}
}

/* STATESZ: size of the tool's state struct, which starts with a devent. */
struct devtab *devtab_new(size_t statesz);
/*
 * The state of NAME[0..LEN), created zeroed (but for its devent) if new;
 * *ISNEW (if not NULL) tells which.  The device of the call before and
 * the one that followed it last time are tried before the hash table.
 */
void	*devtab_get(struct devtab *t, const char *name, size_t len, int *isnew);
/* The state of NAME, or NULL. */
void	*devtab_find(struct devtab *t, const char *name, size_t len);
size_t	devtab_count(const struct devtab *t);
/* State number I in insertion order. */
void	*devtab_at(const struct devtab *t, size_t i);
/* A new array of all states sorted by name (free() it). */
void	**devtab_sorted(const struct devtab *t);
void	devtab_free(struct devtab *t);

#endif
