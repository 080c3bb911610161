/*
 * test_csvin.c: the CSV reader (lib/csvin.c).
 *
 * Reference: RFC 4180 ("Common Format and MIME Type for CSV Files"),
 * section 2: records end at a line break (CRLF; LF accepted here), fields
 * may be enclosed in double quotes, a field holding a comma, a quote or a
 * line break must be quoted, and a quote inside is written twice.  The
 * UTF-8 BOM is U+FEFF encoded as EF BB BF (Unicode 15, section 23.8).
 * Every expected record below is written out by hand from those rules.
 */
#include <fcntl.h>
#include <setjmp.h>
#include <stdarg.h>
#include <stddef.h>
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>
#include <string.h>
#include <unistd.h>
#include <zlib.h>
#include <cmocka.h>

#include "csvin.h"
#include "cw.h"

/* What the callbacks saw, one line per event, for exact comparison. */
struct log {
	char *s;
	size_t n, cap;
	int stop_at_row;	/* row() returns 7 at this row number, if > 0 */
	int rows;
	unsigned long lastline;
};

static char tmpdir[] = "/tmp/test_csvin.XXXXXX";
static int saved_stderr = -1;
static char errpath[300];

static void addf(struct log *, const char *, ...)
    __attribute__((format(printf, 2, 3)));
static void addesc(struct log *, const char *, size_t);
static void addrec(struct log *, char, const struct csvin_rec *);
static int on_header(void *, const struct csvin_rec *);
static int on_row(void *, const struct csvin_rec *);
static int on_bad(void *, const struct csvin_rec *, const char *);
static int on_blank(void *, const struct csvin_rec *);
static const char *put(const char *, const void *, size_t);
static const char *putgz(const char *, const void *, size_t);
static struct csvin *run(char, const char *, struct log *, int *);
static void expect(const char, const char *, const char *);
static void err_begin(void);
static char *err_end(void);

static const struct csvin_ops ops = { on_header, on_row, on_bad, on_blank };

static void
addf(struct log *l, const char *fmt, ...)
{
	va_list ap;
	int n;

	if (l->s == NULL) {
		l->cap = 256;
		l->s = malloc(l->cap);
		assert_non_null(l->s);
	}
	for (;;) {
		va_start(ap, fmt);
		n = vsnprintf(l->s + l->n, l->cap - l->n, fmt, ap);
		va_end(ap);
		if ((size_t)n < l->cap - l->n)
			break;
		l->cap = 2 * (l->cap + (size_t)n);
		l->s = realloc(l->s, l->cap);
		assert_non_null(l->s);
	}
	l->n += (size_t)n;
}

/* Bytes with \n, \r, \t and | shown as escapes, so a log stays one line
 * per record. */
static void
addesc(struct log *l, const char *s, size_t n)
{
	size_t i;

	for (i = 0; i < n; i++) {
		unsigned char c = (unsigned char)s[i];

		if (c == '\n')
			addf(l, "\\n");
		else if (c == '\r')
			addf(l, "\\r");
		else if (c == '\t')
			addf(l, "\\t");
		else if (c == '|' || c == '\\')
			addf(l, "\\%c", c);
		else if (c < 32 || c > 126)
			addf(l, "\\x%02X", c);
		else
			addf(l, "%c", c);
	}
}

/* "K LINE f0|f1|... <raw>" */
static void
addrec(struct log *l, char k, const struct csvin_rec *r)
{
	size_t i;

	addf(l, "%c %lu ", k, r->line);
	for (i = 0; i < r->nf; i++) {
		if (i > 0)
			addf(l, "|");
		assert_int_equal(strlen(r->f[i]), r->len[i]);
		addesc(l, r->f[i], r->len[i]);
	}
	addf(l, " <");
	addesc(l, r->raw, r->rawlen);
	addf(l, ">\n");
	assert_true(r->line >= l->lastline);
	l->lastline = r->line;
}

static int
on_header(void *ctx, const struct csvin_rec *r)
{
	struct log *l = ctx;

	l->lastline = 0;	/* a new file starts at line 1 */
	addrec(l, 'H', r);
	return 0;
}

static int
on_row(void *ctx, const struct csvin_rec *r)
{
	struct log *l = ctx;

	addrec(l, 'R', r);
	if (++l->rows == l->stop_at_row)
		return 7;
	return 0;
}

static int
on_bad(void *ctx, const struct csvin_rec *r, const char *why)
{
	struct log *l = ctx;

	addf(l, "B %lu %s <", r->line, why);
	addesc(l, r->raw, r->rawlen);
	addf(l, ">\n");
	return 0;
}

static int
on_blank(void *ctx, const struct csvin_rec *r)
{
	struct log *l = ctx;

	assert_int_equal(r->rawlen, 0);
	addf(l, "E %lu\n", r->line);
	return 0;
}

/* Write DATA to a file NAME in the scratch folder; its path. */
static const char *
put(const char *name, const void *data, size_t n)
{
	static char path[8][300];
	static int k;
	char *p = path[k++ % 8];
	FILE *fp;

	snprintf(p, 300, "%s/%s", tmpdir, name);
	fp = fopen(p, "wb");
	assert_non_null(fp);
	assert_int_equal(fwrite(data, 1, n, fp), n);
	assert_int_equal(fclose(fp), 0);
	return p;
}

/* The same, gzip-compressed by zlib (RFC 1952 member). */
static const char *
putgz(const char *name, const void *data, size_t n)
{
	static char path[300];
	gzFile gz;

	snprintf(path, sizeof(path), "%s/%s", tmpdir, name);
	gz = gzopen(path, "wb");
	assert_non_null(gz);
	assert_int_equal(gzwrite(gz, data, (unsigned)n), (int)n);
	assert_int_equal(gzclose(gz), Z_OK);
	return path;
}

static void
err_begin(void)
{
	int fd;

	fflush(stderr);
	saved_stderr = dup(2);
	snprintf(errpath, sizeof(errpath), "%s/stderr", tmpdir);
	fd = open(errpath, O_WRONLY | O_CREAT | O_TRUNC, 0600);
	assert_true(fd >= 0);
	dup2(fd, 2);
	close(fd);
}

/* What went to stderr since err_begin() (static buffer). */
static char *
err_end(void)
{
	static char buf[4096];
	FILE *fp;
	size_t n;

	fflush(stderr);
	dup2(saved_stderr, 2);
	close(saved_stderr);
	fp = fopen(errpath, "rb");
	assert_non_null(fp);
	n = fread(buf, 1, sizeof(buf) - 1, fp);
	buf[n] = '\0';
	fclose(fp);
	return buf;
}

/* Read PATH with DELIM; *RC gets csvin_file()'s value.  The reader is
 * returned for its stats (the caller frees it). */
static struct csvin *
run(char delim, const char *path, struct log *l, int *rc)
{
	struct csvin *r = csvin_new(delim, &ops, l);

	*rc = csvin_file(r, path);
	return r;
}

/*
 * Read TEXT (as a file) with DELIM and compare the log with WANT; then
 * the same from memory (csvin_mem(), under the file's name), which must
 * log the same.
 */
static void
expect(const char delim, const char *text, const char *want)
{
	struct log l = { 0 }, m = { 0 };
	struct csvin *r;
	const char *path;
	int rc;

	path = put("in.csv", text, strlen(text));
	r = run(delim, path, &l, &rc);
	assert_int_equal(rc, 0);
	if (l.s == NULL || strcmp(l.s, want) != 0) {
		print_error("got:\n%swant:\n%s", l.s ? l.s : "(nothing)\n",
		    want);
		fail();
	}
	csvin_free(r);
	r = csvin_new(delim, &ops, &m);
	assert_int_equal(csvin_mem(r, path, text, strlen(text)), 0);
	assert_non_null(m.s);
	assert_string_equal(m.s, l.s);
	csvin_free(r);
	free(l.s);
	free(m.s);
}

static int
setup(void **st)
{
	(void)st;
	cw_setprog("test_csvin");
	return mkdtemp(tmpdir) != NULL ? 0 : -1;
}

static int
teardown(void **st)
{
	char cmd[400];

	(void)st;
	snprintf(cmd, sizeof(cmd), "rm -rf '%s'", tmpdir);
	return system(cmd) == 0 ? 0 : -1;
}

/* RFC 4180 2.5-2.7: embedded comma, doubled quote, line break inside
 * quotes; the next record's line number counts the line break. */
static void
test_rfc4180(void **st)
{
	(void)st;
	expect(',',
	    "a,b,c\n"
	    "1,\"x,y\",3\n"
	    "2,\"say \"\"hi\"\"\",4\n"
	    "3,\"line1\nline2\",5\n"
	    "4,after,6\n"
	    "5,\"two\n\nbreaks\",7\n"
	    "6,,\n"
	    "\"\",\"\",\"\"\n"
	    "7,last,8\n",
	    "H 1 a|b|c <a,b,c>\n"
	    "R 2 1|x,y|3 <1,\"x,y\",3>\n"
	    "R 3 2|say \"hi\"|4 <2,\"say \"\"hi\"\"\",4>\n"
	    "R 4 3|line1\\nline2|5 <3,\"line1\\nline2\",5>\n"
	    "R 6 4|after|6 <4,after,6>\n"
	    "R 7 5|two\\n\\nbreaks|7 <5,\"two\\n\\nbreaks\",7>\n"
	    "R 10 6|| <6,,>\n"
	    "R 11 || <\"\",\"\",\"\">\n"
	    "R 12 7|last|8 <7,last,8>\n");
}

/* RFC 4180 2.1: CRLF line ends; a CRLF inside quotes is data. */
static void
test_crlf(void **st)
{
	(void)st;
	expect(',',
	    "a,b\r\n"
	    "1,2\r\n"
	    "\"x\r\ny\",3\r\n"
	    "4,5",
	    "H 1 a|b <a,b>\n"
	    "R 2 1|2 <1,2>\n"
	    "R 3 x\\r\\ny|3 <\"x\\r\\ny\",3>\n"
	    "R 5 4|5 <4,5>\n");
}

/* The UTF-8 BOM before the header is not part of the first name. */
static void
test_bom(void **st)
{
	struct log l = { 0 };
	struct csvin *r;
	const char *p;
	int rc;

	(void)st;
	expect(',', "\xEF\xBB\xBF" "device,time\nEB-1,0\n",
	    "H 1 device|time <device,time>\n"
	    "R 2 EB-1|0 <EB-1,0>\n");
	/* Two such files concatenated: the second header still repeats. */
	p = "\xEF\xBB\xBF" "device,time\nEB-1,0\n"
	    "\xEF\xBB\xBF" "device,time\nEB-1,1\n";
	r = run(',', put("bom2.csv", p, strlen(p)), &l, &rc);
	assert_int_equal(rc, 0);
	assert_string_equal(l.s, "H 1 device|time <device,time>\n"
	    "R 2 EB-1|0 <EB-1,0>\n"
	    "R 4 EB-1|1 <EB-1,1>\n");
	assert_int_equal(csvin_stats(r)->header_repeats, 1);
	csvin_free(r);
	free(l.s);
}

/* Concatenated logs: a later record equal to the header is skipped and
 * counted; blank lines are reported and counted; the counts add up. */
static void
test_repeats_and_blanks(void **st)
{
	static const char text[] =
	    "device,time\n"
	    "A,1\n"
	    "\n"
	    "device,time\n"
	    "A,2\n"
	    "device,time\r\n"
	    "\r\n"
	    "A,3\n"
	    "\n";
	const struct csvin_stats *s;
	struct log l = { 0 };
	struct csvin *r;
	int rc;

	(void)st;
	r = run(',', put("rep.csv", text, sizeof(text) - 1), &l, &rc);
	assert_int_equal(rc, 0);
	assert_string_equal(l.s,
	    "H 1 device|time <device,time>\n"
	    "R 2 A|1 <A,1>\n"
	    "E 3\n"
	    "R 5 A|2 <A,2>\n"
	    "E 7\n"
	    "R 8 A|3 <A,3>\n"
	    "E 9\n");
	s = csvin_stats(r);
	assert_int_equal(s->records, 9);
	assert_int_equal(s->headers, 1);
	assert_int_equal(s->header_repeats, 2);
	assert_int_equal(s->rows, 3);
	assert_int_equal(s->blank, 3);
	assert_int_equal(s->bad, 0);
	assert_int_equal(s->records, s->headers + s->header_repeats +
	    s->rows + s->blank + s->bad);
	/* The header of the first file begins each later one too. */
	csvin_free(r);
	free(l.s);
}

/* An opening quote that never closes swallows the rest of the file: one
 * bad record at its first line, nothing invented after it. */
static void
test_unterminated_quote(void **st)
{
	(void)st;
	expect(',',
	    "a,b\n"
	    "1,2\n"
	    "3,\"open\n"
	    "4,5\n",
	    "H 1 a|b <a,b>\n"
	    "R 2 1|2 <1,2>\n"
	    "B 3 unterminated quote <3,\"open\\n4,5\\n>\n");
	expect(',', "a,b\n\"x", "H 1 a|b <a,b>\nB 2 unterminated quote <\"x>\n");
}

/* RFC 4180 2.5: a quote may only appear in a quoted field.  A stray one
 * makes the record bad, and only that record. */
static void
test_stray_quote(void **st)
{
	const struct csvin_stats *s;
	struct log l = { 0 };
	struct csvin *r;
	static const char text[] =
	    "a,b,c\n"
	    "1,ab\"c,3\n"
	    "2,\"ab\"c,3\n"
	    "3,x\",3\n"
	    "4,ok,5\n";
	int rc;

	(void)st;
	r = run(',', put("stray.csv", text, sizeof(text) - 1), &l, &rc);
	assert_int_equal(rc, 0);
	assert_string_equal(l.s,
	    "H 1 a|b|c <a,b,c>\n"
	    "B 2 malformed quoting <1,ab\"c,3>\n"
	    "B 3 malformed quoting <2,\"ab\"c,3>\n"
	    "B 4 malformed quoting <3,x\",3>\n"
	    "R 5 4|ok|5 <4,ok,5>\n");
	s = csvin_stats(r);
	assert_int_equal(s->bad, 3);
	assert_int_equal(s->rows, 1);
	csvin_free(r);
	free(l.s);
}

/*
 * A quote after blanks at the start of a field: libcsv skips the blanks
 * and opens a quoted field there, so the record splitter must see it the
 * same way, or a line break inside such a field would cut the record and
 * pass a short row on.  After a closing quote, blanks and another quote
 * are malformed (RFC 4180 2.5).
 */
static void
test_quote_after_blank(void **st)
{
	(void)st;
	expect(',',
	    "a,b,c\n"
	    "1, \"x,y\",3\n"
	    "2, \"p\nq\",3\n"
	    "3,  \"r\"\"\ns\",3\n"
	    "\"a\" \"b\nc\",d\n"
	    "4,ok,5\n",
	    "H 1 a|b|c <a,b,c>\n"
	    "R 2 1|x,y|3 <1, \"x,y\",3>\n"
	    "R 3 2|p\\nq|3 <2, \"p\\nq\",3>\n"
	    "R 5 3|r\"\\ns|3 <3,  \"r\"\"\\ns\",3>\n"
	    "B 7 malformed quoting <\"a\" \"b>\n"
	    "B 8 malformed quoting <c\",d>\n"
	    "R 9 4|ok|5 <4,ok,5>\n");
	/* libcsv's blanks are space and tab (tab only when it is not the
	 * delimiter). */
	expect(',',
	    "a,b\n"
	    "1,\t\"p\nq\"\n"
	    "2, \t \"x\ny\" \n"
	    "3,ok\n",
	    "H 1 a|b <a,b>\n"
	    "R 2 1|p\\nq <1,\\t\"p\\nq\">\n"
	    "R 4 2|x\\ny <2, \\t \"x\\ny\" >\n"
	    "R 6 3|ok <3,ok>\n");
	expect('\t',
	    "a\tb\n"
	    "1\t\"p\nq\"\n"
	    "3\tok\n",
	    "H 1 a|b <a\\tb>\n"
	    "R 2 1|p\\nq <1\\t\"p\\nq\">\n"
	    "R 4 3|ok <3\\tok>\n");
}

/*
 * A bare CR is not a record end (records end at LF; RFC 4180 2.1 makes it
 * CRLF): the same bytes must give the same fields whether or not a quote
 * elsewhere in the record sends it through libcsv.
 */
static void
test_bare_cr(void **st)
{
	(void)st;
	expect(',',
	    "h1,h2,h3\n"
	    "a,b\rc,d\n"
	    "\"a\",b\rc,d\n"
	    "\"x\ry\",2,3\n",
	    "H 1 h1|h2|h3 <h1,h2,h3>\n"
	    "R 2 a|b\\rc|d <a,b\\rc,d>\n"
	    "R 3 a|b\\rc|d <\"a\",b\\rc,d>\n"
	    "R 4 x\\ry|2|3 <\"x\\ry\",2,3>\n");
}

/* Other delimiters: ';' (decimal-comma locales) and tab. */
static void
test_delimiters(void **st)
{
	(void)st;
	expect(';',
	    "a;b;c\n"
	    "1,5;\"x;y\";3\n"
	    "2;\"q\"\"\";\n",
	    "H 1 a|b|c <a;b;c>\n"
	    "R 2 1,5|x;y|3 <1,5;\"x;y\";3>\n"
	    "R 3 2|q\"| <2;\"q\"\"\";>\n");
	expect('\t',
	    "a\tb\tc\n"
	    "1\t\"x\ty\"\t3,4\n",
	    "H 1 a|b|c <a\\tb\\tc>\n"
	    "R 2 1|x\\ty|3,4 <1\\t\"x\\ty\"\\t3,4>\n");
}

/*
 * The one pass that finds a line's end, quotes and delimiters 16 bytes at
 * a time (scan_line()) must give the fields the byte-wise reading gives:
 * a plain line with a quoted one after it in the same 16 bytes; blanks
 * around the fields of a line longer than 16 bytes trimmed; a delimiter
 * just before a CR line end making an empty last field; a line of more
 * delimiters than the pass keeps (64), cut the other way.  Hand-written
 * expectations.
 */
static void
test_line_scan(void **st)
{
	char text[1024], want[2048];
	size_t tn = 0, wn = 0;
	int i;

	(void)st;
	expect(',',
	    "a,b\n"
	    "1,2\n\"x,y\",3\n"
	    "  long field one  ,\tsecond field here\t, third ,\r\n",
	    "H 1 a|b <a,b>\n"
	    "R 2 1|2 <1,2>\n"
	    "R 3 x,y|3 <\"x,y\",3>\n"
	    "R 4 long field one|second field here|third| <  long field one  ,"
	    "\\tsecond field here\\t, third ,>\n");
	/* A header of 70 fields h0,...,h69 and a row 0,...,69. */
	for (i = 0; i < 2; i++) {
		int k;

		for (k = 0; k < 70; k++)
			tn += (size_t)snprintf(text + tn, sizeof(text) - tn,
			    "%s%s%d", k > 0 ? "," : "", i == 0 ? "h" : "", k);
		text[tn++] = '\n';
	}
	text[tn] = '\0';
	for (i = 0; i < 2; i++) {
		int k;

		wn += (size_t)snprintf(want + wn, sizeof(want) - wn, "%c %d ",
		    i == 0 ? 'H' : 'R', i + 1);
		for (k = 0; k < 70; k++)
			wn += (size_t)snprintf(want + wn, sizeof(want) - wn,
			    "%s%s%d", k > 0 ? "|" : "", i == 0 ? "h" : "", k);
		wn += (size_t)snprintf(want + wn, sizeof(want) - wn, " <");
		for (k = 0; k < 70; k++)
			wn += (size_t)snprintf(want + wn, sizeof(want) - wn,
			    "%s%s%d", k > 0 ? "," : "", i == 0 ? "h" : "", k);
		wn += (size_t)snprintf(want + wn, sizeof(want) - wn, ">\n");
	}
	expect(',', text, want);
}

/* The raw text is the record exactly as read, bytes that are not UTF-8
 * included; only the line end (and a BOM) is left out. */
static void
test_raw_exact(void **st)
{
	static const char text[] = "h\n\"a\"\"b\",\xff\x80 x ,\"\"\n";

	(void)st;
	expect(',', text, "H 1 h <h>\n"
	    "R 2 a\"b|\\xFF\\x80 x| <\"a\"\"b\",\\xFF\\x80 x ,\"\">\n");
}

/* Records that straddle every read boundary (GZSRC_BUFSZ = 256 KiB and
 * the reader's own buffer): a few MB of random records, some quoted with
 * commas, doubled quotes and line breaks, read plain and gzipped; each
 * record must come back whole with its line number. */
static void
test_read_boundaries(void **st)
{
	size_t cap = 6u << 20, n = 0;
	char *text = malloc(cap);
	struct log want = { 0 }, got = { 0 };
	unsigned long line = 2, nrec = 0;
	uint64_t x = 88172645463325252u;
	struct csvin *r;
	int rc, pass;

	(void)st;
	assert_non_null(text);
	n += (size_t)sprintf(text, "id,val,note\n");
	addf(&want, "H 1 id|val|note <id,val,note>\n");
	while (n < cap - 300000) {
		char note[300], raw[700];
		size_t nl = 0, k, len, rl;

		x ^= x << 13, x ^= x >> 7, x ^= x << 17;
		len = (size_t)(x % (nrec % 97 == 0 ? 280 : 40));
		for (k = 0; k < len; k++) {
			static const char al[] = "abcdefXYZ0123 ,\"\n";

			x ^= x << 13, x ^= x >> 7, x ^= x << 17;
			note[k] = al[x % (sizeof(al) - 1)];
			nl += note[k] == '\n';
		}
		note[len] = '\0';
		rl = (size_t)sprintf(raw, "%lu,%lu,", nrec, line);
		if (strpbrk(note, ",\"\n") != NULL || (x & 1)) {
			raw[rl++] = '"';
			for (k = 0; k < len; k++) {
				if (note[k] == '"')
					raw[rl++] = '"';
				raw[rl++] = note[k];
			}
			raw[rl++] = '"';
		} else {
			/* Unquoted: libcsv trims blanks at the edges. */
			while (len > 0 && note[len - 1] == ' ')
				note[--len] = '\0';
			k = strspn(note, " ");
			memmove(note, note + k, len - k + 1);
			len -= k;
			rl += (size_t)sprintf(raw + rl, "%s", note);
		}
		raw[rl] = '\0';
		n += (size_t)sprintf(text + n, "%s%s", raw,
		    nrec % 5 == 0 ? "\r\n" : "\n");
		addf(&want, "R %lu %lu|%lu|", line, nrec, line);
		addesc(&want, note, len);
		addf(&want, " <");
		addesc(&want, raw, rl);
		addf(&want, ">\n");
		line += 1 + nl;
		nrec++;
	}
	assert_true(n > 5 * GZSRC_BUFSZ);
	for (pass = 0; pass < 2; pass++) {
		const char *path = pass == 0 ? put("big.csv", text, n) :
		    putgz("big.csv.gz", text, n);

		got.n = 0;
		got.lastline = 0;
		r = run(',', path, &got, &rc);
		assert_int_equal(rc, 0);
		assert_int_equal(csvin_stats(r)->rows, nrec);
		assert_int_equal(csvin_stats(r)->bad, 0);
		assert_int_equal(got.n, want.n);
		assert_memory_equal(got.s, want.s, want.n);
		csvin_free(r);
	}
	free(text);
	free(want.s);
	free(got.s);
}

/* One record placed exactly across the 256 KiB and 512 KiB offsets, with
 * its quote and its line break on either side. */
static void
test_record_on_boundary(void **st)
{
	static const size_t at[] = { GZSRC_BUFSZ, 2 * GZSRC_BUFSZ,
	    3 * GZSRC_BUFSZ };
	size_t cap = 4 * GZSRC_BUFSZ, i;
	char *text = malloc(cap);
	int d;

	(void)st;
	assert_non_null(text);
	for (i = 0; i < sizeof(at) / sizeof(at[0]); i++)
		for (d = -3; d <= 3; d++) {
			struct log l = { 0 };
			struct csvin *r;
			size_t n = 0, pad;
			unsigned long lines = 1;
			char want[64];
			int rc;

			n += (size_t)sprintf(text, "a,b\n");
			/* Filler rows "x,y\n" up to a few bytes before AT. */
			pad = at[i] - 40 + (size_t)(d + 3) * 5;
			while (n + 4 <= pad) {
				n += (size_t)sprintf(text + n, "x,y\n");
				lines++;
			}
			n += (size_t)sprintf(text + n,
			    "\"q\"\"\n\",\"r,\r\n\"\"s\"\r\n");
			n += (size_t)sprintf(text + n, "end,1\n");
			r = run(',', put("edge.csv", text, n), &l, &rc);
			assert_int_equal(rc, 0);
			assert_int_equal(csvin_stats(r)->bad, 0);
			assert_non_null(strstr(l.s,
			    "q\"\\n|r,\\r\\n\"s <\"q\"\"\\n\",\"r,\\r\\n"
			    "\"\"s\">\n"));
			/* Header, fillers, three lines of the quoted record. */
			snprintf(want, sizeof(want), "R %lu end|1 <end,1>\n",
			    lines + 4);
			assert_non_null(strstr(l.s, want));
			csvin_free(r);
			free(l.s);
		}
	free(text);
}

/* Several files: each starts with its own header and its own line 1, and
 * the file name is the record's source. */
static void
test_files(void **st)
{
	struct log l = { 0 };
	struct csvin *r = csvin_new(',', &ops, &l);
	char *files[2];
	char p1[300], p2[300];

	(void)st;
	strcpy(p1, put("one.csv", "a\n1\n", 4));
	strcpy(p2, putgz("two.csv.gz", "b\n2\n3\n", 6));
	files[0] = p1;
	files[1] = p2;
	assert_int_equal(csvin_files(r, files, 2), 0);
	assert_string_equal(l.s, "H 1 a <a>\nR 2 1 <1>\nH 1 b <b>\n"
	    "R 2 2 <2>\nR 3 3 <3>\n");
	assert_int_equal(csvin_stats(r)->headers, 2);
	csvin_free(r);
	free(l.s);
}

/* A callback's non-zero value stops the reading and is returned. */
static void
test_stop(void **st)
{
	struct log l = { 0 };
	struct csvin *r;
	int rc;

	(void)st;
	l.stop_at_row = 2;
	r = run(',', put("stop.csv", "h\n1\n2\n3\n", 8), &l, &rc);
	assert_int_equal(rc, 7);
	assert_string_equal(l.s, "H 1 h <h>\nR 2 1 <1>\nR 3 2 <2>\n");
	csvin_free(r);
	free(l.s);
}

/* Input errors: a missing file, and a gzip stream cut short after good
 * rows: CW_EXIT_DATA, a message naming the file, the good rows kept. */
static void
test_input_errors(void **st)
{
	struct log l = { 0 };
	struct csvin *r;
	char text[20000], *msg, path[300];
	size_t n = 0;
	int rc, k;
	FILE *fp;
	long sz;

	(void)st;
	err_begin();
	r = run(',', "/nonexistent/x.csv", &l, &rc);
	msg = err_end();
	assert_int_equal(rc, CW_EXIT_DATA);
	assert_non_null(strstr(msg, "test_csvin: /nonexistent/x.csv: "));
	csvin_free(r);

	n += (size_t)sprintf(text, "k,v\n");
	for (k = 0; n < sizeof(text) - 40; k++)
		n += (size_t)sprintf(text + n, "%d,%d\n", k, k * 7919 % 1000);
	strcpy(path, putgz("cut.csv.gz", text, n));
	fp = fopen(path, "rb+");
	assert_non_null(fp);
	fseek(fp, 0, SEEK_END);
	sz = ftell(fp);
	assert_int_equal(ftruncate(fileno(fp), sz / 2), 0);
	fclose(fp);
	free(l.s);
	memset(&l, 0, sizeof(l));
	err_begin();
	r = run(',', path, &l, &rc);
	msg = err_end();
	assert_int_equal(rc, CW_EXIT_DATA);
	assert_non_null(strstr(msg, path));
	assert_non_null(strstr(msg, "truncated"));
	/* Some rows came through, and they are the file's first rows. */
	assert_true(csvin_stats(r)->rows > 10);
	assert_true(csvin_stats(r)->rows < (unsigned long)k);
	assert_non_null(strstr(l.s, "R 2 0|0 <0,0>\nR 3 1|919 <1,919>\n"));
	csvin_free(r);
	free(l.s);
}

static void
test_find(void **st)
{
	struct csvin_rec h;
	char *f[] = { "device", "time", "voltage_v", "time" };
	size_t len[] = { 6, 4, 9, 4 };

	(void)st;
	h.nf = 4;
	h.f = f;
	h.len = len;
	assert_int_equal(csvin_find(&h, "device"), 0);
	assert_int_equal(csvin_find(&h, "time"), 1);
	assert_int_equal(csvin_find(&h, "voltage_v"), 2);
	assert_int_equal(csvin_find(&h, "voltage"), -1);
	assert_int_equal(csvin_find(&h, "Device"), -1);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_rfc4180),
		cmocka_unit_test(test_crlf),
		cmocka_unit_test(test_bom),
		cmocka_unit_test(test_repeats_and_blanks),
		cmocka_unit_test(test_unterminated_quote),
		cmocka_unit_test(test_stray_quote),
		cmocka_unit_test(test_quote_after_blank),
		cmocka_unit_test(test_bare_cr),
		cmocka_unit_test(test_delimiters),
		cmocka_unit_test(test_line_scan),
		cmocka_unit_test(test_raw_exact),
		cmocka_unit_test(test_read_boundaries),
		cmocka_unit_test(test_record_on_boundary),
		cmocka_unit_test(test_files),
		cmocka_unit_test(test_stop),
		cmocka_unit_test(test_input_errors),
		cmocka_unit_test(test_find),
	};

	return cmocka_run_group_tests(tests, setup, teardown);
}
