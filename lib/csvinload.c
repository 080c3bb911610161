/*
 * csvinload.c: csvin_load() (csvin.h), the whole of a small side file.
 * Apart from csvin.c so that its calls into the reader are calls between
 * objects, which a harness can wrap at link time (tests/fuzz/fuzz_fleet.c
 * wraps csvin_new and csvin_free to free the reader when a row dies).
 */
#include "csvin.h"
#include "cw.h"

void
csvin_load(const char *path, const struct csvin_ops *ops, void *ctx,
    const char *empty, const char *what)
{
	struct csvin *in;
	int rc;

	in = csvin_new('\0', ops, ctx);
	rc = csvin_file(in, path);
	if (rc == 0 && csvin_stats(in)->headers == 0)
		cw_die(CW_EXIT_DATA, "%s: %s", path, empty);
	csvin_free(in);
	if (rc != 0)
		cw_die(rc, "%s: cannot read %s", path, what);
}
