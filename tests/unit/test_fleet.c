/*
 * test_fleet.c: the fleet file reader (lib/fleet.c).
 *
 * The contract is cellwear(7) "The fleet file": columns by name in any
 * order, unknown ones ignored, empty fields not given, a per-pack value
 * overriding the option.  Error paths exit the process (cw_die) and are
 * CLI cases of the tools that take --fleet.
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

#include "fleet.h"
#include "ts.h"

static char path[64];

static void
writefile(const char *text)
{
	FILE *fp;

	strcpy(path, "/tmp/test_fleet.XXXXXX");
	int fd = mkstemp(path);
	assert_true(fd >= 0);
	fp = fdopen(fd, "w");
	assert_non_null(fp);
	fputs(text, fp);
	fclose(fp);
}

static void
test_columns_any_order(void **state)
{
	struct fleet *f;
	const struct fleet_pack *p;
	cw_time t;

	(void)state;
	/* Unknown columns (colour, note) and a quoted name with a comma. */
	writefile("colour,site,capacity_ah,device,cells,in_service,soh_pct,"
	    "efc_prior,model,note\n"
	    "red,North dock,12.8,EB-1,10,2025-06-01,91.5,140,M2,x\n"
	    "blue,,,\"EB,2\",,,,,,\n");
	f = fleet_load(path);
	unlink(path);
	assert_int_equal(fleet_count(f), 2);
	p = fleet_find(f, "EB-1", 4);
	assert_non_null(p);
	assert_int_equal(p->have, FLEET_CAPACITY | FLEET_CELLS |
	    FLEET_IN_SERVICE | FLEET_SOH | FLEET_EFC_PRIOR | FLEET_SITE |
	    FLEET_MODEL);
	assert_true(p->capacity_ah == 12.8);
	assert_int_equal(p->cells, 10);
	assert_true(p->soh_pct == 91.5);
	assert_true(p->efc_prior == 140);
	assert_string_equal(p->site, "North dock");
	assert_string_equal(p->model, "M2");
	/* 2025-06-01 is day 20240 since the epoch (ts_days_from_civil). */
	t = (cw_time)ts_days_from_civil(2025, 6, 1) * 86400 * CW_US_PER_S;
	assert_true(p->in_service == t);
	p = fleet_find(f, "EB,2", 4);
	assert_non_null(p);
	assert_int_equal(p->have, 0);
	assert_string_equal(p->site, "");
	assert_null(fleet_find(f, "EB-3", 4));
	fleet_free(f);
}

static void
test_override_rule(void **state)
{
	struct fleet *f;

	(void)state;
	writefile("device;capacity_ah\nA;20\nB;\n");
	f = fleet_load(path);
	unlink(path);
	/* A per-pack value overrides the option; a blank or missing pack
	 * gets the option's value. */
	assert_true(fleet_capacity(f, "A", 1, 7.5) == 20);
	assert_true(fleet_capacity(f, "B", 1, 7.5) == 7.5);
	assert_true(fleet_capacity(f, "C", 1, 7.5) == 7.5);
	/* No --fleet: no file read, no fleet, every value the option's. */
	assert_null(fleet_load(NULL));
	assert_true(fleet_capacity(NULL, "A", 1, 7.5) == 7.5);
	assert_int_equal(fleet_cells(f, "A", 1, 13), 13);
	assert_true(fleet_capacity(NULL, "A", 1, 3) == 3);
	fleet_free(f);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_columns_any_order),
		cmocka_unit_test(test_override_rule),
	};

	return cmocka_run_group_tests(tests, NULL, NULL);
}
