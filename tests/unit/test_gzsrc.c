/*
 * test_gzsrc.c: the input source (lib/gzsrc.c).
 *
 * Reference: RFC 1952 (GZIP file format 4.3): a gzip file is a series of
 * members, each a header (magic 1f 8b), deflate data (RFC 1951), CRC-32
 * and ISIZE trailer.  Members concatenated are one file whose content is
 * the concatenation (RFC 1952 2.2); a stream that ends before the trailer
 * is truncated; a wrong CRC-32 or ISIZE is corrupt.  The test writes its
 * gzip files with zlib's gzwrite() and checks the bytes read back against
 * the original text.  The memory source (gzsrc_open_mem()) is held to
 * what zlib's own gz* layer makes of the same bytes in a file: the same
 * text, the same end and the same message, over cut and damaged streams.
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

#include "cw.h"
#include "gzsrc.h"

static char tmpdir[] = "/tmp/test_gzsrc.XXXXXX";
static int saved_stderr = -1;
static char errpath[300];

static const char *path_of(const char *);
static void put(const char *, const void *, size_t);
static unsigned char *gz(const void *, size_t, size_t *);
static char *text(size_t);
static ssize_t slurp(const char *, char *, size_t, size_t, int *);
static void err_begin(void);
static char *err_end(void);

static const char *
path_of(const char *name)
{
	static char p[4][300];
	static int k;
	char *s = p[k++ % 4];

	snprintf(s, 300, "%s/%s", tmpdir, name);
	return s;
}

static void
put(const char *name, const void *data, size_t n)
{
	FILE *fp = fopen(path_of(name), "wb");

	assert_non_null(fp);
	assert_int_equal(fwrite(data, 1, n, fp), n);
	assert_int_equal(fclose(fp), 0);
}

/* DATA as one gzip member, by zlib (a malloc'ed buffer, *LEN bytes). */
static unsigned char *
gz(const void *data, size_t n, size_t *len)
{
	const char *p = path_of("member.gz");
	unsigned char *buf;
	gzFile g = gzopen(p, "wb6");
	FILE *fp;
	long sz;

	assert_non_null(g);
	if (n > 0)
		assert_int_equal(gzwrite(g, data, (unsigned)n), (int)n);
	assert_int_equal(gzclose(g), Z_OK);
	fp = fopen(p, "rb");
	assert_non_null(fp);
	fseek(fp, 0, SEEK_END);
	sz = ftell(fp);
	rewind(fp);
	buf = malloc((size_t)sz);
	assert_non_null(buf);
	assert_int_equal(fread(buf, 1, (size_t)sz, fp), (size_t)sz);
	fclose(fp);
	*len = (size_t)sz;
	return buf;
}

/* N bytes of log-like text that does not compress to nothing. */
static char *
text(size_t n)
{
	char *s = malloc(n + 1);
	uint32_t x = 2463534242u;
	size_t i = 0;

	assert_non_null(s);
	while (i < n) {
		char line[80];
		int k;

		x ^= x << 13, x ^= x >> 17, x ^= x << 5;
		k = snprintf(line, sizeof(line), "EB-%04u,%u,%u.%03u,-%u.%02u\n",
		    x % 9973, 1772323260u + (unsigned)i, 36 + x % 6, x % 1000,
		    x % 7, x % 100);
		if ((size_t)k > n - i)
			k = (int)(n - i);
		memcpy(s + i, line, (size_t)k);
		i += (size_t)k;
	}
	s[n] = '\0';
	return s;
}

/*
 * Read PATH through in reads of CHUNK bytes into BUF (CAP bytes); returns
 * the byte count, and in *LAST the last gzsrc_read() value (0 or -1).
 */
static ssize_t
slurp(const char *path, char *buf, size_t cap, size_t chunk, int *last)
{
	struct gzsrc s;
	size_t n = 0;
	ssize_t got;

	assert_int_equal(gzsrc_open(&s, path), 0);
	for (;;) {
		size_t want = chunk < cap - n ? chunk : cap - n;

		assert_true(want > 0);
		got = gzsrc_read(&s, buf + n, want);
		if (got <= 0)
			break;
		assert_true((size_t)got <= want);
		n += (size_t)got;
	}
	*last = (int)got;
	gzsrc_close(&s);
	return (ssize_t)n;
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

static int
setup(void **st)
{
	(void)st;
	cw_setprog("test_gzsrc");
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

/* A plain file passes through unchanged, whatever the read size. */
static void
test_plain(void **st)
{
	size_t n = 3 * GZSRC_BUFSZ + 12345, chunks[] = { 1, 7, 4096,
	    GZSRC_BUFSZ, 10u << 20 };
	char *t = text(n), *buf = malloc(n + 16);
	size_t i;
	int last;

	(void)st;
	put("plain.csv", t, n);
	for (i = 0; i < sizeof(chunks) / sizeof(chunks[0]); i++) {
		memset(buf, 0, n);
		assert_int_equal(slurp(path_of("plain.csv"), buf, n + 16,
		    chunks[i], &last), (ssize_t)n);
		assert_int_equal(last, 0);
		assert_memory_equal(buf, t, n);
	}
	/* A short plain file, even one starting with half a gzip magic. */
	put("short.csv", "\x1f", 1);
	assert_int_equal(slurp(path_of("short.csv"), buf, 16, 16, &last), 1);
	assert_int_equal(last, 0);
	assert_int_equal(buf[0], 0x1f);
	put("empty.csv", "", 0);
	assert_int_equal(slurp(path_of("empty.csv"), buf, 16, 16, &last), 0);
	assert_int_equal(last, 0);
	free(t);
	free(buf);
}

/* Gzip is recognised by its magic bytes, not by the name. */
static void
test_gzip(void **st)
{
	size_t n = 5 * GZSRC_BUFSZ + 999, zn, chunks[] = { 1, 1000,
	    GZSRC_BUFSZ, 8u << 20 };
	char *t = text(n), *buf = malloc(n + 16);
	unsigned char *z = gz(t, n, &zn);
	size_t i;
	int last;

	(void)st;
	assert_true(z[0] == 0x1f && z[1] == 0x8b);
	put("log.csv", z, zn);	/* no .gz in the name */
	for (i = 0; i < sizeof(chunks) / sizeof(chunks[0]); i++) {
		memset(buf, 0, n);
		assert_int_equal(slurp(path_of("log.csv"), buf, n + 16,
		    chunks[i], &last), (ssize_t)n);
		assert_int_equal(last, 0);
		assert_memory_equal(buf, t, n);
	}
	free(z);
	/* An empty member is an empty file. */
	z = gz("", 0, &zn);
	put("empty.gz", z, zn);
	assert_int_equal(slurp(path_of("empty.gz"), buf, 16, 16, &last), 0);
	assert_int_equal(last, 0);
	free(z);
	free(t);
	free(buf);
}

/* RFC 1952 2.2: members concatenated (cat a.gz b.gz) read as one. */
static void
test_members(void **st)
{
	size_t n1 = 300000, n2 = 1, n3 = 700000, z1, z2, z3, zn = 0;
	char *t = text(n1 + n2 + n3), *buf = malloc(n1 + n2 + n3 + 16);
	unsigned char *a = gz(t, n1, &z1), *b = gz(t + n1, n2, &z2),
	    *c = gz(t + n1 + n2, n3, &z3), *all = malloc(z1 + z2 + z3);
	int last;

	(void)st;
	memcpy(all, a, z1);
	zn += z1;
	memcpy(all + zn, b, z2);
	zn += z2;
	memcpy(all + zn, c, z3);
	zn += z3;
	put("cat.gz", all, zn);
	assert_int_equal(slurp(path_of("cat.gz"), buf, n1 + n2 + n3 + 16,
	    GZSRC_BUFSZ, &last), (ssize_t)(n1 + n2 + n3));
	assert_int_equal(last, 0);
	assert_memory_equal(buf, t, n1 + n2 + n3);
	free(a);
	free(b);
	free(c);
	free(all);
	free(t);
	free(buf);
}

/*
 * Cut short anywhere (inside the deflate data, at its end, inside the
 * trailer, after the header only): -1 at the end with a message naming
 * the file, and every byte returned before it is the original text.
 */
static void
test_truncated(void **st)
{
	size_t n = 2 * GZSRC_BUFSZ, zn, k;
	char *t = text(n), *buf = malloc(n + 16), *msg;
	unsigned char *z = gz(t, n, &zn);
	size_t cuts[] = { 10, 11, 100, 0, 0, 0, 0, 0 };
	ssize_t got;
	int last;

	(void)st;
	cuts[3] = zn / 3;
	cuts[4] = zn / 2;
	cuts[5] = zn - 8;	/* no trailer */
	cuts[6] = zn - 4;	/* CRC-32 but no ISIZE */
	cuts[7] = zn - 1;
	for (k = 0; k < sizeof(cuts) / sizeof(cuts[0]); k++) {
		put("cut.gz", z, cuts[k]);
		err_begin();
		got = slurp(path_of("cut.gz"), buf, n + 16, 65536, &last);
		msg = err_end();
		if (last != -1) {
			print_error("cut at %zu of %zu: %zd bytes, last %d\n",
			    cuts[k], zn, got, last);
			fail();
		}
		assert_true(got >= 0 && (size_t)got <= n);
		assert_memory_equal(buf, t, (size_t)got);
		assert_non_null(strstr(msg, path_of("cut.gz")));
		assert_non_null(strstr(msg, "test_gzsrc: "));
		assert_non_null(strstr(msg, "truncated"));
		if (k >= 5)
			/* Only the trailer is missing: all the text came. */
			assert_int_equal(got, (ssize_t)n);
	}
	free(z);
	free(t);
	free(buf);
}

/* A wrong CRC-32 or ISIZE (RFC 1952 2.3.1), or deflate data that make no
 * sense: -1 and "corrupt". */
static void
test_corrupt(void **st)
{
	size_t n = GZSRC_BUFSZ, zn;
	char *t = text(n), *buf = malloc(n + 16), *msg;
	unsigned char *z = gz(t, n, &zn);
	int last, where;

	(void)st;
	for (where = 0; where < 3; where++) {
		unsigned char *c = malloc(zn);
		size_t i;

		memcpy(c, z, zn);
		if (where == 0)
			c[zn - 8] ^= 0x01;	/* CRC-32 */
		else if (where == 1)
			c[zn - 1] ^= 0x40;	/* ISIZE */
		else
			for (i = 10; i < 60; i++)	/* deflate data */
				c[i] = 0xff;
		put("bad.gz", c, zn);
		err_begin();
		(void)slurp(path_of("bad.gz"), buf, n + 16, 65536, &last);
		msg = err_end();
		assert_int_equal(last, -1);
		assert_non_null(strstr(msg, path_of("bad.gz")));
		assert_non_null(strstr(msg, "corrupt"));
		free(c);
	}
	free(z);
	free(t);
	free(buf);
}

/*
 * RFC 1952 2.2 knows only members: bytes after one that start no other
 * (zeros, then a member; text to the end) are an error after every byte
 * of the member before them, naming their offset (the member's size) and
 * length; with gzsrc_skip_junk, skipped to the next member and counted.
 * On the reader thread and, with CW_THREADS=0, without it: the same.
 */
static void
test_junk(void **st)
{
	size_t n1 = 500000, n2 = 300000, z1, z2, zn, k;
	char *t = text(n1 + n2), *buf = malloc(n1 + n2 + 16), *msg, want[64];
	unsigned char *a = gz(t, n1, &z1), *b = gz(t + n1, n2, &z2), *f;
	int last, threads, skip;

	(void)st;
	f = calloc(z1 + 5000 + z2, 1);
	assert_non_null(f);
	memcpy(f, a, z1);
	memcpy(f + z1 + 5000, b, z2);	/* 5000 zeros between */
	zn = z1 + 5000 + z2;
	put("junk.gz", f, zn);
	put("text.gz", a, z1);
	for (k = 0; k < 2; k++) {
		threads = k == 0;
		setenv("CW_THREADS", threads ? "1" : "0", 1);
		for (skip = 0; skip < 2; skip++) {
			gzsrc_skip_junk = skip;
			err_begin();
			assert_int_equal(slurp(path_of("junk.gz"), buf, n1 + n2 +
			    16, 65536, &last), (ssize_t)(skip ? n1 + n2 : n1));
			msg = err_end();
			assert_int_equal(last, skip ? 0 : -1);
			assert_memory_equal(buf, t, skip ? n1 + n2 : n1);
			snprintf(want, sizeof(want), skip ? "5000 bytes after "
			    "gzip members skipped" : "5000 bytes at offset %zu ",
			    z1);
			assert_non_null(strstr(msg, want));
			snprintf(want, sizeof(want), "offset %zu", z1);
			assert_non_null(strstr(msg, want));
		}
	}
	/* Text after the last member: to the end. */
	gzsrc_skip_junk = 0;
	{
		FILE *fp = fopen(path_of("text.gz"), "ab");

		assert_non_null(fp);
		fputs("garbage\n", fp);
		fclose(fp);
	}
	err_begin();
	assert_int_equal(slurp(path_of("text.gz"), buf, n1 + 16, 4096, &last),
	    (ssize_t)n1);
	msg = err_end();
	assert_int_equal(last, -1);
	assert_non_null(strstr(msg, "8 bytes at offset"));
	assert_non_null(strstr(msg, "up to the end"));
	unsetenv("CW_THREADS");
	free(f);
	free(a);
	free(b);
	free(t);
	free(buf);
}

/* Standard input for NULL and "-", shown as "stdin"; gzip there too. */
static void
test_stdin(void **st)
{
	size_t n = 100000, zn;
	char *t = text(n), *buf = malloc(n + 16);
	unsigned char *z = gz(t, n, &zn);
	struct gzsrc s;
	int saved = dup(0), fd, pass;
	size_t got;
	ssize_t r;

	(void)st;
	put("in.gz", z, zn);
	for (pass = 0; pass < 2; pass++) {
		fd = open(path_of("in.gz"), O_RDONLY);
		assert_true(fd >= 0);
		dup2(fd, 0);
		close(fd);
		assert_int_equal(gzsrc_open(&s, pass ? "-" : NULL), 0);
		assert_string_equal(s.name, "stdin");
		assert_true(s.is_stdin);
		got = 0;
		while ((r = gzsrc_read(&s, buf + got, n + 16 - got)) > 0)
			got += (size_t)r;
		assert_int_equal(r, 0);
		assert_int_equal(got, n);
		assert_memory_equal(buf, t, n);
		gzsrc_close(&s);
	}
	dup2(saved, 0);
	close(saved);
	free(z);
	free(t);
	free(buf);
}

/* A file that is not there, and one that cannot be read (a folder). */
static void
test_unreadable(void **st)
{
	struct gzsrc s;
	char buf[64], *msg;
	ssize_t r;

	(void)st;
	err_begin();
	assert_int_equal(gzsrc_open(&s, path_of("none.csv")), -1);
	msg = err_end();
	assert_non_null(strstr(msg, path_of("none.csv")));
	assert_non_null(strstr(msg, "No such file"));

	err_begin();
	r = -2;
	if (gzsrc_open(&s, tmpdir) == 0) {
		r = gzsrc_read(&s, buf, sizeof(buf));
		gzsrc_close(&s);
	}
	msg = err_end();
	assert_int_equal(r, -1);
	assert_non_null(strstr(msg, tmpdir));
}

/* As slurp(), from memory: DATA[0..N) named PATH. */
static ssize_t
slurp_mem(const char *path, const void *data, size_t len, char *buf,
    size_t cap, size_t chunk, int *last)
{
	struct gzsrc s;
	size_t n = 0;
	ssize_t got;

	assert_int_equal(gzsrc_open_mem(&s, path, data, len), 0);
	for (;;) {
		size_t want = chunk < cap - n ? chunk : cap - n;

		assert_true(want > 0);
		got = gzsrc_read(&s, buf + n, want);
		if (got <= 0)
			break;
		n += (size_t)got;
	}
	*last = (int)got;
	gzsrc_close(&s);
	return (ssize_t)n;
}

/* DATA[0..N) read from a file and from memory give the same. */
static void
same_as_file(const void *data, size_t n)
{
	static const size_t chunks[] = { 1, 7, 65536 };
	static char a[65536], b[65536];
	char ea[4096];
	const char *p = path_of("mem.gz");
	ssize_t na, nb;
	int la, lb;
	size_t k;

	put("mem.gz", data, n);
	for (k = 0; k < sizeof(chunks) / sizeof(chunks[0]); k++) {
		err_begin();
		na = slurp(p, a, sizeof(a), chunks[k], &la);
		snprintf(ea, sizeof(ea), "%s", err_end());
		err_begin();
		nb = slurp_mem(p, data, n, b, sizeof(b), chunks[k], &lb);
		assert_int_equal(lb, la);
		assert_string_equal(err_end(), ea);
		/*
		 * Before an error, each gives what it had decoded: the gz*
		 * layer inflates ahead into its own buffer and drops that
		 * buffer's bytes, so one text is a prefix of the other.
		 */
		if (la == 0)
			assert_int_equal(nb, na);
		assert_memory_equal(b, a, (size_t)(na < nb ? na : nb));
	}
}

static void
test_mem(void **st)
{
	static const unsigned char one[] = { 0x1f }, magic[] = { 0x1f, 0x8b };
	unsigned char *m, *two, *buf;
	char *t = text(3000);
	size_t ml, i, cut;
	const char *p;
	char got[64];
	struct gzsrc s;

	(void)st;
	same_as_file("", 0);
	same_as_file(one, 1);
	same_as_file(magic, 2);
	same_as_file(t, 3000);
	m = gz(t, 3000, &ml);
	two = malloc(2 * ml + 3);
	assert_non_null(two);
	memcpy(two, m, ml);
	memcpy(two + ml, m, ml);
	same_as_file(two, 2 * ml);
	/* Trailing garbage after a member, one byte of magic, text. */
	memcpy(two + ml, "x,y\n", 4);
	same_as_file(two, ml + 4);
	same_as_file(two, ml + 1);
	two[ml] = 0x1f;
	same_as_file(two, ml + 1);
	/* Every cut of two members, and damage at every byte of one. */
	memcpy(two + ml, m, ml);
	for (cut = 0; cut < 2 * ml; cut += cut < 40 ? 1 : 17)
		same_as_file(two, cut);
	buf = malloc(ml);
	assert_non_null(buf);
	for (i = 0; i < ml; i++) {
		memcpy(buf, m, ml);
		buf[i] ^= 0x55;
		same_as_file(buf, ml);
	}
	/* A bound name is read from memory, not from its file. */
	put("bound.csv", "on disk\n", 8);
	p = path_of("bound.csv");
	gzsrc_bind_mem(p, "in memory\n", 10);
	assert_int_equal(gzsrc_open(&s, p), 0);
	assert_int_equal(gzsrc_read(&s, got, sizeof(got)), 10);
	assert_memory_equal(got, "in memory\n", 10);
	gzsrc_close(&s);
	gzsrc_bind_mem(NULL, NULL, 0);
	assert_int_equal(gzsrc_open(&s, p), 0);
	assert_int_equal(gzsrc_read(&s, got, sizeof(got)), 8);
	gzsrc_close(&s);
	free(buf);
	free(two);
	free(m);
	free(t);
}

int
main(void)
{
	const struct CMUnitTest tests[] = {
		cmocka_unit_test(test_plain),
		cmocka_unit_test(test_gzip),
		cmocka_unit_test(test_members),
		cmocka_unit_test(test_truncated),
		cmocka_unit_test(test_corrupt),
		cmocka_unit_test(test_junk),
		cmocka_unit_test(test_stdin),
		cmocka_unit_test(test_unreadable),
		cmocka_unit_test(test_mem),
	};

	return cmocka_run_group_tests(tests, setup, teardown);
}
