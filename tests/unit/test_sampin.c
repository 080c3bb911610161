/*
 * test_sampin.c: the sample stream reader (lib/sampin.c).
 *
 * The contract is cellwear(7), "The sample stream" and "Common to every
 * tool": columns found by header name in any order, unknown columns
 * ignored, time in ISO 8601 UTC or epoch seconds, any empty field a
 * missing value, time must not decrease within a device (rows that do are
 * skipped and counted), a required column missing is a data error (exit
 * 1) naming the file and line.  Expected times are POSIX epoch seconds
 * checked with GNU date (date -u -d 2026-03-01T00:01:00Z +%s =
 * 1772323260).
 */
#include <fcntl.h>
#include <math.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <cmocka.h>

#include "cw.h"
#include "devtab.h"
#include "sampin.h"

#define T0 (1772323260LL * CW_US_PER_S)	/* 2026-03-01T00:01:00Z */

struct dev {
	struct devent d;
	int rows;
};

struct got {
	int n, stop_at;
	char name[64][16];
	struct cw_sample s[64];
	struct dev *dev[64];
};

static char tmpdir[] = "/tmp/test_sampin.XXXXXX";
static int saved_stderr = -1;
static char errpath[300];

static const char *put(const char *, const char *);
static int on_row(void *, void *, const struct cw_sample *);
static int run(const char *, unsigned, unsigned, const char *, struct got *,
    struct sampin_stats *, struct devtab **, char **);
static void err_begin(void);
static char *err_end(void);

static const char *
put(const char *name, const char *text)
{
	static char p[4][300];
	static int k;
	char *s = p[k++ % 4];
	FILE *fp;

	snprintf(s, 300, "%s/%s", tmpdir, name);
	fp = fopen(s, "wb");
	assert_non_null(fp);
	fputs(text, fp);
	assert_int_equal(fclose(fp), 0);
	return s;
}

static int
on_row(void *ctx, void *devp, const struct cw_sample *s)
{
	struct got *g = ctx;
	struct dev *d = devp;

	assert_true(g->n < 64);
	snprintf(g->name[g->n], sizeof(g->name[0]), "%s", d->d.name);
	g->s[g->n] = *s;
	g->dev[g->n] = d;
	d->rows++;
	g->n++;
	return g->n == g->stop_at ? 5 : 0;
}

/*
 * Read TEXT with NEED / NEED_ANY / EXTRA; samples in G, counts in ST,
 * stderr in *ERR.  Returns sampin_run()'s value.  The devtab is left in
 * *DT (freed by the caller).
 */
static int
run(const char *text, unsigned need, unsigned need_any, const char *extra,
    struct got *g, struct sampin_stats *st, struct devtab **dt, char **err)
{
	struct sampin_conf c;
	char *files[1];
	int rc;

	memset(&c, 0, sizeof(c));
	c.extra = extra;
	c.need = need;
	c.need_any = need_any;
	c.row = on_row;
	c.ctx = g;
	c.devs = *dt = devtab_new(sizeof(struct dev));
	files[0] = (char *)put("s.csv", text);
	err_begin();
	rc = sampin_run(&c, files, 1, st);
	*err = err_end();
	return rc;
}

static void
err_begin(void)
{
	int fd;

	fflush(stderr);
	saved_stderr = dup(2);
	snprintf(errpath, sizeof(errpath), "%s/stderr", tmpdir);
	fd = open(errpath, O_WRONLY | O_CREAT | O_TRUNC, 0600);
	assert_true(fd >= 0);
	dup2(fd, 2);
	close(fd);
}

static char *
err_end(void)
{
	static char buf[8192];
	FILE *fp;
	size_t n;

	fflush(stderr);
	dup2(saved_stderr, 2);
	close(saved_stderr);
	fp = fopen(errpath, "rb");
	assert_non_null(fp);
	n = fread(buf, 1, sizeof(buf) - 1, fp);
	buf[n] = '\0';
	fclose(fp);
	return buf;
}

static int
setup(void **st)
{
	(void)st;
	cw_setprog("test_sampin");
	return mkdtemp(tmpdir) != NULL ? 0 : -1;
}

static int
teardown(void **st)
{
	char cmd[400];

	(void)st;
	snprintf(cmd, sizeof(cmd), "rm -rf '%s'", tmpdir);
	return system(cmd) == 0 ? 0 : -1;
}

#define NEED (SAMP_BIT(SAMP_DEVICE) | SAMP_BIT(SAMP_TIME) | \
	SAMP_BIT(SAMP_CURRENT))

/* cellwear(7)'s own example row, with the columns shuffled and two unknown
 * ones among them. */
static void
test_any_order(void **st)
{
	struct got g = { 0 };
	struct sampin_stats s;
	struct devtab *dt;
	char *err;

	(void)st;
	assert_int_equal(run(
	    "soc_pct,note,time,current_a,device,temp_c,voltage_v,x\n"
	    "83.5,hello,2026-03-01T00:01:00Z,-2.35,EB-0042,11.4,39.812,9\n"
	    "84,\"a,b\",1772323320,1.5,EB-0042,11.5,39.9,9\n",
	    NEED, 0, NULL, &g, &s, &dt, &err), 0);
	assert_string_equal(err, "");
	assert_int_equal(g.n, 2);
	assert_string_equal(g.name[0], "EB-0042");
	assert_int_equal(g.s[0].t, T0);
	assert_true(g.s[0].v == 39.812);
	assert_true(g.s[0].i == -2.35);
	assert_true(g.s[0].temp == 11.4);
	assert_true(g.s[0].soc == 83.5);
	assert_true(isnan(g.s[0].x));	/* no extra column asked for */
	assert_int_equal(g.s[0].line, 2);
	assert_non_null(strstr(g.s[0].src, "s.csv"));
	/* Epoch seconds in the time column (cellwear(7)). */
	assert_int_equal(g.s[1].t, T0 + 60 * CW_US_PER_S);
	assert_true(g.s[1].i == 1.5);
	assert_int_equal(g.s[1].line, 3);
	assert_ptr_equal(g.dev[0], g.dev[1]);
	assert_int_equal(g.dev[0]->d.nrows, 2);
	assert_int_equal(g.dev[0]->d.last_t, T0 + 60 * CW_US_PER_S);
	assert_int_equal(s.rows, 2);
	assert_int_equal(s.used, 2);
	assert_int_equal(s.skipped, 0);
	devtab_free(dt);
}

/* A required column missing: CW_EXIT_DATA, "FILE:1: no column ...". */
static void
test_missing_column(void **st)
{
	struct got g = { 0 };
	struct sampin_stats s;
	struct devtab *dt;
	char *err;
	char want[400];

	(void)st;
	assert_int_equal(run("device,time,voltage_v\nA,0,3.7\n", NEED, 0, NULL,
	    &g, &s, &dt, &err), CW_EXIT_DATA);
	snprintf(want, sizeof(want), "test_sampin: %s/s.csv:1: no column "
	    "'current_a' in the header\n", tmpdir);
	assert_string_equal(err, want);
	assert_int_equal(g.n, 0);
	devtab_free(dt);

	/* need_any: at least one of soc_pct or the extra column. */
	memset(&g, 0, sizeof(g));
	assert_int_equal(run("device,time,current_a\nA,0,1\n", NEED,
	    SAMP_BIT(SAMP_SOC) | SAMP_BIT(SAMP_EXTRA), "charge_ah", &g, &s,
	    &dt, &err), CW_EXIT_DATA);
	snprintf(want, sizeof(want), "test_sampin: %s/s.csv:1: the header has "
	    "no column soc_pct or charge_ah\n", tmpdir);
	assert_string_equal(err, want);
	devtab_free(dt);

	/* ...and with one of them present it reads. */
	memset(&g, 0, sizeof(g));
	assert_int_equal(run("charge_ah,device,time,current_a\n0.25,A,0,1\n",
	    NEED, SAMP_BIT(SAMP_SOC) | SAMP_BIT(SAMP_EXTRA), "charge_ah", &g,
	    &s, &dt, &err), 0);
	assert_int_equal(g.n, 1);
	assert_true(g.s[0].x == 0.25);
	assert_true(isnan(g.s[0].soc));
	devtab_free(dt);
}

/* Time going back within a device: skipped, counted, reported; equal
 * times pass; other devices keep their own clocks. */
static void
test_time_back(void **st)
{
	struct got g = { 0 };
	struct sampin_stats s;
	struct devtab *dt;
	char *err, want[400];

	(void)st;
	assert_int_equal(run(
	    "device,time,current_a\n"
	    "A,2026-03-01T00:01:00Z,1\n"
	    "B,2026-03-01T00:00:00Z,1\n"
	    "A,2026-03-01T00:02:00Z,1\n"
	    "A,2026-03-01T00:01:30Z,1\n"
	    "B,2026-03-01T00:00:30Z,1\n"
	    "A,2026-03-01T00:02:00Z,2\n"
	    "A,2026-03-01T00:03:00Z,3\n",
	    NEED, 0, NULL, &g, &s, &dt, &err), 0);
	assert_int_equal(g.n, 6);
	assert_string_equal(g.name[2], "A");
	assert_int_equal(g.s[2].t, T0 + 60 * CW_US_PER_S);
	assert_string_equal(g.name[3], "B");
	assert_true(g.s[4].i == 2);	/* the equal time */
	assert_true(g.s[5].i == 3);
	assert_int_equal(s.rows, 7);
	assert_int_equal(s.used, 6);
	assert_int_equal(s.skipped, 1);
	assert_int_equal(s.rows, s.used + s.skipped);
	snprintf(want, sizeof(want), "test_sampin: %s/s.csv:5: time goes back "
	    "for A (2026-03-01T00:01:30Z after 2026-03-01T00:02:00Z; clean "
	    "the stream with cw-clean); row skipped\n", tmpdir);
	assert_string_equal(err, want);
	assert_int_equal(((struct dev *)devtab_find(dt, "A", 1))->d.nrows, 4);
	devtab_free(dt);
}

/* Empty fields are missing values, other non-numbers invalid: both NaN,
 * counted per column; a bad time or no device skips the row; a short row
 * has its absent fields missing. */
static void
test_values(void **st)
{
	struct got g = { 0 };
	struct sampin_stats s;
	struct devtab *dt;
	char *err;

	(void)st;
	assert_int_equal(run(
	    "device,time,voltage_v,current_a,temp_c,soc_pct\n"
	    "A,0,,1,abc,50\n"
	    "A,1,3.7,nan,0x10,\n"
	    "A,yesterday,3.7,1,20,50\n"
	    ",3,3.7,1,20,50\n"
	    "A,4,3.8\n"
	    "A,\"5\",\" 3.9 \",inf,1e999,100\n"
	    "A,2026-02-30T00:00:00Z,3.7,1,20,50\n",
	    NEED, 0, NULL, &g, &s, &dt, &err), 0);
	assert_int_equal(g.n, 4);
	assert_true(isnan(g.s[0].v) && g.s[0].i == 1 && isnan(g.s[0].temp) &&
	    g.s[0].soc == 50);
	assert_true(g.s[1].v == 3.7 && isnan(g.s[1].i) && isnan(g.s[1].temp) &&
	    isnan(g.s[1].soc));
	assert_int_equal(g.s[2].t, 4 * CW_US_PER_S);
	assert_true(g.s[2].v == 3.8 && isnan(g.s[2].i) && isnan(g.s[2].soc));
	assert_int_equal(g.s[3].t, 5 * CW_US_PER_S);
	assert_true(g.s[3].v == 3.9 && isnan(g.s[3].i) && isnan(g.s[3].temp));
	assert_int_equal(s.rows, 7);
	assert_int_equal(s.used, 4);
	assert_int_equal(s.skipped, 3);
	assert_int_equal(s.missing[SAMP_VOLTAGE], 1);
	assert_int_equal(s.missing[SAMP_SOC], 2);
	assert_int_equal(s.missing[SAMP_CURRENT], 1);
	assert_int_equal(s.missing[SAMP_TEMP], 1);
	assert_int_equal(s.invalid[SAMP_CURRENT], 2);
	assert_int_equal(s.invalid[SAMP_TEMP], 3);
	assert_int_equal(s.invalid[SAMP_TIME], 2);
	assert_int_equal(s.missing[SAMP_DEVICE], 1);
	assert_non_null(strstr(err, "s.csv:4: bad time 'yesterday'; row "
	    "skipped\n"));
	assert_non_null(strstr(err, "s.csv:5: no device; row skipped\n"));
	assert_non_null(strstr(err, "s.csv:8: bad time "
	    "'2026-02-30T00:00:00Z'; row skipped\n"));
	devtab_free(dt);
}

/* A record the CSV reader cannot parse is a skipped row too, so the
 * counts still add up; after ten reports, skips are only counted and a
 * total is printed at the end. */
static void
test_bad_and_many(void **st)
{
	struct got g = { 0 };
	struct sampin_stats s;
	struct devtab *dt;
	char *err, text[4096], *p = text, *q;
	int k, lines = 0;

	(void)st;
	p += sprintf(p, "device,time,current_a\nA,1,1\nA,2,\"x\"y\n");
	for (k = 0; k < 14; k++)
		p += sprintf(p, "A,%d,1\n", -k);	/* all go back */
	sprintf(p, "A,9,1\n");
	assert_int_equal(run(text, NEED, 0, NULL, &g, &s, &dt, &err), 0);
	assert_int_equal(g.n, 2);
	assert_int_equal(s.rows, 17);
	assert_int_equal(s.skipped, 15);
	assert_int_equal(s.rows, s.used + s.skipped);
	assert_non_null(strstr(err, "s.csv:3: malformed quoting; row "
	    "skipped\n"));
	for (q = err; (q = strchr(q, '\n')) != NULL; q++)
		lines++;
	assert_int_equal(lines, 11);
	assert_non_null(strstr(err, "(further skips only counted)\n"));
	assert_non_null(strstr(err, "test_sampin: 15 rows skipped in all\n"));
	devtab_free(dt);
}

/* The tool's non-zero return stops the reading and comes back. */
static void
test_stop(void **st)
{
	struct got g = { 0 };
	struct sampin_stats s;
	struct devtab *dt;
	char *err;

	(void)st;
	g.stop_at = 2;
	assert_int_equal(run("device,time,current_a\nA,1,1\nA,2,1\nA,3,1\n",
	    NEED, 0, NULL, &g, &s, &dt, &err), 5);
	assert_int_equal(g.n, 2);
	devtab_free(dt);
}

/* Without a device column (not required), every row is one device "". */
static void
test_no_device_column(void **st)
{
	struct got g = { 0 };
	struct sampin_stats s;
	struct devtab *dt;
	char *err;

	(void)st;
	assert_int_equal(run("time,current_a\n1,1\n2,1\n",
	    SAMP_BIT(SAMP_TIME), 0, NULL, &g, &s, &dt, &err), 0);
	assert_int_equal(g.n, 2);
	assert_int_equal(devtab_count(dt), 1);
	assert_string_equal(g.name[0], "");
	devtab_free(dt);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_any_order),
		cmocka_unit_test(test_missing_column),
		cmocka_unit_test(test_time_back),
		cmocka_unit_test(test_values),
		cmocka_unit_test(test_bad_and_many),
		cmocka_unit_test(test_stop),
		cmocka_unit_test(test_no_device_column),
	};

	return cmocka_run_group_tests(tests, setup, teardown);
}
