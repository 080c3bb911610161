/*
 * fuzz_num.c: num_parse() on arbitrary bytes.
 *
 * Oracles: a number num_parse() accepts is finite and, with '.' as the
 * decimal mark, exactly the double that the C library's strtod() (C
 * locale, correctly rounded in glibc) gives for the same trimmed text,
 * sign of zero included, and strtod() takes the whole text; NUM_RANGE
 * means strtod() overflows; text without ',' parses the same with ','
 * as the decimal mark once its '.' are turned into ','.
 */
#include "fuzz.h"
#include "num.h"

#define MAXN 512

int
LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
	char s[MAXN + 1], t[MAXN + 1], *end;
	const char *p, *e;
	double x, y, z;
	size_t n, i;
	int rc, rc2, comma = 0;

	if (size > MAXN)
		return 0;
	memcpy(s, data, size);
	s[size] = '\0';
	rc = num_parse(s, size, '.', &x);
	FZ_CHECK(rc == NUM_OK || rc == NUM_EMPTY || rc == NUM_BAD ||
	    rc == NUM_RANGE);
	FZ_CHECK(num_strerror(rc) != NULL);
	for (i = 0; i < size; i++)
		comma |= s[i] == ',';
	if (!comma) {
		for (i = 0; i < size; i++)
			t[i] = s[i] == '.' ? ',' : s[i];
		rc2 = num_parse(t, size, ',', &z);
		FZ_CHECK(rc2 == rc);
		if (rc == NUM_OK)
			FZ_CHECK(memcmp(&x, &z, sizeof(x)) == 0);
	}
	if (rc != NUM_OK && rc != NUM_RANGE)
		return 0;
	/* The trimmed text, as num_parse() sees it. */
	p = s;
	e = s + size;
	while (p < e && (*p == ' ' || *p == '\t'))
		p++;
	while (e > p && (e[-1] == ' ' || e[-1] == '\t'))
		e--;
	n = (size_t)(e - p);
	memcpy(t, p, n);
	t[n] = '\0';
	y = strtod(t, &end);
	FZ_CHECK(end == t + n);
	if (rc == NUM_RANGE) {
		FZ_CHECK(isinf(y));
		return 0;
	}
	FZ_CHECK(isfinite(x));
	if (memcmp(&x, &y, sizeof(x)) != 0) {
		fprintf(stderr, "num_parse(\"%s\") = %.17g, strtod %.17g\n", t,
		    x, y);
		abort();
	}
	return 0;
}
