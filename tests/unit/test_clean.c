/*
 * test_clean.c: the cleaning engine (lib/clean.h) on small raw logs
 * written here.  The expected streams follow cw-clean(1) and cellwear(7):
 * units converted (mV to V, mA to A, deci-kelvin to C: T = dK / 10 -
 * 273.15), charging positive, rows late within the reorder window put
 * back in order and later ones rejected, duplicates and out-of-range
 * values rejected with their reason, and every data line either accepted
 * or rejected.
 */
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <cmocka.h>

#include "clean.h"
#include "csvout.h"
#include "cw.h"

struct run {
	char path[64];
	char *out, *rej;
	size_t nout, nrej;
	struct clean_stats st;
	int rc;
};

/* Clean the raw log TEXT with C into R's output and rejects. */
static void
run_clean(struct run *r, const struct clean_conf *c, const char *text)
{
	FILE *fo, *fr, *fp;
	struct csvout out, rej;
	char *files[1];
	int fd;

	memset(r, 0, sizeof(*r));
	snprintf(r->path, sizeof(r->path), "/tmp/test_clean.XXXXXX");
	fd = mkstemp(r->path);
	assert_true(fd >= 0);
	fp = fdopen(fd, "w");
	assert_non_null(fp);
	fputs(text, fp);
	assert_int_equal(fclose(fp), 0);
	fo = open_memstream(&r->out, &r->nout);
	fr = open_memstream(&r->rej, &r->nrej);
	assert_non_null(fo);
	assert_non_null(fr);
	csvout_init(&out, fo);
	csvout_init(&rej, fr);
	files[0] = r->path;
	r->rc = clean_run(c, files, 1, &out, &rej, &r->st);
	assert_int_equal(csvout_flush(&out), 0);
	assert_int_equal(csvout_flush(&rej), 0);
	csvout_free(&out);
	csvout_free(&rej);
	fclose(fo);
	fclose(fr);
	unlink(r->path);
	/* Every data line is accounted for. */
	assert_int_equal(r->st.lines, r->st.accepted + r->st.rejected);
}

static void
run_free(struct run *r)
{
	free(r->out);
	free(r->rej);
}

/* The data rows of the output, header removed. */
static const char *
body(const struct run *r)
{
	const char *nl = strchr(r->out, '\n');

	assert_non_null(nl);
	return nl + 1;
}

/*
 * Makers' units: epoch ms, mV, mA counted positive on discharge, 0.1 K,
 * SoC as a fraction.  2981.5 dK is 25.0 C; -1500 mA discharging is 1.5 A
 * charging once turned.
 */
static void
test_units_and_sign(void **state)
{
	struct clean_conf c;
	struct run r;

	(void)state;
	clean_conf_default(&c);
	c.charge_sign = CLEAN_SIGN_NEGATIVE;
	c.spec.unit[CM_SOC] = CMU_FRAC;
	run_clean(&r, &c,
	    "device,time_ms,voltage_mv,current_ma,temp_dk,soc\n"
	    "P1,1767225600000,3700,-1500,2981.5,0.5\n"
	    "P1,1767225610000,3712,2000,2991.5,0.505\n");
	assert_int_equal(r.rc, 0);
	assert_string_equal(r.out,
	    "device,time,voltage_v,current_a,temp_c,soc_pct\n"
	    "P1,2026-01-01T00:00:00Z,3.7,1.5,25,50\n"
	    "P1,2026-01-01T00:00:10Z,3.712,-2,26,50.5\n");
	assert_int_equal(r.st.accepted, 2);
	assert_int_equal(r.st.rejected, 0);
	run_free(&r);
}

/*
 * Within --reorder (60 s) a late row goes back in its place; one later
 * than that is rejected as out-of-order; a repeated row as duplicate; a
 * voltage outside 1.5..5 V per cell as out-of-range.
 */
static void
test_order_and_rejects(void **state)
{
	struct clean_conf c;
	struct run r;

	(void)state;
	clean_conf_default(&c);
	c.charge_sign = CLEAN_SIGN_POSITIVE;
	run_clean(&r, &c,
	    "device,time,voltage_v,current_a\n"
	    "P1,2026-01-01T00:00:00Z,3.70,1\n"
	    "P1,2026-01-01T00:00:20Z,3.72,1\n"
	    "P1,2026-01-01T00:00:10Z,3.71,1\n"
	    "P1,2026-01-01T00:00:20Z,3.72,1\n"
	    "P1,2026-01-01T00:02:00Z,3.75,1\n"
	    "P1,2026-01-01T00:00:30Z,3.73,1\n"
	    "P1,2026-01-01T00:02:10Z,9.99,1\n"
	    "P1,2026-01-01T00:02:20Z,3.76,1\n");
	assert_int_equal(r.rc, 0);
	assert_string_equal(body(&r),
	    "P1,2026-01-01T00:00:00Z,3.7,1,,\n"
	    "P1,2026-01-01T00:00:10Z,3.71,1,,\n"
	    "P1,2026-01-01T00:00:20Z,3.72,1,,\n"
	    "P1,2026-01-01T00:02:00Z,3.75,1,,\n"
	    "P1,2026-01-01T00:02:20Z,3.76,1,,\n");
	assert_int_equal(r.st.lines, 8);
	assert_int_equal(r.st.accepted, 5);
	assert_int_equal(r.st.reason[CR_DUPLICATE], 1);
	assert_int_equal(r.st.reason[CR_ORDER], 1);
	assert_int_equal(r.st.reason[CR_RANGE], 1);
	/* The rejects file names the line and reason of each. */
	assert_non_null(strstr(r.rej, ",5,duplicate,"));
	assert_non_null(strstr(r.rej, ",7,out-of-order,"));
	assert_non_null(strstr(r.rej, ",8,out-of-range,"));
	run_free(&r);
}

/*
 * --step 60 over 10 s rows at 2 A: grid points at :00 and :60, the mean
 * current of (0, 60] is 2 A (cw-clean(1): the charge is kept).
 */
static void
test_step(void **state)
{
	struct clean_conf c;
	struct run r;
	char text[2048], *p = text;
	int k;

	(void)state;
	clean_conf_default(&c);
	c.charge_sign = CLEAN_SIGN_POSITIVE;
	c.step = 60 * CW_US_PER_S;
	p += sprintf(p, "device,time,voltage_v,current_a\n");
	for (k = 0; k <= 6; k++)
		p += sprintf(p, "P1,%d,%.2f,2\n", 1767225600 + 10 * k,
		    3.70 + 0.01 * k);
	run_clean(&r, &c, text);
	assert_int_equal(r.rc, 0);
	assert_string_equal(body(&r),
	    "P1,2026-01-01T00:00:00Z,3.7,2,,\n"
	    "P1,2026-01-01T00:01:00Z,3.76,2,,\n");
	assert_int_equal(r.st.accepted, 7);
	run_free(&r);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_units_and_sign),
		cmocka_unit_test(test_order_and_rejects),
		cmocka_unit_test(test_step),
	};

	cw_setprog("test_clean");
	return cmocka_run_group_tests(tests, NULL, NULL);
}
