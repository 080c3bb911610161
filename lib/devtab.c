/*
 * devtab.c: device name -> state, open addressing with linear probing and
 * FNV-1a hashes, kept at most half full.  States live in blocks that never
 * move; names live in an arena of blocks.
 *
 * Laid out for a row stream that cycles through thousands of devices,
 * where every lookup misses the cache: a slot holds the hash and the
 * state number side by side (one line per probe), and each entry is
 * aligned to a cache line with a name of up to DEVTAB_INLINE - 1 bytes
 * stored in front of its state, so that the name compared and the
 * state's first fields share one line.
 *
 * The first blocks are small and double (DEVTAB_FIRST entries, again as
 * many, then twice that, ... up to DEVTAB_BLOCK), so that a table of a
 * few devices costs a few entries, not DEVTAB_BLOCK of them; from entry
 * DEVTAB_BLOCK on every block holds DEVTAB_BLOCK.
 *
 * Such a stream also repeats its devices in much the same order (a log
 * merged by time, a cleaned stream on a grid): each entry keeps the
 * device asked for after it last time (devent.next), and devtab_get()
 * tries the device of the call before, then that one's follower, before
 * hashing the name: the hash slot is then not touched, one cache miss
 * less a row.  A wrong guess costs a name comparison, never a wrong
 * state.  (Prefetching the follower's state as well made no difference
 * that could be measured for cw-wear: BENCHMARKS.md.)
 */
#include <stdint.h>
#include <stdlib.h>
#include <string.h>

#include "devtab.h"

#define DEVTAB_BLOG 8		/* log2 of DEVTAB_BLOCK */
#define DEVTAB_BLOCK (1 << DEVTAB_BLOG)	/* states per block from entry
					   DEVTAB_BLOCK on */
#define DEVTAB_FIRSTLG 3	/* log2 of DEVTAB_FIRST */
#define DEVTAB_FIRST (1 << DEVTAB_FIRSTLG)	/* states in the first block */
/* Blocks before entry DEVTAB_BLOCK: the first and its doublings. */
#define DEVTAB_NSMALL (1 + DEVTAB_BLOG - DEVTAB_FIRSTLG)
#define DEVTAB_NAMEBLK 65536	/* bytes per name block */
#define DEVTAB_SLOT0 32		/* hash slots in the table itself */

/* A hash slot: state number + 1 (0 is empty) and the name's hash. */
struct dslot {
	uint32_t idx;
	uint32_t hash;
};

struct devtab {
	size_t statesz;		/* the tool's state, rounded up */
	size_t stride;		/* an entry: inline name, then the state */
	size_t count;
	struct dslot *slot;	/* slot0 until the first grow() */
	size_t nslot;
	/* States: blocks of DEVTAB_FIRST, doubling to DEVTAB_BLOCK. */
	char **blocks;		/* blk0 until it is full */
	size_t nblocks, blockcap;
	/* Names. */
	char **nameblk;
	size_t nnameblk, nameused;
	struct devent *last;	/* the state devtab_get() returned last */
	/* A small table needs no allocation but this one and its blocks. */
	char *blk0[DEVTAB_NSMALL];
	struct dslot slot0[DEVTAB_SLOT0];
};

static uint32_t fnv1a(const char *, size_t);
static void grow(struct devtab *);
static const char *keep_name(struct devtab *, const char *, size_t);
static char *block_new(const struct devtab *, size_t);
static size_t block_of(size_t, size_t *);
static void grow_blocks(struct devtab *);
static struct devent *lookup(struct devtab *, const char *, size_t, int *);

/* Room for twice as many block pointers (blk0 is left as it is). */
static void
grow_blocks(struct devtab *t)
{
	char **b;

	if (t->blocks == t->blk0) {
		b = cw_malloc(2 * t->blockcap * sizeof(*b));
		memcpy(b, t->blk0, t->nblocks * sizeof(*b));
	} else
		b = cw_realloc(t->blocks, 2 * t->blockcap * sizeof(*b));
	t->blocks = b;
	t->blockcap *= 2;
}

/* A block of N entries, aligned to a cache line. */
static char *
block_new(const struct devtab *t, size_t n)
{
	void *p;

	if (posix_memalign(&p, DEVTAB_LINE, n * t->stride) != 0)
		cw_die(CW_EXIT_DATA, "out of memory");
	return p;
}

/*
 * The block that holds entry I; its place in the block goes to *OFF.
 * Block 0 holds entries [0, DEVTAB_FIRST), block B below DEVTAB_NSMALL
 * [2^(B+FIRSTLG-1), 2^(B+FIRSTLG)), the others DEVTAB_BLOCK each.
 */
static inline size_t
block_of(size_t i, size_t *off)
{
	unsigned lg;

	if (i >= DEVTAB_BLOCK) {
		*off = i % DEVTAB_BLOCK;
		return DEVTAB_NSMALL - 1 + i / DEVTAB_BLOCK;
	}
	if (i < DEVTAB_FIRST) {
		*off = i;
		return 0;
	}
	for (lg = DEVTAB_FIRSTLG; (i >> (lg + 1)) != 0; lg++)
		;
	*off = i - ((size_t)1 << lg);
	return lg - DEVTAB_FIRSTLG + 1;
}

static uint32_t
fnv1a(const char *s, size_t n)
{
	uint32_t h = 2166136261u;
	size_t i;

	for (i = 0; i < n; i++) {
		h ^= (unsigned char)s[i];
		h *= 16777619u;
	}
	return h;
}

struct devtab *
devtab_new(size_t statesz)
{
	struct devtab *t = cw_calloc(1, sizeof(*t));

	if (statesz < sizeof(struct devent))
		statesz = sizeof(struct devent);
	/* Keep every state aligned for any member type. */
	t->statesz = (statesz + 15) & ~(size_t)15;
	t->stride = (DEVTAB_INLINE + t->statesz + DEVTAB_LINE - 1) &
	    ~(size_t)(DEVTAB_LINE - 1);
	t->nslot = DEVTAB_SLOT0;
	t->slot = t->slot0;
	t->blocks = t->blk0;
	t->blockcap = DEVTAB_NSMALL;
	return t;
}

void *
devtab_at(const struct devtab *t, size_t i)
{
	size_t off, b = block_of(i, &off);

	return t->blocks[b] + off * t->stride + DEVTAB_INLINE;
}

size_t
devtab_count(const struct devtab *t)
{
	return t->count;
}

static void
grow(struct devtab *t)
{
	size_t n = t->nslot * 2, i, j;
	struct dslot *slot = cw_calloc(n, sizeof(*slot));

	for (i = 0; i < t->nslot; i++) {
		if (t->slot[i].idx == 0)
			continue;
		for (j = t->slot[i].hash & (n - 1); slot[j].idx != 0;
		    j = (j + 1) & (n - 1))
			;
		slot[j] = t->slot[i];
	}
	if (t->slot != t->slot0)
		free(t->slot);
	t->slot = slot;
	t->nslot = n;
}

static const char *
keep_name(struct devtab *t, const char *s, size_t n)
{
	char *p;

	if (n + 1 > DEVTAB_NAMEBLK) {
		/* A very long name gets a block of its own. */
		t->nameblk = cw_realloc(t->nameblk, (t->nnameblk + 1) *
		    sizeof(*t->nameblk));
		p = cw_malloc(n + 1);
		/* Put it before the current block so that stays current. */
		if (t->nnameblk > 0) {
			t->nameblk[t->nnameblk] = t->nameblk[t->nnameblk - 1];
			t->nameblk[t->nnameblk - 1] = p;
		} else {
			t->nameblk[0] = p;
			t->nameused = DEVTAB_NAMEBLK;
		}
		t->nnameblk++;
	} else {
		if (t->nnameblk == 0 || t->nameused + n + 1 > DEVTAB_NAMEBLK) {
			t->nameblk = cw_realloc(t->nameblk, (t->nnameblk + 1) *
			    sizeof(*t->nameblk));
			t->nameblk[t->nnameblk++] = cw_malloc(DEVTAB_NAMEBLK);
			t->nameused = 0;
		}
		p = t->nameblk[t->nnameblk - 1] + t->nameused;
		t->nameused += n + 1;
	}
	memcpy(p, s, n);
	p[n] = '\0';
	return p;
}

static inline int
same_name(const struct devent *d, const char *name, size_t len)
{
	return d->namelen == len && memcmp(d->name, name, len) == 0;
}

void *
devtab_find(struct devtab *t, const char *name, size_t len)
{
	uint32_t h = fnv1a(name, len);
	size_t j;

	for (j = h & (t->nslot - 1); t->slot[j].idx != 0; j = (j + 1) &
	    (t->nslot - 1)) {
		struct devent *d;

		if (t->slot[j].hash != h)
			continue;
		d = devtab_at(t, t->slot[j].idx - 1);
		if (same_name(d, name, len))
			return d;
	}
	return NULL;
}

void *
devtab_get(struct devtab *t, const char *name, size_t len, int *isnew)
{
	struct devent *d = t->last;

	if (isnew != NULL)
		*isnew = 0;
	if (d != NULL && same_name(d, name, len))
		return d;
	if (d != NULL && d->next != NULL && same_name(d->next, name, len))
		d = d->next;
	else {
		d = lookup(t, name, len, isnew);
		if (t->last != NULL)
			t->last->next = d;
	}
	t->last = d;
	return d;
}

/* The hash table's part of devtab_get(). */
static struct devent *
lookup(struct devtab *t, const char *name, size_t len, int *isnew)
{
	uint32_t h = fnv1a(name, len);
	struct devent *d;
	size_t j;

	for (j = h & (t->nslot - 1); t->slot[j].idx != 0; j = (j + 1) &
	    (t->nslot - 1)) {
		if (t->slot[j].hash != h)
			continue;
		d = devtab_at(t, t->slot[j].idx - 1);
		if (same_name(d, name, len))
			return d;
	}
	if (t->count >= UINT32_MAX - 1)
		cw_die(CW_EXIT_DATA, "more than %lu devices",
		    (unsigned long)UINT32_MAX - 2);
	if (t->count == 0 || (t->count >= DEVTAB_FIRST && (t->count &
	    (t->count - 1)) == 0) || t->count % DEVTAB_BLOCK == 0) {
		/* Entry COUNT starts a block: as large as the entries so far
		 * (DEVTAB_FIRST for the first), at most DEVTAB_BLOCK. */
		size_t n = t->count < DEVTAB_FIRST ? DEVTAB_FIRST :
		    t->count < DEVTAB_BLOCK ? t->count : DEVTAB_BLOCK;

		if (t->nblocks == t->blockcap)
			grow_blocks(t);
		t->blocks[t->nblocks++] = block_new(t, n);
	}
	d = devtab_at(t, t->count);
	/* The inline name and the state; the padding to the line's end is
	 * never read. */
	memset((char *)d - DEVTAB_INLINE, 0, DEVTAB_INLINE + t->statesz);
	if (len < DEVTAB_INLINE) {
		char *p = (char *)d - DEVTAB_INLINE;

		memcpy(p, name, len);
		d->name = p;
	} else
		d->name = keep_name(t, name, len);
	d->namelen = len;
	d->index = t->count;
	d->last_t = INT64_MIN;
	t->slot[j].idx = (uint32_t)++t->count;
	t->slot[j].hash = h;
	if (2 * t->count > t->nslot)
		grow(t);
	if (isnew != NULL)
		*isnew = 1;
	return d;
}

static int
byname(const void *a, const void *b)
{
	const struct devent *x = *(void *const *)a, *y = *(void *const *)b;
	size_t n = x->namelen < y->namelen ? x->namelen : y->namelen;
	int c = memcmp(x->name, y->name, n);

	if (c != 0)
		return c;
	return x->namelen < y->namelen ? -1 : x->namelen > y->namelen;
}

void **
devtab_sorted(const struct devtab *t)
{
	void **v = cw_malloc((t->count + 1) * sizeof(*v));
	size_t i;

	for (i = 0; i < t->count; i++)
		v[i] = devtab_at(t, i);
	qsort(v, t->count, sizeof(*v), byname);
	return v;
}

void
devtab_free(struct devtab *t)
{
	size_t i;

	if (t == NULL)
		return;
	for (i = 0; i < t->nblocks; i++)
		free(t->blocks[i]);
	for (i = 0; i < t->nnameblk; i++)
		free(t->nameblk[i]);
	if (t->blocks != t->blk0)
		free(t->blocks);
	free(t->nameblk);
	if (t->slot != t->slot0)
		free(t->slot);
	free(t);
}
