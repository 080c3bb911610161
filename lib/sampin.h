/*
 * sampin.h: the sample stream reader every analysis tool stands on.
 * Columns are found by header name in any order (device, time, voltage_v,
 * current_a, temp_c, soc_pct and one extra column of the tool's choice);
 * unknown columns are ignored.  Each row is parsed, its device looked up
 * in the tool's devtab, its time checked not to decrease within the device,
 * and handed to the tool.  Missing or non-numeric values arrive as NaN and
 * are counted per column; a row with a bad time or no device is skipped,
 * reported and counted.
 */
#ifndef SAMPIN_H
#define SAMPIN_H

#include "cw.h"
#include "devtab.h"

enum sampin_col {
	SAMP_DEVICE, SAMP_TIME, SAMP_VOLTAGE, SAMP_CURRENT, SAMP_TEMP,
	SAMP_SOC, SAMP_EXTRA,
	SAMP_TAG,	/* a text column of the tool's choice (cw-thermal --by) */
	SAMP_NCOL
};
#define SAMP_BIT(c) (1u << (c))

struct cw_sample {
	cw_time t;
	double v;	/* voltage_v */
	double i;	/* current_a, positive while charging */
	double temp;	/* temp_c */
	double soc;	/* soc_pct, 0..100 */
	double x;	/* the extra column */
	const char *tag;	/* the text column as read, valid during the
				   call; "" when absent or empty */
	size_t taglen;
	const char *src;	/* file and line, for messages */
	unsigned long line;
};

struct sampin_stats {
	unsigned long rows;		/* data rows read */
	unsigned long used;		/* handed to the tool */
	unsigned long skipped;		/* bad time, no device, time going back */
	unsigned long missing[SAMP_NCOL];	/* empty value per column */
	unsigned long invalid[SAMP_NCOL];	/* non-numeric value per column */
};

struct sampin_conf {
	const char *extra;	/* name of the extra column, or NULL */
	const char *tag;	/* name of the text column, or NULL */
	unsigned need;		/* SAMP_BIT()s of columns that must exist */
	unsigned need_any;	/* if non-zero, at least one of these must */
	/*
	 * Called for each row; DEV is the device state from the devtab.
	 * Returns 0, or an exit code to stop.
	 */
	int	(*row)(void *ctx, void *dev, const struct cw_sample *s);
	void	*ctx;
	struct devtab *devs;
};

/* Read FILES[0..N) (stdin when N is 0).  Returns 0 or an exit code. */
int	sampin_run(const struct sampin_conf *c, char **files, int n,
	    struct sampin_stats *st);
/* With -v: print the counts of ST to stderr. */
void	sampin_report(const struct sampin_stats *st, const char *extra);
/* The same, naming the text column TAG (NULL: none). */
void	sampin_report_tag(const struct sampin_stats *st, const char *extra,
	    const char *tag);
/*
 * The sample stream's columns, by enum sampin_col (EXTRA and TAG: NULL): the one
 * table of them.  cw-clean writes them in this order (lib/clean.c), colmap
 * takes them as the canonical raw names, and every reader finds them here.
 */
extern const char *const sampin_colname[SAMP_NCOL];

#endif
