/*
 * finish.h: the one ending of every tool's output.
 */
#ifndef FINISH_H
#define FINISH_H

struct csvout;
struct outf;

/*
 * Flush W, then commit O (an -o FILE renamed into place) and close it.
 * RC is the run's status so far: when it is not 0, the complete rows
 * written stay (they are flushed) but O is not committed, so an -o FILE
 * keeps its old contents, and RC is returned.  A write error is told
 * once, as "PATH: write error: REASON" (PATH "standard output" for
 * none), with the errno of the first failed write.  A row callback that
 * sees the csvout's err set just stops the run: this tells it.  Returns the exit status: RC, or CW_EXIT_DATA on a write error.
 */
int	cw_finish(struct csvout *w, struct outf *o, const char *path, int rc);
/* "PATH: write error: REASON" (strerror(ERRNUM)), PATH NULL or "-":
 * standard output. */
void	cw_write_error(const char *path, int errnum);

#endif
