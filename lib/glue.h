/*
 * glue.h: what the tools' main() functions share around their engines:
 * the devices' table, the -o output and its header, a sample stream
 * reader set up for the tool's columns, and the one ending (cw_finish).
 * A cmd/ file is then its options, a call into lib/ and glue_close().
 */
#ifndef GLUE_H
#define GLUE_H

#include <stddef.h>

#include "csvout.h"
#include "cw.h"
#include "devtab.h"
#include "outf.h"
#include "sampin.h"

struct glue {
	struct devtab *devs;	/* the tool's device states */
	struct outf *of;	/* -o FILE or standard output */
	const char *path;	/* -o's FILE, or NULL */
	struct csvout *w;	/* the tool's writer onto OF */
	struct sampin_conf sc;	/* the reader, as glue_sampin() sets it */
	struct sampin_stats st;	/* its counts, after glue_read() */
};

/*
 * A table of device states of DEVSIZE bytes (0: none), the output PATH
 * (NULL: standard output) opened atomically onto W, and its HEADER
 * written (NULL: none yet).
 */
void	glue_open(struct glue *g, size_t devsize, const char *path,
	    struct csvout *w, const char *header);
/*
 * G as the sample reader alone, into DEVS, a table G does not own (a
 * tool whose devices a state join keeps): glue_sampin() and glue_read()
 * then, and no glue_close().
 */
void	glue_reader(struct glue *g, struct devtab *devs);
/*
 * Set G's reader up to read the sample stream into its devices: the
 * device and time columns and the columns NEED must be there, and one
 * of NEED_ANY when it is not 0; each row goes to ROW(CTX, its device's
 * state, the row).  G->sc may then be changed further (a text column,
 * an extra one).
 */
void	glue_sampin(struct glue *g, unsigned need, unsigned need_any,
	    int (*row)(void *, void *, const struct cw_sample *), void *ctx);
/* Read FILES[0..N) (standard input when N is 0); 0 or an exit code. */
int	glue_read(struct glue *g, char **files, int n);
/*
 * glue_read(), then, when it went well, END(CTX, state) for each device
 * in name order (END NULL: none): the end of the stream for each.
 * Returns 0 or an exit code.
 */
int	glue_run(struct glue *g, char **files, int n,
	    void (*end)(void *, void *), void *ctx);
/*
 * --merge's operands: READ(CTX, PATH, WHOLE) for each of FILES[0..N), or
 * for "-" (standard input) when N is 0, until one fails.  WHOLE is 1 for
 * a file and STDIN_WHOLE for standard input ("-"): whether the states
 * read must be whole, with end rows that count them.  Returns 0 or what
 * READ returned.
 */
int	glue_states(char **files, int n, int stdin_whole,
	    int (*read)(void *, const char *, int), void *ctx);
/* FN(CTX, state) for each device in name order. */
void	glue_each(const struct glue *g, void (*fn)(void *, void *),
	    void *ctx);
/* The devices in name order (free() it), their count in *N. */
void	**glue_sorted(const struct glue *g, size_t *n);
/*
 * The end: cw_finish() with the run's status RC (complete rows stay, -o
 * FILE is committed only when RC is 0 and every write went well), then
 * the writer and the devices' table are freed.  Returns the exit status.
 */
int	glue_close(struct glue *g, int rc);
/*
 * glue_close() after the run, with -v first telling REPORT the devices
 * and what the reader counted: the one ending of a tool that reports.
 */
int	glue_finish(struct glue *g, int rc, void (*report)(const struct devtab *,
	    const struct sampin_stats *));

/*
 * The columns an event row of cw-thermal and cw-volt begins with, for
 * device E: device, KIND, WHERE (zone or limit), START, END, duration_s,
 * the lowest and highest value LO and HI, charge AH, SOC0 and SOC1 (at
 * its start and end).
 */
void	glue_event(struct csvout *w, const struct devent *e, const char *kind,
	    const char *where, cw_time start, cw_time end, double lo,
	    double hi, double ah, double soc0, double soc1);
/* A span's start, end and its length in seconds, as three fields. */
void	glue_span(struct csvout *w, cw_time start, cw_time end);
/* FIRST and LAST as two times when HAVE, else two empty fields. */
void	glue_first_last(struct csvout *w, int have, cw_time first,
	    cw_time last);
/* X when HAVE, else an empty field. */
void	glue_num(struct csvout *w, int have, double x);
/* T as a date when HAVE, else an empty field. */
void	glue_date(struct csvout *w, int have, cw_time t);

#endif
