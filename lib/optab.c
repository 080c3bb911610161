/*
 * optab.c: getopt tables, synopsis and help from one description of a
 * tool's options (optab.h).
 */
#include <ctype.h>
#include <stdlib.h>
#include <string.h>

#include "cw.h"
#include "opt.h"
#include "optab.h"

#define WIDTH	78	/* the help's right margin */
#define TEXTCOL	26	/* where an option's description starts, at least */
#define TEXTMAX	30	/* and at most: longer options break the line */
#define ID_HELP		'h'
#define ID_VERSION	(OPTAB_LONG - 1)
#define ID_VERBOSE	'v'

/*
 * The options every tool has, after its own, into C (four entries):
 * help and version, and -v/--verbose when the tool gives its text.
 */
static const struct optab *
common(const struct optool *tool, struct optab c[4])
{
	static const struct optab help = { "help", 'h', NULL,
	    "print this help and exit 0", NULL, ID_HELP };
	static const struct optab version = { "version", 0, NULL,
	    "print the version and exit 0", NULL, ID_VERSION };
	size_t k = 0;

	memset(c, 0, 4 * sizeof(*c));
	c[k++] = help;
	if (tool->verbose != NULL) {
		c[k].name = "verbose";
		c[k].letter = 'v';
		c[k].help = tool->verbose;
		c[k++].id = ID_VERBOSE;
	}
	c[k] = version;
	return c;
}

static size_t
count(const struct optab *t)
{
	size_t n = 0;

	while (t[n].name != NULL)
		n++;
	return n;
}

static int
id_of(const struct optab *o)
{
	return o->id != 0 ? o->id : o->letter;
}

void
optab_init(struct optparse *p, const struct optool *tool, void *base)
{
	struct optab com[4];
	const struct optab *sets[2] = { tool->opts, common(tool, com) };
	size_t n, i, k = 0, s;
	char *sh = p->shorts;

	/* Messages name the program from here on. */
	cw_setprog(tool->prog);
	p->tool = tool;
	p->base = base;
	n = count(tool->opts) + count(sets[1]);
	p->longopts = cw_calloc(n + 1, sizeof(*p->longopts));
	*sh++ = ':';
	for (s = 0; s < 2; s++)
		for (i = 0; sets[s][i].name != NULL; i++) {
			const struct optab *o = &sets[s][i];

			p->longopts[k].name = o->name;
			p->longopts[k].has_arg = o->arg != NULL ?
			    required_argument : no_argument;
			p->longopts[k].val = id_of(o);
			k++;
			if (o->letter != 0 && sh < p->shorts +
			    sizeof(p->shorts) - 2) {
				*sh++ = (char)o->letter;
				if (o->arg != NULL)
					*sh++ = ':';
			}
		}
	*sh = '\0';
	opterr = 0;
}

/* Store the value of O, as its kind says, into BASE. */
static void
store(const struct optab *o, void *base, const char *v)
{
	char *at = (char *)base + o->off, name[64];

	snprintf(name, sizeof(name), "--%s", o->name);
	switch (o->kind & ~OPTAB_TELL) {
	case OPTAB_NUM:
		*(double *)(void *)at = opt_num_arg(name, v, o->lo, o->hi);
		break;
	case OPTAB_INT:
		*(int *)(void *)at = (int)opt_long_arg(name, v, (long)o->lo,
		    (long)o->hi);
		break;
	case OPTAB_DUR:
		*(cw_time *)(void *)at = opt_dur_arg(name, v, o->lo < 0);
		break;
	case OPTAB_TEMPDIFF:
		*(double *)(void *)at = opt_tempdiff_arg(name, v);
		break;
	case OPTAB_FLAG:
		*(int *)(void *)at = 1;
		break;
	case OPTAB_STR:
		*(const char **)(void *)at = v;
		break;
	case OPTAB_POS:
		*(double *)(void *)at = opt_pos_arg(name, v, o->hi);
		break;
	case OPTAB_OPEN:
		*(double *)(void *)at = opt_open_arg(name, v, o->lo, o->hi);
		break;
	case OPTAB_LONGINT:
		*(long *)(void *)at = opt_long_arg(name, v, (long)o->lo,
		    (long)o->hi);
		break;
	case OPTAB_ULONG:
		*(unsigned long *)(void *)at = (unsigned long)opt_long_arg(name,
		    v, (long)o->lo, (long)o->hi);
		break;
	case OPTAB_SIZE:
		*(size_t *)(void *)at = (size_t)opt_long_arg(name, v,
		    (long)o->lo, (long)o->hi);
		break;
	}
}

/* The entry of the tool's table with id ID that stores itself. */
static const struct optab *
stored(const struct optparse *p, int ch)
{
	const struct optab *o;

	for (o = p->tool->opts; o->name != NULL; o++) {
		if (id_of(o) != ch)
			continue;
		return o->kind != OPTAB_CASE && p->base != NULL ? o : NULL;
	}
	return NULL;
}

int
optab_next(struct optparse *p, int argc, char *argv[])
{
	const struct optab *o;
	int ch;

	for (;;) {
		ch = getopt_long(argc, argv, p->shorts, p->longopts, NULL);
		switch (ch) {
		case -1:
			return -1;
		case ID_HELP:
			optab_help(stdout, p->tool);
			exit(fflush(stdout) == 0 ? CW_EXIT_OK : CW_EXIT_DATA);
		case ID_VERSION:
			cw_print_version();
		case ID_VERBOSE:
			if (p->tool->verbose == NULL)
				break;
			cw_verbose = 1;
			continue;
		case ':':
		case '?':
			opt_getopt_fail(ch, argv);
		}
		if ((o = stored(p, ch)) == NULL)
			return ch;
		store(o, p->base, optarg);
		if (o->kind & OPTAB_TELL)
			return ch;
	}
}

void
optab_free(struct optparse *p)
{
	free(p->longopts);
	p->longopts = NULL;
}

int
optab_getopt(const struct optool *tool, void *base, int argc, char *argv[])
{
	static struct optparse p;
	static int open;
	int ch;

	if (!open) {
		optab_init(&p, tool, base);
		open = 1;
	}
	if ((ch = optab_next(&p, argc, argv)) == -1) {
		optab_free(&p);
		open = 0;
	}
	return ch;
}

int
optab_parse(const struct optool *tool, void *base, int argc, char *argv[])
{
	while (optab_getopt(tool, base, argc, argv) != -1)
		;
	return optind;
}

/*
 * The key an option is sorted by in the synopsis and the help: its
 * letter, or its name when it has none (so -o sorts as "o", before
 * --output-format).
 */
static const char *
key(const struct optab *o, char buf[2])
{
	if (o->letter == 0)
		return o->name;
	buf[0] = (char)o->letter;
	buf[1] = '\0';
	return buf;
}

static int
cmp_syn(const void *a, const void *b)
{
	const struct optab *x = *(const struct optab *const *)a;
	const struct optab *y = *(const struct optab *const *)b;
	char bx[2], by[2];
	const char *kx = key(x, bx), *ky = key(y, by);
	int c;

	for (; *kx != '\0' && *ky != '\0'; kx++, ky++)
		if ((c = tolower((unsigned char)*kx) -
		    tolower((unsigned char)*ky)) != 0)
			return c;
	if (*kx != *ky)
		return *kx == '\0' ? -1 : 1;
	/* The lower case letter first, as -s before -S. */
	return islower((unsigned char)*key(y, by)) -
	    islower((unsigned char)*key(x, bx));
}

/* Word W of length N at column *COL of a line indented by IND. */
static void
put_word(FILE *fp, const char *w, size_t n, size_t *col, size_t ind)
{
	if (*col > ind && *col + 1 + n > WIDTH) {
		fprintf(fp, "\n%*s", (int)ind, "");
		*col = ind;
	} else if (*col != ind) {
		fputc(' ', fp);
		(*col)++;
	}
	fwrite(w, 1, n, fp);
	*col += n;
}

/* TEXT word by word from column *COL, wrapped lines indented by IND. */
static void
put_text(FILE *fp, const char *text, size_t *col, size_t ind)
{
	const char *s = text, *e;

	for (;;) {
		while (*s == ' ')
			s++;
		if (*s == '\0')
			return;
		/* A bracketed option stays whole, as "[--full PCT]". */
		if (*s == '[' && (e = strchr(s, ']')) != NULL)
			e++;
		else
			for (e = s; *e != '\0' && *e != ' '; e++)
				;
		put_word(fp, s, (size_t)(e - s), col, ind);
		s = e;
	}
}

static void
synopsis(FILE *fp, const struct optool *tool)
{
	struct optab com[4];
	const struct optab *sets[2] = { tool->opts, common(tool, com) };
	const struct optab **v;
	char flags[64], buf[256];
	size_t n, i, k = 0, nf = 0, col, ind;
	int s;

	n = count(tool->opts) + count(sets[1]);
	v = cw_calloc(n, sizeof(*v));
	for (s = 0; s < 2; s++)
		for (i = 0; sets[s][i].name != NULL; i++) {
			const struct optab *o = &sets[s][i];

			if (o->letter != 0 && o->arg == NULL) {
				if (nf < sizeof(flags) - 1)
					flags[nf++] = (char)o->letter;
			} else
				v[k++] = o;
		}
	/* The flags' letters in order, lower case first per letter. */
	for (i = 1; i < nf; i++) {
		char c = flags[i];
		size_t j = i;

		while (j > 0 && (tolower((unsigned char)flags[j - 1]) >
		    tolower((unsigned char)c) ||
		    (tolower((unsigned char)flags[j - 1]) ==
		    tolower((unsigned char)c) && isupper((unsigned char)
		    flags[j - 1])))) {
			flags[j] = flags[j - 1];
			j--;
		}
		flags[j] = c;
	}
	flags[nf] = '\0';
	qsort(v, k, sizeof(*v), cmp_syn);
	fprintf(fp, "usage: %s", tool->prog);
	ind = strlen("usage: ") + strlen(tool->prog) + 1;
	col = ind - 1;
	if (nf > 0) {
		snprintf(buf, sizeof(buf), "[-%s]", flags);
		put_word(fp, buf, strlen(buf), &col, ind);
	}
	for (i = 0; i < k; i++) {
		if (v[i]->letter != 0)
			snprintf(buf, sizeof(buf), "[-%c %s]", v[i]->letter,
			    v[i]->arg);
		else if (v[i]->arg != NULL)
			snprintf(buf, sizeof(buf), "[--%s %s]", v[i]->name,
			    v[i]->arg);
		else
			snprintf(buf, sizeof(buf), "[--%s]", v[i]->name);
		put_word(fp, buf, strlen(buf), &col, ind);
	}
	if (tool->operands != NULL)
		put_text(fp, tool->operands, &col, ind);
	fputc('\n', fp);
	free(v);
}

/* The option as the help lists it ("  -o, --output FILE") into BUF. */
static size_t
head(char *buf, size_t size, const struct optab *o)
{
	if (o->letter != 0)
		snprintf(buf, size, "  -%c, --%s%s%s", o->letter, o->name,
		    o->arg ? " " : "", o->arg ? o->arg : "");
	else
		snprintf(buf, size, "      --%s%s%s", o->name,
		    o->arg ? " " : "", o->arg ? o->arg : "");
	return strlen(buf);
}

void
optab_help(FILE *fp, const struct optool *tool)
{
	struct optab com[4];
	const struct optab *sets[2] = { tool->opts, common(tool, com) };
	const struct optab **v;
	char buf[256];
	size_t n, i, k = 0, col, ind = TEXTCOL;
	int s;

	synopsis(fp, tool);
	if (tool->about != NULL)
		fprintf(fp, "\n%s", tool->about);
	fputc('\n', fp);
	n = count(tool->opts) + count(sets[1]);
	v = cw_calloc(n, sizeof(*v));
	for (s = 0; s < 2; s++)
		for (i = 0; sets[s][i].name != NULL; i++)
			v[k++] = &sets[s][i];
	qsort(v, k, sizeof(*v), cmp_syn);
	/* The text column: past the longest option that fits TEXTMAX. */
	for (i = 0; i < k; i++) {
		col = head(buf, sizeof(buf), v[i]) + 2;
		if (col > ind && col <= TEXTMAX)
			ind = col;
	}
	for (i = 0; i < k; i++) {
		const struct optab *o = v[i];

		col = head(buf, sizeof(buf), o);
		fputs(buf, fp);
		/* A long one has its text on the next line. */
		if (col < ind - 1)
			fprintf(fp, "%*s", (int)(ind - col), "");
		else if (col == ind - 1)
			fputc(' ', fp);
		else
			fprintf(fp, "\n%*s", (int)ind, "");
		col = ind;
		put_text(fp, o->help, &col, ind);
		if (o->dflt != NULL) {
			/* "(default X)" on one line when X is one word. */
			snprintf(buf, sizeof(buf), "(default %s)", o->dflt);
			if (strchr(o->dflt, ' ') == NULL)
				put_word(fp, buf, strlen(buf), &col, ind);
			else
				put_text(fp, buf, &col, ind);
		}
		fputc('\n', fp);
	}
	free(v);
	if (tool->epilogue != NULL)
		fprintf(fp, "\n%s", tool->epilogue);
}
