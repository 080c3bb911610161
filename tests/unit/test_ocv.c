/*
 * test_ocv.c: the OCV table's inverse (ocv.h), and the rest-voltage
 * estimate of capacity.h built on it.
 *
 * References: linear interpolation, worked out in the comments; the
 * capacity by coulomb counting (charge = integral of I dt, in the
 * rectangle reading of lib/charge.h) between two rested states.  The
 * tables and packs are invented.
 */
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

#include "capacity.h"
#include "cw.h"
#include "ocv.h"

#define S	(CW_US_PER_S)

static void
near(double got, double want, double tol)
{
	if (!(fabs(got - want) <= tol))
		fail_msg("got %.12g, want %.12g (tolerance %g)", got, want,
		    tol);
}

/*
 * The table 3.0 V 0 %, 3.6 V 20 %, 4.2 V 100 %: 3.3 V is halfway up the
 * first piece (10 %), 3.9 V halfway up the second (20 + 40 = 60 %);
 * the ends are exact; outside the table there is no SoC.  Read from a
 * file with its columns swapped and one more ignored.
 */
static void
test_inverse(void **state)
{
	char path[] = "/tmp/test_ocv.XXXXXX";
	struct ocv *o;
	FILE *fp;
	int fd;

	(void)state;
	fd = mkstemp(path);
	assert_true(fd >= 0);
	fp = fdopen(fd, "w");
	fputs("voltage_v,note,soc_pct\n3.0,empty,0\n3.6,,20\n4.2,full,100\n",
	    fp);
	fclose(fp);
	o = ocv_load(path);
	unlink(path);
	assert_int_equal(o->n, 3);
	near(ocv_soc(o, 3.3), 10, 1e-12);
	near(ocv_soc(o, 3.9), 60, 1e-12);
	near(ocv_soc(o, 3.0), 0, 1e-12);
	near(ocv_soc(o, 4.2), 100, 1e-12);
	assert_false(ocv_soc(o, 2.99) == ocv_soc(o, 2.99));
	assert_false(ocv_soc(o, 4.21) == ocv_soc(o, 4.21));
	ocv_free(o);
}

/*
 * A 10 Ah cell on the table 3.0..4.0 V for 0..100 %: rested 40 minutes at
 * 3.9 V (90 %), discharged 3 A for 1 h at 60 s rows (3 Ah), rested 40
 * minutes at 3.6 V (60 %): 3 Ah over 30 points, 10 Ah, at the point that
 * ends the second rest (the first row with current after it, which
 * begins a discharge of 40 minutes, 2 Ah, to a rest at 3.4 V, 40 %).  A
 * gap after that rest still gives its point (60 to 40 %: 2 Ah over 20
 * points), but no estimate spans the gap: the next one runs from the
 * rest after the gap (40 %) through a charge of 3 Ah to a rest at 3.7 V
 * (70 %), given at the end of the input.
 */
static void
test_rest_points(void **state)
{
	struct ocv o;
	struct cap_conf c;
	struct cap_ocvdev d;
	struct cap_counts n;
	struct cap_est e;
	cw_time t = 0;
	int k, got = 0;

	(void)state;
	memset(&o, 0, sizeof o);
	o.n = 2;
	o.v[0] = 3.0;
	o.v[1] = 4.0;
	o.soc[1] = 100;
	cap_conf_default(&c);
	memset(&d, 0, sizeof d);
	memset(&n, 0, sizeof n);
	for (k = 0; k <= 40; k++, t += 60 * S)
		got += cap_ocv_feed(&c, &o, &d, t, 3.9, 0, 25, &n, &e);
	for (k = 0; k < 60; k++, t += 60 * S)
		got += cap_ocv_feed(&c, &o, &d, t, 3.75, -3, 25, &n, &e);
	for (k = 0; k < 40; k++, t += 60 * S)
		got += cap_ocv_feed(&c, &o, &d, t, 3.6, 0, 25, &n, &e);
	assert_int_equal(got, 0);
	got = cap_ocv_feed(&c, &o, &d, t, 3.5, -3, 25, &n, &e);
	assert_int_equal(got, 1);
	assert_int_equal(e.reason, CAP_OK);
	near(e.soc_from, 90, 1e-9);
	near(e.soc_to, 60, 1e-9);
	near(e.charge_ah, -3, 1e-9);
	near(e.capacity_ah, 10, 1e-9);
	assert_true(e.end == t - 60 * S);

	/* A gap: the rest before it is a point, nothing spans it. */
	got = 0;
	for (k = 1, t += 60 * S; k < 40; k++, t += 60 * S)
		got += cap_ocv_feed(&c, &o, &d, t, 3.5, -3, 25, &n, &e);
	for (k = 0; k < 40; k++, t += 60 * S)
		got += cap_ocv_feed(&c, &o, &d, t, 3.4, 0, 25, &n, &e);
	assert_int_equal(got, 0);
	t += 3600 * S;
	assert_int_equal(cap_ocv_feed(&c, &o, &d, t, 3.4, 0, 25, &n, &e), 1);
	near(e.soc_from, 60, 1e-9);
	near(e.soc_to, 40, 1e-9);
	near(e.charge_ah, -2, 1e-9);
	near(e.capacity_ah, 10, 1e-9);
	t += 60 * S;
	for (k = 0; k < 40; k++, t += 60 * S)
		assert_int_equal(cap_ocv_feed(&c, &o, &d, t, 3.4, 0, 25, &n,
		    &e), 0);
	for (k = 0; k < 60; k++, t += 60 * S)
		assert_int_equal(cap_ocv_feed(&c, &o, &d, t, 3.5, 3, 25, &n,
		    &e), 0);
	assert_int_equal(n.cut[CAP_GAP], 1);
	/* Its first point after the gap is an anchor only. */
	for (k = 0; k < 40; k++, t += 60 * S)
		assert_int_equal(cap_ocv_feed(&c, &o, &d, t, 3.7, 0, 25, &n,
		    &e), 0);
	assert_int_equal(cap_ocv_finish(&c, &d, &n, &e), 1);
	near(e.soc_from, 40, 1e-9);
	near(e.soc_to, 70, 1e-9);
	near(e.capacity_ah, 10, 1e-9);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_inverse),
		cmocka_unit_test(test_rest_points),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
