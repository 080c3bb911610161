/*
 * fuzz_ts.c: ts_parse() and ts_format() on arbitrary bytes.
 *
 * The first byte picks the kind (ISO, epoch s, ms, us, auto) and the
 * local offset for zone-less times; the rest is the text.  Oracles: a
 * time that parses formats as ISO 8601 (years 0000-9999) or as plain
 * epoch seconds, and the ISO text parses back to the same time; a civil
 * date from ts_civil_from_days() goes back to the same day number; a
 * whole epoch number in seconds, ms or us is exact.
 */
#include "fuzz.h"
#include "ts.h"

#define MAXN 128

int
LLVMFuzzerTestOneInput(const uint8_t *data, size_t size)
{
	static const int kinds[] = { TS_ISO, TS_EPOCH_S, TS_EPOCH_MS,
	    TS_EPOCH_US, TS_AUTO };
	struct fz f = { data, size };
	char s[MAXN + 1], out[TS_FMTMAX];
	cw_time t, back;
	long offset, y;
	unsigned b, m, d;
	size_t n, len;
	int kind;

	b = fz_byte(&f);
	kind = kinds[(b & 0x07) % 5];
	/* Offsets from -18 h to +16.9 h in steps of 67.5 minutes. */
	offset = ((long)(b >> 3) - 16) * 4050;
	if (f.n > MAXN)
		return 0;
	n = f.n;
	memcpy(s, f.p, n);
	s[n] = '\0';
	if (ts_parse(s, n, kind, offset, &t) < 0)
		return 0;
	len = ts_format(t, out);
	FZ_CHECK(len > 0 && len < TS_FMTMAX && out[len] == '\0');
	if (out[len - 1] == 'Z') {
		FZ_CHECK(ts_parse(out, len, TS_ISO, 0, &back) == 0);
		if (back != t) {
			fprintf(stderr, "'%s' -> %lld -> '%s' -> %lld\n", s,
			    (long long)t, out, (long long)back);
			abort();
		}
		FZ_CHECK(ts_parse(out, len, TS_AUTO, 12345, &back) == 0 &&
		    back == t);
	}
	/* Day numbers and civil dates agree both ways. */
	{
		long z = (long)(t / CW_US_PER_S / 86400);

		ts_civil_from_days(z, &y, &m, &d);
		FZ_CHECK(m >= 1 && m <= 12 && d >= 1 && d <= 31);
		FZ_CHECK(ts_days_from_civil(y, m, d) == z);
	}
	/* A plain whole number is converted exactly. */
	if (kind != TS_ISO && kind != TS_AUTO) {
		long long v = 0;
		size_t i = 0, k;
		int neg = 0, ok = 1;

		while (i < n && (s[i] == ' ' || s[i] == '\t'))
			i++;
		k = n;
		while (k > i && (s[k - 1] == ' ' || s[k - 1] == '\t'))
			k--;
		if (i < k && (s[i] == '-' || s[i] == '+'))
			neg = s[i++] == '-';
		if (i == k || k - i > 15)
			ok = 0;
		for (; ok && i < k; i++) {
			if (s[i] < '0' || s[i] > '9')
				ok = 0;
			else
				v = v * 10 + (s[i] - '0');
		}
		if (ok) {
			long long mul = kind == TS_EPOCH_S ? 1000000 :
			    kind == TS_EPOCH_MS ? 1000 : 1;

			FZ_CHECK(t == (neg ? -v : v) * mul);
		}
	}
	return 0;
}
