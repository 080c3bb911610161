/*
 * test_glue.c: what the tools' main() functions share (lib/glue.c):
 * --merge's operands and the row helpers.  The expected rows follow
 * cellwear(7) (times in ISO 8601, an empty field for a value that is
 * not there) and the event columns of cw-thermal(1) and cw-volt(1).
 */
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "csvout.h"
#include "cw.h"
#include "devtab.h"
#include "glue.h"

#define T0 ((cw_time)1767225600 * CW_US_PER_S)	/* 2026-01-01 */

/* What read() was called with, in order. */
struct calls {
	char path[4][16];
	int whole[4];
	int n;
	int fail_at;		/* the call that fails, or -1 */
};

static int
read_one(void *ctx, const char *path, int whole)
{
	struct calls *c = ctx;

	snprintf(c->path[c->n], sizeof(c->path[0]), "%s", path);
	c->whole[c->n] = whole;
	return c->n++ == c->fail_at ? CW_EXIT_DATA : 0;
}

/*
 * A file operand is a whole state; "-" and standard input without
 * operands are whole only when the tool says so (cw-wear without
 * --partition); the first failure stops the reading.
 */
static void
test_states(void **st)
{
	char a[] = "a.csv", dash[] = "-", b[] = "b.csv";
	char *files[] = { a, dash, b };
	struct calls c;

	(void)st;
	memset(&c, 0, sizeof(c));
	c.fail_at = -1;
	assert_int_equal(glue_states(files, 3, 0, read_one, &c), 0);
	assert_int_equal(c.n, 3);
	assert_string_equal(c.path[0], "a.csv");
	assert_string_equal(c.path[1], "-");
	assert_string_equal(c.path[2], "b.csv");
	assert_int_equal(c.whole[0], 1);
	assert_int_equal(c.whole[1], 0);
	assert_int_equal(c.whole[2], 1);
	memset(&c, 0, sizeof(c));
	c.fail_at = -1;
	assert_int_equal(glue_states(files, 0, 1, read_one, &c), 0);
	assert_int_equal(c.n, 1);
	assert_string_equal(c.path[0], "-");
	assert_int_equal(c.whole[0], 1);
	memset(&c, 0, sizeof(c));
	c.fail_at = 1;
	assert_int_equal(glue_states(files, 3, 1, read_one, &c),
	    CW_EXIT_DATA);
	assert_int_equal(c.n, 2);
	assert_int_equal(c.whole[1], 1);
}

/* The rows the helpers write, to a memory stream. */
static void
test_rows(void **st)
{
	struct devtab *devs = devtab_new(sizeof(struct devent));
	struct devent *e = devtab_get(devs, "bike-3", 6, NULL);
	struct csvout w;
	char *buf = NULL;
	size_t len = 0;
	FILE *fp = open_memstream(&buf, &len);

	(void)st;
	assert_non_null(fp);
	csvout_init(&w, fp);
	/* 90 s of charge, 0.5 Ah, SoC 40 to 41.5 %. */
	glue_event(&w, e, "charge", "cool", T0, T0 + 90 * CW_US_PER_S, 4.5,
	    7.25, 0.5, 40, 41.5);
	csvout_endrow(&w);
	glue_num(&w, 1, 2.5);
	glue_num(&w, 0, 2.5);
	glue_first_last(&w, 0, T0, T0);
	glue_date(&w, 1, T0);
	csvout_endrow(&w);
	assert_int_equal(csvout_flush(&w), 0);
	csvout_free(&w);
	fclose(fp);
	assert_string_equal(buf, "bike-3,charge,cool,2026-01-01T00:00:00Z,"
	    "2026-01-01T00:01:30Z,90,4.5,7.25,0.5,40,41.5\n"
	    "2.5,,,,2026-01-01\n");
	free(buf);
	devtab_free(devs);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_states),
		cmocka_unit_test(test_rows),
	};

	cw_setprog("test_glue");
	return cmocka_run_group_tests(tests, NULL, NULL);
}
