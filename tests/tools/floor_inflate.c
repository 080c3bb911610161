/*
 * floor_inflate: benchmark floor A.  Inflates every file named (zlib's
 * gzread, the same 256 KiB buffer as cellwear) and discards the bytes.
 * Prints the byte count.
 */
#include <stdio.h>
#include <zlib.h>

int
main(int argc, char *argv[])
{
	static char buf[256 * 1024];
	unsigned long long total = 0;
	int i, n;

	for (i = 1; i < argc; i++) {
		gzFile gz = gzopen(argv[i], "rb");

		if (gz == NULL) {
			fprintf(stderr, "floor_inflate: %s: cannot open\n",
			    argv[i]);
			return 1;
		}
		gzbuffer(gz, sizeof(buf));
		while ((n = gzread(gz, buf, sizeof(buf))) > 0)
			total += (unsigned)n;
		gzclose(gz);
	}
	printf("%llu bytes\n", total);
	return 0;
}
