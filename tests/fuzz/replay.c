/*
 * replay.c: a main() for a libFuzzer harness without libFuzzer, so that
 * make check can run every saved regression input through its harness's
 * invariants with the ordinary compiler (no fuzzing, just the inputs).
 * Linked with one fuzz_<name>.c; each argument is an input file.  Exits 0
 * when every input ran; a broken invariant aborts, as under libFuzzer.
 */
#include <stdint.h>
#include <stdio.h>
#include <stdlib.h>

int	LLVMFuzzerTestOneInput(const uint8_t *data, size_t size);

int
main(int argc, char **argv)
{
	for (int k = 1; k < argc; k++) {
		FILE *fp = fopen(argv[k], "rb");
		unsigned char *buf = NULL;
		size_t n = 0, cap = 0, got;

		if (fp == NULL) {
			perror(argv[k]);
			return 2;
		}
		do {
			if (n == cap) {
				cap = cap ? 2 * cap : 65536;
				if ((buf = realloc(buf, cap)) == NULL) {
					perror("replay");
					return 2;
				}
			}
			got = fread(buf + n, 1, cap - n, fp);
			n += got;
		} while (got > 0);
		if (ferror(fp)) {
			perror(argv[k]);
			return 2;
		}
		fclose(fp);
		LLVMFuzzerTestOneInput(buf, n);
		free(buf);
		printf("ok %s\n", argv[k]);
	}
	return 0;
}
