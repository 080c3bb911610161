/*
 * finish.c: flush, report a write error in one shape, commit.
 */
#include <errno.h>
#include <string.h>

#include "csvout.h"
#include "cw.h"
#include "finish.h"
#include "outf.h"

void
cw_write_error(const char *path, int errnum)
{
	if (path == NULL || strcmp(path, "-") == 0)
		path = "standard output";
	cw_warn("%s: write error: %s", path, strerror(errnum));
}

int
cw_finish(struct csvout *w, struct outf *o, const char *path, int rc)
{
	if (csvout_flush(w) != 0) {
		cw_write_error(path, w->errnum != 0 ? w->errnum : EIO);
		return CW_EXIT_DATA;
	}
	if (rc != CW_EXIT_OK)
		return rc;
	return outf_commit(o) != 0 ? CW_EXIT_DATA : CW_EXIT_OK;
}
