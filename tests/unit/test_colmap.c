/*
 * test_colmap.c: which raw column holds which field (lib/colmap.h).  The
 * expected mappings follow cellwear(7) and cw-clean(1): canonical names,
 * obvious variants and unit suffixes (_mv, _ma, _f, "(mV)", "[0.1K]") are
 * recognised without -c; -c field=header[:unit] names them; a required
 * field that cannot be found is an error.  The headers are written in the
 * styles gauge makers use, invented here.
 */
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <cmocka.h>

#include "colmap.h"
#include "cw.h"

#define REQ ((1u << CM_TIME) | (1u << CM_VOLTAGE) | (1u << CM_CURRENT))
#define MAXF 16

/* A header record of the comma-separated names in LINE. */
struct hdr {
	char buf[512];
	char *f[MAXF];
	size_t len[MAXF];
	struct csvin_rec r;
};

static const struct csvin_rec *
header(struct hdr *h, const char *line)
{
	char *p;

	memset(h, 0, sizeof(*h));
	snprintf(h->buf, sizeof(h->buf), "%s", line);
	h->r.src = "test.csv";
	h->r.line = 1;
	h->r.raw = line;
	h->r.rawlen = strlen(line);
	h->r.f = h->f;
	h->r.len = h->len;
	for (p = h->buf;; p++) {
		char *e = strchr(p, ',');

		assert_true(h->r.nf < MAXF);
		h->f[h->r.nf] = p;
		if (e != NULL)
			*e = '\0';
		h->len[h->r.nf] = strlen(p);
		h->r.nf++;
		if (e == NULL)
			break;
		p = e;
	}
	return &h->r;
}

static void
resolve(const char *line, const char *spec, struct colmap *m, int want)
{
	struct colmap_spec s;
	struct hdr h;
	const char *err = NULL;

	memset(&s, 0, sizeof(s));
	if (spec != NULL)
		assert_int_equal(colmap_parse_spec(spec, &s, &err), 0);
	assert_int_equal(colmap_resolve(&s, header(&h, line),
	    REQ | (1u << CM_DEVICE), m), want);
}

/* The sample stream's own header maps one to one, in the stream's units. */
static void
test_canonical(void **state)
{
	struct colmap m;
	int f;

	(void)state;
	resolve("device,time,voltage_v,current_a,temp_c,soc_pct", NULL, &m,
	    0);
	for (f = CM_DEVICE; f <= CM_SOC; f++)
		assert_int_equal(m.col[f], f);
	assert_int_equal(m.col[CM_DATE], -1);
	assert_int_equal(m.unit[CM_VOLTAGE], CMU_V);
	assert_int_equal(m.unit[CM_CURRENT], CMU_A);
	assert_int_equal(m.unit[CM_TEMP], CMU_C);
	assert_int_equal(m.unit[CM_SOC], CMU_PCT);
}

/* Units from suffixes and brackets, in any order of columns. */
static void
test_units_in_names(void **state)
{
	struct colmap m;

	(void)state;
	resolve("Serial,SOC,Temp_F,Current_mA,Pack Voltage (mV),"
	    "Timestamp_ms", NULL, &m, 0);
	assert_int_equal(m.col[CM_DEVICE], 0);
	assert_int_equal(m.col[CM_SOC], 1);
	assert_int_equal(m.col[CM_TEMP], 2);
	assert_int_equal(m.unit[CM_TEMP], CMU_F);
	assert_int_equal(m.col[CM_CURRENT], 3);
	assert_int_equal(m.unit[CM_CURRENT], CMU_MA);
	assert_int_equal(m.col[CM_VOLTAGE], 4);
	assert_int_equal(m.unit[CM_VOLTAGE], CMU_MV);
	assert_int_equal(m.col[CM_TIME], 5);
	assert_int_equal(m.unit[CM_TIME], CMU_MS);

	resolve("id,ts,vbat,ibat,temperature[0.1K]", NULL, &m, 0);
	assert_int_equal(m.col[CM_TEMP], 4);
	assert_int_equal(m.unit[CM_TEMP], CMU_DK);
	assert_int_equal(m.col[CM_SOC], -1);
}

/* -c names the columns and units; a named field wins over recognition. */
static void
test_spec(void **state)
{
	struct colmap m;

	(void)state;
	resolve("unit,U,I,stamp,voltage_v", "device=unit,time=stamp:s,"
	    "voltage=U:mV,current=I:mA", &m, 0);
	assert_int_equal(m.col[CM_DEVICE], 0);
	assert_int_equal(m.col[CM_VOLTAGE], 1);
	assert_int_equal(m.unit[CM_VOLTAGE], CMU_MV);
	assert_int_equal(m.col[CM_CURRENT], 2);
	assert_int_equal(m.unit[CM_CURRENT], CMU_MA);
	assert_int_equal(m.col[CM_TIME], 3);
	assert_int_equal(m.unit[CM_TIME], CMU_S);
}

/* Bad specs are refused with a message; nothing half parsed is used. */
static void
test_bad_spec(void **state)
{
	static const char *const bad[] = {
		"volts", "voltage=", "power=P", "voltage=V:furlongs",
		"temp=T:mV",
	};
	struct colmap_spec s;
	const char *err;
	size_t i;

	(void)state;
	for (i = 0; i < sizeof(bad) / sizeof(bad[0]); i++) {
		memset(&s, 0, sizeof(s));
		err = NULL;
		assert_int_equal(colmap_parse_spec(bad[i], &s, &err), -1);
		assert_non_null(err);
	}
}

/* A required field missing from the header is an error. */
static void
test_missing(void **state)
{
	struct colmap m;

	(void)state;
	resolve("device,time,voltage_v,temp_c", NULL, &m, -1);
	resolve("device,when,voltage_v,current_a", NULL, &m, -1);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_canonical),
		cmocka_unit_test(test_units_in_names),
		cmocka_unit_test(test_spec),
		cmocka_unit_test(test_bad_spec),
		cmocka_unit_test(test_missing),
	};

	cw_setprog("test_colmap");
	return cmocka_run_group_tests(tests, NULL, NULL);
}
