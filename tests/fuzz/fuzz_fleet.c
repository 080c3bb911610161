/*
 * fuzz_fleet.c: the fleet file reader (lib/fleet.c) on arbitrary fleet
 * files, read from memory.
 *
 * fleet_load() ends the process on a bad file (cw_die(), its contract:
 * the tools exit 1).  This harness is linked with --wrap for cw_die, the
 * library's allocators, free, and the opening and closing of the source
 * and of the CSV reader: while fleet_load() runs, what the library
 * allocates is noted and what is freed struck off; a cw_die() then
 * closes the source and the reader, frees what is left and goes back
 * here with longjmp(), so a rejected file ends the input, not the
 * fuzzer, and leaks nothing (leaks stay findings).
 *
 * The whole input is the file.  Oracles, from fleet.h and cellwear(7):
 * - a file read holds as many packs as data rows, and each row's device
 *   is found (the same rows read here through csvin_mem());
 * - every value given lies in its documented range: capacity_ah > 0,
 *   cells 1..1000, soh_pct in (0, 150], efc_prior >= 0, a time for
 *   in_service; site and model are strings;
 * - fleet_capacity() and fleet_cells() give the pack's value when it has
 *   one, the default otherwise.
 */
#include <setjmp.h>
#include <stdarg.h>

#include "csvin.h"
#include "fleet.h"
#include "fuzz.h"
#include "gzsrc.h"

_Noreturn void	__wrap_cw_die(int, const char *, ...);
void	*__wrap_cw_malloc(size_t);
void	*__wrap_cw_calloc(size_t, size_t);
void	*__wrap_cw_realloc(void *, size_t);
int	__wrap_posix_memalign(void **, size_t, size_t);
int	__real_posix_memalign(void **, size_t, size_t);
void	__wrap_free(void *);
ssize_t	__wrap_gzsrc_read(struct gzsrc *, void *, size_t);
void	*__real_cw_malloc(size_t);
void	*__real_cw_calloc(size_t, size_t);
void	*__real_cw_realloc(void *, size_t);
void	__real_free(void *);
ssize_t	__real_gzsrc_read(struct gzsrc *, void *, size_t);
void	__wrap_gzsrc_close(struct gzsrc *);
void	__real_gzsrc_close(struct gzsrc *);
struct csvin *__wrap_csvin_new(char, const struct csvin_ops *, void *);
struct csvin *__real_csvin_new(char, const struct csvin_ops *, void *);
void	__wrap_csvin_free(struct csvin *);
void	__real_csvin_free(struct csvin *);

#define NLIVE 4096

static jmp_buf fz_die;
static int fz_died, fz_track;
static void *live[NLIVE];	/* the library's blocks while tracking */
static size_t nlive;
static struct gzsrc *reading;	/* the source fleet_load() reads */
static struct csvin *parsing;	/* its reader (libcsv's memory inside) */

static void
note(void *p)
{
	if (fz_track && p != NULL) {
		FZ_CHECK(nlive < NLIVE);
		live[nlive++] = p;
	}
}

static void
strike(void *p)
{
	size_t k;

	if (!fz_track || p == NULL)
		return;
	for (k = nlive; k-- > 0;)
		if (live[k] == p) {
			live[k] = live[--nlive];
			return;
		}
}

void *
__wrap_cw_malloc(size_t n)
{
	void *p = __real_cw_malloc(n);

	note(p);
	return p;
}

void *
__wrap_cw_calloc(size_t n, size_t sz)
{
	void *p = __real_cw_calloc(n, sz);

	note(p);
	return p;
}

void *
__wrap_cw_realloc(void *old, size_t n)
{
	void *p = __real_cw_realloc(old, n);

	strike(old);
	note(p);
	return p;
}

int
__wrap_posix_memalign(void **pp, size_t align, size_t n)
{
	int e = __real_posix_memalign(pp, align, n);

	if (e == 0)
		note(*pp);
	return e;
}

void
__wrap_free(void *p)
{
	strike(p);
	__real_free(p);
}

ssize_t
__wrap_gzsrc_read(struct gzsrc *s, void *buf, size_t n)
{
	reading = s;
	return __real_gzsrc_read(s, buf, n);
}

void
__wrap_gzsrc_close(struct gzsrc *s)
{
	reading = NULL;
	__real_gzsrc_close(s);
}

struct csvin *
__wrap_csvin_new(char delim, const struct csvin_ops *ops, void *ctx)
{
	return parsing = __real_csvin_new(delim, ops, ctx);
}

void
__wrap_csvin_free(struct csvin *r)
{
	if (r == parsing)
		parsing = NULL;
	__real_csvin_free(r);
}

_Noreturn void
__wrap_cw_die(int code, const char *fmt, ...)
{
	FZ_CHECK(code == CW_EXIT_DATA);
	FZ_CHECK(fmt != NULL);
	/* The source and its reader are still open when a row's callback
	 * gives up; what they free is struck off. */
	if (reading != NULL)
		gzsrc_close(reading);
	if (parsing != NULL)
		csvin_free(parsing);
	fz_track = 0;
	while (nlive > 0)
		__real_free(live[--nlive]);
	fz_died = 1;
	longjmp(fz_die, 1);
}

struct ctx {
	const struct fleet *f;
	int dev;
	unsigned long rows;
};

static int
on_header(void *cp, const struct csvin_rec *r)
{
	struct ctx *c = cp;

	c->dev = csvin_find(r, "device");
	FZ_CHECK(c->dev >= 0);
	return 0;
}

/* The pack P, found under the name N[0..LEN) (a NUL may be inside). */
static void
check_pack(const struct fleet *f, const struct fleet_pack *p, const char *n,
    size_t len)
{
	FZ_CHECK(p->site != NULL && p->model != NULL);
	if (p->have & FLEET_CAPACITY)
		FZ_CHECK(p->capacity_ah > 0 && isfinite(p->capacity_ah) &&
		    fleet_capacity(f, n, len, -1) == p->capacity_ah);
	else
		FZ_CHECK(fleet_capacity(f, n, len, -1) == -1);
	if (p->have & FLEET_CELLS)
		FZ_CHECK(p->cells >= 1 && p->cells <= 1000 &&
		    fleet_cells(f, n, len, -1) == p->cells);
	else
		FZ_CHECK(fleet_cells(f, n, len, -1) == -1);
	if (p->have & FLEET_SOH)
		FZ_CHECK(p->soh_pct > 0 && p->soh_pct <= 150);
	if (p->have & FLEET_EFC_PRIOR)
		FZ_CHECK(p->efc_prior >= 0 && isfinite(p->efc_prior));
}

static int
on_row(void *cp, const struct csvin_rec *r)
{
	struct ctx *c = cp;
	const struct fleet_pack *p;

	c->rows++;
	FZ_CHECK((size_t)c->dev < r->nf);
	p = fleet_find(c->f, r->f[c->dev], r->len[c->dev]);
	FZ_CHECK(p != NULL);
	check_pack(c->f, p, r->f[c->dev], r->len[c->dev]);
	return 0;
}

static int
on_bad(void *cp, const struct csvin_rec *r, const char *why)
{
	(void)cp;
	(void)r;
	(void)why;
	FZ_CHECK(!"a bad record in a fleet file that was read");
	return 0;
}

int
LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
	static const struct csvin_ops ops = { on_header, on_row, on_bad,
	    NULL };
	struct fleet *volatile f = NULL;
	struct csvin *in;
	struct ctx c;
	const char *path;

	path = fz_file(data, size);
	fz_died = 0;
	nlive = 0;
	reading = NULL;
	parsing = NULL;
	fz_track = 1;
	if (setjmp(fz_die) == 0)
		f = fleet_load(path);
	fz_track = 0;
	reading = NULL;
	if (fz_died)
		return 0;
	FZ_CHECK(f != NULL);
	memset(&c, 0, sizeof(c));
	c.f = f;
	in = csvin_new('\0', &ops, &c);
	FZ_CHECK(csvin_mem(in, path, data, size) == 0);
	csvin_free(in);
	FZ_CHECK(fleet_count(f) == c.rows);
	FZ_CHECK(fleet_find(f, "", 0) == NULL || c.rows > 0);
	fleet_free(f);
	return 0;
}
