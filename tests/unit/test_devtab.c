/*
 * test_devtab.c: the per-device state table (lib/devtab.c).
 *
 * The contract is lib/devtab.h.  The sorted order is checked against the
 * C library's strcmp() (ISO C11 7.24.4.2: bytes compared as unsigned
 * char, a prefix sorts first), the expected order computed here
 * independently with qsort().
 */
#include <setjmp.h>
#include <stdalign.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "devtab.h"

#define NDEV 100000

struct state {
	struct devent d;
	long id;
	double acc;
	char tag[5];
};

static int cmpstr(const void *, const void *);
static void mkname(char *, size_t, long);

static int
cmpstr(const void *a, const void *b)
{
	return strcmp(*(char *const *)a, *(char *const *)b);
}

/* Names as fleets spell them, of varying length so that prefixes occur:
 * EB-7, EB-70, EB-700 ... and some with bytes above 127. */
static void
mkname(char *buf, size_t n, long i)
{
	switch (i % 4) {
	case 0:
		snprintf(buf, n, "EB-%ld", i);
		break;
	case 1:
		snprintf(buf, n, "HT-%06ld", i);
		break;
	case 2:
		snprintf(buf, n, "cart %ld/\xc3\xa9", i);
		break;
	default:
		snprintf(buf, n, "%ld", i * 7919 % 1000003);
		break;
	}
}

/* 100,000 distinct names: each created once, found again by value, its
 * state pointer unchanged by all the growth after it, its contents kept;
 * insertion order by devtab_at(), name order by devtab_sorted(). */
static void
test_many(void **st)
{
	struct devtab *t = devtab_new(sizeof(struct state));
	struct state **ptr = calloc(NDEV, sizeof(*ptr));
	char **names = calloc(NDEV, sizeof(*names));
	void **sorted;
	char buf[64];
	long i;
	int isnew;

	(void)st;
	assert_non_null(ptr);
	assert_non_null(names);
	for (i = 0; i < NDEV; i++) {
		struct state *s;

		mkname(buf, sizeof(buf), i);
		names[i] = strdup(buf);
		isnew = -1;
		s = devtab_get(t, buf, strlen(buf), &isnew);
		assert_int_equal(isnew, 1);
		/* A new state is zero but for its header. */
		assert_int_equal(s->id, 0);
		assert_true(s->acc == 0.0);
		assert_int_equal(s->d.nrows, 0);
		assert_true(s->d.last_t == INT64_MIN);
		assert_int_equal(s->d.index, (size_t)i);
		assert_int_equal(s->d.namelen, strlen(buf));
		assert_true(((uintptr_t)s % alignof(max_align_t)) == 0);
		s->id = i;
		s->acc = i * 0.5;
		s->d.nrows = (unsigned long)i + 1;
		memcpy(s->tag, "tag", 4);
		ptr[i] = s;
		/* The name is a copy: the caller's buffer may change. */
		memset(buf, '#', sizeof(buf));
		assert_string_equal(s->d.name, names[i]);
	}
	assert_int_equal(devtab_count(t), NDEV);
	for (i = NDEV - 1; i >= 0; i--) {
		size_t n = strlen(names[i]);
		struct state *s = devtab_find(t, names[i], n);

		assert_ptr_equal(s, ptr[i]);
		assert_ptr_equal(devtab_get(t, names[i], n, &isnew), ptr[i]);
		assert_int_equal(isnew, 0);
		assert_ptr_equal(devtab_at(t, (size_t)i), ptr[i]);
		assert_int_equal(s->id, i);
		assert_true(s->acc == i * 0.5);
		assert_int_equal(s->d.nrows, (unsigned long)i + 1);
		assert_string_equal(s->tag, "tag");
		assert_string_equal(s->d.name, names[i]);
	}
	/* Found only by the whole name. */
	assert_null(devtab_find(t, "EB-", 3));
	assert_null(devtab_find(t, "EB-4x", 5));
	assert_null(devtab_find(t, "EB-41", 5));	/* 41 is "HT-000041" */
	assert_ptr_equal(devtab_find(t, "EB-401", 5), ptr[40]);
	assert_int_equal(devtab_count(t), NDEV);

	sorted = devtab_sorted(t);
	qsort(names, NDEV, sizeof(*names), cmpstr);
	for (i = 0; i < NDEV; i++) {
		const struct devent *d = sorted[i];

		if (strcmp(d->name, names[i]) != 0) {
			print_error("sorted[%ld] = '%s', want '%s'\n", i,
			    d->name, names[i]);
			fail();
		}
	}
	free(sorted);
	for (i = 0; i < NDEV; i++)
		free(names[i]);
	free(names);
	free(ptr);
	devtab_free(t);
}

/* Names are byte strings of a given length: an empty name, a NUL inside,
 * a name longer than the 64 KiB name blocks. */
static void
test_odd_names(void **st)
{
	struct devtab *t = devtab_new(sizeof(struct state));
	size_t big = 100000;
	char *longname = malloc(big);
	struct state *e, *a, *anb, *l, *after;
	void **v;

	(void)st;
	assert_non_null(longname);
	memset(longname, 'L', big);
	e = devtab_get(t, "", 0, NULL);
	a = devtab_get(t, "A", 1, NULL);
	anb = devtab_get(t, "A\0B", 3, NULL);
	l = devtab_get(t, longname, big, NULL);
	after = devtab_get(t, "Z", 1, NULL);
	assert_int_equal(devtab_count(t), 5);
	assert_true(e != a && a != anb && anb != l && l != after);
	assert_ptr_equal(devtab_find(t, "", 0), e);
	assert_ptr_equal(devtab_find(t, "A", 1), a);
	assert_ptr_equal(devtab_find(t, "A\0B", 3), anb);
	assert_ptr_equal(devtab_find(t, longname, big), l);
	assert_ptr_equal(devtab_find(t, "Z", 1), after);
	assert_null(devtab_find(t, longname, big - 1));
	assert_int_equal(l->d.namelen, big);
	assert_memory_equal(l->d.name, longname, big);
	assert_int_equal(l->d.name[big], '\0');
	assert_string_equal(after->d.name, "Z");
	/* Sorted: "" < "A" < "A\0B" < "LLL..." < "Z". */
	v = devtab_sorted(t);
	assert_ptr_equal(v[0], e);
	assert_ptr_equal(v[1], a);
	assert_ptr_equal(v[2], anb);
	assert_ptr_equal(v[3], l);
	assert_ptr_equal(v[4], after);
	free(v);
	free(longname);
	devtab_free(t);
}

/* Bytes compare as unsigned: 0xC3 sorts after 'z' (strcmp, C11
 * 7.24.4). */
static void
test_unsigned_order(void **st)
{
	struct devtab *t = devtab_new(sizeof(struct devent));
	void **v;

	(void)st;
	devtab_get(t, "\xc3\xa9", 2, NULL);
	devtab_get(t, "z", 1, NULL);
	devtab_get(t, "a", 1, NULL);
	v = devtab_sorted(t);
	assert_string_equal(((struct devent *)v[0])->name, "a");
	assert_string_equal(((struct devent *)v[1])->name, "z");
	assert_string_equal(((struct devent *)v[2])->name, "\xc3\xa9");
	free(v);
	devtab_free(t);
}

/* An empty table: nothing found, an empty sorted array. */
static void
test_empty(void **st)
{
	struct devtab *t = devtab_new(0);
	void **v;

	(void)st;
	assert_int_equal(devtab_count(t), 0);
	assert_null(devtab_find(t, "x", 1));
	v = devtab_sorted(t);
	assert_non_null(v);
	free(v);
	devtab_free(t);
	devtab_free(NULL);
}

/*
 * The follower guess (devtab_get() tries the device of the call before
 * and the one that followed it last time before the hash): rows of 300
 * devices in a fixed order, then in that order with every seventh row
 * swapped with the next, then reversed, then a new device in the middle
 * of a known order.  Every call must give the state of its own name
 * (its id), ISNEW only for a name seen first, whatever the guesses
 * were; after the fixed order, each device's follower is the next one.
 */
#define NFOL 300

static struct state *
get_named(struct devtab *t, int k, int *isnew)
{
	char name[16];
	struct state *s;

	snprintf(name, sizeof(name), "F-%d", k);
	s = devtab_get(t, name, strlen(name), isnew);
	assert_non_null(s);
	assert_string_equal(s->d.name, name);
	return s;
}

static void
test_follower(void **st)
{
	struct devtab *t = devtab_new(sizeof(struct state));
	struct state *s, *ids[NFOL];
	int k, round, isnew, order[NFOL];

	(void)st;
	for (k = 0; k < NFOL; k++) {
		s = get_named(t, k, &isnew);
		assert_int_equal(isnew, 1);
		s->id = k;
		ids[k] = s;
		/* The same device twice: the call before. */
		assert_ptr_equal(get_named(t, k, &isnew), s);
		assert_int_equal(isnew, 0);
	}
	for (round = 0; round < 3; round++)
		for (k = 0; k < NFOL; k++) {
			s = get_named(t, k, &isnew);
			assert_int_equal(isnew, 0);
			assert_int_equal(s->id, k);
		}
	for (k = 0; k + 1 < NFOL; k++)
		assert_ptr_equal(ids[k]->d.next, &ids[k + 1]->d);
	/* Guesses that are wrong now and then, or always. */
	for (k = 0; k < NFOL; k++)
		order[k] = k;
	for (k = 0; k + 1 < NFOL; k += 7) {
		int x = order[k];

		order[k] = order[k + 1];
		order[k + 1] = x;
	}
	for (round = 0; round < 2; round++)
		for (k = 0; k < NFOL; k++) {
			s = get_named(t, order[k], &isnew);
			assert_int_equal(isnew, 0);
			assert_int_equal(s->id, order[k]);
		}
	for (k = NFOL - 1; k >= 0; k--) {
		s = get_named(t, k, &isnew);
		assert_int_equal(isnew, 0);
		assert_int_equal(s->id, k);
	}
	/* A new name where the guess is a known device. */
	get_named(t, 10, &isnew);
	s = get_named(t, NFOL, &isnew);
	assert_int_equal(isnew, 1);
	assert_int_equal(s->id, 0);	/* zeroed */
	s->id = NFOL;
	assert_int_equal(get_named(t, 11, &isnew)->id, 11);
	assert_int_equal(isnew, 0);
	assert_int_equal(devtab_count(t), NFOL + 1);
	devtab_free(t);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_many),
		cmocka_unit_test(test_odd_names),
		cmocka_unit_test(test_unsigned_order),
		cmocka_unit_test(test_empty),
		cmocka_unit_test(test_follower),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
