/*
 * synth_rng: a test driver for the random numbers of synth/synth.c, used by
 * tests/ref/synth_rng.sh.
 *
 *   synth_rng SEED STREAM N
 *
 * prints N lines "NEXT UNIF GAUSS": a raw 64-bit output, then a uniform
 * and a normal deviate, from stream STREAM of SEED.  Not a tool: stdio and
 * strtoull are fine here.
 */
#include <stdio.h>
#include <stdlib.h>

#include "synth.h"

int
main(int argc, char *argv[])
{
	struct synth_rng r;
	unsigned long long seed, stream;
	long n, i;

	if (argc != 4) {
		fprintf(stderr, "usage: synth_rng seed stream n\n");
		return 2;
	}
	seed = strtoull(argv[1], NULL, 10);
	stream = strtoull(argv[2], NULL, 10);
	n = strtol(argv[3], NULL, 10);
	synth_rng_seed(&r, (uint64_t)seed, (uint64_t)stream);
	for (i = 0; i < n; i++) {
		unsigned long long x = (unsigned long long)synth_rng_next(&r);
		double u = synth_rng_unif(&r);
		double g = synth_rng_gauss(&r);

		printf("%llu %.17g %.17g\n", x, u, g);
	}
	return 0;
}
