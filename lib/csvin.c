/*
 * csvin.c: the CSV reader.
 *
 * Input arrives in GZSRC_BUFSZ chunks.  Each line is found by one pass
 * (scan_line(): 16 bytes at a time with SSE2) that also notes its quotes
 * and delimiters; only a line that holds a quote is scanned byte by byte
 * again, to see if
 * a quoted field carries the record over the line end.  A record with a
 * quote is parsed by libcsv in strict mode and finished with csv_fini(),
 * so a broken record never spills into the next one.  A record without one
 * has nothing for a CSV state machine to do: it is cut at its delimiters
 * (split_plain, at the delimiters the line's pass found), which gives
 * the same fields libcsv would, at a fraction of the cost.  Fields go to one arena that is
 * reused for every record: no allocation per row once warm.
 */
#include <stdlib.h>
#include <string.h>
#ifdef __SSE2__
#include <emmintrin.h>
#endif

#include <csv.h>

#include "csvin.h"
#include "cw.h"

#define CSVIN_MAXREC (64u * 1024 * 1024)	/* longest record accepted */
#define CSVIN_MEMCHUNK 4096	/* read size from a memory source */
#define CSVIN_NDPOS 64		/* delimiters a line's scan keeps */

struct csvin {
	char delim;
	int auto_delim;		/* pick the delimiter from each header */
	const struct csvin_ops *ops;
	void *ctx;
	struct csv_parser p;
	/* Input buffer: bytes [pos, len) are not consumed yet. */
	char *buf;
	size_t cap, len, pos;
	/* The record being parsed. */
	char *arena;
	size_t acap, alen;
	size_t *off, *flen;
	char **f;
	size_t fcap, nf;
	int failed;		/* libcsv reported an error in this record */
	/*
	 * The delimiters of the line scan_line() found last, as offsets
	 * from its start: ndpos of them, or -1 when they were not kept
	 * (more than CSVIN_NDPOS, or a delimiter a line scan cannot see).
	 */
	int ndpos;
	unsigned dpos[CSVIN_NDPOS];
	int growing;		/* csvin_set_growing(): hold a cut last line */
	/* Per file. */
	const char *src;
	unsigned long line;	/* line number of the next record */
	int need_header;
	char *hdr;
	size_t hdrlen, hdrcap;
	struct csvin_stats st;
};

static void field_cb(void *, size_t, void *);
static void row_cb(int, void *);
static int record(struct csvin *, const char *, size_t, unsigned long, int,
    int);
static void split_plain(struct csvin *, const char *, size_t, int);
static const char *scan_line(struct csvin *, const char *, const char *,
    int *);
static char guess_delim(const char *, size_t);
static int read_src(struct csvin *, struct gzsrc *);
static int term_fn(unsigned char);
static int unended(struct csvin *, struct gzsrc *, const char *,
    const char *);
static int scan_quoted(const struct csvin *, const char *, const char *, int,
    const char **, unsigned long *);

/* Records are split before libcsv sees them: no terminator inside, so a
 * bare CR stays in its field as it does in split_plain(). */
static int
term_fn(unsigned char c)
{
	(void)c;
	return 0;
}

struct csvin *
csvin_new(char delim, const struct csvin_ops *ops, void *ctx)
{
	struct csvin *r = cw_calloc(1, sizeof(*r));

	r->auto_delim = delim == '\0';
	r->delim = delim != '\0' ? delim : ',';
	r->ops = ops;
	r->ctx = ctx;
	if (csv_init(&r->p, CSV_STRICT) != 0)
		cw_die(CW_EXIT_DATA, "cannot start the CSV parser");
	csv_set_delim(&r->p, (unsigned char)delim);
	csv_set_term_func(&r->p, term_fn);
	/* The input buffer is made by the first read (read_src()). */
	r->acap = 4096;
	r->arena = cw_malloc(r->acap);
	r->fcap = 64;
	r->off = cw_malloc(r->fcap * sizeof(*r->off));
	r->flen = cw_malloc(r->fcap * sizeof(*r->flen));
	r->f = cw_malloc(r->fcap * sizeof(*r->f));
	return r;
}

void
csvin_free(struct csvin *r)
{
	if (r == NULL)
		return;
	csv_free(&r->p);
	free(r->buf);
	free(r->arena);
	free(r->off);
	free(r->flen);
	free(r->f);
	free(r->hdr);
	free(r);
}

char
csvin_delim(const struct csvin *r)
{
	return r->delim;
}

const struct csvin_stats *
csvin_stats(const struct csvin *r)
{
	return &r->st;
}

int
csvin_skip_blank(void *ctx, const struct csvin_rec *r)
{
	(void)ctx;
	(void)r;
	return 0;
}

int
csvin_find(const struct csvin_rec *hdr, const char *name)
{
	size_t i;

	for (i = 0; i < hdr->nf; i++)
		if (strcmp(hdr->f[i], name) == 0)
			return (int)i;
	return -1;
}

static void
field_cb(void *s, size_t n, void *data)
{
	struct csvin *r = data;

	if (r->failed)
		return;
	if (r->alen + n + 1 > r->acap) {
		while (r->alen + n + 1 > r->acap)
			r->acap *= 2;
		r->arena = cw_realloc(r->arena, r->acap);
	}
	if (r->nf == r->fcap) {
		r->fcap *= 2;
		r->off = cw_realloc(r->off, r->fcap * sizeof(*r->off));
		r->flen = cw_realloc(r->flen, r->fcap * sizeof(*r->flen));
		r->f = cw_realloc(r->f, r->fcap * sizeof(*r->f));
	}
	if (n > 0)
		memcpy(r->arena + r->alen, s, n);
	r->arena[r->alen + n] = '\0';
	r->off[r->nf] = r->alen;
	r->flen[r->nf] = n;
	r->nf++;
	r->alen += n + 1;
}

static void
row_cb(int c, void *data)
{
	(void)c;
	(void)data;
}

/*
 * The delimiter of a header: whichever of ',', ';', tab and '|' it holds
 * most often outside quotes (',' when it holds none).
 */
static char
guess_delim(const char *s, size_t n)
{
	static const char cand[] = ",;\t|";
	size_t count[4] = { 0 }, i, k;
	int inq = 0, best = 0;

	for (i = 0; i < n; i++) {
		if (s[i] == '"')
			inq = !inq;
		else if (!inq)
			for (k = 0; k < 4; k++)
				if (s[i] == cand[k])
					count[k]++;
	}
	for (k = 1; k < 4; k++)
		if (count[k] > count[best])
			best = (int)k;
	return cand[best];
}

/*
 * A record without quotes needs no state machine: copy it to the arena and
 * cut it at each delimiter, trimming blanks around fields as libcsv does.
 * KNOWN: the delimiters are those scan_line() found in the line REC
 * starts (r->dpos), so no search for each; they are all before N, since
 * a trailing CR cut off the line is not one (scan_line() keeps none for
 * a CR delimiter).
 */
static void
split_plain(struct csvin *r, const char *rec, size_t n, int known)
{
	char *p, *e, *q, *a, *b;

	if (n + 1 > r->acap) {
		while (n + 1 > r->acap)
			r->acap *= 2;
		r->arena = cw_realloc(r->arena, r->acap);
	}
	memcpy(r->arena, rec, n);
	r->arena[n] = '\0';
	r->alen = n + 1;
	p = r->arena;
	e = r->arena + n;
	for (;;) {
		if (!known)
			q = memchr(p, r->delim, (size_t)(e - p));
		else
			q = r->nf < (size_t)r->ndpos ? r->arena +
			    r->dpos[r->nf] : NULL;
		if (q == NULL)
			q = e;
		a = p;
		b = q;
		while (a < b && (*a == ' ' || (*a == '\t' && r->delim != '\t')))
			a++;
		while (b > a && (b[-1] == ' ' || (b[-1] == '\t' &&
		    r->delim != '\t')))
			b--;
		*b = '\0';
		if (r->nf == r->fcap) {
			r->fcap *= 2;
			r->off = cw_realloc(r->off, r->fcap * sizeof(*r->off));
			r->flen = cw_realloc(r->flen, r->fcap *
			    sizeof(*r->flen));
			r->f = cw_realloc(r->f, r->fcap * sizeof(*r->f));
		}
		r->off[r->nf] = (size_t)(a - r->arena);
		r->flen[r->nf] = (size_t)(b - a);
		r->nf++;
		if (q == e)
			break;
		p = q + 1;
	}
}

/*
 * The line from S: the first '\n' in [S, E), or NULL; *QUOTED whether a
 * quote comes before it (or before E).  The delimiters before the line
 * end go to r->dpos (r->ndpos, -1 when not kept), for split_plain().
 * With SSE2, 16 bytes are compared at a time with all three bytes, which
 * replaces a search for each of them (and one for each delimiter) on the
 * short lines of a gauge log.
 */
static const char *
scan_line(struct csvin *r, const char *s, const char *e, int *quoted)
{
	const char *p = s, *nl = NULL;
	char delim = r->delim;
	int nd = 0, keep = delim != '\n' && delim != '"' && delim != '\r';

	*quoted = 0;
#ifdef __SSE2__
	{
		const __m128i vn = _mm_set1_epi8('\n'), vq = _mm_set1_epi8('"'),
		    vd = _mm_set1_epi8(delim);

		while (e - p >= 16) {
			__m128i v = _mm_loadu_si128((const __m128i *)(const
			    void *)p);
			unsigned mn = (unsigned)_mm_movemask_epi8(
			    _mm_cmpeq_epi8(v, vn));
			unsigned mq = (unsigned)_mm_movemask_epi8(
			    _mm_cmpeq_epi8(v, vq));
			unsigned md = (unsigned)_mm_movemask_epi8(
			    _mm_cmpeq_epi8(v, vd));
			/* The bits before the line end, if it is here. */
			unsigned lim = mn != 0 ? (mn & -mn) - 1 : 0xffffu;

			if ((mq & lim) != 0)
				*quoted = 1;
			for (md &= lim; md != 0; md &= md - 1) {
				if (nd < CSVIN_NDPOS)
					r->dpos[nd] = (unsigned)(p - s) +
					    (unsigned)__builtin_ctz(md);
				nd++;
			}
			if (mn != 0) {
				nl = p + __builtin_ctz(mn);
				goto done;
			}
			p += 16;
		}
	}
#endif
	for (; p < e; p++) {
		if (*p == '\n') {
			nl = p;
			goto done;
		}
		if (*p == '"')
			*quoted = 1;
		else if (*p == delim) {
			if (nd < CSVIN_NDPOS)
				r->dpos[nd] = (unsigned)(p - s);
			nd++;
		}
	}
done:
	r->ndpos = keep && nd <= CSVIN_NDPOS ? nd : -1;
	return nl;
}

/*
 * Handle one record REC[0..N) that starts on LINE: blank, header, repeated
 * header, bad, or data.  KNOWN: r->dpos holds its delimiters
 * (scan_line()).
 */
static int
record(struct csvin *r, const char *rec, size_t n, unsigned long line,
    int quoted, int known)
{
	struct csvin_rec cr;
	size_t i, done;

	if (n >= 3 && memcmp(rec, "\xEF\xBB\xBF", 3) == 0) {
		rec += 3;
		n -= 3;
		known = 0;	/* the offsets are from the line's start */
	}
	r->st.records++;
	cr.src = r->src;
	cr.line = line;
	cr.raw = rec;
	cr.rawlen = n;
	cr.nf = 0;
	cr.f = NULL;
	cr.len = NULL;
	if (n == 0) {
		r->st.blank++;
		return r->ops->blank != NULL ? r->ops->blank(r->ctx, &cr) : 0;
	}
	if (!r->need_header && n == r->hdrlen && memcmp(rec, r->hdr, n) == 0) {
		r->st.header_repeats++;
		return 0;
	}
	if (r->need_header && r->auto_delim) {
		r->delim = guess_delim(rec, n);
		csv_set_delim(&r->p, (unsigned char)r->delim);
		known = 0;	/* found with the delimiter before */
	}
	r->nf = 0;
	r->alen = 0;
	r->failed = 0;
	if (!quoted)
		split_plain(r, rec, n, known && r->ndpos >= 0);
	else {
		done = csv_parse(&r->p, rec, n, field_cb, row_cb, r);
		if (done != n || csv_error(&r->p) != CSV_SUCCESS)
			r->failed = 1;
		if (csv_fini(&r->p, field_cb, row_cb, r) != 0)
			r->failed = 1;
	}
	if (r->failed) {
		r->st.bad++;
		return r->ops->bad != NULL ?
		    r->ops->bad(r->ctx, &cr, "malformed quoting") : 0;
	}
	for (i = 0; i < r->nf; i++)
		r->f[i] = r->arena + r->off[i];
	cr.nf = r->nf;
	cr.f = r->f;
	cr.len = r->flen;
	if (r->need_header) {
		r->need_header = 0;
		if (n > r->hdrcap) {
			r->hdrcap = n;
			r->hdr = cw_realloc(r->hdr, n);
		}
		memcpy(r->hdr, rec, n);
		r->hdrlen = n;
		r->st.headers++;
		return r->ops->header != NULL ? r->ops->header(r->ctx, &cr) : 0;
	}
	r->st.rows++;
	return r->ops->row(r->ctx, &cr);
}

/*
 * A line from P holds a quote: scan the record from its start P to see
 * where it ends, with RFC 4180's rule that only a quote opening a field
 * starts a quoted field.  Returns 0 with *END at the '\n' that ends the
 * record and *NL the number of line ends inside it; 1 when the data up to
 * E ends outside quotes without a line end; -1 when it ends inside quotes.
 * EOF tells whether more data may follow E.
 */
static int
scan_quoted(const struct csvin *r, const char *p, const char *e, int eof,
    const char **end, unsigned long *nl)
{
	int inq = 0, fstart = 1;
	unsigned long k = 0;

	for (; p < e; p++) {
		char c = *p;

		if (inq) {
			if (c == '"') {
				if (p + 1 < e && p[1] == '"')
					p++;
				else if (p + 1 == e && !eof)
					return -1;	/* cannot tell yet */
				else
					inq = 0;
			} else if (c == '\n')
				k++;
			continue;
		}
		if (c == '\n') {
			*end = p;
			*nl = k;
			return 0;
		}
		if (fstart && c == '"')
			inq = 1;
		/* libcsv skips blanks (space, tab unless it is the
		 * delimiter) before an opening quote: so do we. */
		fstart = c == r->delim || (fstart && (c == ' ' ||
		    (c == '\t' && r->delim != '\t')));
	}
	*nl = k;
	return inq ? -1 : 1;
}

/*
 * The last line of a plain (not gzip) source, [S, E), has no line end: a
 * file cut or still being written.  Whether it is held back (not read).
 */
static int
unended(struct csvin *r, struct gzsrc *src, const char *s, const char *e)
{
	const char *p;

	if (!gzsrc_plain(src))
		return 0;
	for (p = s; p < e && (*p == '\r' || *p == ' ' || *p == '\t'); p++)
		continue;
	if (p == e)
		return 0;	/* blanks only: no data to take or hold */
	if (r->growing) {
		r->st.held++;
		return 1;
	}
	r->st.unended++;
	cw_warn_at(r->src, r->line, "last line without a line end (a file "
	    "cut or still being written?): taken as it is");
	return 0;
}

void
csvin_set_growing(struct csvin *r, int on)
{
	r->growing = on;
}

int
csvin_file(struct csvin *r, const char *path)
{
	struct gzsrc src;

	if (gzsrc_open(&src, path) < 0)
		return CW_EXIT_DATA;
	return read_src(r, &src);
}

int
csvin_mem(struct csvin *r, const char *name, const void *buf, size_t n)
{
	struct gzsrc src;

	gzsrc_open_mem(&src, name, buf, n);
	return read_src(r, &src);
}

/*
 * Read the source SRC through and close it.  The buffer grows by the
 * source's chunk: GZSRC_BUFSZ from a file, less from memory, where a
 * large read saves no system call (and a large buffer costs a fuzz
 * harness more than its input).
 */
static int
read_src(struct csvin *r, struct gzsrc *src)
{
	size_t chunk = src->is_mem ? CSVIN_MEMCHUNK : GZSRC_BUFSZ;
	int rc = 0, eof = 0, skipping = 0;

	r->src = src->name;
	r->line = 1;
	r->need_header = 1;
	r->len = r->pos = 0;
	while (rc == 0) {
		const char *s, *e, *nlp, *end;
		unsigned long extra;
		ssize_t got;

		/* Refill: keep the unconsumed tail, grow for long records. */
		if (!eof) {
			if (r->pos > 0) {
				memmove(r->buf, r->buf + r->pos, r->len - r->pos);
				r->len -= r->pos;
				r->pos = 0;
			}
			if (r->cap - r->len < chunk) {
				if (r->cap >= CSVIN_MAXREC + chunk) {
					/* Nothing fits: drop the record. */
					cw_warn_at(r->src, r->line, "record "
					    "longer than %u bytes skipped",
					    CSVIN_MAXREC);
					r->st.bad++;
					r->len = r->pos = 0;
					skipping = 1;
				} else {
					r->cap = r->cap > 0 ? 2 * r->cap :
					    2 * chunk;
					r->buf = cw_realloc(r->buf, r->cap);
				}
			}
			got = gzsrc_read(src, r->buf + r->len,
			    r->cap - r->len);
			if (got < 0) {
				rc = CW_EXIT_DATA;
				break;
			}
			if (got == 0)
				eof = 1;
			r->len += (size_t)got;
		}
		s = r->buf + r->pos;
		e = r->buf + r->len;
		if (skipping) {
			nlp = memchr(s, '\n', (size_t)(e - s));
			if (nlp == NULL) {
				r->pos = r->len;
				if (eof)
					break;
				continue;
			}
			r->line++;
			r->pos = (size_t)(nlp + 1 - r->buf);
			skipping = 0;
			continue;
		}
		/* Every complete record in the buffer. */
		while (rc == 0 && s < e) {
			size_t n;
			int q, quoted;

			nlp = scan_line(r, s, e, &quoted);
			extra = 0;
			end = nlp;
			if (quoted)
				q = scan_quoted(r, s, e, eof, &end, &extra);
			else
				q = nlp != NULL ? 0 : 1;
			if (q != 0) {
				if (!eof)
					break;	/* wait for more data */
				end = e;	/* the last record */
				if (q > 0 && unended(r, src, s, e)) {
					s = e;
					break;
				}
			}
			n = (size_t)(end - s);
			if (n > 0 && s[n - 1] == '\r')
				n--;
			if (q < 0) {
				struct csvin_rec cr = { r->src, r->line, s, n,
				    0, NULL, NULL };

				r->st.records++;
				r->st.bad++;
				if (r->ops->bad != NULL)
					rc = r->ops->bad(r->ctx, &cr,
					    "unterminated quote");
			} else
				rc = record(r, s, n, r->line, quoted,
				    nlp != NULL && end == nlp);
			r->line += 1 + extra;
			s = end < e ? end + 1 : e;
		}
		r->pos = (size_t)(s - r->buf);
		if (eof && r->pos >= r->len)
			break;
	}
	gzsrc_close(src);
	return rc;
}

int
csvin_files(struct csvin *r, char **files, int n)
{
	int i, rc;

	if (n == 0)
		return csvin_file(r, "-");
	for (i = 0; i < n; i++)
		if ((rc = csvin_file(r, files[i])) != 0)
			return rc;
	return 0;
}
