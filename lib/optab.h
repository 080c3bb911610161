/*
 * optab.h: a tool's options described once.  From one table come the
 * getopt_long() tables, the usage synopsis and the --help text, and
 * tests/tools/helpman.sh checks the manual page against that help, so
 * the three cannot drift apart.
 *
 * -h/--help, --version and -v/--verbose are handled here; a missing value or an
 * unknown option is a usage error (exit 2).  Values are still checked by
 * the opt_*_arg() functions of opt.h, in the tool.
 */
#ifndef OPTAB_H
#define OPTAB_H

#include <getopt.h>
#include <stdio.h>

/* The id optab_next() returns for an option without a letter starts here. */
#define OPTAB_LONG 256

/*
 * What optab_next() does with an option's value itself, into the
 * struct the caller gave optab_init() (at offset OFF): OPTAB_CASE hands
 * the option back to the caller; the others store it, checked by the
 * opt_*_arg() function of opt.h with LO and HI.
 */
enum optab_kind {
	OPTAB_CASE,	/* returned to the caller */
	OPTAB_NUM,	/* double, opt_num_arg(LO, HI) */
	OPTAB_INT,	/* int, opt_long_arg(LO, HI) */
	OPTAB_DUR,	/* cw_time, opt_dur_arg(zero allowed when LO < 0) */
	OPTAB_TEMPDIFF,	/* double, opt_tempdiff_arg() */
	OPTAB_FLAG,	/* int set to 1 */
	OPTAB_STR,	/* const char *, the value as given */
	OPTAB_POS,	/* double, opt_pos_arg(HI): above 0 */
	OPTAB_OPEN,	/* double, opt_open_arg(LO, HI): strictly between */
	OPTAB_LONGINT,	/* long, opt_long_arg(LO, HI) */
	OPTAB_ULONG,	/* unsigned long, opt_long_arg(LO >= 0, HI) */
	OPTAB_SIZE	/* size_t, opt_long_arg(LO >= 0, HI) */
};
/*
 * OR'ed into a kind other than OPTAB_CASE: the value is stored and the
 * option's id is then handed back too, for a caller that notes which
 * options were given (cw-wear's settings kept in a state).
 */
#define OPTAB_TELL 0x100

struct optab {
	const char *name;	/* long name without "--"; NULL ends a table */
	int letter;		/* short letter, or 0 */
	const char *arg;	/* the value's name (AH, FILE), NULL: a flag */
	const char *help;	/* what it does, one sentence without a stop */
	const char *dflt;	/* the default as shown, or NULL for none */
	int id;			/* returned for it; 0: the letter */
	int kind;		/* enum optab_kind */
	size_t off;		/* where it is stored, in the caller's struct */
	double lo, hi;		/* its range */
};

/* The end of a table. */
#define OPTAB_END	{ NULL, 0, NULL, NULL, NULL, 0, 0, 0, 0, 0 }
/*
 * -o FILE, the output every tool but cw-clean and cw-synth writes, into
 * the const char * at OFF.
 */
#define OPTAB_OUTPUT(off) { "output", 'o', "FILE", "write to FILE " \
	"atomically, not standard output", NULL, 0, OPTAB_STR, (off), 0, 0 }

/* What the helps of the tools say of the units of values. */
#define OPTAB_TEMPS	"Temperatures take a unit suffix: 10, 10C, 50F, " \
	"283.15K (C without one).\n"
#define OPTAB_DURATIONS	"Durations take 90, 90s, 15m, 2h, 1d.\n"

struct optool {
	const char *prog;	/* the tool's name */
	const char *operands;	/* after the options: "[FILE ...]" */
	const char *about;	/* the help's paragraph, lines ending in \n */
	const char *epilogue;	/* after the options, or NULL */
	const struct optab *opts;	/* without help, version, verbose */
	const char *verbose;	/* -v/--verbose's text (it sets cw_verbose),
				   or NULL: the tool has no -v */
};

/*
 * The description of a tool that reads FILE operands (the sample stream,
 * or states; standard input when none) and has -v count what it read:
 * PROG, the help's paragraph ABOUT, its EPILOGUE and the table OPTS.
 */
#define OPTOOL_FILES(prog, about, epilogue, opts) { (prog), \
	"[FILE ...]", (about), (epilogue), (opts), \
	"report counts on standard error" }

struct optparse {
	const struct optool *tool;
	void *base;		/* the struct options are stored into */
	struct option *longopts;
	char shorts[2 * 64 + 2];
};

/*
 * BASE: the struct the table's offsets point into (NULL: none).  Names
 * the program for messages (cw_setprog()) after the tool's table.
 */
void	optab_init(struct optparse *p, const struct optool *tool,
	    void *base);
/*
 * The next option's id (its letter, or its table id), with optarg set
 * for one that takes a value; -1 at the end, with optind at the first
 * operand.  Prints the help or the version and exits for those; stores
 * the options of a kind other than OPTAB_CASE and goes on (returns
 * their id after storing them when the kind has OPTAB_TELL).
 */
int	optab_next(struct optparse *p, int argc, char *argv[]);
void	optab_free(struct optparse *p);
/*
 * optab_init() on the first call, then optab_next(), and optab_free()
 * when that returns -1: a tool's option loop, which keeps its state
 * between calls as getopt_long(3) itself does.
 */
int	optab_getopt(const struct optool *tool, void *base, int argc,
	    char *argv[]);
/*
 * The options of a tool whose table has no OPTAB_CASE entry, all stored
 * into BASE: the index of the first operand.
 */
int	optab_parse(const struct optool *tool, void *base, int argc,
	    char *argv[]);
/* The help: synopsis, paragraph, every option with its default. */
void	optab_help(FILE *fp, const struct optool *tool);

#endif
