/*
 * outf.h: output files written atomically.  outf_open() makes a temporary
 * file beside PATH (beside the file a symbolic link PATH points to, so the
 * link stays a link), with the old file's mode; outf_commit() flushes,
 * syncs, closes and renames it over the target, then syncs the folder.
 * The target is never opened before the rename.  If the program exits
 * before commit (an error, or any signal that would end it: SIGINT,
 * SIGTERM, SIGHUP, SIGPIPE, SIGQUIT, SIGALRM, SIGUSR1, SIGUSR2, SIGXCPU,
 * SIGVTALRM, SIGPROF), the temporary is removed and the target stays as
 * it was.  SIGXFSZ (a file size limit) is ignored, so the write that
 * crosses the limit fails with an error message and exit 1 instead.
 */
#ifndef OUTF_H
#define OUTF_H

#include <stdio.h>

struct outf;

/*
 * PATH NULL or "-": standard output.  A character device (/dev/null,
 * /dev/stdout on a terminal) is written in place; so is a FIFO that has a
 * reader (/dev/stdout on a pipe), but not one without a reader (the run
 * would hang) nor one of another user in a shared folder.  A symbolic
 * link of another user in a shared folder (sticky, writable by all) is
 * not followed.  Exits 1 with a message on failure.
 */
struct outf *outf_open(const char *path);
/* As outf_open, for a state file: PATH must be a regular file (or not
 * exist yet); a FIFO, a device or a folder is refused with a message. */
struct outf *outf_open_state(const char *path);
/* Refuse (exit 1 with a message) a state PATH that exists and is not a
 * regular file, before it is read. */
void	outf_check_state(const char *path);
/* Whether paths A and B name the same file (after symbolic links and
 * "./" and ".."), existing or not. */
int	outf_same(const char *a, const char *b);
FILE	*outf_fp(struct outf *o);
/* Flush, close, rename.  0, or -1 with a message (write error). */
int	outf_commit(struct outf *o);
/* Remove the temporary (no-op for stdout). */
void	outf_abort(struct outf *o);

#endif
