/*
 * test_report.c: the ranking of the attention list (lib/report.c).
 *
 * References named beside each check:
 * - The order (tier, then reason, then the reason's measure, then the
 *   name) and the thresholds are this project's documented rules
 *   (report.h, cw-report(1)); the defaults (80 % SoH, +100 % resistance,
 *   90 days, 365 days) are common practice, no source, used here as given
 *   values.
 * - Projections are worked by hand in the comments: days = distance to
 *   the threshold over the slope.
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

#include "report.h"

#define WEAR_HDR "device,first,last,days,charge_ah,efc,max_depth_pct," \
	"hours_near_full,hours_hot,cold_charge_ah,cool_charge_ah," \
	"hot_charge_ah,topoff_cycles,share_age,share_cycling," \
	"share_high_soc,share_heat,fade_pct,soh_pct,days_to_eol,dominant," \
	"prior,damage,damage_prior\n"
#define THERMAL_HDR "device,first,last,charge_ah,ah_below_min,ah_cool," \
	"ah_normal,ah_warm,ah_above_max,ah_no_temp,outside_pct," \
	"charge_events,below_min_events,cool_events,warm_events," \
	"above_max_events,use_events,use_cold_events,use_hot_events," \
	"unjudged_rows,events_within,events_over_current," \
	"events_over_voltage,events_no_charge_allowed," \
	"events_unknown_protocol\n"
#define CAP_HDR "device,estimates,first,last,capacity_start_ah," \
	"capacity_end_ah,fade_pct,fade_pct_per_30d,soh_pct,eol_date," \
	"slope_ah_per_day,slope_lo_ah_per_day,slope_hi_ah_per_day," \
	"fit_estimates,rated_ah\n"
#define T0 "2026-03-01T00:00:00Z"
#define T1 "2026-03-31T00:00:00Z"

static char path[64];

static void	put(const char *text);
static void	wear_text(char *buf, size_t size, const char *const *rows,
		    int n);
static struct report *run(const struct report_conf *c, const char *since,
		    int nfile, const char *const *texts);
static const char *dev_of(const struct report_finding *f);

/* Write TEXT to the scratch file PATH. */
static void
put(const char *text)
{
	FILE *fp;
	int fd;

	strcpy(path, "/tmp/test_report.XXXXXX");
	fd = mkstemp(path);
	assert_true(fd >= 0);
	fp = fdopen(fd, "w");
	assert_non_null(fp);
	fputs(text, fp);
	assert_int_equal(fclose(fp), 0);
}

/* A cw-wear output into BUF: N rows of (device, days_to_eol, dominant). */
static void
wear_text(char *buf, size_t size, const char *const *rows, int n)
{
	FILE *fp = fmemopen(buf, size, "w");
	int i;

	assert_non_null(fp);
	fputs(WEAR_HDR, fp);
	for (i = 0; i < n; i++)
		fprintf(fp, "%s," T0 "," T1 ",30,100,7,80,10,0,0,0,0,0,0.3,0.6,"
		    "0.1,0,1,99,%s,%s,new,0.001,0\n", rows[3 * i],
		    rows[3 * i + 1], rows[3 * i + 2]);
	assert_int_equal(fclose(fp), 0);
}

/* Read each of TEXTS as a file (and SINCE as --since), then rank. */
static struct report *
run(const struct report_conf *c, const char *since, int nfile,
    const char *const *texts)
{
	struct report *r = report_new(c, NULL);
	int i;

	if (since != NULL) {
		put(since);
		assert_int_equal(report_since(r, path), 0);
		unlink(path);
	}
	for (i = 0; i < nfile; i++) {
		put(texts[i]);
		assert_int_equal(report_read(r, path), 0);
		unlink(path);
	}
	(void)report_rank(r);
	return r;
}

/* The device name of a finding: the devent at the start of its pack. */
static const char *
dev_of(const struct report_finding *f)
{
	return *(const char *const *)f->dev;
}

/* report_cmp: the tier and the reason decide before any measure. */
static void
test_cmp(void **state)
{
	struct report_finding a, b;

	(void)state;
	memset(&a, 0, sizeof(a));
	memset(&b, 0, sizeof(b));
	/* 0.1 Ah below T1 (tier 1) before 10 days of modelled life (4). */
	a.reason = REPORT_CHARGE_BELOW_MIN;
	a.mag = 0.1;
	b.reason = REPORT_SHORT_LIFE;
	b.mag = -10;
	assert_true(report_cmp(&a, &b, "Z", "A") < 0);
	assert_true(report_cmp(&b, &a, "A", "Z") > 0);
	/* Within tier 1, charging before over-discharge, whatever the
	 * hours. */
	b.reason = REPORT_CELL_UNDER_VOLTAGE;
	b.mag = 1000;
	assert_true(report_cmp(&a, &b, "Z", "A") < 0);
	/* One reason: the larger measure first (more Ah charged cold). */
	b.reason = REPORT_CHARGE_BELOW_MIN;
	b.mag = 5;
	assert_true(report_cmp(&b, &a, "Z", "A") < 0);
	/* A tie: by name. */
	b.mag = a.mag;
	assert_true(report_cmp(&a, &b, "A", "B") < 0);
	assert_int_equal(report_cmp(&a, &b, "A", "A"), 0);
	assert_int_equal(report_reason_tier(REPORT_COOL_OVER_CURRENT), 2);
	assert_int_equal(report_reason_tier(REPORT_RESISTANCE_RISING), 3);
	assert_string_equal(report_reason_name(REPORT_CAPACITY_FADING),
	    "capacity-fading");
}

/*
 * Packs are ranked by their most urgent reason and keep their reasons
 * together: P has short-life (200 days) and cool-over-current (tier 2),
 * Q short-life only (100 days, shorter than P's), R charged below T1.
 * Order: R (tier 1), P (tier 2, then its short-life), Q.  Without the
 * grouping, Q's 100 days would come before P's 200.
 */
static void
test_rank_groups(void **state)
{
	struct report_conf c;
	struct report *r;
	const struct report_finding *f;
	char wear[2048], thermal[2048];
	const char *texts[2] = { wear, thermal };
	size_t n;

	(void)state;
	report_conf_default(&c);
	/* S: 365 days, not below --life's 365: healthy. */
	wear_text(wear, sizeof(wear), (const char *const[]){ "P", "200",
	    "cycling", "Q", "100", "cycling", "R", "", "cold-charge", "S",
	    "365", "cycling" }, 4);
	snprintf(thermal, sizeof(thermal), THERMAL_HDR
	    "P," T0 "," T1 ",100,0,20,80,0,0,0,20,10,0,5,0,0,0,0,0,0,8,2,0,0,"
	    "0\n"
	    "R," T0 "," T1 ",100,2,0,98,0,0,0,2,10,1,0,0,0,0,0,0,0,9,0,0,1,0\n"
	    "Q," T0 "," T1 ",100,0,20,80,0,0,0,20,10,0,5,0,0,0,0,0,0,10,0,0,0,"
	    "0\n");
	r = run(&c, NULL, 2, texts);
	f = report_findings(r, &n);
	assert_int_equal(n, 4);
	assert_string_equal(dev_of(&f[0]), "R");
	assert_int_equal(f[0].reason, REPORT_CHARGE_BELOW_MIN);
	assert_int_equal(f[0].rank, 1);
	assert_string_equal(dev_of(&f[1]), "P");
	assert_int_equal(f[1].reason, REPORT_COOL_OVER_CURRENT);
	assert_int_equal(f[1].rank, 2);
	assert_string_equal(dev_of(&f[2]), "P");
	assert_int_equal(f[2].reason, REPORT_SHORT_LIFE);
	assert_int_equal(f[2].rank, 2);
	assert_string_equal(dev_of(&f[3]), "Q");
	assert_int_equal(f[3].rank, 3);
	report_free(r);

	/* Without the thermal summary, R's cold charge comes from cw-wear's
	 * dominant, and P is ranked by its life alone, after Q. */
	r = run(&c, NULL, 1, texts);
	f = report_findings(r, &n);
	assert_int_equal(n, 3);
	assert_string_equal(dev_of(&f[0]), "R");
	assert_int_equal(f[0].reason, REPORT_CHARGE_BELOW_MIN);
	assert_string_equal(dev_of(&f[1]), "Q");
	assert_string_equal(dev_of(&f[2]), "P");
	report_free(r);
}

/*
 * A capacity projection needs a sure slope and the horizon: of 14 Ah
 * rated, a slope of -0.028 Ah/day is -0.2 points a day; from SoH 89 % to
 * 80 % that is 45 days.  A: interval all below zero, listed with horizon
 * 45 (45 <= 45) and not with 44.  B: same slope, interval up to +0.001:
 * never listed.  C: SoH 79.9 %: capacity-low whatever its slope.
 */
static void
test_projection(void **state)
{
	struct report_conf c;
	struct report *r;
	const struct report_finding *f;
	const char *texts[1];
	size_t n;

	(void)state;
	texts[0] = CAP_HDR
	    "A,10," T0 "," T1 ",12.7,12.46,2,2,89,,-0.028,-0.04,-0.01,10,14\n"
	    "B,10," T0 "," T1 ",12.7,12.46,2,2,89,,-0.028,-0.06,0.001,10,14\n"
	    "C,10," T0 "," T1 ",11.5,11.186,2,2,79.9,,0.01,-0.02,0.03,10,14\n";
	report_conf_default(&c);
	c.horizon_d = 45;
	r = run(&c, NULL, 1, texts);
	f = report_findings(r, &n);
	assert_int_equal(n, 2);
	assert_string_equal(dev_of(&f[0]), "C");
	assert_int_equal(f[0].reason, REPORT_CAPACITY_LOW);
	assert_string_equal(dev_of(&f[1]), "A");
	assert_int_equal(f[1].reason, REPORT_CAPACITY_FADING);
	assert_non_null(strstr(f[1].detail, "in 45 days"));
	/* 2026-03-31T00:00Z + 45 days. */
	assert_non_null(strstr(f[1].detail, "80 % by 2026-05-15"));
	report_free(r);

	c.horizon_d = 44;
	r = run(&c, NULL, 1, texts);
	f = report_findings(r, &n);
	assert_int_equal(n, 1);
	assert_string_equal(dev_of(&f[0]), "C");
	report_free(r);
}

/* --since: a (device, reason) the earlier report held is not new. */
static void
test_since(void **state)
{
	struct report_conf c;
	struct report *r;
	const struct report_finding *f;
	char wear[1024];
	const char *texts[1] = { wear };
	size_t n;

	(void)state;
	report_conf_default(&c);
	wear_text(wear, sizeof(wear), (const char *const[]){ "P", "200",
	    "cycling", "Q", "100", "cycling" }, 2);
	r = run(&c, "rank,device,site,reason,detail,new\n"
	    "1,Q,,short-life,x,1\n1,P,,capacity-low,y,1\n", 1, texts);
	f = report_findings(r, &n);
	assert_int_equal(n, 2);
	assert_string_equal(dev_of(&f[0]), "Q");
	assert_int_equal(f[0].isnew, 0);
	assert_string_equal(dev_of(&f[1]), "P");
	assert_int_equal(f[1].isnew, 1);
	report_free(r);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_cmp),
		cmocka_unit_test(test_rank_groups),
		cmocka_unit_test(test_projection),
		cmocka_unit_test(test_since),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
