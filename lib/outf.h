/*
 * outf.h: output files written atomically.  outf_open() makes a temporary
 * file beside PATH; outf_commit() flushes, closes and renames it over PATH.
 * If the program exits before commit (an error, SIGINT, SIGTERM, SIGHUP,
 * SIGPIPE), the temporary is removed and PATH stays as it was.
 */
#ifndef OUTF_H
#define OUTF_H

#include <stdio.h>

struct outf;

/* PATH NULL or "-": standard output.  Exits 1 with a message on failure. */
struct outf *outf_open(const char *path);
FILE	*outf_fp(struct outf *o);
/* Flush, close, rename.  0, or -1 with a message (write error). */
int	outf_commit(struct outf *o);
/* Remove the temporary (no-op for stdout). */
void	outf_abort(struct outf *o);

#endif
